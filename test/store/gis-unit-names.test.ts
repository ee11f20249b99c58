/**
 * The names and codes a state, county or municipality from a GIS file, a GeoJSON or a CSV gazetteer is recorded
 * by in the store's unit names, and the note for state codes no loaded state holds (src/store/unit-names.ts). Inputs and expected values side by
 * side; the real files go through the CLI in test/e2e/real-files.test.ts.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { importGazetteer } from '../../src/store/import.ts';
import { mappedColumns } from '../../src/store/gis-import.ts';
import { parentCodeNote, unitNamesOf } from '../../src/store/unit-names.ts';

describe('unitNamesOf', () => {
  it('gives a state\'s or county\'s level and its other names, codes and the subdivision part of its own country\'s ISO 3166-2 code', () => {
    // ISO 3166-2 code elements: alpha-2 country code, hyphen, up to three letters or digits (ISO 3166-2, from memory);
    // the values are Natural Earth 1:50m admin-1's (public domain): Washington's name_alt "WA|Wash.", iso_3166_2 "US-WA",
    // Santa Catarina's name_alt "Santa Catharina", iso_3166_2 "BR-SC".
    const cases: [Parameters<typeof unitNamesOf>[0], string[], ReturnType<typeof unitNamesOf>][] = [
      [{ name: 'Washington', alternateNames: ['WA', 'Wash.'], featureType: 'stateProvince', countryCode: 'US' }, ['US-WA'],
        { level: 1, name: 'Washington', names: ['WA', 'Wash.', 'US-WA'] }],
      [{ name: 'Santa Catarina', alternateNames: ['Santa Catharina'], featureType: 'stateProvince', countryCode: 'BR' }, ['BR-SC', ' '],
        { level: 1, name: 'Santa Catarina', names: ['Santa Catharina', 'BR-SC', 'SC'] }],
      // another country's code keeps its whole form only; a county is level 2
      [{ name: 'Pierce', alternateNames: ['Pierce County'], featureType: 'county', countryCode: 'US' }, ['BR-SC'],
        { level: 2, name: 'Pierce', names: ['Pierce County', 'BR-SC'] }],
      // a municipality is level 3; its statistical code is kept whole (IBGE's 2502201 for Bom Jesus, Paraíba:
      // github.com/tbrugz/geodata-br, CC0 1.0, test/fixtures/real/README.md)
      [{ name: 'Bom Jesus', alternateNames: [], featureType: 'municipality', countryCode: 'BR' }, ['2502201'],
        { level: 3, name: 'Bom Jesus', names: ['2502201'] }],
      // no unit: a town's names are no unit names
      [{ name: 'Tacoma', alternateNames: [], featureType: 'populated place', countryCode: 'US' }, ['US-WA'], null],
    ];
    for (const [record, codes, expected] of cases) expect(unitNamesOf(record, codes)).toEqual(expected);
  });

  it('reads several alternate-name attributes and the code attributes of a GIS layer (invented attributes)', () => {
    const properties = { NOMBRE: 'Poniente', ALT: 'Prov. Poniente|Western Province', ALT2: 'Pon.', CODE: 'QV-PN' };
    expect(mappedColumns(properties, { nameField: 'NOMBRE', alternateNamesField: ['ALT', 'ALT2'], unitCodeFields: ['CODE'] }))
      .toEqual({ name: 'Poniente', alternateNames: ['Prov. Poniente', 'Western Province', 'Pon.'], unitCodes: ['QV-PN'] });
    // one attribute, as before
    expect(mappedColumns(properties, { alternateNamesField: 'ALT' })).toEqual({ alternateNames: ['Prov. Poniente', 'Western Province'] });
  });
});

describe('parentCodeNote', () => {
  it('names each state code no loaded state holds, with its count, and leaves names and known codes out', () => {
    const known = new Set(['ID']);
    expect(parentCodeNote(new Map([['WA', 39], ['ID', 44], ['Washington', 2]]), (code) => known.has(code)))
      .toBe('the state/province code "WA" (39 features) names no state or province loaded (by a name or code), so a record writing the state by its name meets these features only where the state\'s polygon is loaded: import the states with this code among their names or codes (--alternate-names-field, --unit-code-field), before or after this file');
    expect(parentCodeNote(new Map([['US-53', 1], ['US-16', 2]]), () => false)).toMatch(/^the state\/province codes "US-53" \(1 feature\), "US-16" \(2 features\) name no state/);
    expect(parentCodeNote(new Map([['ID', 44]]), (code) => known.has(code))).toBeNull();
  });
});

describe('a GeoJSON and a CSV gazetteer record their units\' names and codes as a GIS file does', () => {
  // Invented units of the demo country QV (user-assigned, ISO 3166-1 §7.1.3): the same state and municipality
  // written as a GeoJSON FeatureCollection (RFC 7946 §3.3) and as the gazetteer CSV (README, "Importing").
  const directory = mkdtempSync(join(tmpdir(), 'whereabouts-unit-names-formats-'));
  afterAll(() => rmSync(directory, { recursive: true, force: true }));
  const square = (west: number, south: number) => ({ type: 'Polygon', coordinates: [[[west, south], [west + 0.1, south], [west + 0.1, south + 0.1], [west, south + 0.1], [west, south]]] });
  const expected = [
    { key: '2650', level: 3, unitKey: 'vado alto' }, { key: 'pn', level: 1, unitKey: 'poniente' }, { key: 'pon', level: 1, unitKey: 'poniente' },
    { key: 'poniente', level: 1, unitKey: 'poniente' }, { key: 'qv pn', level: 1, unitKey: 'poniente' }, { key: 'vado alto', level: 3, unitKey: 'vado alto' },
  ];
  const unitNames = (store: GazetteerStore) => [1, 2, 3].flatMap((level) => store.unitNames(level as 1 | 2 | 3).map((name) => ({ key: name.key, level, unitKey: name.unitKey })))
    .sort((a, b) => a.key.localeCompare(b.key));

  it('GeoJSON: alternate names and the codes of --unit-code-field, at each unit\'s level', async () => {
    const file = join(directory, 'units.geojson');
    writeFileSync(file, JSON.stringify({ type: 'FeatureCollection', features: [
      { type: 'Feature', properties: { name: 'Poniente', alternateNames: 'Pon.', CODE: 'QV-PN', featureType: 'stateProvince', countryCode: 'QV' }, geometry: square(-131.5, -45.5) },
      { type: 'Feature', properties: { name: 'Vado Alto', CODE: '2650', featureType: 'municipality', countryCode: 'QV', stateProvince: 'PN' }, geometry: square(-131.45, -45.45) },
    ] }));
    const store = openGazetteer(join(directory, 'geojson.sqlite'));
    try {
      await importGazetteer(store, file, { format: 'geojson', citation: 'invented units', gis: { unitCodeFields: ['CODE'] } });
      expect(unitNames(store)).toEqual(expected);
      // the code is tied to its unit's own feature, which comes with its polygon
      expect(store.unitFeatures(3, '2650').map((unit) => [unit.name, unit.geometry?.type])).toEqual([['Vado Alto', 'Polygon']]);
    } finally {
      store.close();
    }
  });

  it('CSV: the alternateNames and unitCodes columns', async () => {
    const file = join(directory, 'units.csv');
    writeFileSync(file, 'id,name,alternateNames,latitude,longitude,featureType,countryCode,stateProvince,unitCodes\n'
      + 's1,Poniente,Pon.,-45.45,-131.45,stateProvince,QV,,QV-PN\nm1,Vado Alto,,-45.4,-131.4,municipality,QV,PN,2650\n');
    const store = openGazetteer(join(directory, 'csv.sqlite'));
    try {
      await importGazetteer(store, file, { format: 'csv', citation: 'invented units' });
      expect(unitNames(store)).toEqual(expected);
      expect(store.unitFeatures(3, '2650').map((unit) => unit.featureId)).toEqual(['m1']);
      expect(store.unitFeatures(1, 'qv pn').map((unit) => unit.featureId)).toEqual(['s1']);
    } finally {
      store.close();
    }
  });
});
