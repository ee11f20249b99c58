/** Longitudes brought next to a reference, so that planar lon/lat operations work across the antimeridian. */
import type { Geometry, Position } from 'geojson';
import { normaliseLongitude } from './azimuthal-equidistant.ts';

/**
 * The same geometry with every longitude moved by a multiple of 360° into [ref − 180, ref + 180).
 * Exact (adds multiples of 360). Geometries spanning more than 180° from the reference are not meant.
 * @example unwrapGeometry({ type: 'Point', coordinates: [-179, 0] }, 179) // { type: 'Point', coordinates: [181, 0] }
 */
export function unwrapGeometry<G extends Geometry>(geometry: G, referenceLongitude: number): G {
  const shift = (p: Position): Position => [referenceLongitude + normaliseLongitude(p[0]! - referenceLongitude), ...p.slice(1)];
  const g = geometry as Geometry;
  switch (g.type) {
    case 'Point':
      return { ...g, coordinates: shift(g.coordinates) } as G;
    case 'MultiPoint':
    case 'LineString':
      return { ...g, coordinates: g.coordinates.map(shift) } as G;
    case 'MultiLineString':
    case 'Polygon':
      return { ...g, coordinates: g.coordinates.map((line) => line.map(shift)) } as G;
    case 'MultiPolygon':
      return { ...g, coordinates: g.coordinates.map((rings) => rings.map((ring) => ring.map(shift))) } as G;
    case 'GeometryCollection':
      return { ...g, geometries: g.geometries.map((part) => unwrapGeometry(part, referenceLongitude)) } as G;
  }
}
