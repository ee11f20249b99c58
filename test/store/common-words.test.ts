/**
 * Names of several words with words too common for a lookup's posting budget, on a real temporary
 * SQLite file against the same invented places held in memory (test/support/memory-name-index.ts):
 * the store's partner probes (each partner on its cheaper side, with a country filter or without)
 * and its probes of found places for unread words must answer as the plain reading in memory does.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CandidateMatcher } from '../../src/match/candidate-matcher.ts';
import type { CandidateQuery, Feature } from '../../src/match/types.ts';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { memoryNameIndex } from '../support/memory-name-index.ts';

/** Invented places: [name, how many], in the user-assigned country codes QV and (every third) QW. */
const NAMES: [string, number][] = [
  ['Santa', 900], ['Salto', 820], ['Castillo', 830], ['Salto Castilho', 2], ['Castico', 60], ['Santa Salto Castillo', 1],
  ['Vieja', 5001], ['Rosa', 5001], ['Dormida', 100], ['Vieja Rosa Dormida', 1],
];
const features: Feature[] = NAMES.flatMap(([name, count]) => Array.from({ length: count }, (_, i) => ({
  sourceId: 'places', featureId: `${name.replace(/ /g, '-')}-${i}`, name, alternateNames: [], featureType: 'town',
  countryCode: i % 3 === 2 ? 'QW' : 'QV', stateProvince: null, county: null, latitude: -45 + i / 1000, longitude: -131,
  radiusMeters: 2000, radiusIsDefault: false, geometryType: 'Point' as const,
})));
const directory = mkdtempSync(join(tmpdir(), 'whereabouts-common-words-'));
let store: GazetteerStore;

beforeAll(async () => {
  const csv = ['id,name,alternateNames,latitude,longitude,featureType,countryCode,stateProvince,county,radiusMeters',
    ...features.map((f) => `${f.featureId},${f.name},,${f.latitude},${f.longitude},town,${f.countryCode},,,2000`)].join('\n');
  writeFileSync(join(directory, 'places.csv'), csv);
  store = openGazetteer(join(directory, 'g.sqlite'));
  await importGazetteer(store, join(directory, 'places.csv'), { format: 'csv', citation: 'Invented places', sourceId: 'places' });
});
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

const answers = (find: (query: CandidateQuery) => { feature: Feature }[], query: CandidateQuery) => find(query).map((c) => c.feature.featureId);

describe('a name of several words with common words, in the store', () => {
  it.each([
    ['Santa Salto Castilco', {}, 'Santa-Salto-Castillo-0'],
    ['Santa Salto Castilco', { countryCode: 'QV' }, 'Santa-Salto-Castillo-0'],
    ['Vieja Rosa Dbormida', {}, 'Vieja-Rosa-Dormida-0'],
    ['Vieja Rosa Dbormida', { countryCode: 'QV' }, 'Vieja-Rosa-Dormida-0'],
  ])('finds %s (context %j) first, as the same places in memory give it', (name, context, first) => {
    const query: CandidateQuery = { name, context, limit: 5 };
    const inStore = answers((q) => store.findCandidates(q), query);
    const matcher = new CandidateMatcher(memoryNameIndex(features));
    expect(inStore[0]).toBe(first);
    expect(inStore).toEqual(answers((q) => matcher.lookup(q).candidates, query));
  });
});
