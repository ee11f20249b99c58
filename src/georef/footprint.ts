/** Footprints: the uncertainty circle as a polygon, sectors, and shapes clipped to an administrative unit. */
import type { Geometry, MultiPolygon, Polygon, Position } from 'geojson';
import { bboxClip } from '@turf/bbox-clip';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { featureCollection, multiPolygon as turfMultiPolygon, polygon as turfPolygon } from '@turf/helpers';
import { intersect } from '@turf/intersect';
import { intersection as fastIntersection, type Geometry as ClipGeometry } from 'martinez-polygon-clipping';
import { direct, inverse } from '../geodesy/geodesic.ts';
import { normaliseLongitude } from '../geodesy/azimuthal-equidistant.ts';
import { polygonsToWKT } from '../geodesy/wkt.ts';
import { METHOD_DEFAULTS } from './method-defaults.ts';

/** 7 decimals of a degree are about 1 cm: smaller circles are written as their center. */
const MIN_DRAWABLE_METERS = 0.01;

/**
 * The geodesic circle as a closed, counter-clockwise ring of [lon, lat] positions, longitudes unwrapped
 * around the center (they may pass ±180). Vertices lie exactly (geographiclib, ~15 nm) at the radius.
 * A circle holding a pole is a cap: the ring runs around all longitudes from −180 to 180 and closes
 * along the pole; one holding both poles is the whole globe.
 */
export function circleRing(latitude: number, longitude: number, radiusMeters: number, segments: number = METHOD_DEFAULTS.footprintSegments): Position[] {
  if (!(radiusMeters > 0)) throw new Error(`circle radius must be positive, got ${radiusMeters}`);
  if (!Number.isInteger(segments) || segments < 8) throw new Error(`a circle needs a whole number of at least 8 segments, got ${segments}`);
  const holdsNorth = inverse(latitude, longitude, 90, 0).meters <= radiusMeters;
  const holdsSouth = inverse(latitude, longitude, -90, 0).meters <= radiusMeters;
  if (holdsNorth && holdsSouth) return [[-180, -90], [180, -90], [180, 90], [-180, 90], [-180, -90]];
  const boundary: Position[] = [];
  for (let i = 0; i < segments; i++) {
    const end = direct(latitude, longitude, (-360 * i) / segments, radiusMeters);
    boundary.push([longitude + normaliseLongitude(end.longitude - longitude), end.latitude]);
  }
  if (holdsNorth || holdsSouth) return poleCap(boundary, holdsNorth);
  return [...boundary, boundary[0]!];
}

/** A cap around a pole: boundary sorted by longitude, cut at ±180, closed along the pole, counter-clockwise. */
function poleCap(boundary: Position[], north: boolean): Position[] {
  const sorted = boundary.map(([lon, lat]) => [normaliseLongitude(lon!), lat!]).sort((a, b) => a[0]! - b[0]!);
  const [first, last] = [sorted[0]!, sorted[sorted.length - 1]!];
  const t = (180 - last[0]!) / (first[0]! + 360 - last[0]!);
  const edgeLatitude = last[1]! + t * (first[1]! - last[1]!);
  const pole = north ? 90 : -90;
  // Walking east with the pole on the left is counter-clockwise for the north cap; the south cap walks west.
  const eastward = [[-180, edgeLatitude], ...sorted, [180, edgeLatitude], [180, pole], [-180, pole]];
  const ring = north ? eastward : eastward.reverse();
  return [...ring, ring[0]!];
}

/**
 * The uncertainty circle as WKT in EPSG:4326: a POLYGON (lon lat, closed, counter-clockwise), or a
 * MULTIPOLYGON cut at the antimeridian; a circle holding a pole is a polar cap; radius 0 gives a POINT.
 * Accuracy: vertices exactly on the geodesic circle; straight edges between them cut inside it by at most
 * r·(1 − cos(π/segments)) (0.12 % of r with 64 segments). A radius under 1 cm, below what 7 decimals
 * can draw, gives a POINT.
 * @example circleWKT(-12.5, -60.25, 1000, 8) // 'POLYGON((-60.25 -12.4909563,…))'
 */
