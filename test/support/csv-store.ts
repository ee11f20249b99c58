/**
 * A small invented gazetteer written as CSV in `directory`, imported into a real SQLite file there and opened
 * read-only; the caller removes the directory.
 * @example const store = await openCsvStore(directory, ['id,name,latitude,longitude', 't1,Alisos,-20,-50'], 'towns');
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll } from 'vitest';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';

export async function openCsvStore(directory: string, lines: string[], sourceId: string): Promise<GazetteerStore> {
  const csv = join(directory, `${sourceId}.csv`);
  writeFileSync(csv, lines.join('\n'));
  const db = join(directory, `${sourceId}.sqlite`);
  const writer = openGazetteer(db);
  await importGazetteer(writer, csv, { format: 'csv', citation: `invented ${sourceId}`, sourceId });
  writer.close();
  return openGazetteer(db, { readonly: true });
}

/** An invented town: id, name, latitude, longitude and its state, on the island QV. */
export type InventedTown = readonly [id: string, name: string, latitude: number, longitude: number, state: string];

/**
 * The towns in a store opened before a test file's tests and removed after them; the store is read through
 * the function returned, once the tests run.
 * @example const store = useTownStore('older-spelling', [['t1', 'Itacorá', -20, -50, 'Poniente']]); // in a test: locate(store(), …)
 */
export function useTownStore(name: string, towns: readonly InventedTown[]): () => GazetteerStore {
  const directory = mkdtempSync(join(tmpdir(), `whereabouts-${name}-`));
  let store: GazetteerStore | undefined;
  beforeAll(async () => {
    store = await openCsvStore(directory, ['id,name,latitude,longitude,featureType,countryCode,stateProvince',
      ...towns.map(([id, town, lat, lon, state]) => `${id},${town},${lat},${lon},town,QV,${state}`)], 'towns');
  });
  afterAll(() => {
    store?.close();
    rmSync(directory, { recursive: true, force: true });
  });
  return () => store!;
}
