/**
 * A job the service started and a stop left unfinished, when the gazetteer changed before the next
 * start (a source ranked anew by another process): the job cannot be resumed with the answers it
 * started with, so the service says so on the job (failed, with the reason) and starts, rather than
 * resuming it with other answers or refusing to start at all. A real `whereabouts serve` process takes
 * the upload and is stopped with SIGTERM; the next start is buildServer on the same files.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jobProgress, jobsDatabasePath } from '../../src/batch/index.ts';
import { buildServer } from '../../src/server/app.ts';
import { openGazetteer } from '../../src/store/gazetteer-store.ts';
import { demoDatabase, uploadThenStop, type TempDatabase } from './helpers.ts';

let db: TempDatabase;
beforeAll(async () => {
  db = await demoDatabase();
});
afterAll(() => db?.remove());

describe('the next start after the gazetteer changed under a stopped job', () => {
  it('starts, and the job says it failed because the sources changed', async () => {
    const rows = Array.from({ length: 4000 }, (_, i) => `occ-${i + 1},${(i + 1) / 10} km NE of Puerto Lindo,QV`);
    const csv = Buffer.from(['occurrenceID,locality,countryCode', ...rows].join('\n'));
    const { jobId, uploadStatus } = await uploadThenStop(db.dbPath, csv, 'many.csv');
    expect(uploadStatus).toBe(202);
    expect(jobProgress(jobsDatabasePath(db.dbPath), jobId).state).not.toBe('done');

    const store = openGazetteer(db.dbPath);
    expect(store.setPriority(store.sources()[0].id, 1)).toBe(true);
    store.close();

    const second = await buildServer({ dbPath: db.dbPath, threads: 0 });
    try {
      const progress = (await second.inject({ url: `/api/v1/batches/${jobId}` })).json();
      expect(progress.state).toBe('failed');
      expect(progress.error).toMatch(/sources have changed since the job started/);
      expect(progress.error).not.toContain(db.dir);
    } finally {
      await second.close();
    }
  }, 60_000);
});
