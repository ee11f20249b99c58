/**
 * The stated units as a soft wall when no polygon of the unit is loaded (src/locate/just-outside.ts):
 * the unit's loaded places stand for its extent. A small invented gazetteer (demo island style, CC0)
 * of towns only, imported from CSV into a real SQLite file. What is checked is the workflow rule that
 * a feature outside the stated units is never used silently (Chapman & Wieczorek 2020, Georeferencing
 * Best Practices, §Georeferencing Workflow – Localities, step 5), with the [CHOICE] justOutsideMeters
 * cited. Expected distances by Vincenty on WGS84 (geodesy 2.4.0), independent of the code under test.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { openCsvStore } from '../support/csv-store.ts';
import { locate } from '../../src/locate/locate.ts';

// Invented towns of the island state Poniente (two of them with their county) and its neighbours; no unit polygons.
const ROWS = [
  ['t1', 'Alisos', -20.0, -50.0, 'Poniente'],
  ['t2', 'Cerrillos', -20.0, -50.5, 'Poniente'],
  ['t3', 'Las Garzas', -20.0, -49.8, 'Levante'],
  ['t4', 'Punta Fria', -20.0, -48.5, 'Levante'],
  ['t5', 'San Telmo', -19.9, -49.85, 'Levante'],
  ['t6', 'San Telmo', -20.1, -49.85, 'Sur'],
  ['t7', 'Villa Capital', -20.0, -49.6, 'Distrito Capital'],
  ['t8', 'Los Pinos', -20.0, -49.9, null],
  ['t9', 'Isla Fecha', -16.0, -179.95, 'Oriente'],
  ['t10', 'Valle Hondo', -21.0, -50.0, 'Poniente', 'Alisos'],
  ['t11', 'El Molino', -21.0, -50.15, 'Poniente', 'Cerrillos'],
] as const;
const row = (id: string) => ROWS.find((r) => r[0] === id)!;
const km = (a: string, b: string) => new LatLon(row(a)[2], row(a)[3]).distanceTo(new LatLon(row(b)[2], row(b)[3])) / 1000;

const directory = mkdtempSync(join(tmpdir(), 'whereabouts-just-outside-'));
let store: GazetteerStore;

beforeAll(async () => {
  store = await openCsvStore(directory, ['id,name,latitude,longitude,featureType,countryCode,stateProvince,county',
    ...ROWS.map(([id, name, lat, lon, state, county]) => `${id},${name},${lat},${lon},town,QV,${state ?? ''},${county ?? ''}`)], 'towns');
});
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

describe('a place loaded only outside the stated state, no polygon of it loaded', () => {
  it('is taken when the nearest loaded place inside the state lies within the allowance, and the remark says by how much', () => {
    // Las Garzas (Levante) to Alisos (Poniente): 20.9 km, within 25 km. Los Pinos, nearer, records no state: not a place of Poniente.
    expect(km('t3', 't1')).toBeCloseTo(20.93, 1);
    const result = locate(store, { locality: 'Las Garzas', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.featureId).toBe('t3');
    expect(result.georeference!.remarks[0]).toBe(
      `"Las Garzas" is not inside the record's state/province "Poniente" (state/province 'Levante', not the one given) but just outside it: ${km('t3', 't1').toFixed(1)} km from its nearest loaded place, Alisos (towns:t1), so at most that far outside it, as no polygon of it is loaded: accepted, within the 25 km allowed [CHOICE justOutsideMeters, unitEdgeByPlaces, src/georef/method-defaults.ts]`,
    );
  });

  it('is declined when it lies farther from every place of the state than the allowance, naming the rule', () => {
    expect(km('t4', 't1')).toBeGreaterThan(100);
    const result = locate(store, { locality: 'Punta Fria', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/"Punta Fria" is loaded only outside the record's stated units: Punta Fria \(towns:t4; .*\); none lies within 25 km of a loaded place of the stated unit, .*\[CHOICE justOutsideMeters, unitEdgeByPlaces/);
  });

  it('lets the allowance grow with the offset: the point, not the town, must lie in the state', () => {
    // Punta Fria to Alisos 157.0 km: 150 km W of it is allowed 25 km + 150 km + δ 5 km (a distance written
    // to tens of km: half of 10 km; Chapman & Wieczorek 2020, offset precision table).
    const result = locate(store, { locality: '150 km W of Punta Fria', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.remarks[0]).toContain(`but just outside it: ${km('t4', 't1').toFixed(1)} km from its nearest loaded place, Alisos (towns:t1), so at most that far outside it, as no polygon of it is loaded: accepted, within the 180 km allowed`);
  });

  it('declines namesakes both just outside as ambiguous', () => {
    expect(km('t5', 't1')).toBeLessThan(25);
    expect(km('t6', 't1')).toBeLessThan(25);
    const result = locate(store, { locality: 'San Telmo', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/2 lie within 25 km of a loaded place of the stated unit/);
  });

  it('takes, of namesakes just outside, the one in the unit the text names', () => {
    const result = locate(store, { locality: 'San Telmo, Estado de Levante', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.featureId).toBe('t5');
    expect(result.georeference!.remarks[0]).toMatch(/just outside it, in "Levante", which the text names/);
  });

  it('puts the line halfway when the text names the unit the place lies in ("Near Villa Capital, Distrito Capital")', () => {
    // Villa Capital to Alisos 41.9 km: beyond 25 km as a bare name; half of it, 20.9 km, when the text names its unit.
    expect(km('t7', 't1')).toBeCloseTo(41.86, 1);
    expect(locate(store, { locality: 'Near Villa Capital', countryCode: 'QV', stateProvince: 'Poniente' }).status).toBe('not-found');
    const result = locate(store, { locality: 'Near Villa Capital, Distrito Capital.', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.remarks[0]).toBe(
      `"Villa Capital" is not inside the record's state/province "Poniente" (state/province 'Distrito Capital', not the one given) but just outside it, in "Distrito Capital", which the text names: ${km('t7', 't1').toFixed(1)} km from its nearest loaded place, Alisos (towns:t1), the line between the two units put halfway, about ${(km('t7', 't1') / 2).toFixed(1)} km outside it, as no polygon of it is loaded: accepted, within the 25 km allowed [CHOICE justOutsideMeters, unitEdgeByPlaces, src/georef/method-defaults.ts]`,
    );
  });
});

describe('how far outside the stated state a place lies, told from its loaded places [CHOICE unitEdgeByPlaces]', () => {
  // Input and expected side by side: text, choice, the status, and the distance the remark gives as outside the
  // state (Vincenty on WGS84 from the rows above). Villa Capital to Alisos 41.9 km: beyond 25 km as an upper
  // bound, 20.9 km with the line put halfway; Las Garzas to Alisos 20.9 km.
  const cases: { text: string; edge: 'nearest place' | 'halfway' | 'off'; status: string; outsideKm?: number }[] = [
    { text: 'Las Garzas', edge: 'nearest place', status: 'georeferenced', outsideKm: km('t3', 't1') },
    { text: 'Las Garzas', edge: 'halfway', status: 'georeferenced', outsideKm: km('t3', 't1') / 2 },
    { text: 'Las Garzas', edge: 'off', status: 'not-found' },
    { text: 'Near Villa Capital', edge: 'nearest place', status: 'not-found' },
    { text: 'Near Villa Capital', edge: 'halfway', status: 'georeferenced', outsideKm: km('t7', 't1') / 2 },
    { text: 'Near Villa Capital, Distrito Capital.', edge: 'off', status: 'not-found' },
  ];
  for (const c of cases) {
    it(`"${c.text}" with '${c.edge}': ${c.status}`, () => {
      const result = locate(store, { locality: c.text, countryCode: 'QV', stateProvince: 'Poniente', options: { unitEdgeByPlaces: c.edge } });
      expect(result.status).toBe(c.status);
      if (c.outsideKm === undefined) {
        expect(result.reason).toMatch(/loaded only outside the record's stated units/);
        if (c.edge === 'off') expect(result.reason).toContain('no polygon of the stated unit is loaded to tell how far outside, so none is taken [CHOICE justOutsideMeters, unitEdgeByPlaces');
        return;
      }
      const remark = result.georeference!.remarks[0]!;
      expect(remark).toContain(c.edge === 'halfway' ? `the line between the two units put halfway, about ${c.outsideKm.toFixed(1)} km outside it` : `so at most that far outside it`);
      expect(remark).toContain('[CHOICE justOutsideMeters, unitEdgeByPlaces, src/georef/method-defaults.ts]');
    });
  }
});

describe('a place loaded only outside the stated county, no polygon of it loaded', () => {
  it('is measured against the places recorded in that county', () => {
    // El Molino (county Cerrillos) to Valle Hondo (county Alisos): 15.6 km.
    expect(km('t11', 't10')).toBeCloseTo(15.6, 1);
    const result = locate(store, { locality: 'El Molino', countryCode: 'QV', stateProvince: 'Poniente', county: 'Alisos' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.remarks[0]).toContain(`"El Molino" is not inside the record's county "Alisos" (county 'Cerrillos', not the one given) but just outside it: ${km('t11', 't10').toFixed(1)} km from its nearest loaded place, Valle Hondo (towns:t10)`);
  });
});

describe('the nearest place of the stated units', () => {
  it('is the nearest place recording the unit, by geodesic distance, within the distance asked', () => {
    const found = store.nearestPlace({ latitude: -20.0, longitude: -49.8, context: { countryCode: 'QV', stateProvince: 'Poniente' }, meters: 30000 });
    expect(found?.feature.featureId).toBe('t1');
    expect(found!.meters / 1000).toBeCloseTo(km('t3', 't1'), 3);
    expect(store.nearestPlace({ latitude: -20.0, longitude: -49.8, context: { countryCode: 'QV', stateProvince: 'Poniente' }, meters: 20000 })).toBeNull();
  });

  it('finds a place across the 180th meridian (the box is asked as two)', () => {
    const found = store.nearestPlace({ latitude: -16.0, longitude: 179.95, context: { countryCode: 'QV', stateProvince: 'Oriente' }, meters: 20000 });
    expect(found?.feature.featureId).toBe('t9');
    expect(found!.meters).toBeCloseTo(new LatLon(-16.0, 179.95).distanceTo(new LatLon(-16.0, -179.95)), 0);
  });
});
