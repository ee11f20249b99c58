/**
 * Batch upload and review through a real server: the demo batch file is uploaded, runs to the end,
 * is listed, a record is accepted, another rejected, one given another candidate, and the reviewed
 * file comes back with every original column untouched and the new statuses (Darwin Core
 * georeferenceVerificationStatus recommended values: "verified by data custodian", "requires georeference").
 */
import { methodChoiceValues } from '../../src/georef/method-choices.ts';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jobProgress, jobsDatabasePath } from '../../src/batch/index.ts';
import { parseLocality } from '../../src/parse/index.ts';
import { openGazetteer } from '../../src/store/gazetteer-store.ts';
import { buildServer } from '../../src/server/app.ts';
import { gdalAvailable, ogrFeatures } from '../support/gdal.ts';
import { DEMO_LOCALITIES, demoDatabase, listen, uploadThenStop, type RunningServer, type TempDatabase } from './helpers.ts';

let db: TempDatabase;
let server: RunningServer;

beforeAll(async () => {
  db = await demoDatabase();
  server = await listen({ dbPath: db.dbPath, uploadLimit: 200_000 });
});
afterAll(async () => {
  await server?.close();
  db?.remove();
});

async function upload(bytes: Uint8Array, name = 'records.csv', field = 'file') {
  const form = new FormData();
  form.append(field, new Blob([new Uint8Array(bytes)], { type: 'text/csv' }), name);
  const response = await fetch(`${server.url}/api/v1/batches`, { method: 'POST', body: form });
  return { status: response.status, json: (await response.json()) as any };
}

