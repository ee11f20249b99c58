/**
 * A lone name matched in the stated state, where the gazetteer records no county to check it against:
 * the record's county usually bears its seat's name, so a match far from that seat is likely another
 * place of the same name [CHOICE countyReachMeters]. Pure: the gazetteer is reached only through the
 * CandidateFinder it is given.
 */
import type { CandidateFinder, Feature } from '../match/types.ts';
import type { AdministrativeContext } from '../parse/types.ts';
import { inverse } from '../geodesy/geodesic.ts';
import { unitArea } from './administrative-unit.ts';

/**
 * Why the feature is doubtful, or null: the record states a county whose polygon is not loaded, the feature
 * records none, the one town named as the county (score ≥ `acceptScore`) lies in the stated state, and the feature is farther than
 * `meters` from it (geodesic on WGS84).
 * @example farFromCountySeat(store, alisosFarm, { countryCode: 'QV', stateProvince: 'Poniente', county: 'Alisos' }, 0.95, 50000) // null when within 50 km of Alisos
 */
export function farFromCountySeat(finder: CandidateFinder, feature: Feature, context: AdministrativeContext, acceptScore: number, meters: number): string | null {
  if (!meters || !context.county || !context.stateProvince || feature.county) return null;
  const named = finder.findCandidates({ name: context.county, context: { ...context, county: undefined } }).filter((c) => c.score >= acceptScore);
  // The county's own polygon, when loaded, has already decided that the feature lies in it (the unit-polygon
  // filter, src/match/unit-polygons.ts), and is no town to measure from.
  if (named.some((c) => unitArea(c.feature)?.featureType === 'county')) return null;
  if (named.length !== 1) return null;
  const seat = named[0]!.feature;
  const distance = inverse(seat.latitude, seat.longitude, feature.latitude, feature.longitude).meters;
  if (distance <= meters) return null;
  return `"${feature.name}" is found ${(distance / 1000).toFixed(0)} km from ${seat.name}, the town of the record's county "${context.county}", farther than ${(meters / 1000).toFixed(0)} km: likely another place of that name, left for a person to confirm [CHOICE countyReachMeters, src/georef/method-defaults.ts]`;
}
