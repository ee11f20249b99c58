/**
 * The record's administrative units as a soft wall: the reference place of "3 mi N of X" often lies
 * in the next county. When no candidate lies inside the stated unit, one that lies just outside its
 * polygon (METHOD_DEFAULTS.justOutsideMeters [CHOICE]) is accepted, and the remarks say so. Pure:
 * the gazetteer is reached only through the CandidateFinder it is given.
 */
import { pointToPolygonDistance } from '@turf/point-to-polygon-distance';
import type { Candidate, CandidateFinder, CandidateQuery, Feature } from '../match/types.ts';

export type JustOutside = { candidate: Candidate; remark: string } | { candidate: null; reason: string };

/**
 * A candidate the stated unit's wall dropped but that lies within `maxMeters` of the unit's polygon;
 * or, when there is none to accept, the reason naming what lies outside; or null when the context
 * dropped no candidate of that name. Distances by turf's geodesic point-to-polygon distance
 * (haversine on a sphere: within about 0.5 % of the ellipsoidal distance, ample for a threshold).
 * @example justOutside(store, { name: 'Millbrook', context: { countryCode: 'QV', county: 'Haut-Levant' } }, hautLevant, 0.95, 25000)
 *   // { candidate, remark: '"Millbrook" lies 3.1 km outside county "Haut-Levant" …' }
 */
export function justOutside(finder: CandidateFinder, query: CandidateQuery, unit: Feature | undefined, acceptScore: number, maxMeters: number): JustOutside | null {
  const lookup = finder.lookupCandidates?.(query);
  const seen = new Set<string>();
  // The same feature may be dropped once for each of its names that matched.
  const walled = (lookup?.dropped ?? []).filter((d) => {
    const key = `${d.candidate.feature.sourceId}\u0000${d.candidate.feature.featureId}`;
    return d.candidate.score >= acceptScore && !d.reason.startsWith('country') && !seen.has(key) && seen.add(key);
  });
  if (walled.length === 0) return null;
  const listed = walled.slice(0, 3).map((d) => `${d.candidate.feature.name} (${d.candidate.feature.sourceId}:${d.candidate.feature.featureId}; ${d.reason})`).join('; ');
  const polygon = unit?.geometry && (unit.geometry.type === 'Polygon' || unit.geometry.type === 'MultiPolygon') ? unit.geometry : undefined;
  if (!unit || !polygon) {
    return { candidate: null, reason: `"${query.name}" is loaded only outside the record's stated units: ${listed}; no polygon of the stated unit is loaded to tell how far outside, so none is taken` };
  }
  const near = walled
    .map((d) => ({ d, meters: pointToPolygonDistance([d.candidate.feature.longitude, d.candidate.feature.latitude], polygon, { units: 'meters', method: 'geodesic' }) }))
    .filter((x) => x.meters <= maxMeters);
  if (near.length !== 1) {
    const why = near.length === 0 ? `none lies within ${(maxMeters / 1000).toFixed(0)} km of it` : `${near.length} lie within ${(maxMeters / 1000).toFixed(0)} km of it`;
    return { candidate: null, reason: `"${query.name}" is loaded only outside ${unit.featureType ?? 'unit'} "${unit.name}": ${listed}; ${why} [CHOICE justOutsideMeters, src/georef/method-defaults.ts]` };
  }
  const { d, meters } = near[0]!;
  const where = meters <= 0 ? 'within the polygon of' : `${(meters / 1000).toFixed(1)} km outside`;
  return {
    candidate: d.candidate,
    remark: `"${query.name}" is not inside the record's ${unit.featureType ?? 'unit'} "${unit.name}" (${d.reason}) but lies ${where} it: accepted, within the ${(maxMeters / 1000).toFixed(0)} km allowed [CHOICE justOutsideMeters, src/georef/method-defaults.ts]`,
  };
}