async function finished(jobId: string) {
  for (let i = 0; i < 300; i++) {
    const progress = await (await fetch(`${server.url}/api/v1/batches/${jobId}`)).json();
    if (progress.state === 'done' || progress.state === 'failed') return progress;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('the job did not finish in 30 s');
}

const json = async (path: string, init?: RequestInit) => {
  const response = await fetch(`${server.url}${path}`, init);
  return { status: response.status, body: (await response.json()) as any };
};
/** An appended term: `proposed_<term>` where the input already had the column (issue 2 batch contract). */
const term = (row: Record<string, string>, name: string) => row[`proposed_${name}`] ?? row[name];
const put = (path: string, body: unknown) => json(path, { method: 'PUT', body: JSON.stringify(body), headers: { 'content-type': 'application/json' } });

describe('a batch from upload to reviewed file', () => {
  let jobId: string;

  it('uploads the demo file and runs it to the end', async () => {
    const started = await upload(readFileSync(DEMO_LOCALITIES));
    expect(started.status).toBe(202);
    jobId = started.json.jobId;
    const progress = await finished(jobId);
    expect(progress.state).toBe('done');
    expect(progress.fraction).toBe(1);
    expect(progress.outputPath).toBeUndefined(); // no server path is ever shown
    expect(progress.methodChoices).toEqual(methodChoiceValues()); // the values the job used, to reproduce it
  });

  it('lists every record with facets, and filters them', async () => {
    const input = parse(readFileSync(DEMO_LOCALITIES), { columns: true }) as Record<string, string>[];
    const { body } = await json(`/api/v1/batches/${jobId}/records`);
    expect(body.total).toBe(input.length);
    expect(body.records.map((r: any) => r.locality)).toEqual(input.map((r) => r.locality.replace(/\s+/g, ' ').trim()));
    expect(body.facets.status).toContain('requires verification');
    const georeferenced = await json(`/api/v1/batches/${jobId}/records?status=${encodeURIComponent('requires verification')}&radiusMin=1`);
    expect(georeferenced.body.records.length).toBeGreaterThan(0);
    expect(georeferenced.body.records.every((r: any) => r.status === 'requires verification' && r.radiusMeters >= 1)).toBe(true);
    const bad = await json(`/api/v1/batches/${jobId}/records?radiusMin=-5`);
    expect(bad.status).toBe(400);
    expect(bad.body.field).toBe('radiusMin');
  });

  it('gives each record the locality type the batch read it as (kept with the job, not parsed again)', async () => {
    const input = parse(readFileSync(DEMO_LOCALITIES), { columns: true }) as Record<string, string>[];
    const { body } = await json(`/api/v1/batches/${jobId}/records`);
    // The parser itself is the reference: what parseLocality says of the text, or "coordinates" where the
    // record's readable verbatimCoordinates were used (both rows of the demo file that have them).
    body.records.forEach((r: any, i: number) => expect(r.localityType).toBe(input[i].verbatimCoordinates ? 'coordinates' : parseLocality(r.locality).type));
    expect(body.facets.localityType).toEqual([...new Set(body.records.map((r: any) => r.localityType))].filter(Boolean).sort());
  });

  it('accepts, rejects and re-picks records, and stores who and when', async () => {
    const { body } = await json(`/api/v1/batches/${jobId}/records?status=${encodeURIComponent('requires verification')}`);
    const [first, second] = body.records;
    const accepted = await put(`/api/v1/batches/${jobId}/records/${first.row}/review`, { decision: 'accepted', reviewer: 'A. Curator' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.reviewer).toBe('A. Curator');
    expect(Date.parse(accepted.body.decidedAt)).toBeGreaterThan(Date.now() - 60_000);
    await put(`/api/v1/batches/${jobId}/records/${second.row}/review`, { decision: 'rejected', reviewer: 'A. Curator' });
    const detail = await json(`/api/v1/batches/${jobId}/records/${first.row}`);
    expect(detail.body.review.decision).toBe('accepted');
    expect(detail.body.answer.status).toBe('georeferenced');

    const bogus = await put(`/api/v1/batches/${jobId}/records/${first.row}/review`, { decision: 'maybe', reviewer: 'x' });
    expect(bogus.status).toBe(400);
    expect(bogus.body.field).toBe('decision');
    const missing = await put(`/api/v1/batches/${jobId}/records/99999/review`, { decision: 'accepted', reviewer: 'x' });
    expect(missing.status).toBe(404);

    const download = await fetch(`${server.url}/api/v1/batches/${jobId}/reviewed.csv`);
    expect(download.headers.get('content-disposition')).toMatch(/attachment/);
    const rows = parse(await download.text(), { columns: true }) as Record<string, string>[];
    const input = parse(readFileSync(DEMO_LOCALITIES), { columns: true }) as Record<string, string>[];
    expect(rows.length).toBe(input.length);
    rows.forEach((row, i) => {
      for (const [column, value] of Object.entries(input[i])) if (!['decimalLatitude', 'decimalLongitude', 'geodeticDatum'].includes(column)) expect(row[column]).toBe(value);
      for (const column of ['decimalLatitude', 'decimalLongitude', 'geodeticDatum']) expect(row[column]).toBe(input[i][column]);
    });
    expect(term(rows[first.row - 1], 'georeferenceVerificationStatus')).toBe('verified by data custodian');
    expect(term(rows[first.row - 1], 'georeferenceRemarks')).toMatch(/verified by A\. Curator on \d{4}-\d\d-\d\dT/);
    expect(term(rows[second.row - 1], 'georeferenceVerificationStatus')).toBe('requires georeference');
    expect(term(rows[second.row - 1], 'decimalLatitude')).toBe('');
    expect(term(rows[second.row - 1], 'georeferenceRemarks')).toMatch(/proposed georeference rejected \(was -45\./);

    // The same reviewed rows for a GIS: GeoJSON (RFC 7946) and a GeoPackage that GDAL's ogrinfo reads.
    const geojson = await (await fetch(`${server.url}/api/v1/batches/${jobId}/reviewed.geojson`)).json();
    expect(geojson.features.map((f: { properties: Record<string, string> }) => f.properties.georeferenceVerificationStatus)).toEqual(rows.map((r) => term(r, 'georeferenceVerificationStatus')));
    expect(geojson.features[second.row - 1].geometry).toBeNull();
    const gpkg = await fetch(`${server.url}/api/v1/batches/${jobId}/reviewed.gpkg`);
    expect(gpkg.headers.get('content-disposition')).toMatch(/attachment; filename="whereabouts-reviewed-.*\.gpkg"/);
    const bytes = Buffer.from(await gpkg.arrayBuffer());
    expect(bytes.subarray(0, 16).toString('latin1')).toBe('SQLite format 3\0');
    if (gdalAvailable('test/server/batch.test.ts (reviewed.gpkg)')) {
      const path = join(mkdtempSync(join(tmpdir(), 'whereabouts-reviewed-')), 'reviewed.gpkg');
      writeFileSync(path, bytes);
      expect(ogrFeatures(path, 'points').map((f) => f.fields.georeferenceVerificationStatus)).toEqual(rows.map((r) => term(r, 'georeferenceVerificationStatus')));
    }
  });

  it('takes another candidate for an ambiguous record and recomputes its terms', async () => {
    const { body } = await json(`/api/v1/batches/${jobId}/records?status=${encodeURIComponent('requires georeference')}&review=pending`);
    const ambiguous = [];
    for (const r of body.records) {
      const detail = await json(`/api/v1/batches/${jobId}/records/${r.row}`);
      if (detail.body.answer.status === 'ambiguous' && detail.body.answer.interpretation.features.length === 1) ambiguous.push(detail.body);
    }
    expect(ambiguous.length).toBeGreaterThan(0);
    const record = ambiguous[0];
    const candidate = { sourceId: record.answer.candidates[1].feature.sourceId, featureId: record.answer.candidates[1].feature.featureId };
    const picked = await put(`/api/v1/batches/${jobId}/records/${record.row}/review`, { decision: 'accepted', reviewer: 'B. Keeper', candidate });
    expect(picked.status).toBe(200);
    const rows = parse(await (await fetch(`${server.url}/api/v1/batches/${jobId}/reviewed.csv`)).text(), { columns: true }) as Record<string, string>[];
    const row = rows[record.row - 1];
    expect(term(row, 'georeferenceVerificationStatus')).toBe('verified by data custodian');
    expect(term(row, 'georeferencedBy')).toBe('B. Keeper');
    expect(term(row, 'georeferenceSources')).toContain(candidate.featureId);
    // The chosen feature's corrected center: for a point feature, its own coordinates (Method §4), read from
    // gazetteer/demo.geojson; the reported latitude may differ from it only by the rounding of its decimals (§6).
    const demo = JSON.parse(readFileSync(new URL('../../gazetteer/demo.geojson', import.meta.url), 'utf8'));
    const chosen = demo.features.find((f: any) => f.properties.id === candidate.featureId);
    expect(chosen.geometry.type).toBe('Point');
    const reported = term(row, 'decimalLatitude');
    const decimals = reported.split('.')[1]?.length ?? 0;
    expect(Math.abs(Number(reported) - chosen.geometry.coordinates[1])).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-12);
  });
});

describe('uploads are checked by content and size', () => {
  it('refuses a workbook even when it is named .csv', async () => {
    const zip = Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00]);
    const { status, json: body } = await upload(zip, 'records.csv');
    expect(status).toBe(415);
    expect(body.message).toMatch(/ZIP archive .*not CSV text/);
  });

  it('accepts CSV text whatever its name', async () => {
    const { status } = await upload(Buffer.from('locality,countryCode\nPuerto Lindo,QV\n'), 'export.xlsx');
    expect(status).toBe(202);
  });

  it('refuses binary data, an empty file, a file without a locality column, and a missing file field', async () => {
    expect((await upload(Buffer.from('locality\n\u0000\u0001\u0002'))).status).toBe(415);
    const empty = await upload(new Uint8Array());
    expect(empty.status).toBe(400);
    expect(empty.json.message).toMatch(/empty/);
    const noLocality = await upload(Buffer.from('name,country\nX,Y\n'));
    expect(noLocality.status).toBe(400);
    expect(noLocality.json.message).toMatch(/no "locality" or "verbatimLocality" column/);
    const wrongField = await upload(Buffer.from('locality\nX\n'), 'a.csv', 'data');
    expect(wrongField.status).toBe(400);
    expect(wrongField.json.field).toBe('file');
  });

  it('answers 413 for an upload over the limit, and keeps answering', async () => {
    const big = Buffer.alloc(300_000, 'a');
    big.write('locality\n');
    const { status, json: body } = await upload(big);
    expect(status).toBe(413);
    expect(body.message).toMatch(/larger than the upload limit of 200000 bytes/);
    expect((await fetch(`${server.url}/api/v1/layers`)).status).toBe(200);
  });

  it('never takes a path from a job id', async () => {
    expect((await fetch(`${server.url}/api/v1/batches/..%2F..%2Fetc%2Fpasswd`)).status).toBe(400);
    expect((await fetch(`${server.url}/api/v1/batches/no-such-job`)).status).toBe(404);
  });
});

