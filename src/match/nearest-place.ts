/**
 * The loaded place nearest a point that lies in the stated units by what it records: with no polygon
 * of a unit loaded, the unit's places stand for its extent (src/locate/just-outside.ts). Pure: rows
 * come from the NameIndex (a box of degrees), distances are geodesics on WGS84 (geographiclib).
 */
import { inverse } from '../geodesy/geodesic.ts';
import { contextMismatch, type ResolvedContext } from './context.ts';
import type { DegreeBox, NameIndex, NearbyPlace, NearestPlaceQuery } from './types.ts';

/** Meters in a degree of latitude, the least anywhere on WGS84 (at the equator): a box this wide never cuts short. */
const LEAST_METERS_PER_DEGREE_LATITUDE = 110_574;
/** Meters in a degree of longitude at the equator on WGS84 (its semi-major axis × π / 180). */
const METERS_PER_DEGREE_LONGITUDE_AT_EQUATOR = 111_319.49;
/** An administrative unit's own feature is the unit, not a place of it. */
const UNIT_TYPES = new Set(['country', 'stateProvince', 'county', 'municipality']);

/**
 * The nearest place within `query.meters` of the point that records every stated level of `context`
 * (resolved from `query.context`) and fits it; null when none, or when the index cannot search by position.
 * @example nearestPlace(index, { latitude: -15.8, longitude: -47.9, context: { countryCode: 'QV', stateProvince: 'Poniente' }, meters: 25000 }, resolved)
 *   // { feature: <a town of Poniente>, meters: 18250 }
 */
export function nearestPlace(index: NameIndex, query: NearestPlaceQuery, context: ResolvedContext): NearbyPlace | null {
  if (!index.featureIdsInBox) return null;
  const ids = boxesAround(query.latitude, query.longitude, query.meters).flatMap((box) => index.featureIdsInBox!(box));
  if (ids.length === 0) return null;
  const stated = query.context;
  let nearest: NearbyPlace | null = null;
  for (const feature of index.features(ids).values()) {
    if (feature.featureType !== null && UNIT_TYPES.has(feature.featureType)) continue;
    // A place that does not record a stated level cannot be told to lie in it.
    if ((stated.stateProvince && !feature.stateProvince) || (stated.county && !feature.county)) continue;
    if (contextMismatch(feature, context) !== null) continue;
    const meters = inverse(query.latitude, query.longitude, feature.latitude, feature.longitude).meters;
    if (meters <= query.meters && (!nearest || meters < nearest.meters)) nearest = { feature, meters };
  }
  return nearest;
}

/** The box (two, across 180°) holding every point within `meters` of the point; all longitudes near a pole. */
function boxesAround(latitude: number, longitude: number, meters: number): DegreeBox[] {
  const dLat = meters / LEAST_METERS_PER_DEGREE_LATITUDE;
  const south = Math.max(-90, latitude - dLat);
  const north = Math.min(90, latitude + dLat);
  const poleward = Math.max(Math.abs(south), Math.abs(north));
  if (poleward >= 89) return [{ south, west: -180, north, east: 180 }];
  const dLon = meters / (METERS_PER_DEGREE_LONGITUDE_AT_EQUATOR * Math.cos((poleward * Math.PI) / 180));
  if (dLon >= 180) return [{ south, west: -180, north, east: 180 }];
  const west = longitude - dLon;
  const east = longitude + dLon;
  if (west < -180) return [{ south, west: west + 360, north, east: 180 }, { south, west: -180, north, east }];
  if (east > 180) return [{ south, west, north, east: 180 }, { south, west: -180, north, east: east - 360 }];
  return [{ south, west, north, east }];
}
