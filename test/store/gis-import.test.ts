/**
 * Shapefiles and GeoPackages as gazetteer sources. GDAL (ogr2ogr, Debian's gdal-bin) writes the demo's
 * administrative units in projected coordinate systems, one with a datum shift; the import must give back
 * the same polygons in WGS84 and the same corrected centers and radials as the GeoJSON import of the
 * originals, distances measured with Vincenty's inverse (geodesy 2.4.0, C. Veness, MIT; Vincenty 1975,
 * Survey Review 23:88), and the imported units must bound and filter `locate` through the real CLI.
 */
import { execFile } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { zipSync } from 'fflate';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import type { Feature as GeoJsonFeature, FeatureCollection, Position } from 'geojson';
import { beforeAll, describe, expect, it } from 'vitest';
import { importGazetteer, type ImportOptions } from '../../src/store/import.ts';
import { openGazetteer } from '../../src/store/gazetteer-store.ts';
import type { Feature } from '../../src/match/types.ts';
import { gdal, gdalAvailable } from '../support/gdal.ts';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const cli = join(root, 'bin/whereabouts.js');
const demo = join(root, 'gazetteer/demo.geojson');
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-gis-in-'));
const hasGdal = gdalAvailable('test/store/gis-import.test.ts');
const UNITS = "featureType IN ('county', 'stateProvince')";
/** ogr2ogr shortens shapefile attribute names to 10 characters (dBASE III limit). */
const SHAPEFILE_FIELDS = { idField: 'id', featureTypeField: 'featureTyp', stateProvinceField: 'stateProvi', countyField: 'county', countryCodeField: 'countryCod', alternateNamesField: 'alternateN' };
const GPKG_FIELDS = { idField: 'id', featureTypeField: 'featureType', stateProvinceField: 'stateProvince', countyField: 'county', countryCodeField: 'countryCode', alternateNamesField: 'alternateNames' };

const originals = (JSON.parse(readFileSync(demo, 'utf8')) as FeatureCollection).features.filter((f) => ['county', 'stateProvince'].includes(String(f.properties?.featureType)));

async function importInto(dbPath: string, file: string, options: Omit<ImportOptions, 'citation'>) {
  const store = openGazetteer(dbPath);
  try {
    return await importGazetteer(store, file, { citation: `${file} (invented demo units)`, ...options });
  } finally {
    store.close();
  }
}

function featuresOf(dbPath: string, sourceId: string): Map<string, Feature> {
  const store = openGazetteer(dbPath, { readonly: true });
  try {
    return new Map(originals.map((f) => [String(f.properties!.id), store.getFeature(sourceId, String(f.properties!.id), { withGeometry: true })!]));
  } finally {
    store.close();
  }
}

function sourceHash(dbPath: string): string {
  const store = openGazetteer(dbPath, { readonly: true });
  try {
    return store.sources()[0]!.contentHash;
  } finally {
    store.close();
  }
}

const meters = (a: Position, b: Position) => new LatLon(a[1]!, a[0]!).distanceTo(new LatLon(b[1]!, b[0]!));

const referenceDb = join(dir, 'reference.sqlite');
const files = {
  zippedUtm: join(dir, 'units-utm7s.zip'),
  shpWgs72: join(dir, 'wgs72', 'units.shp'),
  gpkgWgs72: join(dir, 'units-wgs72.gpkg'),
};

beforeAll(async () => {
  if (!hasGdal) return;
  await importInto(referenceDb, demo, { format: 'geojson', sourceId: 'geojson' });
  // EPSG:32707 WGS 84 / UTM zone 7S: a projection, no datum shift; zipped as its users download it.
  const utm = join(dir, 'utm');
  gdal('ogr2ogr', '-f', 'ESRI Shapefile', '-t_srs', 'EPSG:32707', '-where', UNITS, '-lco', 'ENCODING=UTF-8', utm, demo);
  const parts = Object.fromEntries(['shp', 'shx', 'dbf', 'prj', 'cpg'].map((ext) => [`units/demo.${ext}`, readFileSync(join(utm, `demo.${ext}`))]));
  writeFileSync(files.zippedUtm, zipSync(parts));
  // EPSG:32307 WGS 72 / UTM zone 7S: a datum shift (EPSG:1238, WGS 72 to WGS 84), as a file set and a GeoPackage.
  mkdirSync(join(dir, 'wgs72'));
  gdal('ogr2ogr', '-f', 'ESRI Shapefile', '-t_srs', 'EPSG:32307', '-where', UNITS, '-nln', 'units', '-lco', 'ENCODING=UTF-8', join(dir, 'wgs72'), demo);
  gdal('ogr2ogr', '-f', 'GPKG', '-t_srs', 'EPSG:32307', '-where', UNITS, '-nln', 'units', files.gpkgWgs72, demo);
}, 120_000);