export function circleWKT(latitude: number, longitude: number, radiusMeters: number, segments: number = METHOD_DEFAULTS.footprintSegments): string {
  if (radiusMeters < MIN_DRAWABLE_METERS) return `POINT(${Number(normaliseLongitude(longitude).toFixed(7))} ${Number(latitude.toFixed(7))})`;
  return polygonsToWKT([[circleRing(latitude, longitude, radiusMeters, segments)]]);
}

/**
 * The sector of a heading as a closed counter-clockwise ring (longitudes unwrapped around the apex): from
 * the apex out to `radiusMeters` along azimuth θ + Δ, back along the arc to θ − Δ and in again. Radial
 * edges are geodesics sampled every 1/32 of the radius, the arc every degree or less.
 */
export function sectorRing(latitude: number, longitude: number, azimuth: number, halfWidth: number, radiusMeters: number): Position[] {
  const at = (bearing: number, meters: number): Position => {
    const end = direct(latitude, longitude, bearing, meters);
    return [longitude + normaliseLongitude(end.longitude - longitude), end.latitude];
  };
  const steps = 32;
  const arcSteps = Math.max(2, Math.ceil(2 * halfWidth));
  const out: Position[] = [[longitude, latitude]];
  for (let i = 1; i <= steps; i++) out.push(at(azimuth + halfWidth, (radiusMeters * i) / steps));
  for (let i = 1; i < arcSteps; i++) out.push(at(azimuth + halfWidth - (2 * halfWidth * i) / arcSteps, radiusMeters));
  for (let i = steps; i >= 1; i--) out.push(at(azimuth - halfWidth, (radiusMeters * i) / steps));
  return [...out, out[0]!];
}

export interface ClippedShape {
  /** The clipped shape as WKT (EPSG:4326). */
  footprintWKT: string;
  /** The clipped shape as GeoJSON, longitudes unwrapped around the shape. */
  geometry: Polygon | MultiPolygon;
  /**
   * Set when the clipping library failed on these shapes: the shape is then returned unclipped (larger
   * than it should be, never smaller), and this says why, for the remarks.
   */
  unclippedBecause?: string;
}

/**
 * A ring (its longitudes unwrapped around its own center: they may pass ±180) intersected with a unit's polygon (its
 * corrected center and radial, when wanted, are featureExtent(geometry)); undefined when they do not
 * overlap or the unit has no polygon. The intersection is planar in lon/lat (intersectPolygons), with
 * edges straight in lon/lat: for rings with edges of a few km this is within meters of the geodesic shapes.
 * Never throws on geometry: should both clipping libraries fail, the ring comes back unclipped with
 * `unclippedBecause` set.
 */
export function clipRingToUnit(ring: Position[], unitGeometry: Geometry): ClippedShape | undefined {
  if (unitGeometry.type !== 'Polygon' && unitGeometry.type !== 'MultiPolygon') return undefined;
  const box = boxOf(ring);
  const unit = unitNear(unitGeometry, box);
  if (!unit) return undefined;
  const unitRings = unit.flat();
  // Written only when the ring comes back whole: most clips cut it.
  const whole = (): ClippedShape => ({ footprintWKT: polygonsToWKT([[ring]]), geometry: { type: 'Polygon', coordinates: [ring] } });
  if (!boundariesMeet(ring, box, unitRings)) {
    // No edge crosses and no part of the unit lies inside the ring: the ring is wholly in or wholly out.
    return booleanPointInPolygon(ring[0]!, turfMultiPolygon(unit)) ? whole() : undefined;
  }
  try {
    // Only the part of the unit inside the ring's box can meet it: cutting the unit to that box first
    // keeps the polygon clipping small, whatever the size of the unit.
    const [west, south, east, north] = box;
    const margin = 1e-9 + (east - west + north - south) * 1e-6;
    const nearby = bboxClip(turfMultiPolygon(unit), [west - margin, south - margin, east + margin, north + margin]) as GeoJSON.Feature<Polygon | MultiPolygon>;
    // The box cut can leave rings too short to be rings (a corner grazed); they hold no area.
    const cut = (nearby.geometry.type === 'Polygon' ? [nearby.geometry.coordinates] : nearby.geometry.coordinates)
      .map((rings) => rings.filter((r) => r.length >= 4))
      .filter((rings) => rings.length > 0);
    if (cut.length === 0) return undefined;
    const polygons = intersectPolygons(ring, cut).map(orientRings);
    if (polygons.length === 0) return undefined;
    return {
      footprintWKT: polygonsToWKT(polygons),
      geometry: polygons.length === 1 ? { type: 'Polygon', coordinates: polygons[0]! } : { type: 'MultiPolygon', coordinates: polygons },
    };
  } catch (error) {
    return { ...whole(), unclippedBecause: `the polygon clipping failed (${error instanceof Error ? error.message : String(error)})` };
  }
}

