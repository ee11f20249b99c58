/**
 * locate() over the real store: the demo gazetteer imported into a temporary SQLite file.
 * Expected behaviours come from the method's workflow (Chapman & Wieczorek 2020, BP2020 §Georeferencing
 * Workflow – Localities, step 5: ambiguous or missing features are not georeferenced silently).
 */
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { locate } from '../../src/locate/locate.ts';
import { openDemoStore } from '../support/demo-store.ts';

let store: GazetteerStore;

beforeAll(async () => {
  store = await openDemoStore('whereabouts-locate-');
});
afterAll(() => store.close());

describe('locate', () => {
  it('lists every candidate of a shared name and picks none', () => {
    const result = locate(store, { locality: 'San Telmo', countryCode: 'QV' });
    expect(result.status).toBe('ambiguous');
    expect(result.georeference).toBeUndefined();
    expect(result.reason).toMatch(/qv-0027/);
    expect(result.reason).toMatch(/qv-0062/);
  });

  it('resolves a shared name by the record\'s province', () => {
    const result = locate(store, { locality: 'San Telmo', countryCode: 'QV', stateProvince: 'Serra Alta' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference?.features[0]?.featureId).toBe('qv-0062');
  });

  it('covers every candidate with one circle only when asked', () => {
    const alone = ['Poniente', 'Serra Alta'].map((stateProvince) =>
      locate(store, { locality: '5 km N of San Telmo', countryCode: 'QV', stateProvince }).georeference!,
    );
    const covered = locate(store, { locality: '5 km N of San Telmo', countryCode: 'QV', options: { coverAmbiguous: true } });
    expect(covered.status).toBe('georeferenced');
    const g = covered.georeference!;
    // Every alternative circle lies inside the covering one (distances by Vincenty, geodesy 2.4.0).
    for (const a of alone) {
      const d = new LatLon(g.latitude, g.longitude).distanceTo(new LatLon(a.latitude, a.longitude));
      expect(d + a.uncertaintyMeters).toBeLessThanOrEqual(g.uncertaintyMeters + 0.01);
    }
  });

  it('names the missing feature', () => {
    const result = locate(store, { locality: '3 km S of Villa Quimera', countryCode: 'QV' });
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/Villa Quimera/);
  });

  it('says so in the remarks when a name was matched fuzzily (a bare name so matched is left for review: fuzzyLoneName)', () => {
    const result = locate(store, { locality: '2 km N of Kingsfery', countryCode: 'QV' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference?.remarks.join(' ')).toMatch(/Kingsferry/);
  });

  it('does not georeference text that names no place, unless asked to use the county', () => {
    const refused = locate(store, { locality: 'sin localidad', countryCode: 'QV', county: 'Serrana' });
    expect(refused.status).toBe('unparseable');
    expect(refused.reason).toBeTruthy();
    const county = locate(store, { locality: 'sin localidad', countryCode: 'QV', county: 'Serrana', options: { administrativeFallback: true } });
    expect(county.status).toBe('georeferenced');
    expect(county.georeference?.remarks.join(' ')).toMatch(/Serrana/);
  });

  it('uses the record\'s verbatim coordinates when they can be read', () => {
    const result = locate(store, { locality: 'Vila Serena', verbatimCoordinates: '45°18\'S 131°00\'W', geodeticDatum: 'WGS84' });
    expect(result.interpretation.type).toBe('coordinates');
    expect(result.components?.datum).toBe(0);
  });
});