describe.skipIf(!hasGdal)('importing administrative units from GIS files', () => {
  const cases = [
    { label: 'a zipped shapefile in EPSG:32707 (WGS 84 / UTM 7S)', file: () => files.zippedUtm, format: 'shapefile' as const, fields: SHAPEFILE_FIELDS, crs: /WGS_1984_UTM_Zone_7S.*no datum shift/ },
    { label: 'a shapefile file set in EPSG:32307 (WGS 72 / UTM 7S)', file: () => files.shpWgs72, format: 'shapefile' as const, fields: SHAPEFILE_FIELDS, crs: /WGS_1972_UTM_Zone_7S.*EPSG:1238/ },
    { label: 'a GeoPackage in EPSG:32307 (WGS 72 / UTM 7S)', file: () => files.gpkgWgs72, format: 'gpkg' as const, fields: GPKG_FIELDS, crs: /WGS 72 \/ UTM zone 7S.*EPSG:1238/ },
  ];
  for (const { label, file, format, fields, crs } of cases) {
    it(`${label}: every unit, vertices within 1 m, corrected center within 1 m and radial within 0.5 % of the GeoJSON import`, async () => {
      const dbPath = join(dir, `${format}-${label.length}.sqlite`);
      const summary = await importInto(dbPath, file(), { format, sourceId: 'units', gis: fields });
      expect(summary.rejected).toEqual([]);
      expect(summary.imported).toBe(originals.length);
      expect(summary.notes?.join('\n')).toMatch(crs);
      const reference = featuresOf(referenceDb, 'geojson');
      const imported = featuresOf(dbPath, 'units');
      for (const original of originals as GeoJsonFeature[]) {
        const id = String(original.properties!.id);
        const got = imported.get(id)!;
        const want = reference.get(id)!;
        expect(got.name).toBe(original.properties!.name);
        expect(got.featureType).toBe(original.properties!.featureType);
        expect(got.stateProvince).toBe(original.properties!.stateProvince);
        expect(meters([got.longitude, got.latitude], [want.longitude, want.latitude])).toBeLessThan(1);
        expect(Math.abs(got.radiusMeters - want.radiusMeters) / want.radiusMeters).toBeLessThan(0.005);
        // Vertex for vertex (a shapefile may start rings elsewhere or turn them, so each original vertex has a near twin).
        const vertices = (JSON.parse(String(got.geometry ? JSON.stringify(got.geometry) : 'null')) as { coordinates: unknown }).coordinates;
        const flat = (c: unknown): Position[] => (typeof (c as Position)[0] === 'number' ? [c as Position] : (c as unknown[]).flatMap(flat));
        const importedVertices = flat(vertices);
        for (const vertex of flat((original.geometry as { coordinates: unknown }).coordinates)) {
          expect(Math.min(...importedVertices.map((v) => meters(v, vertex)))).toBeLessThan(1);
        }
      }
    });
  }

  it('reads a .dbf in its .cpg code page or the default windows-1252, and a GeoPackage with Z coordinates', async () => {
    const cp1252 = join(dir, 'cp1252');
    gdal('ogr2ogr', '-f', 'ESRI Shapefile', '-t_srs', 'EPSG:32707', '-where', UNITS, '-nln', 'units', '-lco', 'ENCODING=CP1252', cp1252, demo);
    expect(readFileSync(join(cp1252, 'units.cpg'), 'latin1').trim()).toBe('CP1252');
    const names = async (file: string, gis: object, sourceId: string) => {
      const dbPath = join(dir, `${sourceId}.sqlite`);
      const summary = await importInto(dbPath, file, { format: file.endsWith('.gpkg') ? 'gpkg' : 'shapefile', sourceId, gis });
      return { summary, features: featuresOf(dbPath, sourceId) };
    };
    const withCpg = await names(join(cp1252, 'units.shp'), SHAPEFILE_FIELDS, 'cpg');
    expect(withCpg.features.get('qv-0004')!.name).toBe('Côte-du-Levant');
    const hashWithCpg = sourceHash(join(dir, 'cpg.sqlite'));
    rmSync(join(cp1252, 'units.cpg'));
    expect((await names(join(cp1252, 'units.shp'), SHAPEFILE_FIELDS, 'nocpg')).features.get('qv-0004')!.name).toBe('Côte-du-Levant');
    // The source's content hash covers the side files: without the .cpg it differs.
    expect(sourceHash(join(dir, 'nocpg.sqlite'))).not.toBe(hashWithCpg);
    const wrong = await names(join(cp1252, 'units.shp'), { ...SHAPEFILE_FIELDS, encoding: 'utf-8' }, 'wrong');
    expect(wrong.summary.rejected.map((r) => r.reason)).toContain('not valid UTF-8 (name)');
    await expect(names(join(cp1252, 'units.shp'), { ...SHAPEFILE_FIELDS, encoding: 'klingon' }, 'unknown')).rejects.toThrow(/encoding "klingon" \(--encoding\) is not one whereabouts knows/);

    const threeD = join(dir, 'units-z.gpkg');
    gdal('ogr2ogr', '-f', 'GPKG', '-t_srs', 'EPSG:32707', '-dim', 'XYZ', '-where', UNITS, '-nln', 'units', threeD, demo);
    const z = await names(threeD, GPKG_FIELDS, 'z');
    expect(z.summary.rejected).toEqual([]);
    const reference = featuresOf(referenceDb, 'geojson');
    for (const [id, feature] of z.features) expect(meters([feature.longitude, feature.latitude], [reference.get(id)!.longitude, reference.get(id)!.latitude])).toBeLessThan(1);
  });

  it('refuses a datum with no known shift by name, and a zip of several shapefiles without --layer', async () => {
    const odd = join(dir, 'odd');
    mkdirSync(odd);
    gdal('ogr2ogr', '-f', 'ESRI Shapefile', '-t_srs', '+proj=utm +zone=7 +south +a=6378300 +rf=296 +units=m', '-where', UNITS, '-nln', 'odd', odd, demo);
    writeFileSync(join(odd, 'odd.prj'), readFileSync(join(odd, 'odd.prj'), 'utf8').replace(/DATUM\["[^"]*"/, 'DATUM["D_Isla_Verdemar_1901"'));
    await expect(importInto(join(dir, 'odd.sqlite'), join(odd, 'odd.shp'), { format: 'shapefile', gis: SHAPEFILE_FIELDS })).rejects.toThrow(/datum "D_Isla_Verdemar_1901".*no shift to WGS84/);
    const two = join(dir, 'two.zip');
    const set = (stem: string) => Object.fromEntries(['shp', 'shx', 'dbf', 'prj'].map((ext) => [`${stem}.${ext}`, readFileSync(join(dir, 'wgs72', `units.${ext}`))]));
    writeFileSync(two, zipSync({ ...set('a'), ...set('b') }));
    await expect(importInto(join(dir, 'two.sqlite'), two, { format: 'shapefile', gis: SHAPEFILE_FIELDS })).rejects.toThrow(/several shapefiles \(a, b\): choose one with --layer/);
  });
});

describe.skipIf(!hasGdal)('imported units bound and filter `locate` (real CLI)', () => {
  const db = join(dir, 'cli.sqlite');
  const whereabouts = (...args: string[]) => run(process.execPath, [cli, '--db', db, ...args], { cwd: root, maxBuffer: 64 << 20 });

  beforeAll(async () => {
    // Places without their county and state attributes, so only the units' polygons can place them.
    const places = join(dir, 'places.geojson');
    gdal('ogr2ogr', '-f', 'GeoJSON', '-where', `NOT (${UNITS})`, '-select', 'id,name,alternateNames,featureType,countryCode,radiusMeters', places, demo);
    await whereabouts('import', places, '--source', 'demo places (invented)');
    await whereabouts('import', files.zippedUtm, '--source-id', 'counties', '--source', 'demo counties (invented)', '--name-field', 'name', '--id-field', 'id',
      '--type-field', 'featureTyp', '--state-province-field', 'stateProvi', '--county-field', 'county', '--country-code', 'QV',
      '--alternate-names-field', 'alternateN');
  }, 120_000);

  it('picks the Los Pinos inside the stated county by its polygon, and clips the footprint to it', async () => {
    // Two villages are named Los Pinos (demo: qv-0016 in Alisos, qv-0039 in Tres Cruces).
    const ambiguous = JSON.parse((await whereabouts('locate', 'Los Pinos', '--country-code', 'QV', '--json')).stdout);
    expect(ambiguous.status).not.toBe('georeferenced');
    const body = JSON.parse((await whereabouts('locate', 'Los Pinos', '--country-code', 'QV', '--county', 'Tres Cruces', '--json')).stdout);
    expect(body.status).toBe('georeferenced');
    // The village, then the imported county whose polygon bounds the footprint.
    const used = body.georeference.features.map((f: { sourceId: string; featureId: string }) => `${f.sourceId}:${f.featureId}`);
    expect(used).toEqual(['places:qv-0039', 'counties:qv-0006']);
    expect(body.darwinCore.georeferenceRemarks).toContain('clipped to county "Tres Cruces"');
  });

  it('bounds and filters by a stated municipality when the units are imported as municipalities', async () => {
    const municipalities = join(dir, 'municipalities.sqlite');
    const own = (...args: string[]) => run(process.execPath, [cli, '--db', municipalities, ...args], { cwd: root, maxBuffer: 64 << 20 });
    await own('import', join(dir, 'places.geojson'), '--source', 'demo places (invented)');
    // The demo's counties, taken as municipalities (an invented scenario: the island's municipalities share their bounds).
    await own('import', files.zippedUtm, '--source-id', 'municipalities', '--source', 'demo municipalities (invented)', '--id-field', 'id', '--feature-type', 'municipality', '--country-code', 'QV');
    const body = JSON.parse((await own('locate', 'Los Pinos', '--country-code', 'QV', '--municipality', 'Tres Cruces', '--json')).stdout);
    expect(body.status).toBe('georeferenced');
    expect(body.georeference.features.map((f: { sourceId: string; featureId: string }) => `${f.sourceId}:${f.featureId}`)).toEqual(['places:qv-0039', 'municipalities:qv-0006']);
    expect(body.darwinCore.georeferenceRemarks).toContain('clipped to municipality "Tres Cruces"');
  });

  it('matches a stated province by an alternate name of the imported unit and takes the Santa Rosa inside it', async () => {
    // Two places are named Santa Rosa (demo: qv-0015 in Poniente, qv-0053 in Serra Alta); "Western Province"
    // is an alternate name of Poniente (qv-0002) in the imported shapefile only.
    const body = JSON.parse((await whereabouts('locate', 'Santa Rosa', '--country-code', 'QV', '--state-province', 'Western Province', '--json')).stdout);
    expect(body.status).toBe('georeferenced');
    const used = body.georeference.features.map((f: { sourceId: string; featureId: string }) => `${f.sourceId}:${f.featureId}`);
    expect(used[0]).toBe('places:qv-0015');
    expect(used).toContain('counties:qv-0002');
  });
});

describe.skipIf(!hasGdal)('real boundaries: Natural Earth countries (1:110m, public domain, via the registry package world-atlas 2.0.2, ISC)', () => {
  it('a shapefile of them in EPSG:3857 imports with the corrected centers (1 m) and radials (0.5 %) of their WGS84 GeoJSON', async () => {
    const geojson = join(dir, 'countries.geojson');
    // Antarctica reaches 90° S, which Web Mercator cannot hold.
    gdal('ogr2ogr', '-f', 'GeoJSON', '-where', "name <> 'Antarctica'", geojson, join(root, 'node_modules/world-atlas/countries-110m.json'), 'countries');
    gdal('ogr2ogr', '-f', 'ESRI Shapefile', '-t_srs', 'EPSG:3857', '-lco', 'ENCODING=UTF-8', join(dir, 'countries-3857'), geojson);
    const dbPath = join(dir, 'countries.sqlite');
    const reference = await importInto(dbPath, geojson, { format: 'geojson', sourceId: 'geojson' });
    const imported = await importInto(dbPath, join(dir, 'countries-3857', 'countries.shp'), { format: 'shapefile', sourceId: 'shapefile', gis: { idField: 'id', featureType: 'country' } });
    expect(imported.rejected).toEqual([]);
    expect(imported.imported).toBe(reference.imported);
    expect(imported.imported).toBeGreaterThan(170);
    const store = openGazetteer(dbPath, { readonly: true });
    try {
      // A few disputed areas have no id in the dataset and are left out of the comparison.
      const ids = (JSON.parse(readFileSync(geojson, 'utf8')) as FeatureCollection).features.map((f) => f.properties!.id as string | undefined).filter((id) => id);
      expect(ids.length).toBeGreaterThan(170);
      for (const id of ids as string[]) {
        const got = store.getFeature('shapefile', id)!;
        const want = store.getFeature('geojson', id)!;
        expect(meters([got.longitude, got.latitude], [want.longitude, want.latitude]), `${want.name} (${id})`).toBeLessThan(1);
        expect(Math.abs(got.radiusMeters - want.radiusMeters) / want.radiusMeters, `${want.name} (${id})`).toBeLessThan(0.005);
      }
    } finally {
      store.close();
    }
  }, 120_000);
});