/**
 * The unit's polygons, and their copies 360° east or west, that reach into the ring's box (the ring's
 * longitudes are unwrapped around its center, so near the antimeridian they pass ±180). Each ring is first
 * made continuous (no edge jumps more than 180° of longitude), so that an island written across ±180 keeps
 * its shape; a ring that encircles a pole (Antarctica), which cannot be made continuous, is kept as written.
 */
function unitNear(unitGeometry: Polygon | MultiPolygon, [west, south, east, north]: Box): Position[][][] | undefined {
  const polygons = unitGeometry.type === 'Polygon' ? [unitGeometry.coordinates] : unitGeometry.coordinates;
  const near: Position[][][] = [];
  for (const written of polygons) {
    if (!written[0] || written[0].length < 4) continue;
    const polygon = written.map((ring) => continuousRing(ring, written[0]![0]![0]!));
    const [w, s, e, n] = boxOf(polygon[0]!);
    if (s > north || n < south) continue;
    for (const shift of [-360, 0, 360]) {
      if (w + shift > east || e + shift < west) continue;
      near.push(shift === 0 ? polygon : polygon.map((r) => r.map(([x, y]) => [x! + shift, y!])));
    }
  }
  return near.length > 0 ? near : undefined;
}

/** The ring with each longitude moved by a multiple of 360° next to the one before, starting near `start`; unchanged when it then fails to close. */
function continuousRing(ring: Position[], start: number): Position[] {
  let previous = start;
  const out = ring.map(([x, y]) => {
    previous += normaliseLongitude(x! - previous);
    return [previous, y!];
  });
  return Math.abs(out[0]![0]! - out[out.length - 1]![0]!) < 1e-9 ? out : ring;
}

/**
 * ring ∩ polygons, planar in lon/lat. The Martinez–Rueda sweep (martinez-polygon-clipping) is tried first,
 * being about 15 times faster here; on shapes it cannot handle it throws or returns too much, and then
 * polyclip-ts (the same sweep with robust predicates and exact arithmetic, which turf's intersect runs) does
 * the work. What martinez returns is accepted only when its area is no larger than either input's.
 */
function intersectPolygons(ring: Position[], polygons: Position[][][]): Position[][][] {
  try {
    const pieces = fastIntersection([ring] as ClipGeometry, polygons as ClipGeometry) ?? [];
    // One piece comes back as Polygon coordinates, several as MultiPolygon coordinates.
    const result = (pieces.length > 0 && typeof (pieces as Position[][])[0]![0]![0] === 'number' ? [pieces] : pieces) as Position[][][];
    const area = polygonsArea(result);
    if (area <= Math.abs(signedArea(ring)) / 2 * (1 + 1e-9) && area <= polygonsArea(polygons) * (1 + 1e-9)) return result;
  } catch {
    // Fall through to the robust library.
  }
  const pieces = intersect(featureCollection<Polygon | MultiPolygon>([turfPolygon([ring]), turfMultiPolygon(polygons)]));
  if (!pieces) return [];
  return pieces.geometry.type === 'Polygon' ? [pieces.geometry.coordinates] : pieces.geometry.coordinates;
}

/** Planar area in lon/lat of polygons, holes subtracted. */
function polygonsArea(polygons: Position[][][]): number {
  return polygons.reduce((total, rings) => total + rings.reduce((sum, r, i) => sum + (i === 0 ? 1 : -1) * Math.abs(signedArea(r)) / 2, 0), 0);
}

/** Exterior ring counter-clockwise, holes clockwise (RFC 7946 §3.1.6), whatever the clipper returned. */
function orientRings(polygon: Position[][]): Position[][] {
  return polygon.map((ring, i) => ((signedArea(ring) > 0) === (i === 0) ? ring : [...ring].reverse()));
}

