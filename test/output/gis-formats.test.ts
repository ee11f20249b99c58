/**
 * `batch --format gpkg|geojson` (src/batch/gis-output.ts, src/output) read by an outside reader: Debian's GDAL (ogrinfo, gdal-bin) opens the
 * GeoPackage (OGC GeoPackage Encoding Standard 1.3, OGC 12-128) and the GeoJSON (RFC 7946) and reads
 * back every row with the same values as the CSV the same batch writes. Real CLI, real files.
 */
import { execFile } from 'node:child_process';
import { appendFileSync, copyFileSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import Database from 'better-sqlite3';
import { beforeAll, describe, expect, it } from 'vitest';
import { gdal, gdalAvailable, ogrFeatures } from '../support/gdal.ts';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const cli = join(root, 'bin/whereabouts.js');
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-gis-out-'));
const db = join(dir, 'demo.sqlite');
const input = join(dir, 'records.csv');
const RUN_TIMESTAMP = '2026-05-01T09:30:00Z';
const hasGdal = gdalAvailable('test/output/gis-formats.test.ts');

function whereabouts(...args: string[]) {
  return run(process.execPath, [cli, '--db', db, ...args], { cwd: root, maxBuffer: 64 << 20 });
}

let csv: string[][];
const column = (name: string) => csv[0].indexOf(name);

beforeAll(async () => {
  await whereabouts('import', 'gazetteer/demo.geojson', '--source', 'Isla Verdemar demo gazetteer (invented)');
  copyFileSync(join(root, 'gazetteer/demo-localities.csv'), input);
  // A row whose quote is left open (malformed) and one naming no place: both must come back.
  appendFileSync(input, 'qvh-x-1,QVH 1,Nomen nudum,"nowhere at all,QV,,,,,,,\nqvh-x-2,QVH 2,Nomen nudum,Zzyzx Qwerty,QV,Isla Verdemar,,,,,,\n');
  const common = ['batch', input, '--quiet', '--run-timestamp', RUN_TIMESTAMP];
  await whereabouts(...common, '--out', join(dir, 'out.csv'));
  await whereabouts(...common, '--out', join(dir, 'out.gpkg'), '--format', 'gpkg');
  await whereabouts(...common, '--out', join(dir, 'out.geojson'), '--format', 'geojson');
  csv = parse(readFileSync(join(dir, 'out.csv')), { relax_column_count: false }) as string[][];
}, 120_000);

describe.skipIf(!hasGdal)('batch --format gpkg, as GDAL reads it', () => {
  it('lists a points layer with every row and a footprints layer with every footprint, in EPSG:4326, with every column', () => {
    const summary = gdal('ogrinfo', '-ro', '-al', '-so', join(dir, 'out.gpkg'));
    const layers = [...summary.matchAll(/Layer name: (\w+)\n[\s\S]*?Geometry: (.+)\nFeature Count: (\d+)/g)].map((m) => [m[1], m[2], Number(m[3])]);
    const rows = csv.length - 1;
    const footprints = csv.slice(1).filter((r) => r[column('footprintWKT')] !== '').length;
    expect(footprints).toBeGreaterThan(0);
    expect(layers).toEqual([['points', 'Point', rows], ['footprints', 'Multi Polygon', footprints]]);
    expect(summary.match(/ID\["EPSG",4326\]\]/g)).toHaveLength(2);
    for (const name of [...csv[0], 'whereabouts_coordinateFlags', 'georeferenceVerificationStatus']) expect(summary).toContain(`\n${name}: String`);
  });

  it('reads back every row with the CSV values, its point at the CSV coordinates, and no geometry where the CSV has none', () => {
    const features = ogrFeatures(join(dir, 'out.gpkg'), 'points');
    expect(features).toHaveLength(csv.length - 1);
    const [lat, lon] = [column('proposed_decimalLatitude'), column('proposed_decimalLongitude')];
    let unlocated = 0;
    features.forEach((feature, i) => {
      const row = csv[i + 1];
      expect(Object.values(feature.fields)).toEqual(row);
      if (row[lat] === '') {
        unlocated++;
        expect(feature.geometry).toBeUndefined();
      } else {
        expect(feature.geometry).toBe(`POINT (${Number(row[lon])} ${Number(row[lat])})`);
      }
    });
    expect(unlocated).toBeGreaterThanOrEqual(2);
    expect(features.some((f) => f.fields.occurrenceID === 'qvh-x-1' && /malformed|quote/i.test(f.fields.georeferenceRemarks ?? ''))).toBe(true);
  });

  it('reads each footprint back as the polygon footprintWKT states, vertex for vertex', () => {
    const wkt = gdal('ogr2ogr', '-f', 'CSV', '/vsistdout/', join(dir, 'out.gpkg'), 'footprints', '-lco', 'GEOMETRY=AS_WKT', '-select', 'occurrenceID,footprintWKT');
    const rows = parse(wkt, { columns: true }) as { WKT: string; occurrenceID: string; footprintWKT: string }[];
    expect(rows.length).toBeGreaterThan(0);
    const numbers = (text: string) => (text.match(/-?\d+(\.\d+)?/g) ?? []).map(Number);
    for (const row of rows) expect(numbers(row.WKT)).toEqual(numbers(row.footprintWKT));
  });

  it('is marked as a GeoPackage: application_id "GPKG" and user_version 10300 (OGC 12-128 §1.1.1.1.1, Req 2)', () => {
    const file = new Database(join(dir, 'out.gpkg'), { readonly: true });
    try {
      expect(file.pragma('application_id', { simple: true })).toBe(0x47504b47);
      expect(file.pragma('user_version', { simple: true })).toBe(10300);
      // Req 11: the three spatial reference systems every GeoPackage holds.
      expect(file.prepare('SELECT srs_id FROM gpkg_spatial_ref_sys ORDER BY srs_id').pluck().all()).toEqual([-1, 0, 4326]);
    } finally {
      file.close();
    }
  });
});

