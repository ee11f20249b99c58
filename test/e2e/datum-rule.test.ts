/**
 * One datum rule for the CLI, the HTTP service and batches: a datum given with the record (the CLI's
 * --geodetic-datum, the body's geodeticDatum or options.datum, a batch's geodeticDatum column) applies to
 * every coordinate pair whose datum is not written beside it; a datum written beside the coordinates wins;
 * "not recorded" states none; an unknown value is refused with how to name a datum. Real CLI in child
 * processes, the real service through inject, a real SQLite file with the demo gazetteer.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inverse } from '../../src/geodesy/geodesic.ts';
import { buildServer } from '../../src/server/app.ts';
import { demoDatabase, type TempDatabase } from '../server/helpers.ts';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const cli = join(root, 'bin/whereabouts.js');
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-datum-'));

// WGS 72 (EPSG:4322), whose area of use is the whole world, so the demo island lies inside it. The shift
// itself is checked against the EPSG dataset in test/geodesy/datums.test.ts; here the rule: a datum given
// with the record must move the point exactly as the same datum written beside the coordinates does.
const WRITTEN = '45.3010 S, 131.2000 W';
let wgs72Latitude: number;
let wgs72Longitude: number;
/** Method §5.4 (Chapman & Wieczorek 2020, §Uncertainty from Unknown Datum): 5359 m when no datum is stated. */
const UNKNOWN_DATUM_METERS = 5359;

let db: TempDatabase;
let app: FastifyInstance;

beforeAll(async () => {
  db = await demoDatabase();
  app = await buildServer({ dbPath: db.dbPath });
  const writtenBeside = await locate(`${WRITTEN} WGS 72`);
  expect(writtenBeside.darwinCore.georeferenceRemarks).toContain('EPSG:4322 as written ("WGS 72")');
  ({ latitude: wgs72Latitude, longitude: wgs72Longitude } = writtenBeside.georeference);
  // WGS 72 → WGS 84 moves a point by a few meters (EPSG:1237: 4.5 m up and a 0.554″ rotation about z).
  expect(inverse(wgs72Latitude, wgs72Longitude, -45.301, -131.2).meters).toBeGreaterThan(5);
});
afterAll(async () => {
  await app?.close();
  db?.remove();
});

async function locate(...args: string[]) {
  const { stdout } = await run(process.execPath, [cli, '--db', db.dbPath, 'locate', ...args, '--json'], { cwd: root });
  return JSON.parse(stdout);
}

function expectShiftedByWgs72(body: { georeference: { latitude: number; longitude: number } }) {
  expect(inverse(body.georeference.latitude, body.georeference.longitude, wgs72Latitude, wgs72Longitude).meters).toBeLessThan(0.001);
}

describe('the CLI', () => {
  it('applies --geodetic-datum to coordinates written in the text that name no datum', async () => {
    const body = await locate(WRITTEN, '--geodetic-datum', 'WGS 72');
    expectShiftedByWgs72(body);
    // EPSG:1237's stated accuracy, 2 m (EPSG dataset; the table in src/geodesy/datums.ts).
    expect(body.components.datum).toBe(2);
    expect(body.darwinCore.georeferenceRemarks).toContain('EPSG:4322 as given with the record');
  });

  it('applies it to --verbatim-coordinates too, the same way', async () => {
    const body = await locate('Vila Serena', '--verbatim-coordinates', WRITTEN, '--geodetic-datum', 'EPSG:4322');
    expectShiftedByWgs72(body);
    expect(body.components.datum).toBe(2);
  });

  it('lets a datum written beside the coordinates win over the option', async () => {
    const body = await locate(`${WRITTEN} WGS84`, '--geodetic-datum', 'WGS 72');
    expect(body.components.datum).toBe(0);
    expect(body.georeference.latitude).toBeCloseTo(-45.301, 9);
  });

  it('reads "not recorded" as no datum stated', async () => {
    const body = await locate(WRITTEN, '--geodetic-datum', 'not recorded');
    expect(body.components.datum).toBe(UNKNOWN_DATUM_METERS);
  });

  it.each(['banana', 'EPSG:99999'])('refuses %s with how to name a datum, exit status 1', async (value) => {
    await expect(locate(WRITTEN, '--geodetic-datum', value)).rejects.toMatchObject({
      code: 1,
      stderr: expect.stringMatching(new RegExp(`"${value}" is not a datum whereabouts knows: name a datum by its EPSG code or a known name: EPSG:4326 \\(WGS 84\\)`)),
    });
  });
});

describe('the HTTP service', () => {
  const georeference = (payload: object) => app.inject({ method: 'POST', url: '/api/v1/georeference', payload });

  it('applies geodeticDatum and options.datum to coordinates written in the text', async () => {
    for (const payload of [{ locality: WRITTEN, geodeticDatum: 'WGS72' }, { locality: WRITTEN, options: { datum: 'EPSG:4322' } }]) {
      const response = await georeference(payload);
      expect(response.statusCode).toBe(200);
      expectShiftedByWgs72(response.json());
      expect(response.json().components.datum).toBe(2);
    }
  });

  it.each([
    ['geodeticDatum', { locality: WRITTEN, geodeticDatum: 'banana' }],
    ['options.datum', { locality: WRITTEN, options: { datum: 'EPSG:99999' } }],
  ])('refuses an unknown %s with 400, naming the field and how to name a datum', async (field, payload) => {
    const response = await georeference(payload);
    expect(response.statusCode).toBe(400);
    expect(JSON.stringify(response.json())).toContain(field);
    expect(JSON.stringify(response.json())).toContain('name a datum by its EPSG code or a known name');
  });
});

describe('a batch', () => {
  it('applies each row\'s geodeticDatum to its written coordinates and refuses an unknown one in that row\'s remarks', async () => {
    const input = join(dir, 'datums.csv');
    const output = join(dir, 'datums.out.csv');
    writeFileSync(input, `occurrenceID,locality,geodeticDatum\nd1,"${WRITTEN}",WGS 72\nd2,"${WRITTEN}",banana\nd3,"${WRITTEN}",not recorded\n`);
    await run(process.execPath, [cli, '--db', db.dbPath, 'batch', input, '--out', output, '--quiet'], { cwd: root });
    const rows = parse(readFileSync(output), { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.occurrenceID)).toEqual(['d1', 'd2', 'd3']);
    expect(rows[0]!.georeferenceRemarks).toContain('EPSG:4322 as given with the record');
    // Written to 4 decimals (the precision written): within 0.00005° on each axis, about 8 m here.
    expect(inverse(Number(rows[0]!.decimalLatitude), Number(rows[0]!.decimalLongitude), wgs72Latitude, wgs72Longitude).meters).toBeLessThan(8);
    expect(rows[1]!.georeferenceVerificationStatus).toBe('unable to georeference');
    expect(rows[1]!.georeferenceRemarks).toContain('geodeticDatum "banana" is not a datum whereabouts knows');
    expect(rows[2]!.georeferenceRemarks).toContain('datum not recorded');
  });
});
