/**
 * The whole path through the real CLI: import the demo gazetteer into a temporary SQLite file, locate
 * one locality, and run a batch. Child processes, a real file, no mocks.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { beforeAll, describe, expect, it } from 'vitest';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const cli = join(root, 'bin/whereabouts.js');
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-e2e-'));
const db = join(dir, 'demo.sqlite');

function whereabouts(...args: string[]) {
  return run(process.execPath, [cli, ...args], { cwd: root, maxBuffer: 64 << 20 });
}

/** A demo feature as the gazetteer file gives it. */
function demoPlace(name: string) {
  const rows = parse(readFileSync(join(root, 'gazetteer/demo-places.csv')), { columns: true }) as Record<string, string>[];
  const row = rows.find((r) => r.name === name);
  if (!row) throw new Error(`${name} is not in the demo gazetteer`);
  return { latitude: Number(row.latitude), longitude: Number(row.longitude), radiusMeters: Number(row.radiusMeters) };
}

beforeAll(async () => {
  await whereabouts('--db', db, 'import', 'gazetteer/demo.geojson', '--source', 'Isla Verdemar demo gazetteer (invented)');
}, 120_000);

describe('whereabouts locate', () => {
  it('offsets 10 km NE geodesically from the town center, with the method radius', async () => {
    const { stdout } = await whereabouts('locate', '10 km NE of Vila Serena', '--country-code', 'QV', '--json', '--db', db);
    const body = JSON.parse(stdout);
    expect(body.status).toBe('georeferenced');
    expect(body.interpretation.type).toBe('offset-heading');

    // Reference: Vincenty's direct solution on WGS84 (Vincenty 1975, Survey Review 23:88), from the
    // registry package geodesy 2.4.0 (C. Veness, MIT): an implementation independent of ours.
    const town = demoPlace('Vila Serena');
    const expected = new LatLon(town.latitude, town.longitude).destinationPoint(10_000, 45);
    const got = new LatLon(body.georeference.latitude, body.georeference.longitude);
    expect(got.distanceTo(expected)).toBeLessThan(1);

    // Radius (docs/method.md §3, §5.2): r_f + U_offset(d = 10 km, δ = 0.5 km, Δ = 22.5°) + base.
    // 10 km NE with δ 0.5 km → 4.029 km [DERIVED check value of the method document, §5.2].
    expect(body.components.extent).toBeCloseTo(town.radiusMeters, 6);
    expect(body.components.offset / 1000).toBeCloseTo(4.029, 3);
    // Each term from its own source, not re-added from the answer: offset from the WGH2004 formula (§5.2),
    // extent from the demo gazetteer, the terms no option asked for 0.
    const offsetTerm = Math.sqrt(10.5 ** 2 + 10 ** 2 - 2 * 10 * 10.5 * Math.cos((22.5 * Math.PI) / 180)) * 1000;
    const terms = { extent: town.radiusMeters, offset: offsetTerm, coordinatePrecision: 0, datum: 0, mapScale: 0, measurement: 0 };
    for (const [name, value] of Object.entries(terms)) {
      expect(Math.abs(body.components[name] - value), name).toBeLessThanOrEqual(0.005 * value);
    }
    const total = Object.values(terms).reduce((a, b) => a + b, 0);
    // §6: the distance the reported decimals move the point (Vincenty inverse, geodesy 2.4.0) is added, then
    // the total is rounded up to a whole meter.
    const shift = got.distanceTo(new LatLon(Number(body.darwinCore.decimalLatitude), Number(body.darwinCore.decimalLongitude)));
    const reported = Number(body.darwinCore.coordinateUncertaintyInMeters);
    expect(reported).toBe(Math.ceil(body.georeference.uncertaintyMeters + shift));
    expect(Math.abs(reported - Math.ceil(total + shift))).toBeLessThanOrEqual(0.005 * total);
    expect(body.darwinCore.georeferenceVerificationStatus).toBe('requires verification');
    expect(body.darwinCore.geodeticDatum).toBe('EPSG:4326');
  });

  it('prints the answer as a GeoJSON FeatureCollection with --format geojson (RFC 7946 §3.1.1, §3.3)', async () => {
    const { stdout } = await whereabouts('locate', '10 km NE of Vila Serena', '--country-code', 'QV', '--format', 'geojson', '--db', db);
    const collection = JSON.parse(stdout);
    expect(collection.type).toBe('FeatureCollection');
    const [point, footprint] = collection.features;
    // Positions are [longitude, latitude], the reported (rounded) decimals of the Darwin Core terms.
    expect(point.geometry.coordinates).toEqual([Number(point.properties.decimalLongitude), Number(point.properties.decimalLatitude)]);
    expect(point.properties.locality).toBe('10 km NE of Vila Serena');
    expect(footprint.geometry.type).toMatch(/Polygon/);
  });

  it('says why when the text names no place', async () => {
    const { stdout } = await whereabouts('--db', db, 'locate', 'locality unknown', '--json');
    const body = JSON.parse(stdout);
    expect(body.status).toBe('unparseable');
    expect(body.darwinCore.georeferenceVerificationStatus).toBe('unable to georeference');
    expect(body.darwinCore.georeferenceRemarks).not.toBe('');
    expect(body.georeference).toBeUndefined();
  });
});

