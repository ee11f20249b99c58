/**
 * A real, openly licensed Darwin Core Archive through the real CLI: the Camtrap DP example dataset as
 * written to a Darwin Core Archive by the R package camtrapdp (test/fixtures/archives/camtrap-dp-example,
 * SOURCE.md there; records CC0 1.0, rights holder INBO). Rules checked are the Darwin Core text guide's
 * (Darwin Core Maintenance Group 2023, TDWG, http://rs.tdwg.org/dwc/terms/guides/text/, "guide §").
 */
import { execFile } from 'node:child_process';
import { createWriteStream, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, it } from 'vitest';
import yazl from 'yazl';
import { unzip } from './helpers.ts';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const FIXTURE = join(root, 'test/fixtures/archives/camtrap-dp-example');
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-dwca-real-'));
const db = join(dir, 'demo.sqlite');
const whereabouts = (...args: string[]) => run(process.execPath, [join(root, 'bin/whereabouts.js'), '--db', db, ...args], { cwd: root, maxBuffer: 64 << 20 });
const original = (name: string) => readFileSync(join(FIXTURE, name));

let out: { name: string; bytes: Buffer }[];

beforeAll(async () => {
  await whereabouts('import', 'gazetteer/demo.geojson', '--source', 'Isla Verdemar demo gazetteer (invented)');
  const zip = new yazl.ZipFile();
  for (const name of ['meta.xml', 'occurrence.csv', 'multimedia.csv']) zip.addBuffer(original(name), name);
  zip.end();
  await pipeline(zip.outputStream, createWriteStream(join(dir, 'camtrap-dp-example.zip')));
  await whereabouts('batch', join(dir, 'camtrap-dp-example.zip'), '--out', join(dir, 'out.zip'), '--quiet');
  out = await unzip(join(dir, 'out.zip'));
}, 180_000);

describe('the Camtrap DP example archive (CC0 1.0)', () => {
  it('comes back with its multimedia extension byte for byte and an EML document holding the method step', () => {
    expect(out.map((e) => e.name)).toEqual(['meta.xml', 'occurrence.csv', 'multimedia.csv', 'eml.xml']);
    expect(out[2].bytes.equals(original('multimedia.csv'))).toBe(true);
    expect(out[3].bytes.toString('utf8')).toMatch(/<methods><methodStep><description><para>Georeferences proposed by whereabouts/);
  });

  it('has every one of its 29 records once, in order, values unchanged, each with a status (guide §2.2: "," and \'"\', one header line)', () => {
    const before = parse(original('occurrence.csv'), { relax_column_count: false }) as string[][];
    const after = parse(out[1].bytes, { delimiter: '\t', record_delimiter: '\r\n' }) as string[][];
    expect(after).toHaveLength(before.length);
    expect(after.length - 1).toBe(29);
    const header = after[0];
    after.slice(1).forEach((row, i) => {
      expect(row.slice(0, before[0].length)).toEqual(before[i + 1]);
      expect(row[header.indexOf('georeferenceVerificationStatus')]).toBe('requires georeference');
    });
  });

  it('keeps the coordinates the records have and proposes beside them, as meta.xml says (guide §2.4)', () => {
    const header = (parse(out[1].bytes, { delimiter: '\t', to_line: 1 }) as string[][])[0];
    for (const term of ['decimalLatitude', 'decimalLongitude', 'geodeticDatum', 'coordinateUncertaintyInMeters', 'coordinatePrecision']) {
      expect(header).toContain(term);
      expect(header).toContain(`proposed_${term}`);
    }
    const meta = out[0].bytes.toString('utf8');
    expect(meta).toContain(`<field index="${header.indexOf('proposed_decimalLatitude')}" term="http://whereabouts.invalid/terms/proposed_decimalLatitude"/>`);
    expect(meta).toContain(`<field index="${header.indexOf('decimalLatitude')}" term="http://rs.tdwg.org/dwc/terms/decimalLatitude"/>`);
    expect(meta).toContain('<id index="8"/>');
  });
});
