/**
 * The service's worker threads give the answers the main thread gives: every demo locality through both
 * routes, byte for byte (but the georeferencedDate, the time of each request), from a service with 2
 * workers and one with none (`threads: 0`); a refused edit is the same 400; a gazetteer imported while
 * serving is seen by the workers; and `serve --threads 0` answers and stops cleanly on SIGTERM.
 * The reference is the main thread's own path, as served before the workers existed.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer } from '../../src/store/gazetteer-store.ts';
import { DEMO_LOCALITIES, demoDatabase, listen, post, spawnServe, type RunningServer, type TempDatabase } from './helpers.ts';

/** The demo localities as request bodies, with the fields a label gives. */
const bodies = (parse(readFileSync(DEMO_LOCALITIES), { columns: true }) as Record<string, string>[]).map((row) => {
  const body: Record<string, string> = { locality: row.locality };
  for (const field of ['countryCode', 'country', 'stateProvince', 'county', 'verbatimCoordinates', 'geodeticDatum']) if (row[field]) body[field] = row[field];
  return body;
});

/** The response text with the request's time taken out. */
const undated = (text: string) => text.replace(/\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z/g, '(the time of the request)');

async function postText(url: string, body: unknown): Promise<{ status: number; text: string }> {
  const response = await fetch(url, { method: 'POST', body: JSON.stringify(body), headers: { 'content-type': 'application/json' } });
  return { status: response.status, text: undated(await response.text()) };
}

let db: TempDatabase;
let inThread: RunningServer;
let pooled: RunningServer;
let pooledCached: RunningServer;

beforeAll(async () => {
  db = await demoDatabase();
  [inThread, pooled, pooledCached] = await Promise.all([
    listen({ dbPath: db.dbPath, threads: 0, resultCache: 0, rateLimit: false }),
    listen({ dbPath: db.dbPath, threads: 2, resultCache: 0, rateLimit: false }),
    listen({ dbPath: db.dbPath, threads: 1, rateLimit: false }),
  ]);
}, 120_000);
afterAll(async () => {
  await Promise.all([inThread, pooled, pooledCached].map((server) => server?.close()));
  db?.remove();
});

describe('worker threads answer as the main thread does', () => {
  it('gives the same body for every demo locality, one at a time and all at once', async () => {
    expect(bodies.length).toBeGreaterThan(50);
    const expected = await Promise.all(bodies.map((body) => postText(`${inThread.url}/api/v1/georeference`, body)));
    expect(expected.every((answer) => answer.status === 200)).toBe(true);
    expect(await Promise.all(bodies.map((body) => postText(`${pooled.url}/api/v1/georeference`, body)))).toEqual(expected);
    // Twice through the cache: computed in a worker, then reused in the main thread.
    for (let pass = 0; pass < 2; pass++) expect(await Promise.all(bodies.map((body) => postText(`${pooledCached.url}/api/v1/georeference`, body)))).toEqual(expected);
  });

  it('gives the same NDJSON lines for the demo localities sent as one request', async () => {
    const records = bodies.map((body, index) => ({ ...body, occurrenceID: `r${index}` }));
    const expected = await postText(`${inThread.url}/api/v1/georeference/records`, records);
    expect(expected.status).toBe(200);
    expect(expected.text.trim().split('\n')).toHaveLength(records.length);
    expect(await postText(`${pooled.url}/api/v1/georeference/records`, records)).toEqual(expected);
  });

  it('gives the same file downloads', async () => {
    for (const extension of ['csv', 'geojson']) {
      const expected = await postText(`${inThread.url}/api/v1/georeference.${extension}`, bodies[0]);
      expect(expected.status).toBe(200);
      expect(await postText(`${pooled.url}/api/v1/georeference.${extension}`, bodies[0])).toEqual(expected);
    }
  });

  it('refuses an edit that does not fit the record with the same 400', async () => {
    const body = { locality: '5 km N of Puerto Lindo', countryCode: 'QV', options: { candidate: { sourceId: 'nowhere', featureId: 'x' } } };
    const expected = await postText(`${inThread.url}/api/v1/georeference`, body);
    expect(expected.status).toBe(400);
    expect(await postText(`${pooled.url}/api/v1/georeference`, body)).toEqual(expected);
  });

  it('sees a gazetteer imported while serving', async () => {
    const body = { locality: 'Cerro Pooltest', countryCode: 'QV' };
    expect((await post(`${pooled.url}/api/v1/georeference`, body)).json.status).toBe('not-found');
    const extra = join(db.dir, 'added.geojson');
    writeFileSync(extra, JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: { id: 'p1', name: 'Cerro Pooltest', featureType: 'mountain', countryCode: 'QV' }, geometry: { type: 'Point', coordinates: [-130.9, -45.5] } }] }));
    const store = openGazetteer(db.dbPath);
    try {
      await importGazetteer(store, extra, { format: 'geojson', citation: 'added while serving', sourceId: 'added' });
    } finally {
      store.close();
    }
    const expected = await postText(`${inThread.url}/api/v1/georeference`, body);
    expect(JSON.parse(expected.text).status).toBe('georeferenced');
    expect(await postText(`${pooled.url}/api/v1/georeference`, body)).toEqual(expected);
  });
});

describe('serve --threads 0', () => {
  it('computes in the main thread, answers as with workers, and stops on SIGTERM with exit 0', async () => {
    const { url, child } = await spawnServe(['--port', '0', '--db', db.dbPath, '--threads', '0', '--rate-limit', '0']);
    const exited = new Promise((resolve) => child.on('exit', resolve));
    try {
      expect(await postText(`${url}/api/v1/georeference`, bodies[1])).toEqual(await postText(`${pooled.url}/api/v1/georeference`, bodies[1]));
    } finally {
      child.kill('SIGTERM');
    }
    expect(await exited).toBe(0);
  }, 60_000);
});
