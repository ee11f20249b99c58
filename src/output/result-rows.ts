/**
 * Rows of a finished batch output (the CSV `batch` writes) as GIS features: unique attribute names, each
 * row's proposed point and footprint, and a row as a GeoJSON Feature (RFC 7946). Pure.
 */
import type { Feature, MultiPolygon, Point, Polygon } from 'geojson';
import { footprintGeometry } from './footprint-geometry.ts';
import { GEOREFERENCE_TERMS, type GeoreferenceTerm } from '../record/darwin-core.ts';
import { GENERALISATION_TERMS } from '../record/generalised-record.ts';
import { termName } from '../record/term-names.ts';

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
 * A function reading rows of a batch output with this header. The appended terms are the last columns but
 * one (the flags are last), or but three when the batch generalised sensitive rows (dataGeneralizations and
 * informationWithheld before the flags), so the proposal is found by position even when the input had its
 * own decimalLatitude.
 * @example resultRowReader(header)(fields).point // [-131.3876, -45.2265]
 */
export function resultRowReader(header: readonly string[]): (fields: readonly string[]) => ResultRow {
  const columnCount = header.length;
  const { termsStart } = appendedColumns(header);
  const at = (term: GeoreferenceTerm) => termsStart + GEOREFERENCE_TERMS.indexOf(term);
  return (given) => {
    const fields = Array.from({ length: columnCount }, (_, i) => given[i] ?? '');
    const latitude = fields[at('decimalLatitude')]!;
    const longitude = fields[at('decimalLongitude')]!;
    const wkt = fields[at('footprintWKT')]!;
    return {
      fields,
      point: latitude !== '' && longitude !== '' ? [Number(longitude), Number(latitude)] : undefined,
      footprint: wkt ? footprintGeometry(wkt) : undefined,
    };
  };
}

/**
 * Where a batch output's appended columns start: the Darwin Core terms, then, when the batch generalised
 * sensitive rows, dataGeneralizations and informationWithheld, then the flags column (always last).
 * @example appendedColumns(header) // { termsStart: 12, generalised: false }
 */
export function appendedColumns(header: readonly string[]): { termsStart: number; generalised: boolean } {
  const generalised = termName(header.at(-2)?.replace(/^proposed_/, '') ?? '') === GENERALISATION_TERMS.at(-1);
  const termsStart = header.length - 1 - (generalised ? GENERALISATION_TERMS.length : 0) - GEOREFERENCE_TERMS.length;
  if (termsStart < 0) throw new Error('not a batch output: it has fewer columns than the appended terms');
  return { termsStart, generalised };
}

/**
 * A row as a GeoJSON Feature: its point, longitude first (§3.1.1), or `geometry: null` (§3.2), and every
 * column as a text property.
 * @example resultFeature(['locality', …], row) // { type: 'Feature', geometry: { type: 'Point', … }, properties: { locality: 'Puerto Lindo', … } }
 */
export function resultFeature(columns: readonly string[], row: ResultRow): Feature<Point | null> {
  const properties = Object.fromEntries(columns.map((name, i) => [name, row.fields[i]]));
  return { type: 'Feature', geometry: row.point ? { type: 'Point', coordinates: row.point } : null, properties };
}
