/**
 * A batch output as GeoJSON (RFC 7946): one FeatureCollection, a Feature for every row in input order,
 * its point in WGS84 longitude, latitude order (§3.1.1, §4: no "crs" member), `geometry: null` for a row
 * without a point (§3.2), and every column of the CSV as a text property (the footprint stays in the
 * footprintWKT property).
 */
import { createWriteStream } from 'node:fs';
import { once } from 'node:events';
import type { Writable } from 'node:stream';
import type { Delimiter } from '../batch/records.ts';
import { readResultTable } from './result-table.ts';

/**
 * Write the GeoJSON of a batch output to a file or a stream; resolves with the number of features.
 * @example await writeGeoJSON('out.csv', ',', 'out.geojson') // 52
 */
export async function writeGeoJSON(csvPath: string, delimiter: Delimiter, target: string | Writable): Promise<number> {
  const { columns, rows } = await readResultTable(csvPath, delimiter);
  const out = typeof target === 'string' ? createWriteStream(target) : target;
  const write = async (text: string) => {
    if (!out.write(text)) await once(out, 'drain');
  };
  let count = 0;
  await write('{"type":"FeatureCollection","features":[');
  for await (const row of rows) {
    const properties = Object.fromEntries(columns.map((name, i) => [name, row.fields[i]]));
    const geometry = row.point ? { type: 'Point', coordinates: row.point } : null;
    await write(`${count === 0 ? '\n' : ',\n'}${JSON.stringify({ type: 'Feature', geometry, properties })}`);
    count++;
  }
  await write('\n]}\n');
  if (typeof target === 'string') {
    out.end();
    await once(out, 'finish');
  }
  return count;
}
