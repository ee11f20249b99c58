/**
 * The doubt on a lone name found far from the town named as the record's county (src/locate/county-reach.ts),
 * over invented features held in a finder of a few lines: it applies where the gazetteer holds the county
 * only as its namesake town; with the county's polygon loaded the polygon has placed the feature, and the
 * polygon is no town to measure from. Distance: 0.6° of latitude at 45° S, 66.7 km on WGS84 (about 111.1 km
 * a degree there, from memory), printed to the kilometre.
 */
import { describe, expect, it } from 'vitest';
import { farFromCountySeat } from '../../src/locate/county-reach.ts';
import type { Candidate, CandidateFinder, Feature } from '../../src/match/types.ts';

const base = { sourceId: 'atlas', alternateNames: [] as string[], countryCode: 'QV', stateProvince: 'Poniente', radiusMeters: 2000, radiusIsDefault: true };
const town: Feature = { ...base, featureId: 't1', name: 'Alisos', featureType: 'town', county: null, latitude: -45, longitude: -131, geometryType: 'Point' };
const county: Feature = {
  ...base, featureId: 'c1', name: 'Alisos', featureType: 'county', county: null, latitude: -45, longitude: -131, radiusMeters: 90_000, radiusIsDefault: false,
  geometryType: 'Polygon', geometry: { type: 'Polygon', coordinates: [[[-132, -46], [-130, -46], [-130, -44], [-132, -44], [-132, -46]]] },
};
const hill: Feature = { ...base, featureId: 'h1', name: 'Cerro Azul', featureType: 'hill', county: null, latitude: -45.6, longitude: -131, geometryType: 'Point' };
/** A finder holding `features`, each matched by its exact name at score 1. */
const finderOf = (...features: Feature[]): CandidateFinder => ({
  findCandidates: ({ name }) => features.filter((f) => f.name === name).map((feature): Candidate => ({ feature, score: 1 } as Candidate)),
});
const context = { countryCode: 'QV', stateProvince: 'Poniente', county: 'Alisos' };

describe('a lone name far from the town of the record\'s county', () => {
  it('is doubted when the county is held only as its town', () => {
    expect(farFromCountySeat(finderOf(town), hill, context, 0.95, 50_000)).toMatch(/^"Cerro Azul" is found 67 km from Alisos, the town of the record's county "Alisos", farther than 50 km/);
  });

  it('is not doubted when the county\'s polygon is loaded, with or without its town: the polygon has placed it', () => {
    expect(farFromCountySeat(finderOf(town, county), hill, context, 0.95, 50_000)).toBeNull();
    expect(farFromCountySeat(finderOf(county), hill, context, 0.95, 50_000)).toBeNull();
  });
});
