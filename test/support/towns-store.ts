/**
 * Invented towns (demo island style, CC0) of the island QV written as a CSV gazetteer and imported into a
 * SQLite file in a temporary folder, opened read-only for a test file and removed after it.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll } from 'vitest';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';

/** One town: id, name, latitude, longitude (WGS84), state (null for none) and county. */
export type TownRow = readonly [string, string, number, number, string | null, string?];

/**
 * The towns as the source "towns", every one of type town in QV, imported before the file's tests and
 * closed and removed after them; call the returned function inside a test for the opened store.
 * @example const store = useTownsStore('whereabouts-x-', [['t1', 'Alisos', -20, -50, 'Poniente']]); … locate(store(), request)
 */
export function useTownsStore(prefix: string, rows: readonly TownRow[]): () => GazetteerStore {
  const directory = mkdtempSync(join(tmpdir(), prefix));
  let store: GazetteerStore | undefined;
  beforeAll(async () => {
    const csv = join(directory, 'towns.csv');
    writeFileSync(csv, ['id,name,latitude,longitude,featureType,countryCode,stateProvince,county',
      ...rows.map(([id, name, lat, lon, state, county]) => `${id},${name},${lat},${lon},town,QV,${state ?? ''},${county ?? ''}`)].join('\n'));
    const db = join(directory, 'towns.sqlite');
    const writer = openGazetteer(db);
    await importGazetteer(writer, csv, { format: 'csv', citation: 'invented towns', sourceId: 'towns' });
    writer.close();
    store = openGazetteer(db, { readonly: true });
  });
  afterAll(() => {
    store?.close();
    rmSync(directory, { recursive: true, force: true });
  });
  return () => store!;
}
