/**
 * A small invented gazetteer written as CSV in `directory`, imported into a real SQLite file there and opened
 * read-only; the caller removes the directory.
 * @example const store = await openCsvStore(directory, ['id,name,latitude,longitude', 't1,Alisos,-20,-50'], 'towns');
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
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
