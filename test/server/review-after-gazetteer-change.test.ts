/**
 * A reviewer's decision holds what was verified: a record accepted with a chosen candidate keeps that
 * candidate's terms in the reviewed file after the gazetteer changed (here the chosen candidate's source
 * removed by another connection, as another process would), where it was once georeferenced again on
 * download and the whole file refused. Real server on 127.0.0.1 over a real SQLite file; the demo
 * gazetteer (invented island) loaded under two ids, so the record's place has a candidate in each.
 */
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { demoDatabase, withDemoCopy, listen, type RunningServer, type TempDatabase } from './helpers.ts';

let db: TempDatabase;
let other: GazetteerStore;
let server: RunningServer;
beforeAll(async () => {
  db = await demoDatabase();
  other = await withDemoCopy(db);
  server = await listen({ dbPath: db.dbPath, threads: 0 });
});
afterAll(async () => {
  await server?.close();
  other?.close();
  db?.remove();
});

describe('a reviewed file after the gazetteer changed', () => {
  it('writes the terms the reviewer verified', async () => {
    const form = new FormData();
    form.append('file', new Blob([Buffer.from('occurrenceID,locality,countryCode\no1,Puerto Lindo,QV\n')]), 'records.csv');
    const { jobId } = (await (await fetch(`${server.url}/api/v1/batches`, { method: 'POST', body: form })).json()) as { jobId: string };
    for (let i = 0; i < 300; i++) {
      if (((await (await fetch(`${server.url}/api/v1/batches/${jobId}`)).json()) as { state: string }).state === 'done') break;
      await new Promise((r) => setTimeout(r, 100));
    }
    const candidate = { sourceId: 'demo', featureId: 'qv-0013' };
    const decided = await fetch(`${server.url}/api/v1/batches/${jobId}/records/1/review`, {
      method: 'PUT', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ decision: 'accepted', reviewer: 'A. Reviewer', candidate }),
    });
    expect(decided.status).toBe(200);
    const download = async () => {
      const response = await fetch(`${server.url}/api/v1/batches/${jobId}/reviewed.csv`);
      return { status: response.status, rows: response.status === 200 ? (parse(await response.text(), { columns: true }) as Record<string, string>[]) : [] };
    };
    const before = await download();
    expect(before.status).toBe(200);
    expect(before.rows[0].georeferenceVerificationStatus).toBe('verified by data custodian');

    expect(other.removeSource('demo')).toBe(true);
    const after = await download();
    expect(after.status).toBe(200);
    expect(after.rows).toEqual(before.rows);
  }, 60_000);
});
