/**
 * A stopped batch resumed with --out on another file system than its partial file: the rename fails
 * (EXDEV, rename(2)), so the rows written so far are copied there and the original removed, and the job
 * finishes with the bytes of an unbroken run. A copy that fails part way (here a file-size limit,
 * setrlimit(2) RLIMIT_FSIZE, making write(2) fail with EFBIG once the copy passes it) leaves no file at the
 * target and the partial file as it was, so a later resume still finishes the job. The second file system
 * is /dev/shm (tmpfs) against the temporary folder; the test is skipped, saying so, where they are one.
 * Common practice, no source: a move between file systems is a copy, then a removal.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jobsDatabasePath } from '../../src/store/side-files.ts';
import { fixtureGazetteer, killWhen, progress, writeManyRowCsv } from './helpers.ts';

const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;
const SLOW = { ...process.env, WHEREABOUTS_TEST_DELAY_MS: '300' };
const RUN_TIMESTAMP = '2026-05-01T09:30:00Z';

/** A folder on another file system than the temporary folder, or undefined (and why) when there is none. */
function otherFileSystem(): string | undefined {
  const candidate = '/dev/shm';
  const reason = !existsSync(candidate) ? `${candidate} does not exist`
    : statSync(candidate).dev === statSync(tmpdir()).dev ? `${candidate} is on the same file system as ${tmpdir()}` : undefined;
  if (reason) console.warn(`test/batch/move-across-file-systems.test.ts skipped: ${reason}, so no rename between them fails with EXDEV`);
  return reason ? undefined : candidate;
}

const other = otherFileSystem();
let dir: string;
let elsewhere: string;
let dbPath: string;
let jobsPath: string;
let input: string;
let reference: Buffer;

beforeAll(async () => {
  if (!other) return;
  ({ dir, dbPath } = await fixtureGazetteer());
  elsewhere = mkdtempSync(join(other, 'whereabouts-move-'));
  jobsPath = jobsDatabasePath(dbPath);
  input = join(dir, 'input.csv');
  writeManyRowCsv(input);
  const out = join(dir, 'reference.csv');
  const run = cli(['batch', input, '--out', out, '--run-timestamp', RUN_TIMESTAMP, '--quiet']);
  expect(run.status, run.stderr).toBe(0);
  reference = readFileSync(out);
}, 60_000);

afterAll(() => {
  if (elsewhere) rmSync(elsewhere, { recursive: true, force: true });
});

/** Run the CLI with `args`; with `fileSizeKb`, under that file-size limit (bash's ulimit -f, in 1024-byte blocks). */
function cli(args: string[], fileSizeKb?: number) {
  const command = [BIN, '--db', dbPath, ...args];
  return fileSizeKb === undefined
    ? spawnSync(process.execPath, command, { encoding: 'utf8' })
    : spawnSync('bash', ['-c', 'ulimit -f "$1" && shift && exec "$@"', 'bash', String(fileSizeKb), process.execPath, ...command], { encoding: 'utf8' });
}

/** Start a batch to `out`, kill it once 3,000 of its 4,000 rows are written, and give the job's id. */
async function stopped(out: string): Promise<string> {
  await killWhen(['--db', dbPath, 'batch', input, '--out', out, '--run-timestamp', RUN_TIMESTAMP, '--quiet'], SLOW, jobsPath, (p) => p.rows_done >= 3000 && p.rows_done < (p.rows_total ?? 0));
  return progress(jobsPath)!.id;
}

describe.skipIf(!other)('a stopped batch resumed into a file on another file system', { timeout: 180_000 }, () => {
  it('a copy that fails part way leaves nothing there and the partial file whole; the next resume copies it, removes the original and finishes', async () => {
    const jobId = await stopped(join(dir, 'started.csv'));
    const partial = join(dir, `started.csv.${jobId}.partial`);
    const written = readFileSync(partial);
    expect(written.length).toBeGreaterThan(200_000);
    // The job database's writes (a checkpointed log) stay far below the limit; the copy of the partial file passes it.
    const jobs = new Database(jobsPath);
    jobs.pragma('wal_checkpoint(TRUNCATE)');
    jobs.close();
    const out = join(elsewhere, 'moved.csv');
    const limitKb = Math.floor(written.length / 2048);
    expect(statSync(jobsPath).size).toBeLessThan(limitKb * 1024);

    const failed = cli(['batch', '--resume', jobId, '--out', out, '--quiet'], limitKb);
    expect(failed.status).toBe(1);
    expect(failed.stderr).toContain('EFBIG');
    expect(readdirSync(elsewhere)).toEqual([]);
    expect(readFileSync(partial).equals(written)).toBe(true);

    const resumed = cli(['batch', '--resume', jobId, '--out', out]);
    expect(resumed.status, resumed.stderr).toBe(0);
    expect(resumed.stderr).toContain('job resumed');
    expect(existsSync(partial)).toBe(false);
    expect(readdirSync(elsewhere)).toEqual(['moved.csv']);
    expect(readFileSync(out).equals(reference)).toBe(true);
  });
});
