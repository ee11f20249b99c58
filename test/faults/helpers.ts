/** Shared set-up for the fault tests: the real CLI in child processes, real SQLite files in a temp dir. */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { seededRandom } from '../../bench/seeded-random.ts';

export const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;
/** Invented places of Isla Quiroga (test/fixtures/batch/gazetteer.csv). */
export const FIXTURE_GAZETTEER = new URL('../fixtures/batch/gazetteer.csv', import.meta.url).pathname;
export const FIXTURE_SOURCE = 'isla-quiroga';

/** Runs `node bin/whereabouts.js ARGS` to the end. */
export function whereabouts(args: string[], env: NodeJS.ProcessEnv = process.env) {
  return spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', env, maxBuffer: 64 << 20 });
}

/** A store at `dir/name` holding the fixture gazetteer as source `isla-quiroga`, imported through the CLI. */
export function fixtureStore(dir = mkdtempSync(join(tmpdir(), 'whereabouts-faults-')), name = 'store.sqlite'): string {
  const dbPath = join(dir, name);
  const imported = whereabouts(['--db', dbPath, 'import', FIXTURE_GAZETTEER, '--source-id', FIXTURE_SOURCE, '--source', 'Invented test gazetteer of Isla Quiroga']);
  if (imported.status !== 0) throw new Error(`fixture import failed: ${imported.stderr}`);
  return dbPath;
}

/** Two letters each, so that a run of them reads back one way only. */
const SYLLABLES = ['ka', 'lo', 'mi', 'ra', 'te', 'vu', 'so', 'br', 'na', 'qu', 'do', 'pa', 'ze', 'ti', 'mo', 've'];

/**
 * A gazetteer CSV of `rows` invented villages, each name distinct: its first word spells the row number
 * in base 16, one syllable a digit; coordinates from a fixed-seed generator.
 */
export function writeInventedGazetteer(path: string, rows: number): void {
  const random = seededRandom(12_345);
  const lines = ['id,name,latitude,longitude,featureType,countryCode'];
  for (let i = 0; i < rows; i++) {
    const word = [...i.toString(16).padStart(5, '0')].map((digit) => SYLLABLES[parseInt(digit, 16)]).join('');
    lines.push(`gen-${i},${word[0].toUpperCase()}${word.slice(1)} Vale,${(-40 - random() * 10).toFixed(4)},${(-120 - random() * 10).toFixed(4)},village,QV`);
  }
  writeFileSync(path, `${lines.join('\n')}\n`);
}

/** The feature of `name` the CLI's locate picks, as its JSON reply has it. */
export function locatedFeature(dbPath: string, name: string): { status: string; sourceId?: string } {
  const located = whereabouts(['--db', dbPath, 'locate', name, '--country-code', 'QV', '--json']);
  if (located.status !== 0) throw new Error(`locate failed: ${located.stderr}`);
  const body = JSON.parse(located.stdout) as { status: string; georeference?: { features: { sourceId: string }[] } };
  return { status: body.status, sourceId: body.georeference?.features[0]?.sourceId };
}
