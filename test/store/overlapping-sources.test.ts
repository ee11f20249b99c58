/**
 * The same places loaded from several gazetteer sources (issue 12) on a real SQLite file: the demo
 * gazetteer (invented places of Isla Verdemar) imported twice under two ids, and a CSV copy of it with
 * every point moved 0.0027° north (about 300 m), as a second gazetteer that re-surveyed the places
 * would give them. One place is one candidate, cited from the source ranked first, the others listed;
 * places of the same name further apart than the rule allows stay apart (docs/method.md §4a).
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import Database from 'better-sqlite3';
import { parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { compatibleTypes, SAME_PLACE_RULE } from '../../src/match/same-place.ts';
import { examineStore } from '../../src/store/doctor.ts';
import { georeferenceRecord, type Memo } from '../../src/locate/georeference-record.ts';
import type { LocateResult } from '../../src/locate/locate.ts';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, SCHEMA_VERSION, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { VERSION_4_UNDONE, VERSION_5_UNDONE } from '../support/schema-undone.ts';
import { listen, post } from '../server/helpers.ts';

const root = new URL('../..', import.meta.url).pathname;
const DEMO = join(root, 'gazetteer/demo-places.csv');
const directory = mkdtempSync(join(tmpdir(), 'whereabouts-overlap-'));
const dbPath = join(directory, 'g.sqlite');
const movedPath = join(directory, 'moved.csv');
/** The copy's shift north, degrees: about 300 m at 45° S. */
const SHIFT = 0.0027;
let store: GazetteerStore;

const demoRows = parse(readFileSync(DEMO), { columns: true }) as Record<string, string>[];
const demoRow = (name: string) => demoRows.find((row) => row.name === name)!;

beforeAll(async () => {
  const moved: Record<string, string>[] = demoRows.map((row) => ({ ...row, id: `m-${row.id}`, latitude: (Number(row.latitude) + SHIFT).toFixed(6) }));
  // Two places of the copy that must stay apart: the same name 5 km away (a village of default radius
  // 2 km), and the same name and point as a river (an incompatible type).
  const losPinos = demoRow('Los Pinos');
  moved.push({ ...losPinos, id: 'm-far', name: 'Los Pinos', latitude: (Number(losPinos.latitude) + 0.045).toFixed(6) });
  const alisos = demoRow('Villa Alisos');
  moved.push({ ...alisos, id: 'm-river', featureType: 'river', radiusMeters: '' });
  writeFileSync(movedPath, stringify(moved, { header: true, columns: Object.keys(demoRows[0]) }));
  store = openGazetteer(dbPath);
  await importGazetteer(store, DEMO, { format: 'csv', citation: 'Isla Verdemar demo gazetteer (invented)', sourceId: 'atlas' });
  await importGazetteer(store, DEMO, { format: 'csv', citation: 'Isla Verdemar demo gazetteer, second copy (invented)', sourceId: 'survey' });
  await importGazetteer(store, movedPath, { format: 'csv', citation: 'Isla Verdemar demo gazetteer, moved copy (invented)', sourceId: 'moved' });
}, 60_000);
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

