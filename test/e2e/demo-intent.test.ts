/**
 * The demo batch against what each row means: the real CLI `batch` over gazetteer/demo-localities.csv,
 * a real demo SQLite store, and every row's status, locality type, features used and coordinate flags
 * compared with gazetteer/demo-localities.intent.json; a row left without a georeference is compared on the
 * name it turns on (the name that matches several features, or the name not found).
 *
 * The intent file states each row's `form` (what kind of locality it is) and `places` (the gazetteer names
 * it means). `expectedFromIntent` turns a form into the answer the method gives that kind of locality
 * (docs/method.md §3) and the features that kind uses: the place for one feature, both places for a
 * "between" or a junction, the place and the line followed for a path offset; each is the gazetteer feature
 * one of the row's `places` names (name or alternate name in gazetteer/demo.geojson). Where the answer legitimately differs from the
 * intent's reading because of a later, documented rule, `documented` says so row by row with the rule's
 * section. Where the answer is simply wrong today, the row is a known defect: its test asserts the
 * intended answer and is marked to fail, so it turns red (asking to drop the mark) once fixed.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, it } from 'vitest';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const cli = join(root, 'bin/whereabouts.js');
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-intent-'));
const db = join(dir, 'demo.sqlite');
const out = join(dir, 'out.csv');

interface Intent { occurrenceID: string; locality: string; form: string; places: string[]; absent: string[]; note?: string }
type Status = 'georeferenced' | 'ambiguous' | 'not found' | 'unable';
/** A row's answer: status, locality type, the gazetteer names of the features used (sorted), the name a row without a georeference turns on, flags. */
interface Expected { status: Status; type?: string; features: string[]; name?: string; flags: string[] }

const intents = JSON.parse(readFileSync(join(root, 'gazetteer/demo-localities.intent.json'), 'utf8')) as Intent[];
const features = (JSON.parse(readFileSync(join(root, 'gazetteer/demo.geojson'), 'utf8')) as { features: { properties: Record<string, string> }[] }).features.map((f) => f.properties);

/** The gazetteer name of the feature that a name as written on the label means (its name or an alternate name). */
function gazetteerName(written: string): string {
  const found = features.filter((p) => p.name === written || (p.alternateNames ?? '').split('|').includes(written));
  if (found.length === 0) throw new Error(`"${written}" names no feature of demo.geojson`);
  return found[0].name;
}

/** Coordinate flags the intent's wording of an "existing coordinates" row implies (README, "Coordinate flags"). */
function flagsFromForm(form: string): string[] {
  if (form === 'existing coordinates, correct') return ['agrees-with-locality'];
  if (form === 'existing coordinates with the longitude sign inverted') return ['outside-locality-circle', 'fits-if-longitude-sign-flipped'];
  if (form === 'existing coordinates 0, 0') return ['both-zero', 'outside-locality-circle'];
  if (form === 'existing coordinates with latitude and longitude swapped') return ['beyond-valid-range', 'outside-locality-circle', 'fits-if-latitude-longitude-exchanged'];
  return [];
}

/**
 * The answer the method gives the row's kind of locality (docs/method.md §3): the features used are the first
 * place named, or both places for the kinds that use two (between, junction, a path offset and its line).
 */
function expectedFromIntent(intent: Intent): Expected {
  const { form, places } = intent;
  const flags = flagsFromForm(form);
  const place = (type: string): Expected => ({ status: 'georeferenced', type, features: [gazetteerName(places[0])], flags });
  const two = (type: string): Expected => ({ status: 'georeferenced', type, features: places.map(gazetteerName).sort(), flags });
  // Coordinates written with the record are the point; the place named beside them is not used
  // (docs/method.md §3, "coordinates"; §2, step 2: the most specific clause).
  if (/coordinates|minutes[- a-z]* in the text/i.test(form) && !form.startsWith('existing')) return { status: 'georeferenced', type: 'coordinates', features: [], flags };
  if (form.startsWith('ambiguous')) return { status: 'ambiguous', features: [], name: places[0], flags };
  if (form.startsWith('name absent')) return { status: 'not found', features: [], name: intent.absent[0], flags };
  if (form.startsWith('names no place') || form === 'empty locality') return { status: 'unable', features: [], flags };
  if (form.startsWith('distance and heading')) return place('offset-heading');
  if (form === 'two orthogonal offsets') return place('offset-orthogonal');
  if (form === 'distance only') return place('distance-only');
  if (form === 'path offset') return two('offset-path');
  if (form === 'between two places') return two('between');
  if (form === 'near') return place('near');
  if (form === 'junction of two lines') return two('junction');
  if (form.startsWith('named place') || form.startsWith('misspelt') || form.startsWith('existing coordinates')) return place('named-place');
  throw new Error(`no expectation for the form "${form}"`);
}

