/**
 * A large invented batch input for the split-batch tests: rows whose localities are offsets from the
 * places of the demo gazetteer (gazetteer/demo-places.csv, the invented island Isla Verdemar), drawn
 * with the project's seeded generator so the file is the same on every run. Some rows repeat a locality
 * with other spacing (the same key), some carry coordinates (for the coordinate check), a few are ragged.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { parse } from 'csv-parse/sync';
import { seededRandom } from '../../bench/seeded-random.ts';

const PLACES_CSV = new URL('../../gazetteer/demo-places.csv', import.meta.url).pathname;
export const DEMO_GAZETTEER = new URL('../../gazetteer/demo.geojson', import.meta.url).pathname;
const HEADINGS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'];

/**
 * Write `rows` rows drawing on `distinct` distinct localities to `path`.
 * @example writeGeneratedInput('/tmp/in.csv', 100_000, 3_000)
 */
export function writeGeneratedInput(path: string, rows: number, distinct: number): void {
  const places = (parse(readFileSync(PLACES_CSV, 'utf8'), { columns: true }) as { name: string }[]).map((p) => p.name);
  const random = seededRandom(1414);
  const localities = Array.from({ length: distinct }, (_, i) => {
    const place = places[i % places.length];
    const step = Math.floor(i / places.length);
    return step === 0 ? place : `${step} km ${HEADINGS[step % HEADINGS.length]} of ${place}`;
  });
  const lines = ['occurrenceID,locality,countryCode,decimalLatitude,decimalLongitude'];
  for (let i = 0; i < rows; i++) {
    const locality = localities[Math.floor(random() * distinct)];
    const spaced = random() < 0.1 ? ` ${locality.replace(/ /g, '  ')} ` : locality;
    const coordinates = random() < 0.2 ? `${(-45.5 + random() - 0.5).toFixed(4)},${(-131 + random() - 0.5).toFixed(4)}` : ',';
    lines.push(random() < 0.001 ? `gen-${i},"${spaced}"` : `gen-${i},"${spaced}",QV,${coordinates}`);
  }
  writeFileSync(path, `${lines.join('\n')}\n`);
}
