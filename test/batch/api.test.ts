/**
 * The programmatic batch API the HTTP service builds on: an upload given as bytes, its job's progress,
 * and a rerun that reproduces the output. Reproducibility as issue 5 states it: same input, sources and
 * settings give the same bytes but for the run timestamp (common practice, no source: compare bytes).
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { jobProgress, jobsDatabasePath, startBatchJob } from '../../src/batch/index.ts';
import { FIXTURES, fixtureGazetteer } from './helpers.ts';

describe('the batch API', () => {
  it('runs an upload given as bytes and reports its progress', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const output = join(dir, 'upload.out.csv');
    const { jobId, done } = await startBatchJob({ dbPath, input: readFileSync(join(FIXTURES, 'windows-1252.csv')), output });
    const summary = await done;
    expect(summary).toMatchObject({ jobId, rows: 5, distinctLocalities: 4, malformedRows: 0, outputPath: output, resumed: false });
    const progress = jobProgress(jobsDatabasePath(dbPath), jobId);
    expect(progress).toMatchObject({ state: 'done', rowsTotal: 5, rowsDone: 5, distinctTotal: 4, distinctDone: 4, outputPath: output });
    expect(progress.finishedAt).toBeDefined();
    expect(readdirSpools(dir)).toEqual([]); // the spooled upload is removed with the finished job
  });

  it('gives the same bytes on a rerun, the run timestamp aside', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const run = async (name: string) => {
      const output = join(dir, name);
      const summary = await (await startBatchJob({ dbPath, input: join(FIXTURES, 'malformed.csv'), output })).done;
      return readFileSync(output, 'utf8').replaceAll(summary.runTimestamp, '<run>');
    };
    expect(await run('first.csv')).toBe(await run('second.csv'));
  });

  it('refuses to resume a job that is done', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const { jobId, done } = await startBatchJob({ dbPath, input: join(FIXTURES, 'utf16le.tsv'), output: join(dir, 'o.tsv') });
    await done;
    await expect(startBatchJob({ dbPath, resume: jobId })).rejects.toThrow(/already done/);
    expect(existsSync(join(dir, 'o.tsv'))).toBe(true);
  });
});

function readdirSpools(dir: string): string[] {
  return readdirSync(dir).filter((f) => f.includes('spool'));
}
