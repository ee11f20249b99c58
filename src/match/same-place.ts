/**
 * One place held by several gazetteer sources is one candidate: the rule that says two features of
 * different sources are the same place, and the merge that keeps the feature of the source the user
 * ranks first with the others listed beside it. Pure.
 */
import { inverse } from '../geodesy/geodesic.ts';
import { foldName } from './fold.ts';
import type { Candidate, Feature, SamePlaceElsewhere } from './types.ts';

/**
 * [CHOICE] docs/method.md §4a. Two features of different sources are the same place when (1) they
 * share a folded name (their names, or the names the query matched), (2) their feature types are
 * compatible (equal, one of them unknown, or of the same family below), and (3) their centers lie at
 * most `max(minimumMeters, smaller radius)` apart: each center inside the other's circle, or within
 * 1 km where both circles are smaller (a town moved by a re-survey or rounding of the coordinates).
 * Common practice, no source: gazetteers copy each other and round or re-survey points by up to a few
 * hundred meters; a feature further away than its own extent is another place of the same name.
 */
export const SAME_PLACE_RULE = {
  minimumMeters: 1000,
  /** Types that name the same kind of thing at different sizes or in different sources' words. */
  families: [
    ['city', 'town', 'village', 'hamlet', 'locality', 'populated place'],
    ['lake', 'reservoir', 'pond'],
    ['river', 'stream'],
    ['mountain', 'peak', 'hill', 'mountains'],
    ['bay', 'cove', 'gulf'],
    ['farm', 'estate'],
    ['island', 'islands'],
  ] as readonly (readonly string[])[],
  /** Cited in the remarks where two features were merged. */
  description: 'same folded name, compatible feature type, centers within the smaller radius or 1 km (docs/method.md §4a [CHOICE])',
} as const;

const FAMILY = new Map<string, number>(SAME_PLACE_RULE.families.flatMap((types, index) => types.map((type) => [type, index] as const)));

/**
 * True when the two feature types may name the same place (SAME_PLACE_RULE).
 * @example compatibleTypes('town', 'village') // true
 * @example compatibleTypes('town', 'river') // false
 */
export function compatibleTypes(a: string | null, b: string | null): boolean {
  if (a === null || b === null || a === b) return true;
  const family = FAMILY.get(a);
  return family !== undefined && family === FAMILY.get(b);
}

/**
 * The distance in meters between two features of different sources that are the same place by
 * SAME_PLACE_RULE (name given folded, as the lookup compared it), or null when they are not.
 * Distances are WGS84 geodesics (geodesic.ts, nanometer accuracy).
 * @example samePlaceDistance(townInA, sameTownMovedBy300mInB) // ≈ 300
 */
export function samePlaceDistance(a: Feature, b: Feature): number | null {
  if (a.sourceId === b.sourceId || !compatibleTypes(a.featureType, b.featureType)) return null;
  const limit = Math.max(SAME_PLACE_RULE.minimumMeters, Math.min(a.radiusMeters, b.radiusMeters));
  // A degree of latitude is at least 110.5 km on WGS84: most places of a common name are told apart here.
  if (Math.abs(a.latitude - b.latitude) * METERS_PER_DEGREE_LATITUDE_AT_LEAST > limit) return null;
  const meters = inverse(a.latitude, a.longitude, b.latitude, b.longitude).meters;
  return meters <= limit ? meters : null;
}

/** A bound below the length of a degree of latitude on WGS84 (110,574 m at the equator, the shortest). */
const METERS_PER_DEGREE_LATITUDE_AT_LEAST = 110_000;

/**
 * Candidates with every place held by several sources merged into one (SAME_PLACE_RULE): the feature
 * of the source ranked first by `rankOf` (lower first; ties by score, then the order given) stands
 * for the place, with the best score of the group, the others in `feature.alsoIn` and its `why`
 * naming them. Groups keep the order of their best-placed member; at most `limit` places are kept
 * (a later candidate still joins one of them), so the cost grows with the candidates times the limit.
 * @example mergeSamePlaces([fromB, fromA], (source) => (source === 'a' ? 0 : 1), 10)
 * // [fromA with feature.alsoIn = [{ sourceId: 'b', … }]]
 */
export function mergeSamePlaces(candidates: readonly Candidate[], rankOf: (sourceId: string) => number, limit: number): Candidate[] {
  if (new Set(candidates.map((c) => c.feature.sourceId)).size < 2) return candidates.slice(0, limit);
  // A place is the first candidate found of it; another source's feature joins when it is the same
  // place as that one, each source once.
  const groups: { first: Feature; keys: string[]; sources: Set<string>; members: Candidate[] }[] = [];
  const folded = new Map<string, string>();
  const fold = (name: string): string => folded.get(name) ?? folded.set(name, foldName(name)).get(name)!;
  for (const candidate of candidates) {
    const keys = [fold(candidate.feature.name), fold(candidate.matchedName)];
    const group = groups.find((place) => !place.sources.has(candidate.feature.sourceId)
      && place.keys.some((key) => keys.includes(key)) && samePlaceDistance(place.first, candidate.feature) !== null);
    if (group !== undefined) {
      group.sources.add(candidate.feature.sourceId);
      group.members.push(candidate);
    } else if (groups.length < limit) {
      groups.push({ first: candidate.feature, keys, sources: new Set([candidate.feature.sourceId]), members: [candidate] });
    }
  }
  return groups.map(({ members }) => {
    if (members.length === 1) return members[0];
    const ordered = members.map((member, order) => ({ member, order }))
      .sort((a, b) => rankOf(a.member.feature.sourceId) - rankOf(b.member.feature.sourceId)
        || b.member.score - a.member.score || a.order - b.order)
      .map(({ member }) => member);
    const [first, ...others] = ordered;
    const alsoIn: SamePlaceElsewhere[] = others.map(({ feature }) => ({
      ...feature, distanceMeters: inverse(first.feature.latitude, first.feature.longitude, feature.latitude, feature.longitude).meters,
    }));
    return {
      ...first,
      feature: { ...first.feature, alsoIn },
      score: Math.max(...members.map((member) => member.score)),
      why: `${first.why}; ${describeAlsoIn(first.feature.sourceId, alsoIn)}`,
    };
  });
}

/**
 * Words for the remarks: which source a merged place is cited from and where else it is held.
 * @example describeAlsoIn('atlas', [{ sourceId: 'survey', featureId: '7', distanceMeters: 312, … }])
 * // 'the same place in source survey (feature 7, 312 m away); cited from atlas, the source ranked first (same folded name, …)'
 */
export function describeAlsoIn(citedFrom: string, alsoIn: readonly SamePlaceElsewhere[]): string {
  const others = alsoIn.map((other) => `source ${other.sourceId} (feature ${other.featureId}, ${Math.round(other.distanceMeters)} m away)`);
  return `the same place in ${others.join(', ')}; cited from ${citedFrom}, the source ranked first (${SAME_PLACE_RULE.description})`;
}