describe('a stop during a batch', () => {
  it('SIGTERM stops the service; the next start resumes the job, with every row once', async () => {
    const rows = Array.from({ length: 4000 }, (_, i) => `occ-${i + 1},${(i + 1) / 10} km NE of Puerto Lindo,QV`);
    const csv = Buffer.from(['occurrenceID,locality,countryCode', ...rows].join('\n'));
    const { jobId, uploadStatus, exitCode } = await uploadThenStop(db.dbPath, csv, 'many.csv');
    expect(uploadStatus).toBe(202);
    expect(exitCode).toBe(0);
    expect(jobProgress(jobsDatabasePath(db.dbPath), jobId).state).not.toBe('done'); // it was stopped part-way

    const second = await buildServer({ dbPath: db.dbPath });
    try {
      let progress: any;
      for (let i = 0; i < 1200; i++) {
        progress = (await second.inject({ url: `/api/v1/batches/${jobId}` })).json();
        if (progress.state === 'done' || progress.state === 'failed') break;
        await new Promise((r) => setTimeout(r, 100));
      }
      expect(progress.state).toBe('done');
      const out = parse((await second.inject({ url: `/api/v1/batches/${jobId}/reviewed.csv` })).body, { columns: true }) as Record<string, string>[];
      expect(out.map((r) => r.occurrenceID)).toEqual(rows.map((r) => r.split(',')[0]));
      expect(out.every((r) => r.georeferenceVerificationStatus === 'requires verification')).toBe(true);
    } finally {
      await second.close();
    }
  });
});

