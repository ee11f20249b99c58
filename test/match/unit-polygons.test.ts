/**
 * The polygon filter for lines, on the demo gazetteer (invented, CC0; gazetteer/README.md) in a real SQLite
 * file: a road is the county's road when any part of it lies in the county, not only when its center does.
 * The outside check is the gazetteer's own county field of the town at the road's end (the roads' ends were
 * checked to lie on those towns in test/real/clean-labels.ts).
 */
import type { Polygon } from 'geojson';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CandidateMatcher } from '../../src/match/candidate-matcher.ts';
import type { Feature } from '../../src/match/types.ts';
import { memoryNameIndex } from '../support/memory-name-index.ts';
import { openDemoStore } from '../support/demo-store.ts';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';

let store: GazetteerStore;
beforeAll(async () => {
  store = await openDemoStore('whereabouts-unit-polygons-');
});
afterAll(() => store.close());

const lines = (name: string, county: string) =>
  store.findCandidates({ name, context: { countryCode: 'QV', county }, geometryTypes: ['LineString', 'MultiLineString'] }).map((c) => c.feature.featureId);

describe('a line is kept by a county it passes through', () => {
  it.each([
    // road, a county it reaches (the county field of the town at its end), its feature id
    ['Estrada do Sul', 'Cerrillos', 'qv-0169'], // ends at San Telmo (qv-0027, Cerrillos)
    ['Ruta 12', 'Alisos', 'qv-0166'], // ends at Puerto Lindo (Alisos)
    ['Route de la Côte', 'Haut-Levant', 'qv-0168'], // ends at Saint-Aubrac (Haut-Levant)
  ])('%s in county %s', (name, county, id) => {
    expect(lines(name, county)).toEqual([id]);
  });

  it('still drops a point feature whose center lies outside the county', () => {
    // El Molino (qv-0029) lies in Cerrillos, 28.2 km outside Alisos (test/locate/policy.test.ts).
    expect(store.findCandidates({ name: 'El Molino', context: { countryCode: 'QV', county: 'Alisos' } }).map((c) => c.feature.featureId)).not.toContain('qv-0029');
  });
});

/**
 * A unit inside a stated wider unit, over invented shapes (degrees) held in memory: the state's border traced
 * at 1.99° E below 0.6° N and at 2.05° E above it, the counties' files tracing it at 2° E. The county west of
 * it has its corrected center on its own eastern edge below 0.6° N, outside the state (as Shoshone County's
 * lies on Idaho's border, test/e2e/real-files.test.ts), with 99.4 % of its area inside; its namesake east of
 * it has its center on its western edge above 0.6° N, inside the state, with 2 % of its area inside. Shares
 * worked by hand from the rectangles (0.99 × 0.6 + 1 × 0.4; 0.05 × 0.4), against the rule's one half
 * (common practice, no source); the old rule, the center alone, kept the wrong one.
 */
describe('a polygon is kept by the stated unit holding most of its area, not by its center', () => {
  const polygon = (...ring: [number, number][]): Polygon => ({ type: 'Polygon', coordinates: [[...ring, ring[0]!]] });
  const unit = (featureId: string, name: string, featureType: string, geometry: Polygon, latitude: number, longitude: number): Feature => ({
    sourceId: 'shapes', featureId, name, alternateNames: [], featureType, countryCode: 'QV', stateProvince: null, county: null,
    latitude, longitude, radiusMeters: 80_000, radiusIsDefault: false, geometryType: 'Polygon', geometry,
  });
  const state = unit('s', 'Norte', 'stateProvince', polygon([0, 0], [1.99, 0], [1.99, 0.6], [2.05, 0.6], [2.05, 1], [0, 1]), 0.5, 1);
  const west = unit('c1', 'Alisos', 'county', polygon([1, 0], [2, 0], [2, 1], [1, 1]), 0.3, 2);
  const east = unit('c2', 'Alisos', 'county', polygon([2, 0], [3, 0], [3, 1], [2, 1]), 0.8, 2);
  const matcher = new CandidateMatcher(memoryNameIndex([state, west, east]));

  it('keeps the county whose area lies in the state, whatever its center, and drops its namesake across the border', () => {
    const found = matcher.lookup({ name: 'Alisos', context: { countryCode: 'QV', stateProvince: 'Norte' }, featureTypes: ['county'] });
    expect(found.candidates.map((c) => c.feature.featureId)).toEqual(['c1']);
    expect(found.dropped.map((d) => d.candidate.feature.featureId)).toEqual(['c2']);
  });
});
