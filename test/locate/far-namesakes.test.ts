/**
 * A unit, region or range word read as a town of that name far away: never a confident circle. Invented
 * gazetteer rows (demo style, Isla Verdemar), imported as CSV into a real SQLite file; the rule checked is the
 * method's workflow rule that a feature is never used when the text does not support it (Chapman & Wieczorek
 * 2020, Georeferencing Best Practices, §Georeferencing Workflow – Localities, step 5), with the [CHOICE]s of
 * src/georef/method-defaults.ts cited in the reasons.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { locate } from '../../src/locate/locate.ts';

// Invented rows: a town named after a region ("Fenwickham City", named after the Fenwickham hills), and a town
// "Rivard" whose name a township ("Canton Le Rivard") shares.
const ROWS = [
  'id,name,alternateNames,latitude,longitude,featureType,countryCode,stateProvince,county,radiusMeters',
  't-1,Fenwickham City,,-44.100000,-130.100000,town,QV,Poniente,,2000',
  't-2,Rivard,,-46.200000,-132.400000,town,QV,Poniente,,2000',
  't-3,Ashcombe,,-45.500000,-131.500000,town,QV,Poniente,,2000',
].join('\n');

const directory = mkdtempSync(join(tmpdir(), 'whereabouts-far-namesakes-'));
let store: GazetteerStore;

beforeAll(async () => {
  const csv = join(directory, 'rows.csv');
  writeFileSync(csv, `${ROWS}\n`);
  store = openGazetteer(join(directory, 'rows.sqlite'));
  await importGazetteer(store, csv, { format: 'csv', citation: 'invented rows' });
});
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

describe('a name found only as the first words of a longer name ([CHOICE] nameAsFirstWords)', () => {
  it('leaves "Fenwickham; Ashby Hollow" for a person to confirm, not the town Fenwickham City', () => {
    const result = locate(store, { locality: 'Fenwickham; Ashby Hollow', countryCode: 'QV' });
    expect(METHOD_DEFAULTS.nameAsFirstWords).toBe('review');
    expect(result.status).toBe('ambiguous');
    expect(result.reason).toMatch(/Fenwickham City .* only begins with it.*\[CHOICE nameAsFirstWords/);
  });

  it("answers with the longer name when asked ('answer'), with the near-name remark", () => {
    const result = locate(store, { locality: 'Fenwickham; Ashby Hollow', countryCode: 'QV', options: { nameAsFirstWords: 'answer' } });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual(['t-1']);
    expect(result.georeference!.remarks.join('\n')).toMatch(/"Fenwickham" is not in the gazetteer as written; taken as "Fenwickham City"/);
  });
});

describe('a township word ("canton") names no town to stand in for a missing place', () => {
  it('declines "Canton Le Rivard, au sud-est du lac Noir" with no lake loaded, never taking the town Rivard', () => {
    const result = locate(store, { locality: 'Canton Le Rivard, au sud-est du lac Noir', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('not-found');
    expect(result.georeference).toBeUndefined();
  });
});

describe('an elevation is never an offset', () => {
  it('reads "Ashcombe, unnamed peak 1900 m in height" as Ashcombe, with no offset term', () => {
    const result = locate(store, { locality: 'Ashcombe, unnamed peak 1900 m in height', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.interpretation.elevation).toMatchObject({ minimumMeters: 1900, maximumMeters: 1900 });
    expect(result.interpretation.offsets).toEqual([]);
    expect(result.components?.offset ?? 0).toBe(0);
  });
});
