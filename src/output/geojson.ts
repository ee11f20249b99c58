/**
 * A record's answer as GeoJSON (RFC 7946): a FeatureCollection whose first Feature is the proposed
 * point with the record's locality, its Darwin Core terms and (when the record had coordinates) the
 * coordinate flags as properties, and whose second, when there is one, is the footprint polygon.
 * The footprint is a Feature of its own rather than a GeometryCollection or a WKT property: RFC 7946
 * §3.1.8 discourages GeometryCollections, and a polygon Feature is what map programs draw.
 */
import type { Feature, FeatureCollection, Point } from 'geojson';
import type { RecordAnswer } from '../locate/georeference-record.ts';
import { footprintGeometry } from './footprint-geometry.ts';
import { COORDINATE_FLAGS_COLUMN, FLAG_SEPARATOR } from './csv.ts';

/**
 * The answer as a FeatureCollection; the point's geometry is null when the record was not
 * georeferenced (RFC 7946 §3.2). Coordinates are the reported (rounded) ones, longitude first (§3.1.1).
 * @example answerGeoJson(answer, '10 km NE of Puerto Lindo').features[0].geometry // { type: 'Point', coordinates: [-131.3, -45.16] }
 */
export function answerGeoJson(answer: RecordAnswer, locality: string): FeatureCollection {
  const { darwinCore, coordinateCheck, result } = answer;
  const georeferenced = darwinCore.decimalLatitude !== '' && darwinCore.decimalLongitude !== '';
  const point: Point | null = georeferenced ? { type: 'Point', coordinates: [Number(darwinCore.decimalLongitude), Number(darwinCore.decimalLatitude)] } : null;
  const properties: Record<string, string> = { locality, ...darwinCore };
  if (coordinateCheck) properties[COORDINATE_FLAGS_COLUMN] = coordinateCheck.flags.join(FLAG_SEPARATOR);
  const features: Feature[] = [{ type: 'Feature', geometry: point as Point, properties }];
  const footprint = result.georeference ? footprintGeometry(result.georeference.footprintWKT) : undefined;
  if (footprint) features.push({ type: 'Feature', geometry: footprint, properties: { role: 'footprint', footprintSRS: 'EPSG:4326' } });
  return { type: 'FeatureCollection', features };
}

/** The FeatureCollection as text, two-space indented. */
export function answerGeoJsonText(answer: RecordAnswer, locality: string): string {
  return JSON.stringify(answerGeoJson(answer, locality), null, 2);
}
