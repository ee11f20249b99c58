/** The demo gazetteer imported into a fresh SQLite file in a temporary folder, opened read-only. */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';

export async function openDemoStore(prefix: string): Promise<GazetteerStore> {
  const db = join(mkdtempSync(join(tmpdir(), prefix)), 'demo.sqlite');
  const writer = openGazetteer(db);
  await importGazetteer(writer, new URL('../../gazetteer/demo.geojson', import.meta.url).pathname, { format: 'geojson', citation: 'demo (invented)' });
  writer.close();
  return openGazetteer(db, { readonly: true });
}
