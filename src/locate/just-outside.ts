/**
 * The record's administrative units as a soft wall: the reference place of "3 mi N of X" often lies
 * in the next county. When no candidate lies inside the stated unit, one that lies just outside its
 * polygon (METHOD_DEFAULTS.justOutsideMeters [CHOICE]) is accepted, and the remarks say so; with no
 * polygon of the unit loaded, the distance is estimated from the unit's own loaded places
 * (METHOD_DEFAULTS.unitEdgeByPlaces [CHOICE]). Pure: the
 * gazetteer is reached only through the CandidateFinder it is given.
 */
import { pointToPolygonDistance } from '@turf/point-to-polygon-distance';
import type { Candidate, CandidateFinder, CandidateQuery, DroppedCandidate, Feature } from '../match/types.ts';
import { administrativeKey, shortFormKey } from '../match/context.ts';
import type { MethodOptions } from '../georef/types.ts';
import { METHOD_DEFAULTS } from '../georef/method-defaults.ts';

export type JustOutside = { candidate: Candidate; remark: string } | { candidate: null; reason: string };

/** How far outside a unit with no polygon a place lies, told from the unit's loaded places [CHOICE unitEdgeByPlaces]. */
type UnitEdge = NonNullable<MethodOptions['unitEdgeByPlaces']>;

/**
 * A candidate the stated unit's wall dropped but that lies within `maxMeters` of the unit's polygon
 * (or, with no polygon loaded, of the unit's loaded places: see byUnitPlaces; `textUnits` are the
 * units the text itself writes); or, when there is none to accept, the reason naming what lies
 * outside; or null when the context dropped no candidate of that name. Distances by turf's geodesic
 * point-to-polygon distance (haversine on a sphere: within about 0.5 % of the ellipsoidal distance,
 * ample for a threshold), and from places by geographiclib's geodesics.
 * @example justOutside(store, { name: 'Millbrook', context: { countryCode: 'QV', county: 'Haut-Levant' } }, hautLevant, 0.95, 25000)
 *   // { candidate, remark: '"Millbrook" lies 3.1 km outside county "Haut-Levant" …' }
 */
export function justOutside(finder: CandidateFinder, query: CandidateQuery, unit: Feature | undefined, acceptScore: number, maxMeters: number, textUnits: string[] = [], edge: UnitEdge = METHOD_DEFAULTS.unitEdgeByPlaces): JustOutside | null {
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
  if (!unit || !polygon) return byUnitPlaces(finder, query, walled, listed, maxMeters, textUnits, edge);
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

/** The level of the stated units a dropped candidate's reason names (contextMismatch's words), if one. */
function walledLevel(reason: string): 'stateProvince' | 'county' | undefined {
  return reason.startsWith('state/province') ? 'stateProvince' : reason.startsWith('county') ? 'county' : undefined;
}

/**
 * With no polygon of the stated unit loaded, the unit's own loaded places stand for its extent
 * [CHOICE unitEdgeByPlaces]: a walled candidate lies at most as far outside the unit as the nearest place
 * recorded in it (that place lies inside), so with 'nearest place' that distance, an upper bound, is held
 * to the same allowance as a polygon's distance; 'halfway' puts the line halfway to that place, the
 * expected place of a line known only to lie between them; 'off' takes none. Where the text itself names
 * the unit the candidate lies in ("Near X, federal district"), text and gazetteer agree on the place and
 * say the two units meet between it and that nearest place: the line is then put halfway whatever the
 * choice (but 'off'), and of several candidates just outside, the one in the unit the text names is taken.
 */
function byUnitPlaces(finder: CandidateFinder, query: CandidateQuery, walled: DroppedCandidate[], listed: string, maxMeters: number, textUnits: string[], edge: UnitEdge): JustOutside {
  const rule = '[CHOICE justOutsideMeters, unitEdgeByPlaces, src/georef/method-defaults.ts]';
  if (!finder.nearestPlace || edge === 'off') {
    return { candidate: null, reason: `"${query.name}" is loaded only outside the record's stated units: ${listed}; no polygon of the stated unit is loaded to tell how far outside, so none is taken${edge === 'off' ? ` ${rule}` : ''}` };
  }
  const c = query.context;
  const near = walled.flatMap((d) => {
    const level = walledLevel(d.reason);
    const own = level && d.candidate.feature[level];
    if (!level || !own) return [];
    const named = textUnits.some((u) => administrativeKey(u) === administrativeKey(own) || shortFormKey(u) === shortFormKey(own));
    const halfway = named || edge === 'halfway';
    const context = { countryCode: c.countryCode, country: c.country, stateProvince: c.stateProvince, county: level === 'county' ? c.county : undefined };
    const inside = finder.nearestPlace!({ latitude: d.candidate.feature.latitude, longitude: d.candidate.feature.longitude, context, meters: halfway ? 2 * maxMeters : maxMeters });
    if (!inside) return [];
    const unit = `${level === 'county' ? 'county' : 'state/province'} "${context[level]}"`;
    return [{ d, inside, unit, named: named ? own : undefined, halfway, outsideMeters: halfway ? inside.meters / 2 : inside.meters }];
  });
  const allowed = `${(maxMeters / 1000).toFixed(0)} km`;
  const textual = near.filter((n) => n.named);
  const chosen = near.length === 1 ? near : textual.length === 1 ? textual : near;
  if (chosen.length !== 1) {
    const why = near.length === 0 ? `none lies within ${allowed} of a loaded place of the stated unit` : `${near.length} lie within ${allowed} of a loaded place of the stated unit`;
    return { candidate: null, reason: `"${query.name}" is loaded only outside the record's stated units: ${listed}; ${why}, the unit's loaded places standing for its extent, as no polygon of it is loaded ${rule}` };
  }
  const { d, inside, unit, named, halfway, outsideMeters } = chosen[0]!;
  const km = (m: number) => `${(m / 1000).toFixed(1)} km`;
  const from = `${km(inside.meters)} from its nearest loaded place, ${inside.feature.name} (${inside.feature.sourceId}:${inside.feature.featureId})`;
  const where = halfway
    ? `${named ? `, in "${named}", which the text names` : ''}: ${from}, the line between the two units put halfway, about ${km(outsideMeters)} outside it`
    : `: ${from}, so at most that far outside it`;
  return {
    candidate: d.candidate,
    remark: `"${query.name}" is not inside the record's ${unit} (${d.reason}) but just outside it${where}, as no polygon of it is loaded: accepted, within the ${allowed} allowed ${rule}`,
  };
}
