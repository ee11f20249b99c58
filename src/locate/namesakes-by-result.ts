/**
 * Places that share a name, judged by where the answer lands [CHOICE namesakesJudgedBy,
 * src/georef/method-defaults.ts]: "10 km N of Santa Rosa" in a county that holds one Santa Rosa may still
 * be measured from the Santa Rosa across the line. The record's units say where the specimen was taken,
 * not where the reference town lies, so each namesake is georeferenced and kept when its footprint (point
 * and radius) reaches the stated unit. Pure: the gazetteer is reached only through the finder.
 */
import { pointToPolygonDistance } from '@turf/point-to-polygon-distance';
import type { Candidate, CandidateFinder, CandidateQuery, Feature } from '../match/types.ts';
import type { Interpretation } from '../parse/types.ts';
import { georeference } from '../georef/georeference.ts';
import type { MethodOptions } from '../georef/types.ts';

export type ByResult = { candidate: Candidate; remark: string } | { ambiguous: string } | null;

/**
 * How far from the unit a reference place may lie: the just-outside allowance plus the longest offset
 * the text states (its distance and δ), since the point, not the town, must be in the unit.
 * @example reachMeters(parseLocality('30 km N of X'), 25000) // 25000 + 30000 + 500
 */
export function reachMeters(interpretation: Interpretation, justOutsideMeters: number): number {
  const offsets = interpretation.offsets.map((o) => (o.distance ? o.distance.meters + o.distance.uncertaintyMeters : 0));
  return justOutsideMeters + Math.max(0, ...offsets);
}

/**
 * For a one-place offset text, the namesake whose footprint reaches the stated unit: `taken` (the
 * candidates the usual choice kept, exact or near; none when the units kept none) and every exact namesake the unit's wall dropped
 * within `reachMeters` of it. An exact name beats a near spelling unless its footprint misses the unit.
 * Null when the rule does not apply or decides nothing (every footprint misses: the usual choice stands).
 * Distances by turf's geodesic point-to-polygon distance (haversine: within about 0.5 %).
 * @example namesakeByResult(store, query, [inCounty], county, reading, undefined, {}, 55500)
 *   // { candidate: acrossTheLine, remark: '"Santa Rosa": Santa Rosa (demo:…) taken, the only one …' }
 */
export function namesakeByResult(
  finder: CandidateFinder,
  query: CandidateQuery,
  taken: Candidate[],
  unit: Feature | undefined,
  interpretation: Interpretation,
  pathLine: Feature | undefined,
  options: MethodOptions,
  reach: number,
): ByResult {
  const polygon = unit?.geometry && (unit.geometry.type === 'Polygon' || unit.geometry.type === 'MultiPolygon') ? unit.geometry : undefined;
  if (!unit || !polygon || interpretation.features.length !== 1 || !interpretation.offsets.some((o) => o.distance)) return null;
  const away = (latitude: number, longitude: number) => pointToPolygonDistance([longitude, latitude], polygon, { units: 'meters', method: 'geodesic' });
  const seen = new Set(taken.map(keyOf));
  const dropped = (finder.lookupCandidates?.(query).dropped ?? [])
    .map((d) => d.candidate)
    .filter((c) => c.score >= 1 && !seen.has(keyOf(c)) && seen.add(keyOf(c)) && away(c.feature.latitude, c.feature.longitude) <= reach);
  if (dropped.length === 0) return null;
  const exactTaken = taken.filter((c) => c.score >= 1);
  const pool = [...exactTaken, ...dropped];
  // A lone place outside the unit with nothing to weigh it against is the just-outside rule's (src/locate/just-outside.ts).
  if (pool.length < 2 && taken.length === 0) return null;
  const fits = pool.filter((c) => {
    const outcome = georeference({ interpretation, features: [c.feature], pathLine, options });
    return outcome.ok && away(outcome.georeference.latitude, outcome.georeference.longitude) <= outcome.georeference.uncertaintyMeters;
  });
  const where = `${unit.featureType ?? 'unit'} "${unit.name}"`;
  const rule = '[CHOICE namesakesJudgedBy, src/georef/method-defaults.ts]';
  if (fits.length === 1) {
    const c = fits[0]!;
    const over = exactTaken.length === 0 && taken.length > 0 ? `, preferred to the near spelling "${taken[0]!.matchedName}" inside it` : '';
    return { candidate: c, remark: `"${query.name}": ${describe(c)} taken, the only one of ${pool.length} place(s) of that exact name within ${(reach / 1000).toFixed(0)} km of the record's ${where} whose answer's circle reaches it${over} ${rule}` };
  }
  if (fits.length > 1) return { ambiguous: `"${query.name}": ${fits.length} places of that name give points whose circles reach the record's ${where}: ${fits.map(describe).join('; ')} ${rule}` };
  return null;
}

const keyOf = (c: Candidate) => `${c.feature.sourceId}\u0000${c.feature.featureId}`;
const describe = (c: Candidate) => `${c.feature.name} (${c.feature.sourceId}:${c.feature.featureId}${c.feature.county ? `, ${c.feature.county}` : ''})`;