describe('a semicolon-delimited upload with decimal commas (the usual export where the decimal separator is a comma)', () => {
  // Invented records on the demo island; Vila Serena is at -45.301038, -131 in gazetteer/demo.geojson.
  const input = [
    'occurrenceID;locality;countryCode;decimalLatitude;decimalLongitude',
    'sc-1;Vila Serena;QV;-45,3010;-131,0000',
    'sc-2;"Puerto Lindo; muelle ""viejo""";QV;;',
    'sc-3;Vila Serena;QV;45,3010;-131,0000',
    '',
  ].join('\r\n');
  let jobId: string;

  it('runs to the end, lists its records and shows one with the record\'s own coordinates read', async () => {
    const started = await upload(Buffer.from(input, 'utf8'), 'export.csv');
    expect(started.status).toBe(202);
    jobId = started.json.jobId;
    expect((await finished(jobId)).state).toBe('done');
    const list = await json(`/api/v1/batches/${jobId}/records`);
    expect(list.status).toBe(200);
    expect(list.body.records.map((r: any) => r.locality)).toEqual(['Vila Serena', 'Puerto Lindo; muelle "viejo"', 'Vila Serena']);
    // The coordinate check reads "-45,3010" as -45.301 (README, Batches): inside the circle, and a sign flip for sc-3.
    expect(list.body.records[0].flags).toEqual(['agrees-with-locality']);
    expect(list.body.records[2].flags).toContain('fits-if-latitude-sign-flipped');
    const detail = await json(`/api/v1/batches/${jobId}/records/1`);
    expect(detail.status).toBe(200);
    expect(detail.body.original).toEqual({ occurrenceID: 'sc-1', locality: 'Vila Serena', countryCode: 'QV', decimalLatitude: '-45,3010', decimalLongitude: '-131,0000' });
    expect(detail.body.answer.recordPoint.latitude).toBeCloseTo(-45.301, 6);
    expect(detail.body.answer.recordPoint.withinUncertainty).toBe(true);
  });

  it('gives back the reviewed file semicolon-delimited, every original value byte for byte', async () => {
    expect((await put(`/api/v1/batches/${jobId}/records/1/review`, { decision: 'accepted', reviewer: 'C. Curator' })).status).toBe(200);
    const download = await fetch(`${server.url}/api/v1/batches/${jobId}/reviewed.csv`);
    expect(download.status).toBe(200);
    const text = await download.text();
    const lines = input.split('\r\n').filter(Boolean);
    let at = -1;
    for (const line of lines) {
      at = text.indexOf(`${line};`, at + 1);
      expect(at, line).toBeGreaterThanOrEqual(0);
    }
    // Read by csv-parse's strict RFC 4180 mode, with the semicolon as delimiter: the same values.
    const rows = parse(text, { delimiter: ';', columns: true, relax_quotes: false }) as Record<string, string>[];
    expect(rows.map((r) => [r.occurrenceID, r.locality, r.decimalLatitude])).toEqual([
      ['sc-1', 'Vila Serena', '-45,3010'], ['sc-2', 'Puerto Lindo; muelle "viejo"', ''], ['sc-3', 'Vila Serena', '45,3010'],
    ]);
    expect(term(rows[0], 'georeferenceVerificationStatus')).toBe('verified by data custodian');
  });

  it('reads the same upload after a first line "sep=;" (common practice of spreadsheet exports, no published source), and keeps the line in the reviewed file', async () => {
    const started = await upload(Buffer.from(`sep=;\r\n${input}`, 'utf8'), 'export-sep.csv');
    expect(started.status).toBe(202);
    const sepJob = started.json.jobId as string;
    expect((await finished(sepJob)).state).toBe('done');
    const list = await json(`/api/v1/batches/${sepJob}/records`);
    expect(list.body.records.map((r: any) => r.locality)).toEqual(['Vila Serena', 'Puerto Lindo; muelle "viejo"', 'Vila Serena']);
    expect((await put(`/api/v1/batches/${sepJob}/records/1/review`, { decision: 'accepted', reviewer: 'C. Curator' })).status).toBe(200);
    const text = await (await fetch(`${server.url}/api/v1/batches/${sepJob}/reviewed.csv`)).text();
    expect(text.startsWith(`sep=;\r\n${input.split('\r\n')[0]};`)).toBe(true);
    const rows = parse(text.slice('sep=;\r\n'.length), { delimiter: ';', columns: true, relax_quotes: false }) as Record<string, string>[];
    expect(rows.map((r) => [r.occurrenceID, r.locality, r.decimalLatitude])).toEqual([
      ['sc-1', 'Vila Serena', '-45,3010'], ['sc-2', 'Puerto Lindo; muelle "viejo"', ''], ['sc-3', 'Vila Serena', '45,3010'],
    ]);
  });
});

