/** Footprints: the uncertainty circle as a polygon, sectors, and shapes clipped to an administrative unit. */
import type { Geometry, MultiPolygon, Polygon, Position } from 'geojson';
import { featureCollection, intersect, multiPolygon as turfMultiPolygon, polygon as turfPolygon } from '@turf/turf';
import { direct, inverse } from '../geodesy/geodesic.ts';
import { normaliseLongitude } from '../geodesy/azimuthal-equidistant.ts';
import { unwrapGeometry } from '../geodesy/unwrap.ts';
import { polygonsToWKT } from '../geodesy/wkt.ts';
import { featureExtent, type FeatureExtent } from './feature-extent.ts';
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

export interface ClippedShape extends FeatureExtent {
  /** The clipped shape as WKT (EPSG:4326). */
  footprintWKT: string;
  /** The clipped shape as GeoJSON, longitudes unwrapped around the shape. */
  geometry: Polygon | MultiPolygon;
}

/**
 * A ring (longitudes unwrapped around `referenceLongitude`) intersected with a unit's polygon, with the
 * corrected center and geographic radial of what remains (featureExtent); undefined when they do not
 * overlap or the unit has no polygon. The intersection is computed by turf in lon/lat (edges straight in
 * lon/lat; for rings with edges of a few km this is within meters of the geodesic shapes).
 */
export function clipRingToUnit(ring: Position[], referenceLongitude: number, unitGeometry: Geometry): ClippedShape | undefined {
  if (unitGeometry.type !== 'Polygon' && unitGeometry.type !== 'MultiPolygon') return undefined;
  const unit = unwrapGeometry(unitGeometry, referenceLongitude);
  const unitFeature = unit.type === 'Polygon' ? turfPolygon(unit.coordinates) : turfMultiPolygon(unit.coordinates);
  const clipped = intersect(featureCollection<Polygon | MultiPolygon>([turfPolygon([ring]), unitFeature]));
  if (!clipped) return undefined;
  const geometry = clipped.geometry;
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  return { ...featureExtent(geometry), footprintWKT: polygonsToWKT(polygons), geometry };
}

/**
 * The uncertainty circle clipped to the administrative unit that bounds it, with the corrected center
 * and radial of the clipped shape (method §4: clip first, then compute). Undefined when they do not meet.
 * @example clipCircleToUnit({ latitude: 0, longitude: 0, radiusMeters: 5000 }, halfPlanePolygon)
 */
export function clipCircleToUnit(
  circle: { latitude: number; longitude: number; radiusMeters: number },
  unitGeometry: Geometry,
  segments: number = METHOD_DEFAULTS.footprintSegments,
): ClippedShape | undefined {
  return clipRingToUnit(circleRing(circle.latitude, circle.longitude, circle.radiusMeters, segments), circle.longitude, unitGeometry);
}
