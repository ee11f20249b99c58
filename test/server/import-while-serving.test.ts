/**
 * A second process imports a gazetteer while the service runs on the same file: the service's next
 * answers are those of the new store, never a remembered one. The lookup of a place only the new source
 * holds was answered (and kept in the result cache, its words in the store's word cache, on the main
 * thread and in the worker threads) before the import; after it, the place is found and cited from the
 * new source. The map's layers list the new source's polygon too. A real server on 127.0.0.1, the
 * import by the real CLI in its own process.
 */
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BIN, demoDatabase, listen, post, type RunningServer, type TempDatabase } from './helpers.ts';

/** An invented farm on the demo island, with its outline (a square of about 1.1 km). */
const FARM = {
  type: 'Feature',
  properties: { id: 'x-1', name: 'Estancia Quillaytue', featureType: 'farm', countryCode: 'QV' },
  geometry: { type: 'Polygon', coordinates: [[[-130.5, -45.3], [-130.5, -45.29], [-130.49, -45.29], [-130.49, -45.3], [-130.5, -45.3]]] },
};

// With worker threads (the default) and without (every lookup, and its word cache, on the main thread).
describe.each([{ threads: undefined }, { threads: 0 }])('an import by another process while the service runs (threads: $threads)', ({ threads }) => {
  let db: TempDatabase;
  let server: RunningServer;
  beforeAll(async () => {
    db = await demoDatabase();
    server = await listen({ dbPath: db.dbPath, threads });
  });
  afterAll(async () => {
    await server?.close();
    db?.remove();
  });

  it('changes the next answers and the layers', async () => {
    const ask = async () => (await post(`${server.url}/api/v1/georeference`, { locality: 'Estancia Quillaytue', countryCode: 'QV' })).json;
    const layerIds = async () => ((await (await fetch(`${server.url}/api/v1/layers`)).json()) as { features: { id: string }[] }).features.map((f) => f.id);
    // Asked twice, so that the second answer is the cached one, on whichever thread.
    for (let i = 0; i < 2; i++) expect((await ask()).status).not.toBe('georeferenced');
    expect(await layerIds()).not.toContain('extra:x-1');

    const extra = join(db.dir, 'extra.geojson');
    writeFileSync(extra, JSON.stringify({ type: 'FeatureCollection', features: [FARM] }));
    const imported = spawnSync(process.execPath, [BIN, '--db', db.dbPath, 'import', extra, '--source-id', 'extra', '--source', 'test farms (invented)'], { encoding: 'utf8' });
    expect(imported.status, imported.stderr).toBe(0);

    for (let i = 0; i < 2; i++) {
      const answer = await ask();
      expect(answer.status).toBe('georeferenced');
      expect(answer.darwinCore.georeferenceSources).toContain('test farms (invented)');
    }
    expect(await layerIds()).toContain('extra:x-1');
  }, 60_000);
});
