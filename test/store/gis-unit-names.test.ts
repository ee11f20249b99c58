/**
 * The names and codes a state or county from a GIS file is recorded by in the store's unit names, and the
 * note for state codes no loaded state holds (src/store/unit-names.ts). Inputs and expected values side by
 * side; the real files go through the CLI in test/e2e/real-files.test.ts.
 */
import { describe, expect, it } from 'vitest';
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
