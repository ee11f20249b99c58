/**
 * A batch killed with SIGKILL part way (no chance to clean up) and then finished must give the same
 * file as a run that was never stopped, with no row lost or repeated, and never a half-written output.
 * The real CLI runs in a child process; WHEREABOUTS_TEST_DELAY_MS (documented in src/batch/run.ts)
 * slows each committed step so that the kill lands mid-run. Common practice, no source: compare bytes.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { jobsDatabasePath } from '../../src/store/side-files.ts';
import { fixtureGazetteer, killWhen, progress, readOutput, writeRepeatedLocalities } from './helpers.ts';

const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;
function sameBytesBut(timestampA: string, a: string, timestampB: string, b: string): void {
  expect(a.replaceAll(timestampA, '<run>')).toBe(b.replaceAll(timestampB, '<run>'));
}

describe('a batch killed part way', { timeout: 180_000 }, () => {
  it('finishes on resume with exactly the rows of an unbroken run', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const input = join(dir, 'input.csv');
    writeRepeatedLocalities(input);
    const jobsPath = jobsDatabasePath(dbPath);
    const env = { ...process.env, WHEREABOUTS_TEST_DELAY_MS: '60' };

    // Unbroken run, for reference.
    const reference = join(dir, 'reference.csv');
    const full = spawnSync(process.execPath, [BIN, '--db', dbPath, 'batch', input, '--out', reference, '--quiet', '--threads', '2'], { encoding: 'utf8' });
    expect(full.status, full.stderr).toBe(0);
    const referenceTimestamp = progress(jobsPath)!.run_timestamp;

    // Killed while georeferencing, then the same command run again.
    const output = join(dir, 'output.csv');
    const args = ['--db', dbPath, 'batch', input, '--out', output, '--quiet', '--threads', '2'];
    await killWhen(args, env, jobsPath, (p) => p.state === 'georeferencing' && p.distinct_done > 0 && p.distinct_done < (p.distinct_total ?? 0));
    expect(existsSync(output)).toBe(false);
    // Killed again part way through writing rows, then finished with --resume <job>.
    await killWhen(args, env, jobsPath, (p) => p.rows_done > 0 && p.rows_done < (p.rows_total ?? 0));
    expect(existsSync(output)).toBe(false);
    const job = new Database(jobsPath, { readonly: true }).prepare("SELECT id, run_timestamp FROM batch_job WHERE state != 'done'").get() as { id: string; run_timestamp: string };
    const resumed = spawnSync(process.execPath, [BIN, '--db', dbPath, 'batch', '--resume', job.id, '--quiet'], { encoding: 'utf8' });
    expect(resumed.status, resumed.stderr).toBe(0);

    sameBytesBut(job.run_timestamp, readFileSync(output, 'utf8'), referenceTimestamp, readFileSync(reference, 'utf8'));
    const [header, ...rows] = readOutput(output);
    expect(rows).toHaveLength(7200);
    expect(new Set(rows.map((r) => r[0])).size).toBe(7200);
    const date = header.indexOf('georeferencedDate');
    expect(new Set(rows.map((r) => r[date]))).toEqual(new Set([job.run_timestamp]));
  });
});
