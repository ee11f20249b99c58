/**
 * A finished batch output (the CSV `batch` writes) read back as a table for GIS formats: unique column
 * names, each row's text fields exactly as written, its proposed point and its footprint.
 */
import type { MultiPolygon, Polygon } from 'geojson';
import { readRecords, type Delimiter } from '../batch/records.ts';
import { inspectInput } from '../batch/input-format.ts';
import { GEOREFERENCE_TERMS } from '../record/darwin-core.ts';
import { footprintGeometry } from '../geodesy/wkt.ts';

export interface ResultRow {
  /** The row's fields, one for each column, as the CSV holds them. */
  fields: string[];
  /** The proposed point, [longitude, latitude] in WGS84 (EPSG:4326), when the row has one. */
  point?: [number, number];
  /** The proposed footprint (footprintWKT), when the row has one. */
  footprint?: Polygon | MultiPolygon;
}

/** Names a GIS table reserves for its own columns [CHOICE]: the feature id and the geometry. */
export const RESERVED_COLUMNS = ['fid', 'geom'] as const;

/**
 * Column names made unique without regard to case (SQLite's rule, and a GIS attribute table's), an empty
 * one named by its position, and the reserved names avoided: a repeat gets `_2`, `_3`….
 * @example uniqueColumnNames(['id', 'ID', '', 'fid']) // ['id', 'ID_2', 'column_3', 'fid_2']
 */
export function uniqueColumnNames(header: readonly string[]): string[] {
  const taken = new Set<string>(RESERVED_COLUMNS);
  return header.map((raw, i) => {
    const base = raw.trim() === '' ? `column_${i + 1}` : raw;
    let name = base;
    for (let n = 2; taken.has(name.toLowerCase()); n++) name = `${base}_${n}`;
    taken.add(name.toLowerCase());
    return name;
  });
}

/**
 * The columns and rows of a batch output. The appended terms are the last columns but one (the flags
 * are last), so the proposal is found by position even when the input had its own decimalLatitude.
 * @example const { columns, rows } = await readResultTable('out.csv', ','); for await (const row of rows) row.point // [-131, -45.5]
 */
export async function readResultTable(path: string, delimiter: Delimiter): Promise<{ columns: string[]; rows: AsyncGenerator<ResultRow> }> {
  const format = await inspectInput(path);
  const records = readRecords(path, format, delimiter)[Symbol.asyncIterator]();
  const first = await records.next();
  if (first.done) throw new Error(`the batch output ${path} is empty`);
  const columns = uniqueColumnNames(first.value.fields);
  const termsStart = columns.length - 1 - GEOREFERENCE_TERMS.length;
  if (termsStart < 0) throw new Error(`${path} is not a batch output: it has fewer columns than the appended terms`);
  const at = (term: (typeof GEOREFERENCE_TERMS)[number]) => termsStart + GEOREFERENCE_TERMS.indexOf(term);
  async function* rows(): AsyncGenerator<ResultRow> {
    for (let next = await records.next(); !next.done; next = await records.next()) {
      const fields = columns.map((_, i) => next.value.fields[i] ?? '');
      const latitude = fields[at('decimalLatitude')];
      const longitude = fields[at('decimalLongitude')];
      const wkt = fields[at('footprintWKT')];
      yield {
        fields,
        point: latitude !== '' && longitude !== '' ? [Number(longitude), Number(latitude)] : undefined,
        footprint: wkt ? footprintGeometry(wkt) : undefined,
      };
    }
  }
  return { columns, rows: rows() };
}