describe('the same place in several sources is one candidate', () => {
  it('merges the two identical copies and the moved copy, cited from the source imported first while none is ranked', () => {
    const candidates = store.findCandidates({ name: 'Villa Alisos', context: {} });
    const towns = candidates.filter((c) => c.feature.featureType === 'town');
    expect(towns).toHaveLength(1);
    const [town] = towns;
    expect(town.feature.sourceId).toBe('atlas');
    expect(town.feature.alsoIn?.map((other) => other.sourceId)).toEqual(['survey', 'moved']);
    // Reference distance: Vincenty's inverse on WGS84 (Vincenty 1975, Survey Review 23:88) from the
    // registry package geodesy 2.4.0 (C. Veness, MIT), independent of our geodesics.
    const row = demoRow('Villa Alisos');
    const expected = new LatLon(Number(row.latitude), Number(row.longitude))
      .distanceTo(new LatLon(Number((Number(row.latitude) + SHIFT).toFixed(6)), Number(row.longitude)));
    const moved = town.feature.alsoIn!.find((other) => other.sourceId === 'moved')!;
    expect(moved.distanceMeters).toBeCloseTo(expected, 2);
    expect(town.feature.alsoIn!.find((other) => other.sourceId === 'survey')!.distanceMeters).toBe(0);
    expect(town.why).toContain('the same place in source survey (feature qv-0014, 0 m away), source moved (feature m-qv-0014, 300 m away)');
    expect(town.why).toContain(SAME_PLACE_RULE.description);
  });

  it('keeps two places of one name apart: Santa Rosa is two candidates, not six', () => {
    const candidates = store.findCandidates({ name: 'Santa Rosa', context: {} });
    expect(candidates.map((c) => c.feature.featureId).sort()).toEqual(['qv-0015', 'qv-0053']);
    for (const candidate of candidates) expect(candidate.feature.alsoIn).toHaveLength(2);
  });

  it('keeps a feature of the same name beyond max(1 km, smaller radius) apart, and one of an incompatible type', () => {
    const pinos = store.findCandidates({ name: 'Los Pinos', context: {} });
    expect(pinos.map((c) => `${c.feature.sourceId}:${c.feature.featureId}`).sort()).toEqual(['atlas:qv-0016', 'atlas:qv-0039', 'moved:m-far']);
    const alisos = store.findCandidates({ name: 'Villa Alisos', context: {} });
    expect(alisos.map((c) => c.feature.featureType).sort()).toEqual(['river', 'town']);
    expect(compatibleTypes('town', 'village')).toBe(true);
    expect(compatibleTypes('town', 'river')).toBe(false);
    expect(compatibleTypes(null, 'river')).toBe(true);
  });

  it('cites the source the user ranks first, and keeps the rank when the source is imported again', async () => {
    expect(store.setPriority('moved', 1)).toBe(true);
    expect(store.setPriority('survey', 2)).toBe(true);
    const [town] = store.findCandidates({ name: 'Villa Alisos', context: {}, featureTypes: ['town'] });
    expect(town.feature).toMatchObject({ sourceId: 'moved', featureId: 'm-qv-0014' });
    expect(town.feature.alsoIn?.map((other) => other.sourceId)).toEqual(['survey', 'atlas']);
    await importGazetteer(store, movedPath, { format: 'csv', citation: 'Isla Verdemar demo gazetteer, moved copy (invented)', sourceId: 'moved' });
    expect(store.sources().map((source) => [source.id, source.priority])).toEqual([['atlas', null], ['moved', 1], ['survey', 2]]);
    expect(() => store.setPriority('moved', 0)).toThrow(/whole number from 1/);
    expect(store.setPriority('nothing', 1)).toBe(false);
    expect(store.setPriority('moved', null)).toBe(true);
    expect(store.setPriority('survey', null)).toBe(true);
  });

  it('gives a remembered answer only while the sources are ranked as when it was computed', () => {
    // A memo as the service keeps one: a cache may save work, never change an answer (common practice, no source).
    const memory = new Map<string, LocateResult>();
    const memo: Memo = (key, compute) => memory.get(key) ?? memory.set(key, compute()).get(key)!;
    const answer = (withMemo: boolean) => georeferenceRecord(store, {
      locality: 'Villa Alisos', attribution: { georeferencedBy: 'test', georeferencedDate: '2026-01-01T00:00:00Z', sources: store.sources() },
    }, withMemo ? memo : undefined).result;
    expect(answer(true).candidates[0].feature.sourceId).toBe('atlas');
    expect(store.setPriority('moved', 1)).toBe(true);
    try {
      expect(answer(true)).toEqual(answer(false));
      expect(answer(true).candidates[0].feature.sourceId).toBe('moved');
    } finally {
      expect(store.setPriority('moved', null)).toBe(true);
    }
  });
});

describe('through the real CLI', () => {
  const run = promisify(execFile);
  const whereabouts = (...args: string[]) => run(process.execPath, [join(root, 'bin/whereabouts.js'), '--db', dbPath, ...args], { cwd: root });

  it('ranks a source with gazetteer priority, and locate names the other sources in the remarks', async () => {
    expect((await whereabouts('gazetteer', 'priority', 'survey', '1')).stdout).toBe('source survey: priority 1\n');
    const { stdout } = await whereabouts('locate', 'Puerto Lindo', '--country-code', 'QV', '--json');
    const body = JSON.parse(stdout);
    expect(body.status).toBe('georeferenced');
    const remarks = JSON.stringify(body.georeference.remarks);
    expect(remarks).toContain('feature used: \\"Puerto Lindo\\" (survey:qv-0013)');
    expect(remarks).toContain('the same place in source atlas (feature qv-0013, 0 m away), source moved (feature m-qv-0013, 300 m away); cited from survey, the source ranked first');
    expect((await whereabouts('gazetteer', 'list')).stdout).toContain('priority: 1');
    await expect(whereabouts('gazetteer', 'priority', 'survey', 'first')).rejects.toThrow(/whole number from 1/);
  }, 60_000);
});