/**
 * Rows whose answer differs from the plain reading of the intent because of a documented rule: the
 * differing fields, and the rule.
 */
const documented: Record<string, { expected: Partial<Expected>; rule: string }> = {
  'qvh-occ-0052': {
    expected: { features: ['Val-Marin'] },
    rule: 'the most specific clause is georeferenced ("3 km N of Val-Marin"); the road clause only bounds it (docs/method.md §2, step 2)',
  },
  'qvh-occ-0037': {
    expected: { status: 'ambiguous', features: [], name: 'Rio Fundo', type: undefined, flags: ['beyond-valid-range'] },
    rule:
      '"Rio Fundo" names a town, a river and a county, so no georeference is made (docs/method.md §2, step 5; as row 0021); ' +
      'with no proposed circle the swapped coordinates can only be found out of range (README, "Coordinate flags": the ' +
      'circle comparisons need a proposed georeference)',
  },
  'qvh-occ-0022': {
    expected: { status: 'not found', features: [], name: 'Kingsfery', type: undefined },
    rule:
      'a text that is only a name, found only by a near spelling with nothing else to corroborate it, is left for a ' +
      'person to confirm, not answered ([CHOICE] fuzzyLoneName, src/georef/method-defaults.ts; docs/real-records.md)',
  },
};

/** Rows whose answer is wrong today: the intended answer is asserted and the test is marked to fail. None at present. */
const knownDefects: Record<string, string> = {};

/**
 * What the batch wrote for one row, read back from its output columns: the type and every feature used from
 * the remarks of any row (a row without a georeference must name none), the line a path offset followed
 * ("followed … along "Ruta 12"", src/georef/georeference.ts) among them.
 */
function answerOf(row: Record<string, string>): Expected {
  const remarks = row.georeferenceRemarks;
  const flags = row.whereabouts_coordinateFlags === '' ? [] : row.whereabouts_coordinateFlags.split(' | ');
  const verification = row.georeferenceVerificationStatus;
  const type = /locality type "([^"]+)"/.exec(remarks)?.[1];
  const used = [...remarks.matchAll(/feature used: "([^"]+)"/g), ...remarks.matchAll(/followed [^;]*?along "([^"]+)"/g)].map((m) => m[1]!).sort();
  if (verification === 'unable to georeference') return { status: 'unable', type, features: used, flags };
  if (verification === 'requires georeference') {
    const several = /^"([^"]+)" matches several features/.exec(remarks);
    const absent = /no feature named "([^"]+)"/.exec(remarks);
    return several ? { status: 'ambiguous', type, features: used, name: several[1], flags } : { status: 'not found', type, features: used, name: absent?.[1], flags };
  }
  expect(verification).toBe('requires verification');
  return { status: 'georeferenced', type, features: used, flags };
}

let rows: Record<string, string>[] = [];

beforeAll(async () => {
  await run(process.execPath, [cli, '--db', db, 'import', 'gazetteer/demo.geojson', '--source', 'Isla Verdemar demo gazetteer (invented)'], { cwd: root });
  await run(process.execPath, [cli, '--db', db, 'batch', 'gazetteer/demo-localities.csv', '--out', out, '--quiet'], { cwd: root, maxBuffer: 64 << 20 });
  rows = parse(readFileSync(out), { columns: true }) as Record<string, string>[];
}, 180_000);

describe('the demo batch against demo-localities.intent.json', () => {
  it('has one intent for every row, in order', () => {
    expect(rows.map((r) => r.occurrenceID)).toEqual(intents.map((i) => i.occurrenceID));
    expect(rows.map((r) => r.locality)).toEqual(intents.map((i) => i.locality));
  });

  for (const intent of intents) {
    const id = intent.occurrenceID;
    const exception = documented[id];
    const title = `${id} "${intent.locality}" (${intent.form})${exception ? `, differs by rule: ${exception.rule}` : ''}`;
    const test = knownDefects[id] ? it.fails : it;
    test(knownDefects[id] ? `${title} [known defect: ${knownDefects[id]}]` : title, () => {
      const expected = { ...expectedFromIntent(intent), ...(exception?.expected ?? {}) };
      const row = rows.find((r) => r.occurrenceID === id);
      expect(row).toBeDefined();
      const answer = answerOf(row as Record<string, string>);
      expect({ ...answer, flags: [...answer.flags].sort() }).toEqual({ ...expected, flags: [...expected.flags].sort() });
      // Every feature used is one the row's places name (the intent's own list), unless a documented rule says otherwise.
      if (!exception) for (const used of answer.features) expect(intent.places.map(gazetteerName)).toContain(used);
    });
  }
});
