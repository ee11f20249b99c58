/**
 * Polygons written as WKT in EPSG:4326 (lon lat order), split at the antimeridian, and footprints
 * (as GeoJSON geometry, src/output/footprint-geometry.ts) summarised for a person.
 */
import type { MultiPolygon, Polygon, Position } from 'geojson';
import { largest, smallest } from './extremes.ts';
import { geometryAreaSquareMeters } from './geodesic.ts';

/**
 * WKT of polygons whose longitudes may run past ±180 (rings unwrapped around a center): each polygon is
 * cut into the longitude bands [−180, 180] + 360k and shifted back, so every written longitude lies in
 * [−180, 180] (RFC 7946 §3.1.9 advises the same cut for GeoJSON). Cuts interpolate linearly in lon/lat,
 * exact for the straight lon/lat edges WKT stands for. Coordinates to 7 decimals (about 1 cm).
 * One part gives POLYGON, several MULTIPOLYGON; rings are written as given (orientation is kept).
 * @example polygonsToWKT([[[[179, 0], [181, 0], [181, 1], [179, 0]]]]) // 'MULTIPOLYGON(((179 0,180 0,180 0.5,179 0)),((-180 0,…)))'
 */
export function polygonsToWKT(polygons: Position[][][]): string {
  const parts: Position[][][] = [];
  for (const rings of polygons) {
    const longitudes = rings.flat().map((p) => p[0]!);
    if (longitudes.every((lon) => lon >= -180 && lon <= 180)) {
      parts.push(rings);
      continue;
    }
    const lowBand = Math.round(smallest(longitudes) / 360);
    const highBand = Math.round(largest(longitudes) / 360);
    for (let band = lowBand; band <= highBand; band++) {
      const west = 360 * band - 180;
      const east = 360 * band + 180;
      const clipped = rings.map((ring) => clipRingToBand(ring, west, east).map(([lon, lat]) => [lon! - 360 * band, lat!]));
      // A hole can only survive where its outer ring does.
      if (clipped[0]!.length >= 4 && hasWidth(clipped[0]!)) parts.push(clipped.filter((ring) => ring.length >= 4));
    }
  }
  if (parts.length === 0) throw new Error('polygonsToWKT: no polygon with area to write');
  const ring = (r: Position[]) => `(${r.map(([lon, lat]) => `${format(lon!)} ${format(lat!)}`).join(',')})`;
  const polygon = (rings: Position[][]) => `(${rings.map(ring).join(',')})`;
  return parts.length === 1 ? `POLYGON${polygon(parts[0]!)}` : `MULTIPOLYGON(${parts.map(polygon).join(',')})`;
}

/** False for the zero-width slivers a cut along a ring's own vertex line leaves. */
function hasWidth(ring: Position[]): boolean {
  const longitudes = ring.map((p) => p[0]!);
  const latitudes = ring.map((p) => p[1]!);
  return largest(longitudes) > smallest(longitudes) && largest(latitudes) > smallest(latitudes);
}

function format(value: number): string {
  const rounded = Math.round(value * 1e7) / 1e7;
  return String(Object.is(rounded, -0) ? 0 : rounded);
}

/** Sutherland–Hodgman clip of a closed ring to west ≤ lon ≤ east; returns a closed ring or []. */
function clipRingToBand(ring: Position[], west: number, east: number): Position[] {
  const keep = (inside: (p: Position) => boolean, edge: number) => (points: Position[]) => {
    const out: Position[] = [];
    for (let i = 0; i < points.length; i++) {
      const current = points[i]!;
      const previous = points[(i + points.length - 1) % points.length]!;
      const crossing = (): Position => {
        const t = (edge - previous[0]!) / (current[0]! - previous[0]!);
        return [edge, previous[1]! + t * (current[1]! - previous[1]!)];
      };
      if (inside(current)) {
        if (!inside(previous)) out.push(crossing());
        out.push(current);
      } else if (inside(previous)) out.push(crossing());
    }
    return out;
  };
  const open = ring.slice(0, -1);
  const clipped = keep((p) => p[0]! <= east, east)(keep((p) => p[0]! >= west, west)(open)).filter(
    // A vertex on the cut comes out twice: keep one.
    (p, i, all) => { const q = all[(i + all.length - 1) % all.length]!; return p[0] !== q[0] || p[1] !== q[1]; },
  );
  return clipped.length >= 3 ? [...clipped, clipped[0]!] : [];
}

/** What a person needs to know of a footprint without reading its coordinates. */
export interface FootprintSummary {
  type: 'Polygon' | 'MultiPolygon';
  /** Polygons in it (1 for a Polygon; more where the antimeridian or a unit's shape cuts it). */
  parts: number;
  /** Distinct vertices of every ring (a ring's closing repeat is not counted). */
  vertices: number;
  /** Geodesic area on WGS84 (polygonAreaSquareMeters: about 0.1 m² per ring). */
  areaSquareMeters: number;
}

/**
 * Type, parts, vertices and area of a footprint geometry.
 * @example footprintSummary({ type: 'Polygon', coordinates: [[[0, 0], [1, 0], [1, 1], [0, 0]]] }) // { type: 'Polygon', parts: 1, vertices: 3, areaSquareMeters: ≈ 6.15e9 }
 */
export function footprintSummary(geometry: Polygon | MultiPolygon): FootprintSummary {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  const vertices = polygons.flat().reduce((n, ring) => n + Math.max(ring.length - 1, 0), 0);
  return { type: geometry.type, parts: polygons.length, vertices, areaSquareMeters: geometryAreaSquareMeters(geometry) };
}
