/**
 * A stopped job resumes only against the gazetteer it started with. Which source a place found in
 * several is cited from follows the sources' ranks (docs/method.md §4a), so a rank changed while a job
 * was stopped would give its later rows answers its earlier rows did not get: the job must not resume,
 * and the same command starts a new job instead. Real SQLite files; the stop is the job's state put
 * back part way, as a kill leaves it (test/batch/crash.test.ts kills a real process).
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { jobProgress, jobsDatabasePath, startBatchJob } from '../../src/batch/index.ts';
import { openGazetteer } from '../../src/store/gazetteer-store.ts';
import { openJobs, updateJob } from '../../src/store/jobs.ts';
import { FIXTURES, fixtureGazetteer } from './helpers.ts';

describe('resuming a job after the gazetteer changed', () => {
  it('refuses a job whose source was ranked anew meanwhile, and the same command starts a new job', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const options = { dbPath, input: join(FIXTURES, 'malformed.csv'), output: join(dir, 'out.csv') };
    const { jobId, done } = await startBatchJob(options);
    await done;
    const jobs = openJobs(jobsDatabasePath(dbPath));
    updateJob(jobs, jobId, { state: 'georeferencing', finishedAt: null });
    jobs.close();

    const store = openGazetteer(dbPath);
    const [source] = store.sources();
    expect(store.setPriority(source.id, 1)).toBe(true);
    store.close();

    await expect(startBatchJob({ dbPath, resume: jobId })).rejects.toThrow(/sources have changed since the job started/);
    const rerun = await startBatchJob(options);
    expect(rerun.jobId).not.toBe(jobId);
    expect((await rerun.done).resumed).toBe(false);
  });
});

describe('the gazetteer changed while a job runs', () => {
  it('fails the job, saying so, rather than write rows of two gazetteers under the sources it started with', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    // 200 distinct localities: four chunks, answered one after another in this process.
    const rows = Array.from({ length: 200 }, (_, i) => `occ-${i + 1},${(i + 1) / 10} km N of Caleta Brava,QV`);
    const input = Buffer.from(['occurrenceID,locality,countryCode', ...rows].join('\n'));
    let ranked = false;
    const { jobId, done } = await startBatchJob({
      dbPath, input, output: join(dir, 'running.csv'),
      // After the first chunk is stored, another connection ranks the source anew.
      onProgress: (event) => {
        if (event.phase !== 'georeferencing' || ranked) return;
        const store = openGazetteer(dbPath);
        store.setPriority(store.sources()[0].id, 1);
        store.close();
        ranked = true;
      },
    });
    await expect(done).rejects.toThrow(/gazetteer changed while the job ran/);
    expect(ranked).toBe(true);
    const jobs = openJobs(jobsDatabasePath(dbPath));
    expect(jobProgress(jobs, jobId)).toMatchObject({ state: 'failed', error: expect.stringMatching(/gazetteer changed while the job ran/) });
    jobs.close();
  });
});