describe('an upload to a service whose gazetteer holds no source', () => {
  it('answers 409 saying how to load one, without the store\'s path', async () => {
    const empty = await demoDatabase();
    const store = openGazetteer(empty.dbPath);
    for (const source of store.sources()) store.removeSource(source.id);
    store.close();
    const service = await listen({ dbPath: empty.dbPath, uploadLimit: 200_000 });
    try {
      const form = new FormData();
      form.append('file', new Blob([Buffer.from('locality,countryCode\nVila Serena,QV\n')], { type: 'text/csv' }), 'records.csv');
      const response = await fetch(`${service.url}/api/v1/batches`, { method: 'POST', body: form });
      const body = (await response.json()) as { message: string };
      expect(response.status).toBe(409);
      expect(body.message).toMatch(/holds no source.*whereabouts import/);
      expect(body.message).not.toContain(empty.dir);
    } finally {
      await service.close();
      empty.remove();
    }
  });
});

describe('accepting needs a point', () => {
  // Row 1 is found; row 2 is the same text with the latitude's sign lost; row 3 names no known place
  // but carries coordinates; row 4 names no known place and has none.
  let jobId: string;
  let proposed: { latitude: string; longitude: string };

  beforeAll(async () => {
    const found = (await json('/api/v1/georeference', { method: 'POST', body: JSON.stringify({ locality: '10 km NE of Puerto Lindo', countryCode: 'QV' }), headers: { 'content-type': 'application/json' } })).body;
    proposed = { latitude: found.darwinCore.decimalLatitude, longitude: found.darwinCore.decimalLongitude };
    const csv = [
      'occurrenceID,locality,countryCode,decimalLatitude,decimalLongitude',
      `a1,10 km NE of Puerto Lindo,QV,${proposed.latitude},${proposed.longitude}`,
      `a2,10 km NE of Puerto Lindo,QV,${proposed.latitude.replace(/^-/, '')},${proposed.longitude}`,
      'a3,Qzxv Wrrp,QV,-45.3010,-131.0000',
      'a4,Qzxv Wrrp,QV,,',
    ].join('\r\n');
    jobId = (await upload(Buffer.from(csv))).json.jobId;
    expect((await finished(jobId)).state).toBe('done');
  });

  const review = (row: number, body: object) => put(`/api/v1/batches/${jobId}/records/${row}/review`, { decision: 'accepted', reviewer: 'C. Checker', ...body });
  const reviewed = async () => parse(await (await fetch(`${server.url}/api/v1/batches/${jobId}/reviewed.csv`)).text(), { columns: true }) as Record<string, string>[];

  it('refuses an accept of a record with no point, naming why and what to do', async () => {
    const refused = await review(4, {});
    expect(refused.status).toBe(409);
    expect(refused.body.field).toBe('decision');
    expect(refused.body.message).toMatch(/row 4 has no point to verify \(requires georeference\).*choose a candidate, give a corrected locality, or accept the record's own coordinates/);
    const noOwn = await review(4, { recordCoordinates: true });
    expect(noOwn.status).toBe(409);
    expect(noOwn.body.message).toMatch(/no coordinates of its own/);
    const stillNone = await review(4, { locality: 'Qzxv Wrrp again' });
    expect(stillNone.status).toBe(409);
    expect(stillNone.body.message).toMatch(/no point to verify \(not-found/);
    // Rejecting needs no point.
    expect((await review(4, { decision: 'rejected' })).status).toBe(200);
    expect((await reviewed())[3].georeferenceVerificationStatus).toBe('requires georeference');
  });

  it('accepts a corrected locality, georeferenced through the same lookup, the original text kept', async () => {
    const preview = await json(`/api/v1/batches/${jobId}/records/3?locality=${encodeURIComponent('10 km NE of Puerto Lindo')}`);
    expect(preview.body.answer.status).toBe('georeferenced');
    expect(preview.body.resolutionNote).toMatch(/corrected by the reviewer/);
    expect((await review(3, { locality: '10 km NE of Puerto Lindo' })).status).toBe(200);
    const row = (await reviewed())[2];
    expect(row.locality).toBe('Qzxv Wrrp');
    expect(row.georeferenceVerificationStatus).toBe('verified by data custodian');
    expect(row.decimalLatitude).toBe('-45.3010'); // the record's own column, unchanged
    expect(term(row, 'decimalLatitude')).toBe(proposed.latitude);
    expect(term(row, 'georeferenceRemarks')).toMatch(/locality text corrected by the reviewer to "10 km NE of Puerto Lindo"/);
  });

  it("accepts the record's own coordinates, with the sign error the coordinate check found corrected and said", async () => {
    const detail = (await json(`/api/v1/batches/${jobId}/records/2`)).body;
    expect(detail.flags).toContain('fits-if-latitude-sign-flipped');
    expect((await review(2, { recordCoordinates: true })).status).toBe(200);
    const row = (await reviewed())[1];
    expect(row.georeferenceVerificationStatus).toBe('verified by data custodian');
    expect(Number(term(row, 'decimalLatitude'))).toBeCloseTo(Number(proposed.latitude), 4);
    expect(Number(term(row, 'decimalLongitude'))).toBeCloseTo(Number(proposed.longitude), 4);
    expect(term(row, 'georeferenceRemarks')).toMatch(/record's own coordinates \([0-9.]+, -[0-9.]+\) with the sign of latitude inverted, as the coordinate check found/);
    // The record's own columns are never changed.
    expect(row.decimalLatitude).toBe(proposed.latitude.replace(/^-/, ''));
  });

  it('checks the resolution fields like every other field', async () => {
    const empty = await review(3, { locality: '' });
    expect(empty.status).toBe(400);
    expect(empty.body.field).toBe('locality');
    const notBoolean = await review(3, { recordCoordinates: 'yes' });
    expect(notBoolean.status).toBe(400);
    expect(notBoolean.body.field).toBe('recordCoordinates');
    expect((await json(`/api/v1/batches/${jobId}/records/3?recordCoordinates=1`)).status).toBe(400);
  });

  it('accepts a record that already has a point without any resolution', async () => {
    expect((await review(1, {})).status).toBe(200);
    expect((await reviewed())[0].georeferenceVerificationStatus).toBe('verified by data custodian');
  });
});