describe('whereabouts batch', () => {
  it('returns every row of the demo file with its original columns unchanged', async () => {
    const out = join(dir, 'out.csv');
    await whereabouts('--db', db, 'batch', 'gazetteer/demo-localities.csv', '--out', out, '--quiet');
    const input = parse(readFileSync(join(root, 'gazetteer/demo-localities.csv')), { columns: false }) as string[][];
    const output = parse(readFileSync(out), { columns: false }) as string[][];
    expect(output.length).toBe(input.length);
    const header = input[0];
    expect(output[0].slice(0, header.length)).toEqual(header);
    for (let i = 1; i < input.length; i++) expect(output[i].slice(0, header.length)).toEqual(input[i]);

    const status = output[0].findIndex((c) => c.endsWith('georeferenceVerificationStatus'));
    const allowed = ['requires verification', 'requires georeference', 'unable to georeference'];
    for (const row of output.slice(1)) expect(allowed).toContain(row[status]);
  });
});

describe('clear errors', () => {
  it('names a missing gazetteer and a missing import file, exit status 1', async () => {
    const missingDb = whereabouts('--db', join(dir, 'none.sqlite'), 'locate', 'Vila Serena');
    await expect(missingDb).rejects.toMatchObject({ code: 1, stderr: expect.stringMatching(/no gazetteer at .*none\.sqlite: import one first/) });
    const missingFile = whereabouts('--db', db, 'import', join(dir, 'none.csv'));
    await expect(missingFile).rejects.toMatchObject({ code: 1, stderr: expect.stringMatching(/cannot read .*none\.csv: no such file/) });
  });
});


describe('the reading for a person', () => {
  it('summarises the footprint instead of printing its coordinates', async () => {
    const { stdout } = await whereabouts('locate', '10 km NE of Vila Serena', '--country-code', 'QV', '--db', db);
    const line = stdout.split('\n').find((l) => l.trimStart().startsWith('footprintWKT:'));
    // A 64-gon inscribed in the circle: area = (n/2) r² sin(2π/n), r the unrounded radius (elementary geometry).
    const body = JSON.parse((await whereabouts('locate', '10 km NE of Vila Serena', '--country-code', 'QV', '--json', '--db', db)).stdout);
    const r = body.georeference.uncertaintyMeters;
    const expectedKm2 = (32 * r * r * Math.sin((2 * Math.PI) / 64)) / 1e6;
    expect(line).toBe(`  footprintWKT: Polygon, 64 vertices, ${expectedKm2.toFixed(1)} km² (the WKT itself: --json)`);
    expect(stdout).not.toMatch(/POLYGON/);
  });
});
