/**
 * A named place that may be a route between two places (src/locate/route.ts, [CHOICE routeReading] and
 * [CHOICE routeKilometrePost]): the whole found as one name stays one name; else both ends found make the route,
 * georeferenced by the between rule; one end alone is declined. A small invented gazetteer (demo island style,
 * CC0) imported from CSV into a real SQLite file. The between rule (midpoint of the two places, radius half their
 * distance plus the larger extent) is docs/method.md §3, our choice, no published source; the expected midpoint
 * and distance are by Vincenty on WGS84 (geodesy 2.4.0), independent of the code under test.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { openCsvStore } from '../support/csv-store.ts';
import { locate } from '../../src/locate/locate.ts';

// Invented towns of the island state Poniente, with their radii in meters; "Puerto a Dentro" and "Dentro a Vaubrun"
// are towns' names that hold a joiner.
const ROWS = [
  ['r1', 'Alisos', -20.0, -50.0, 2000],
  ['r2', 'Vila Serena', -20.2, -50.3, 3000],
  ['r3', 'Puerto a Dentro', -21.0, -51.0, 1500],
  ['r4', 'Puerto', -20.5, -50.5, 1000],
  ['r5', 'Dentro', -20.6, -50.9, 1000],
  ['r6', 'Vaubrun', -21.5, -50.0, 2500],
  ['r7', 'Dentro a Vaubrun', -21.2, -50.2, 1000],
] as const;
const row = (id: string) => ROWS.find((r) => r[0] === id)!;
const point = (id: string) => new LatLon(row(id)[2], row(id)[3]);

const directory = mkdtempSync(join(tmpdir(), 'whereabouts-route-'));
let store: GazetteerStore;

beforeAll(async () => {
  store = await openCsvStore(directory, ['id,name,latitude,longitude,featureType,countryCode,stateProvince,radiusMeters',
    ...ROWS.map(([id, name, lat, lon, radius]) => `${id},${name},${lat},${lon},town,QV,Poniente,${radius}`)], 'towns');
});
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

describe('a route between two places', () => {
  it.each([
    ['Alisos to Vila Serena', 'en'],
    ['de Alisos a Vila Serena', 'es'],
    ['estrada Alisos - Vila Serena', 'pt'],
    ['route de Alisos à Vila Serena', 'fr'],
  ])('"%s" (%s): both ends found, the midpoint and a radius over the whole segment and both extents', (locality) => {
    const result = locate(store, { locality, countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.interpretation.type).toBe('between');
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual(['r1', 'r2']);
    const middle = point('r1').intermediatePointTo(point('r2'), 0.5);
    expect(new LatLon(result.georeference!.latitude, result.georeference!.longitude).distanceTo(middle)).toBeLessThan(1);
    // D/2 + max(r_f1, r_f2): the circle reaches both ends' far edges (docs/method.md §3).
    const expected = point('r1').distanceTo(point('r2')) / 2 + 3000;
    expect(Math.abs(result.georeference!.uncertaintyMeters - expected) / expected).toBeLessThan(0.005);
    expect(result.georeference!.remarks.join('\n')).toContain('read as the route between Alisos and Vila Serena, both found');
    expect(result.georeference!.remarks.join('\n')).toContain('[CHOICE routeReading');
  });

  it('keeps a whole name that holds a joiner as one name ("Puerto a Dentro"), though both halves are loaded', () => {
    const result = locate(store, { locality: 'Puerto a Dentro', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.interpretation.type).toBe('named-place');
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual(['r3']);
  });

  it('takes a name that holds a joiner as one end when only that split finds both ends', () => {
    const result = locate(store, { locality: 'Alisos to Puerto a Dentro', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual(['r1', 'r3']);
  });

  it('leaves two splits that both find their ends for a person ("Puerto | Dentro a Vaubrun", "Puerto a Dentro | Vaubrun")', () => {
    const result = locate(store, { locality: 'Puerto a Dentro a Vaubrun', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('ambiguous');
    expect(result.reason).toContain('splits into two places in 2 ways');
  });

  it('declines when only one end is found, and says which, never answering with that end', () => {
    const result = locate(store, { locality: 'Alisos to Marisco Alto', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('not-found');
    expect(result.reason).toContain('only "Alisos" found: one end alone does not place a route');
  });

  it('with a road kilometre post: the route\'s circle with the post named as not placed, or a decline when asked', () => {
    const answered = locate(store, { locality: 'Alisos - Vila Serena road, km 12', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(answered.status).toBe('georeferenced');
    expect(answered.georeference!.remarks.join('\n')).toContain('"km 12" not placed');
    expect(answered.georeference!.remarks.join('\n')).toContain('[CHOICE routeKilometrePost');
    const declined = locate(store, { locality: 'Alisos - Vila Serena road, km 12', countryCode: 'QV', stateProvince: 'Poniente', options: { routeKilometrePost: 'decline' } });
    expect(declined.status).toBe('not-found');
    expect(declined.reason).toContain('cannot be placed without the road\'s line');
  });
});