/** Twice the signed planar area of a closed ring in lon/lat: positive when counter-clockwise. */
function signedArea(ring: Position[]): number {
  let sum = 0;
  for (let i = 0; i + 1 < ring.length; i++) sum += ring[i]![0]! * ring[i + 1]![1]! - ring[i + 1]![0]! * ring[i]![1]!;
  return sum;
}

/** [west, south, east, north] in the ring's own (unwrapped) longitudes. */
type Box = [number, number, number, number];

function boxOf(ring: Position[]): Box {
  const box: Box = [Infinity, Infinity, -Infinity, -Infinity];
  for (const [x, y] of ring) {
    box[0] = Math.min(box[0], x!);
    box[1] = Math.min(box[1], y!);
    box[2] = Math.max(box[2], x!);
    box[3] = Math.max(box[3], y!);
  }
  return box;
}

/**
 * Whether a ring and a unit's rings touch or cross, or a vertex of the unit lies inside the ring (a hole
 * or a small part of the unit held by the ring). Planar in longitude/latitude, as the clipping is; edges
 * outside the ring's bounding box are skipped, so a large unit costs one pass over its vertices.
 */
function boundariesMeet(ring: Position[], [west, south, east, north]: Box, unitRings: Position[][]): boolean {
  const inBox = (p: Position) => p[0]! >= west && p[0]! <= east && p[1]! >= south && p[1]! <= north;
  for (const unitRing of unitRings) {
    for (let i = 0; i + 1 < unitRing.length; i++) {
      const a = unitRing[i]!;
      const b = unitRing[i + 1]!;
      if (Math.max(a[0]!, b[0]!) < west || Math.min(a[0]!, b[0]!) > east || Math.max(a[1]!, b[1]!) < south || Math.min(a[1]!, b[1]!) > north) continue;
      if (inBox(a) && insideRing(a, ring)) return true;
      for (let j = 0; j + 1 < ring.length; j++) if (segmentsMeet(a, b, ring[j]!, ring[j + 1]!)) return true;
    }
  }
  return false;
}

function orientation(a: Position, b: Position, c: Position): number {
  return Math.sign((b[0]! - a[0]!) * (c[1]! - a[1]!) - (b[1]! - a[1]!) * (c[0]! - a[0]!));
}

/** Closed segments ab and cd share a point (collinear overlaps count). */
function segmentsMeet(a: Position, b: Position, c: Position, d: Position): boolean {
  const [o1, o2, o3, o4] = [orientation(a, b, c), orientation(a, b, d), orientation(c, d, a), orientation(c, d, b)];
  if (o1 !== o2 && o3 !== o4) return true;
  const onSegment = (p: Position, q: Position, r: Position) =>
    Math.min(p[0]!, q[0]!) <= r[0]! && r[0]! <= Math.max(p[0]!, q[0]!) && Math.min(p[1]!, q[1]!) <= r[1]! && r[1]! <= Math.max(p[1]!, q[1]!);
  return (o1 === 0 && onSegment(a, b, c)) || (o2 === 0 && onSegment(a, b, d)) || (o3 === 0 && onSegment(c, d, a)) || (o4 === 0 && onSegment(c, d, b));
}

/** Even-odd test of a point against one closed ring. */
function insideRing(p: Position, ring: Position[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i]!;
    const [xj, yj] = ring[j]!;
    if (yi! > p[1]! !== yj! > p[1]! && p[0]! < ((xj! - xi!) * (p[1]! - yi!)) / (yj! - yi!) + xi!) inside = !inside;
  }
  return inside;
}

/**
 * The uncertainty circle clipped to the administrative unit that bounds it, with the corrected center
 * and radial of the clipped shape (docs/method.md §4: clip first, then compute). Undefined when they do not meet.
 * @example clipCircleToUnit({ latitude: 0, longitude: 0, radiusMeters: 5000 }, halfPlanePolygon)
 */
export function clipCircleToUnit(
  circle: { latitude: number; longitude: number; radiusMeters: number },
  unitGeometry: Geometry,
  segments: number = METHOD_DEFAULTS.footprintSegments,
): ClippedShape | undefined {
  return clipRingToUnit(circleRing(circle.latitude, circle.longitude, circle.radiusMeters, segments), unitGeometry);
}
