/**
 * The polygon filter for lines, on the demo gazetteer (invented, CC0; gazetteer/README.md) in a real SQLite
 * file: a road is the county's road when any part of it lies in the county, not only when its center does.
 * The outside check is the gazetteer's own county field of the town at the road's end (the roads' ends were
 * checked to lie on those towns in test/real/clean-labels.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
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
