/**
 * The same-place rule and merge on plain candidates (docs/method.md §4a [CHOICE], common practice, no
 * source): inputs and expected outputs side by side. Distances are checked against Vincenty's inverse
 * (Vincenty 1975, Survey Review 23:88) from the registry package geodesy 2.4.0 (C. Veness, MIT).
 */
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { describe, expect, it } from 'vitest';
import { mergeSamePlaces, samePlaceDistance } from '../../src/match/same-place.ts';
import type { Candidate, Feature } from '../../src/match/types.ts';

const feature = (sourceId: string, featureId: string, name: string, latitude: number, longitude: number, featureType: string | null, radiusMeters = 2000): Feature => ({
  sourceId, featureId, name, alternateNames: [], featureType, countryCode: 'QV', stateProvince: null, county: null,
  latitude, longitude, radiusMeters, radiusIsDefault: true, geometryType: 'Point',
});
const candidate = (f: Feature, score = 1): Candidate => ({ feature: f, score, matchedName: f.name, why: 'exact name' });
const rank = (order: string[]) => (source: string) => order.indexOf(source);

describe('samePlaceDistance: name aside, compatible type and centers within max(1 km, smaller radius)', () => {
  it.each([
    // a, b, same place?
    [feature('a', '1', 'Alisos', -45.3, -131.5, 'town', 5000), feature('b', '9', 'Alisos', -45.33, -131.5, 'village', 2000), false], // 3.3 km > 2 km
    [feature('a', '1', 'Alisos', -45.3, -131.5, 'town', 5000), feature('b', '9', 'Alisos', -45.315, -131.5, 'village', 2000), true], // 1.7 km ≤ 2 km
    [feature('a', '1', 'Alisos', -45.3, -131.5, 'hamlet', 300), feature('b', '9', 'Alisos', -45.3, -131.51, 'hamlet', 300), true], // 0.78 km ≤ 1 km
    [feature('a', '1', 'Alisos', -45.3, -131.5, 'town'), feature('b', '9', 'Alisos', -45.3, -131.5, 'river'), false], // incompatible types
    [feature('a', '1', 'Alisos', -45.3, -131.5, null), feature('b', '9', 'Alisos', -45.3, -131.5, 'river'), true], // one type unknown
    [feature('a', '1', 'Alisos', -45.3, -131.5, 'town'), feature('a', '9', 'Alisos', -45.3, -131.5, 'town'), false], // one source
  ])('%#', (a, b, same) => {
    const distance = samePlaceDistance(a, b);
    expect(distance !== null).toBe(same);
    if (distance !== null) expect(distance).toBeCloseTo(new LatLon(a.latitude, a.longitude).distanceTo(new LatLon(b.latitude, b.longitude)), 3);
  });
});

describe('mergeSamePlaces', () => {
  const atlas = feature('atlas', 'a1', 'Alisos', -45.3, -131.5, 'town');
  const survey = feature('survey', 's1', 'Alisos', -45.301, -131.5, 'town');
  const elsewhere = feature('survey', 's2', 'Alisos', -44.0, -130.0, 'town');

  it('cites the source ranked first, keeps the best score, lists the others and leaves other places alone', () => {
    const merged = mergeSamePlaces([candidate(survey, 1), candidate(elsewhere, 1), candidate(atlas, 0.97)], rank(['atlas', 'survey']), 10);
    expect(merged.map((c) => [c.feature.sourceId, c.feature.featureId, c.score, c.feature.alsoIn?.map((o) => o.featureId)])).toEqual([
      ['atlas', 'a1', 1, ['s1']],
      ['survey', 's2', 1, undefined],
    ]);
    expect(merged[0].why).toMatch(/^exact name; the same place in source survey \(feature s1, 111 m away\); cited from atlas, the source ranked first/);
  });

  it('ties in rank go to the better score, then the order given; at most `limit` places', () => {
    expect(mergeSamePlaces([candidate(survey, 0.9), candidate(atlas, 1)], () => 0, 10)[0].feature.sourceId).toBe('atlas');
    expect(mergeSamePlaces([candidate(survey), candidate(atlas)], () => 0, 10)[0].feature.sourceId).toBe('survey');
    expect(mergeSamePlaces([candidate(survey), candidate(elsewhere), candidate(atlas)], rank(['atlas', 'survey']), 1)
      .map((c) => c.feature.featureId)).toEqual(['a1']);
  });
});