describe('through the real service on 127.0.0.1', () => {
  it('lists the other sources in the candidate, and lets the reviewer choose one of them', async () => {
    const server = await listen({ dbPath, rateLimit: false });
    try {
      const url = `${server.url}/api/v1/georeference`;
      const { status, json } = await post(url, { locality: 'Puerto Lindo', countryCode: 'QV' });
      expect(status).toBe(200);
      expect(json.candidates).toHaveLength(1);
      const cited = json.candidates[0].feature;
      const other = cited.alsoIn.find((copy: { sourceId: string }) => copy.sourceId === 'moved');
      expect(other).toMatchObject({ featureId: 'm-qv-0013', name: 'Puerto Lindo' });
      const chosen = await post(url, { locality: 'Puerto Lindo', countryCode: 'QV', options: { candidate: { sourceId: 'moved', featureId: 'm-qv-0013' } } });
      expect(chosen.status).toBe(200);
      expect(chosen.json.georeference.latitude).toBeCloseTo(other.latitude, 6);
    } finally {
      await server.close();
    }
  });
});

describe('schema migration', () => {
  it('migrates a version-1 store when opened, read-only too, and the doctor notes the older version first', () => {
    const old = join(directory, 'old.sqlite');
    const v2 = openGazetteer(old);
    v2.close();
    const raw = new Database(old);
    // The version-1 schema: without the columns and the table version 2 added, the index version 3 added and what version 4 changed.
    raw.exec(`ALTER TABLE sources DROP COLUMN priority; ALTER TABLE features DROP COLUMN name_details; DROP TABLE unit_names; DROP INDEX features_by_position;
      ${VERSION_4_UNDONE} PRAGMA user_version = 1;`);
    raw.close();
    const note = examineStore(old).checks.find((check) => check.check === 'schema version')!;
    expect(note).toMatchObject({ status: 'note' });
    expect(note.finding).toContain(`schema version 1, older than version ${SCHEMA_VERSION}`);
    const reader = openGazetteer(old, { readonly: true });
    expect(reader.sources()).toEqual([]);
    reader.close();
    const check = new Database(old, { readonly: true });
    expect(check.pragma('user_version', { simple: true })).toBe(SCHEMA_VERSION);
    expect((check.prepare('SELECT name FROM pragma_table_info(?)').pluck().all('sources') as string[])).toContain('priority');
    expect((check.prepare('SELECT name FROM pragma_table_info(?)').pluck().all('unit_names') as string[])).toContain('feature');
    expect((check.prepare('SELECT name FROM pragma_index_list(?)').pluck().all('features') as string[])).toContain('features_by_position');
    check.close();
    expect(examineStore(old).checks.find((c) => c.check === 'schema version')!.status).toBe('ok');
  });

  it('migrates a version-3 store holding a gazetteer: the country outlines get their index, and lookups answer as before', async () => {
    const old = join(directory, 'v3.sqlite');
    const built = openGazetteer(old);
    await importGazetteer(built, join(root, 'gazetteer/demo.geojson'), { format: 'geojson', citation: 'demo' });
    // Misspelt names (one and two typing errors), found through the token index.
    const queries = ['Puerto Lindp', 'Vila Alisso', 'Laguna Negrs', 'Alisoss', 'Verdemra'];
    const answers = (store: GazetteerStore) => ({
      candidates: queries.map((name) => store.findCandidates({ name, context: {} }).map((c) => [c.feature.featureId, c.score])),
      outlines: store.countryOutlines!('QV').map((feature) => feature.featureId),
    });
    const before = answers(built);
    built.close();
    expect(before.outlines).toHaveLength(1);
    expect(before.candidates.every((found) => found.length > 0)).toBe(true);
    const raw = new Database(old);
    raw.exec(`${VERSION_5_UNDONE} ${VERSION_4_UNDONE} PRAGMA user_version = 3;`);
    raw.close();
    // Examined before it is migrated: a note on its version, no problem.
    expect(examineStore(old).healthy).toBe(true);
    const reader = openGazetteer(old, { readonly: true });
    expect(answers(reader)).toEqual(before);
    reader.close();
    const check = new Database(old, { readonly: true });
    expect(check.pragma('user_version', { simple: true })).toBe(SCHEMA_VERSION);
    expect(check.prepare('SELECT name FROM pragma_index_list(?)').pluck().all('features')).toContain('features_country_polygons');
    check.close();
    expect(examineStore(old).healthy).toBe(true);
  });
});
