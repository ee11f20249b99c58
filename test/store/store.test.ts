/**
 * The gazetteer store on a real temporary SQLite file: import of the fixture CSV and GeoJSON (invented
 * places in an invented region, codes QX/QY from the ISO 3166-1 user-assigned range), exact and fuzzy
 * matching, context filters, spatial constraints, ambiguity, sources, and imports that fail.
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, SCHEMA_VERSION, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { DEFAULT_RADII } from '../../src/georef/default-radii.ts';
import { edgeMinimax } from '../support/independent-minimax.ts';

const FIXTURES = new URL('../fixtures/gazetteer/', import.meta.url).pathname;
const directory = mkdtempSync(join(tmpdir(), 'whereabouts-gazetteer-'));
let store: GazetteerStore;

beforeAll(async () => {
  store = openGazetteer(join(directory, 'g.sqlite'));
  await importGazetteer(store, join(FIXTURES, 'places.csv'), { format: 'csv', citation: 'Fixture places', sourceId: 'places', licence: 'CC0-1.0' });
  await importGazetteer(store, join(FIXTURES, 'admin.geojson'), { format: 'geojson', citation: 'Fixture units', sourceId: 'units' });
});
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

const ids = (name: string, context = {}, extra = {}) =>
  store.findCandidates({ name, context, ...extra }).map((c) => c.feature.featureId);

describe('exact matching on folded names', () => {
  it('folds case, accents, punctuation and spacing, and keeps every feature of the name', () => {
    expect(ids('santa  rosa').sort()).toEqual(['p1', 'p10', 'p13', 'p2']);
    expect(ids('SAO TOME-DE-BAIXO')).toEqual(['p3']);
    const [candidate] = store.findCandidates({ name: 'Puerto Albarran', context: {} });
    expect(candidate).toMatchObject({ score: 1, matchedName: 'Puerto Albarrán', why: 'exact name' });
  });

  it('finds alternate names and says so', () => {
    const [candidate] = store.findCandidates({ name: 'Port Albarran', context: {} });
    expect(candidate.feature.featureId).toBe('p6');
    expect(candidate.why).toBe("exact alternate name 'Port Albarran'");
  });

  it('reads abbreviations and optional generic words, below a plain exact match', () => {
    // 'Mte.' stands for Monte; the gazetteer's 'Mt.' may too, so the two readings meet.
    const [monte] = store.findCandidates({ name: 'Mte. Greyhill', context: {} });
    expect(monte).toMatchObject({ score: 0.97, matchedName: 'Mt. Greyhill' });
    expect(monte.why).toBe("exact alternate name 'Mt. Greyhill' with 'mte' read as 'monte' in the query; 'mt' read as 'monte' in the gazetteer");
    const [saint] = store.findCandidates({ name: 'St Laurent des Brumes', context: {} });
    expect(saint.feature.featureId).toBe('p7');
    const [farm] = store.findCandidates({ name: 'Boa Vista', context: {} });
    expect(farm).toMatchObject({ score: 0.97, why: 'exact name with generic word left out in the gazetteer' });
    const [estate] = store.findCandidates({ name: 'Faz. Boa Vista', context: {} });
    expect(estate.why).toBe("exact name with 'faz' read as 'fazenda' in the query");
    const [cerro] = store.findCandidates({ name: 'Co. Pelón', context: {} });
    expect(cerro.feature.featureId).toBe('p8');
    const [river] = store.findCandidates({ name: 'R. Brezo', context: {} });
    expect(river.feature.featureId).toBe('r1');
  });
});

describe('fuzzy matching through the index', () => {
  it('finds a name with typing errors, scored below 1 with the edits in the reason', () => {
    const [candidate] = store.findCandidates({ name: 'Puerto Albaran', context: {} });
    expect(candidate.feature.featureId).toBe('p6');
    expect(candidate.score).toBeLessThan(1);
    expect(candidate.why).toBe("1 edit from name 'Puerto Albarrán'");
    expect(ids('Cero Pleón')).toContain('p8');
  });

  it('ranks exact matches alone: a fuzzy neighbour never joins an exact hit', () => {
    // 'Rosario' (QY) is 3 edits from 'Rosalinda' but an exact name: only it is returned.
    expect(ids('Rosario')).toEqual(['p12']);
    // 'Rosalnda' is 1 edit from 'Rosalinda' and further from 'Rosario'.
    expect(ids('Rosalnda')[0]).toBe('p9');
  });
});

describe('query words kept between lookups (OpenOptions.wordCacheKiB)', () => {
  // Misspellings sharing words, as a batch's records do; what a connection keeps must never change an
  // answer, whatever came before (common practice, no source: a cache is transparent).
  const queries = ['Santa Rosaa', 'Sant Rosa', 'Rosalnda', 'Puerto Albaran', 'Pto Albaran', 'Cero Pleón', 'Cerro Pelom',
    'Sao Tome de Baxo', 'Arroyo Hndo', 'Santa Rossa', 'Rosarop', 'Mount Greyhil', 'Fazenda Boa Vsta', 'Sata Rosa', 'Rosalnda', 'Santa Rosaa'];
  const answers = (options: { wordCacheKiB?: number }, order: string[]) => {
    const reader = openGazetteer(join(directory, 'g.sqlite'), { readonly: true, ...options });
    const found = new Map(order.map((name) => [name, reader.findCandidates({ name, context: {}, limit: 5 })
      .map((c) => `${c.feature.featureId} ${c.score} ${c.why}`)]));
    reader.close();
    return queries.map((name) => found.get(name));
  };

  it('gives the same candidates in order, reversed, with none kept, and with so few kept that words are forgotten', () => {
    const inOrder = answers({}, queries);
    expect(inOrder.flat().length).toBeGreaterThan(queries.length);
    expect(answers({}, [...queries].reverse())).toEqual(inOrder);
    expect(answers({ wordCacheKiB: 0 }, queries)).toEqual(inOrder);
    expect(answers({ wordCacheKiB: 1 }, queries)).toEqual(inOrder);
    expect(answers({ wordCacheKiB: 1 }, [...queries].reverse())).toEqual(inOrder);
  });
});

describe('administrative context', () => {
  it('keeps every candidate the context cannot separate (ambiguous, never a silent pick)', () => {
    expect(ids('Santa Rosa', { countryCode: 'QX' })).toHaveLength(4);
    // Norteña's polygon holds p1 and p10; p13 says Norteña but lies outside it.
    expect(ids('Santa Rosa', { stateProvince: 'Norteña' }).sort()).toEqual(['p1', 'p10']);
  });

  it('filters by country code, state and county names folded, and reports what it dropped', () => {
    expect(ids('Rosario', { countryCode: 'QX' })).toEqual([]);
    expect(ids('Santa Rosa', { stateProvince: 'Provincia Sureña' })).toEqual(['p2']);
    const lookup = store.lookupCandidates({ name: 'Rosario', context: { countryCode: 'qx' } });
    expect(lookup.dropped.map((d) => d.reason)).toEqual(['country QY, not QX']);
  });

  it('drops a candidate outside the polygon of the stated county, with the reason', () => {
    // p13 says county Alto Brezo but lies inside Bajo Brezo's polygon; p1 and p10 lie inside Alto Brezo.
    const lookup = store.lookupCandidates({ name: 'Santa Rosa', context: { county: 'Alto Brezo' } });
    expect(lookup.candidates.map((c) => c.feature.featureId).sort()).toEqual(['p1', 'p10']);
    const reasons = lookup.dropped.map((d) => `${d.candidate.feature.featureId}: ${d.reason}`).sort();
    expect(reasons).toEqual([
      "p13: center outside the polygon of county 'Alto Brezo' (units:c1)",
      "p2: center outside the polygon of county 'Alto Brezo' (units:c1)",
    ]);
    expect(lookup.notes).toEqual(["county 'Alto Brezo' checked against its polygon (units:c1)"]);
  });

  it('does not test a larger unit against the polygon of a smaller one', () => {
    const [state] = store.findCandidates({ name: 'Norteña', context: { county: 'Alto Brezo' }, featureTypes: ['stateProvince'] });
    expect(state.feature.featureId).toBe('s1');
  });

  it('notes a country name it cannot resolve instead of filtering on it', () => {
    const lookup = store.lookupCandidates({ name: 'Rosario', context: { country: 'Verdemaria' } });
    expect(lookup.candidates).toHaveLength(1);
    expect(lookup.notes).toEqual(["country 'Verdemaria' not recognised: not used to filter"]);
  });
});

describe('administrative units and geometry', () => {
  it('finds a county polygon by type, with its geometry only when asked', () => {
    const [county] = store.findCandidates({ name: 'Alto Brezo', context: {}, featureTypes: ['county'], withGeometry: true });
    expect(county.feature).toMatchObject({ featureId: 'c1', geometryType: 'Polygon', radiusIsDefault: false });
    expect(county.feature.geometry?.type).toBe('Polygon');
    const [plain] = store.findCandidates({ name: 'Alto Brezo', context: {}, featureTypes: ['county'] });
    expect(plain.feature.geometry).toBeUndefined();
    expect(store.findCandidates({ name: 'Alto Brezo', context: {}, featureTypes: ['town'] })).toEqual([]);
  });

  it('stores the corrected center and radial of a line computed at import (method §4)', () => {
    const river = store.getFeature('units', 'r1', { withGeometry: true });
    expect(river?.geometryType).toBe('LineString');
    expect(river?.radiusIsDefault).toBe(false);
    // The radial is the minimax over the line, computed independently with Vincenty's solutions
    // (test/support/independent-minimax.ts); the store keeps the importer's value, so they agree to 1 cm.
    const line = JSON.parse(readFileSync(join(FIXTURES, 'admin.geojson'), 'utf8')).features.find((f: { properties: { name: string } }) => f.properties.name === 'Río Brezo').geometry;
    const reference = edgeMinimax(line, [line.coordinates]);
    expect(Math.abs(river!.radiusMeters - reference.radiusMeters), `${river!.radiusMeters} against ${reference.radiusMeters}`).toBeLessThan(0.01);
    expect(Math.abs(river!.latitude - reference.latitude) + Math.abs(river!.longitude - reference.longitude)).toBeLessThan(1e-6);
    expect(store.findCandidates({ name: 'Rio Brezo', context: {}, geometryTypes: ['LineString'] })).toHaveLength(1);
  });

  it('uses the default radius of the feature type when a point has none, and the given one otherwise', () => {
    expect(store.getFeature('places', 'p1')).toMatchObject({ radiusMeters: DEFAULT_RADII.town.meters, radiusIsDefault: true });
    expect(store.getFeature('places', 'p2')).toMatchObject({ radiusMeters: 1500, radiusIsDefault: false });
    expect(store.getFeature('units', 't1')).toMatchObject({ radiusMeters: 1200, latitude: -10.25, longitude: -150.25 });
    expect(store.getFeature('places', 'nope')).toBeNull();
  });
});

describe('sources', () => {
  it('records citation, licence, date and the sha256 of the file (checked with node:crypto)', () => {
    const places = store.sources().find((s) => s.id === 'places');
    const expected = createHash('sha256').update(readFileSync(join(FIXTURES, 'places.csv'))).digest('hex');
    expect(places).toMatchObject({ citation: 'Fixture places', licence: 'CC0-1.0', contentHash: expected, featureCount: 13 });
    expect(Number.isNaN(Date.parse(places!.importedAt))).toBe(false);
  });

  it('hashes a GeoJSON file\'s own bytes too', () => {
    const units = store.sources().find((s) => s.id === 'units');
    expect(units?.contentHash).toBe(createHash('sha256').update(readFileSync(join(FIXTURES, 'admin.geojson'))).digest('hex'));
  });

  it('replaces a source imported again under the same id, and removes one', async () => {
    const path = join(directory, 'replace.sqlite');
    const local = openGazetteer(path);
    await importGazetteer(local, join(FIXTURES, 'places.csv'), { format: 'csv', citation: 'first', sourceId: 'x' });
    const csv = join(directory, 'one.csv');
    writeFileSync(csv, 'id,name,latitude,longitude,countryCode\nq1,Villa Nueva,-10,-150,QX\n');
    await importGazetteer(local, csv, { format: 'csv', citation: 'second', sourceId: 'x' });
    expect(local.sources()).toMatchObject([{ id: 'x', citation: 'second', featureCount: 1 }]);
    expect(local.findCandidates({ name: 'Santa Rosa', context: {} })).toEqual([]);
    expect(local.findCandidates({ name: 'Villa Nueva', context: {} })).toHaveLength(1);
    expect(local.findCandidates({ name: 'Vila Nueva', context: {} })).toHaveLength(1);
    expect(local.removeSource('x')).toBe(true);
    expect(local.removeSource('x')).toBe(false);
    expect(local.sources()).toEqual([]);
    expect(local.findCandidates({ name: 'Vila Nueva', context: {} })).toEqual([]);
    local.close();
  });

  it('reads a gazetteer CSV after a first line "sep=;" (common practice of spreadsheet exports, no published source), rows keeping the file\'s line numbers', async () => {
    const local = openGazetteer(join(directory, 'sep.sqlite'));
    const csv = join(directory, 'sep.csv');
    writeFileSync(csv, 'sep=;\r\nid;name;latitude;longitude;countryCode\r\nq1;Villa Nueva;-10,5;-150;QX\r\nq2;Loma Baja;-11;-151\r\n');
    const summary = await importGazetteer(local, csv, { format: 'csv', citation: 'sep', sourceId: 's' });
    expect(summary.imported).toBe(1);
    expect(summary.rejected).toEqual([{ row: 4, reason: '4 columns, the header has 5' }]);
    expect(local.findCandidates({ name: 'Villa Nueva', context: {} })).toHaveLength(1);
    local.close();
  });
});

describe('imports that fail', () => {
  it('leaves the store as it was when a file cannot be read to the end', async () => {
    const path = join(directory, 'fail.sqlite');
    const local = openGazetteer(path);
    await importGazetteer(local, join(FIXTURES, 'places.csv'), { format: 'csv', citation: 'kept', sourceId: 'places' });
    const broken = join(directory, 'broken.geojson');
    writeFileSync(broken, '{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"name":"A"},"geometry":{"type":"Point","coordinates":[1,2]}},');
    await expect(importGazetteer(local, broken, { format: 'geojson', citation: 'broken', sourceId: 'places' }))
      .rejects.toThrow('GeoJSON ends before the FeatureCollection is closed');
    expect(local.sources()).toMatchObject([{ id: 'places', citation: 'kept', featureCount: 13 }]);
    expect(local.findCandidates({ name: 'Santa Rosa', context: {} })).toHaveLength(4);
    local.close();
  });

  it('refuses a CSV without a name column or with unknown columns, naming them', async () => {
    const csv = join(directory, 'bad-header.csv');
    writeFileSync(csv, 'id,nombre,latitude,longitude\n1,X,1,2\n');
    await expect(importGazetteer(store, csv, { format: 'csv', citation: 'x', sourceId: 'bad' })).rejects.toThrow("CSV header has no 'name' column");
    expect(store.sources().map((s) => s.id)).toEqual(['places', 'units']);
  });

  it('rejects bad CSV rows one by one with their line numbers and imports the rest', async () => {
    const csv = join(directory, 'rows.csv');
    writeFileSync(csv, [
      'id,name,latitude,longitude,countryCode,radiusMeters',
      'a,Uno,-10,-150,QX,',
      'b,,-10,-150,QX,',
      'c,Tres,-10,-190,QX,',
      'd,Cuatro,-10,-150,Q1,',
      'e,Cinco,-10,-150,QX,-5',
      'a,Seis,-10,-150,QX,',
      'g,Siete,-10',
    ].join('\n'));
    const local = openGazetteer(join(directory, 'rows.sqlite'));
    const summary = await importGazetteer(local, csv, { format: 'csv', citation: 'rows' });
    expect(summary).toMatchObject({ sourceId: 'rows', rowsRead: 7, imported: 1 });
    expect(summary.rejected).toEqual([
      { row: 3, reason: 'name missing' },
      { row: 4, reason: 'longitude -190 is outside −180…180' },
      { row: 5, reason: "countryCode 'Q1' is not an ISO 3166-1 alpha-2 code" },
      { row: 6, reason: "radiusMeters '-5' is not a distance in meters" },
      { row: 7, reason: "duplicate id 'a'" },
      { row: 8, reason: '3 columns, the header has 6' },
    ]);
    local.close();
  });
});

describe('the file', () => {
  it('is one SQLite file in WAL mode with the schema version in user_version', () => {
    const path = join(directory, 'g.sqlite');
    const raw = new Database(path, { readonly: true });
    expect(raw.pragma('user_version', { simple: true })).toBe(SCHEMA_VERSION);
    expect(raw.pragma('journal_mode', { simple: true })).toBe('wal');
    raw.close();
  });

  it('refuses a file of another schema version and a missing file opened read-only', () => {
    const path = join(directory, 'other.sqlite');
    const raw = new Database(path);
    raw.pragma('user_version = 99');
    raw.close();
    expect(() => openGazetteer(path)).toThrow(`gazetteer schema version 99, this whereabouts reads versions 1 to ${SCHEMA_VERSION}`);
    expect(() => openGazetteer(join(directory, 'missing.sqlite'), { readonly: true })).toThrow();
  });
});