describe.skipIf(!hasGdal)('batch --format geojson (RFC 7946)', () => {
  it('is one FeatureCollection, a feature a row in order, lon/lat points, geometry null where there is no point (§3.2)', () => {
    const collection = JSON.parse(readFileSync(join(dir, 'out.geojson'), 'utf8'));
    expect(collection.type).toBe('FeatureCollection');
    expect(collection.crs).toBeUndefined(); // §4: WGS84 lon/lat, no crs member
    expect(collection.features).toHaveLength(csv.length - 1);
    const [lat, lon] = [column('proposed_decimalLatitude'), column('proposed_decimalLongitude')];
    collection.features.forEach((f: { geometry: { coordinates: number[] } | null; properties: Record<string, string> }, i: number) => {
      const row = csv[i + 1];
      expect(Object.values(f.properties)).toEqual(row);
      expect(f.geometry === null ? null : f.geometry.coordinates).toEqual(row[lat] === '' ? null : [Number(row[lon]), Number(row[lat])]);
    });
  });

  it('is read by GDAL with the same values', () => {
    // DATE_AS_STRING: GDAL would otherwise read georeferencedDate as a date and print it in its own style.
    const features = ogrFeatures(join(dir, 'out.geojson'), undefined, '-oo', 'DATE_AS_STRING=YES');
    expect(features).toHaveLength(csv.length - 1);
    features.forEach((feature, i) => expect(Object.values(feature.fields)).toEqual(csv[i + 1]));
  });
});

describe('batch --format', () => {
  it('refuses a GeoPackage on standard output and an unknown format, by name', async () => {
    await expect(whereabouts('batch', input, '--format', 'gpkg')).rejects.toThrow(/GeoPackage is a database file.*--out/);
    await expect(whereabouts('batch', input, '--format', 'kml', '--out', join(dir, 'x'))).rejects.toThrow(/--format must be one of csv, geojson, gpkg, not 'kml'/);
  });
});
