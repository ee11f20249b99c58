/**
 * A Darwin Core Archive uploaded to the batch route (fastify `inject`, over a real SQLite gazetteer): the
 * archive is built by the rules of the Darwin Core text guide (Darwin Core Maintenance Group 2023, TDWG,
 * http://rs.tdwg.org/dwc/terms/guides/text/, "guide §"; test/support/demo-archive.ts), told from CSV by
 * its bytes, its core georeferenced by the CLI's archive job, reviewed, and downloaded as a new archive,
 * CSV, GeoJSON (RFC 7946) and a GeoPackage that GDAL's ogrinfo reads. Zips are read back with yauzl,
 * XML with saxes, CSV with csv-parse: libraries independent of the code under test.
 */
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import type { FastifyInstance } from 'fastify';
import { SaxesParser } from 'saxes';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildServer } from '../../src/server/app.ts';
import { batchFolderPath } from '../../src/store/side-files.ts';
import { unzip } from '../batch/helpers.ts';
import { gdalAvailable, ogrFeatures } from '../support/gdal.ts';
import { ARCHIVE_FILES, coreBytes, coreRows, DWC, metaXml, multimedia, SHORT_ROW, writeManyRowArchive, zipFiles } from '../support/demo-archive.ts';
import { jobProgress, jobsDatabasePath } from '../../src/batch/index.ts';
import { DEMO_LOCALITIES, demoDatabase, uploadThenStop, type TempDatabase } from './helpers.ts';

let db: TempDatabase;
let app: FastifyInstance;
let archive: Buffer;
const files = mkdtempSync(join(tmpdir(), 'whereabouts-upload-archive-'));

/** The demo archive's files, zipped, as bytes. */
async function zipped(name: string, entries: [string, Buffer][]): Promise<Buffer> {
  const path = join(files, name);
  await zipFiles(path, entries);
  return readFileSync(path);
}

beforeAll(async () => {
  db = await demoDatabase();
  app = await buildServer({ dbPath: db.dbPath, uploadLimit: 200_000, rateLimit: false });
  archive = await zipped('dwca.zip', ARCHIVE_FILES);
}, 60_000);
afterAll(async () => {
  await app?.close();
  db?.remove();
});

async function upload(bytes: Buffer, name: string, server = app) {
  const form = new FormData();
  form.append('file', new Blob([new Uint8Array(bytes)], { type: 'application/octet-stream' }), name);
  const response = await server.inject({ method: 'POST', url: '/api/v1/batches', payload: form });
  return { status: response.statusCode, body: response.json() };
}

async function finished(jobId: string, server = app) {
  for (let i = 0; i < 1200; i++) {
    const progress = (await server.inject({ url: `/api/v1/batches/${jobId}` })).json();
    if (progress.state === 'done' || progress.state === 'failed') return progress;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('the job did not finish in 120 s');
}

const get = (url: string) => app.inject({ url });
const core = (rows: string[][]) => ({ header: rows[0], body: rows.slice(1) });
/** Elements of an XML document (saxes), with their attributes. */
function elements(xml: string): { name: string; attributes: Record<string, string> }[] {
  const parser = new SaxesParser({ xmlns: true });
  const found: { name: string; attributes: Record<string, string> }[] = [];
  parser.on('opentag', (tag) => found.push({ name: tag.local, attributes: Object.fromEntries(Object.values(tag.attributes).map((a) => [a.local, a.value])) }));
  parser.write(xml).close();
  return found;
}
// guide §2.4 default: an empty stateProvince (index 6) is the field's default, written as it in the core.
const expectedOriginals = (i: number) => coreRows[i].map((v, k) => (k === 6 && v === '' ? 'Poniente' : v));

describe('a Darwin Core Archive uploaded for a batch', () => {
  let jobId: string;
  let acceptedRow: number;

  it('is told by its bytes (here named .csv), georeferenced, and says it was an archive', async () => {
    const started = await upload(archive, 'records.csv');
    expect(started.status, JSON.stringify(started.body)).toBe(202);
    jobId = started.body.jobId;
    const progress = await finished(jobId);
    expect(progress.state).toBe('done');
    expect(progress.input).toBe('darwin-core-archive');
    expect(progress.rowsTotal).toBe(coreRows.length);
    expect(Object.keys(progress.downloads).sort()).toEqual(['csv', 'geojson', 'gpkg', 'zip']);
    expect(JSON.stringify(progress)).not.toContain(db.dir); // no server path is ever shown
  });

  it("lists every row of the archive's core, in order, each with a status", async () => {
    const { records, total } = (await get(`/api/v1/batches/${jobId}/records`)).json();
    expect(total).toBe(coreRows.length);
    expect(records.map((r: { row: number }) => r.row)).toEqual(coreRows.map((_, i) => i + 1));
    records.forEach((r: { locality: string; status: string }, i: number) => {
      expect(r.locality).toBe((coreRows[i][3] ?? '').replace(/\s+/g, ' ').trim());
      expect(['requires verification', 'requires georeference', 'unable to georeference']).toContain(r.status);
    });
    expect(records[SHORT_ROW].status).toBe('unable to georeference');
    // The record as it came, decoded from Windows-1252 as meta.xml says, with the constant of guide §2.4.
    const first = (await get(`/api/v1/batches/${jobId}/records/1`)).json();
    expect(first.original).toMatchObject({ occurrenceID: coreRows[0][0], locality: coreRows[0][3], decimalLatitude: '-45.1', note: 'note 0', countryCode: 'QV' });
    const accepted = records.find((r: { status: string }) => r.status === 'requires verification');
    acceptedRow = accepted.row;
    const review = await app.inject({ method: 'PUT', url: `/api/v1/batches/${jobId}/records/${acceptedRow}/review`, payload: { decision: 'accepted', reviewer: 'A. Curator' } });
    expect(review.statusCode).toBe(200);
  });

  it('comes back as a new archive: the Audubon Core extension byte for byte, the reviewed core described by meta.xml, a method step in eml.xml', async () => {
    const response = await get(`/api/v1/batches/${jobId}/reviewed.zip`);
    expect(response.statusCode).toBe(200);
    expect(response.headers['content-type']).toBe('application/zip');
    expect(response.headers['content-disposition']).toMatch(/attachment; filename="whereabouts-reviewed-.*\.zip"/);
    const path = join(files, 'reviewed.zip');
    writeFileSync(path, response.rawPayload);
    const entries = await unzip(path);
    const entry = (name: string) => entries.find((e) => e.name === name)!.bytes;
    // guide §2.1: extensions relate to the core by coreid; whereabouts leaves them untouched.
    expect(entries.map((e) => e.name)).toEqual(['meta.xml', 'eml.xml', 'occurrence.txt', 'multimedia.txt']);
    expect(entry('multimedia.txt').equals(multimedia)).toBe(true);
    const meta = elements(entry('meta.xml').toString('utf8'));
    expect(meta.find((e) => e.name === 'extension')!.attributes.rowType).toBe('http://rs.tdwg.org/ac/terms/Multimedia');
    expect(meta.find((e) => e.name === 'core')!.attributes).toMatchObject({ encoding: 'UTF-8', fieldsTerminatedBy: '\\t', ignoreHeaderLines: '1', rowType: `${DWC}Occurrence` });
    expect(elements(entry('eml.xml').toString('utf8')).filter((e) => e.name === 'methodStep')).toHaveLength(1);
    // guide §2.2: the new core as its meta.xml describes it (tab-separated, '"' enclosing, one header line).
    const { header, body } = core(parse(entry('occurrence.txt'), { delimiter: '\t', record_delimiter: '\r\n', quote: '"', relax_column_count: true }) as string[][]);
    expect(body).toHaveLength(coreRows.length);
    const status = header.indexOf('georeferenceVerificationStatus');
    body.forEach((row, i) => {
      expect(row.slice(0, coreRows[i].length)).toEqual(expectedOriginals(i));
      expect(row[status]).not.toBe('');
    });
    // Darwin Core georeferenceVerificationStatus recommended value for a record the custodian checked.
    expect(body[acceptedRow - 1][status]).toBe('verified by data custodian');
    expect(body[acceptedRow - 1][header.indexOf('georeferenceRemarks')]).toMatch(/verified by A\. Curator on /);
  });

  it('comes back as CSV (RFC 4180, comma-separated), GeoJSON and a GeoPackage that ogrinfo opens, every row with its status', async () => {
    const csv = await get(`/api/v1/batches/${jobId}/reviewed.csv`);
    expect(csv.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(csv.headers['content-disposition']).toMatch(/\.csv"$/);
    const rows = parse(csv.body, { columns: true, relax_column_count: true }) as Record<string, string>[];
    expect(rows.map((r) => r.occurrenceID)).toEqual(coreRows.map((r) => r[0]));
    const statuses = rows.map((r) => r.georeferenceVerificationStatus);
    expect(statuses.every((s) => s !== '')).toBe(true);
    expect(statuses[acceptedRow - 1]).toBe('verified by data custodian');
    expect(rows[0].locality).toBe(coreRows[0][3]);

    const geojson = (await get(`/api/v1/batches/${jobId}/reviewed.geojson`)).json();
    expect(geojson.type).toBe('FeatureCollection');
    expect(geojson.features.map((f: { properties: Record<string, string> }) => f.properties.georeferenceVerificationStatus)).toEqual(statuses);

    const gpkg = await get(`/api/v1/batches/${jobId}/reviewed.gpkg`);
    expect(gpkg.headers['content-type']).toBe('application/geopackage+sqlite3');
    // SQLite file format §1.3: the header string; a GeoPackage is an SQLite file (OGC 12-128 §1.1.1).
    expect(gpkg.rawPayload.subarray(0, 16).toString('latin1')).toBe('SQLite format 3\0');
    if (gdalAvailable('test/server/batch-archive.test.ts (reviewed.gpkg)')) {
      const path = join(files, 'reviewed.gpkg');
      writeFileSync(path, gpkg.rawPayload);
      const points = ogrFeatures(path, 'points');
      expect(points.map((f) => f.fields.occurrenceID)).toEqual(coreRows.map((r) => r[0]));
      expect(points.map((f) => f.fields.georeferenceVerificationStatus)).toEqual(statuses);
    }
  });
});

describe('an uploaded zip that is not a Darwin Core Archive, or too large', () => {
  const refused = async (bytes: Buffer, status: number, message: RegExp, server = app) => {
    const answer = await upload(bytes, 'upload.zip', server);
    expect(answer.status, JSON.stringify(answer.body)).toBe(status);
    expect(answer.body.field).toBe('file');
    expect(answer.body.message).toMatch(message);
    expect(answer.body.message).not.toContain(db.dir);
  };

  it('refuses a zip without meta.xml (guide §2.1), naming what it holds', async () => {
    await refused(await zipped('plain.zip', [['records.csv', Buffer.from('occurrenceID,locality\nx1,Vila Serena\n')]]), 415, /ZIP archive and not CSV text, nor a Darwin Core Archive: the uploaded zip has no meta\.xml .*its files: records\.csv/);
  });

  it('refuses a file that starts as a zip but cannot be read as one', async () => {
    await refused(Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04]), Buffer.alloc(200, 7)]), 415, /nor a Darwin Core Archive: the uploaded zip cannot be read as a zip \(cannot read it: /);
  });

  it('refuses a meta.xml with no core (guide §2.1: exactly one), and a core file the archive lacks (guide §2.3)', async () => {
    const noCore = metaXml.replace(/<core [\s\S]*<\/core>/, '');
    await refused(await zipped('no-core.zip', [['meta.xml', Buffer.from(noCore)], ['occurrence.txt', coreBytes]]), 400, /meta\.xml has no <core> element/);
    await refused(await zipped('no-core-file.zip', [['meta.xml', Buffer.from(metaXml)], ['multimedia.txt', multimedia]]), 400, /names the core file occurrence\.txt, which is not in the archive/);
  });

  it('still refuses a workbook (a zip too) as a workbook', async () => {
    await refused(await zipped('book.xlsx', [['[Content_Types].xml', Buffer.from('<Types/>')], ['xl/workbook.xml', Buffer.from('<workbook/>')]]), 415, /an Excel workbook/);
  });

  it('refuses an archive whose files are larger uncompressed than the limit, with 413', async () => {
    const small = await buildServer({ dbPath: db.dbPath, archiveExpandedLimit: 1000, rateLimit: false });
    try {
      await refused(archive, 413, /holds \d+ bytes uncompressed, more than the limit of 1000 bytes/, small);
    } finally {
      await small.close();
    }
  });

  it('leaves no upload behind, and a CSV job has no archive to download', async () => {
    expect(readdirSync(batchFolderPath(db.dbPath)).filter((f) => f.endsWith('.dwca.zip'))).toHaveLength(1); // the accepted upload's only
    const started = await upload(readFileSync(DEMO_LOCALITIES), 'records.csv');
    const progress = await finished(started.body.jobId);
    expect(progress.input).toBe('csv');
    expect(Object.keys(progress.downloads).sort()).toEqual(['csv', 'geojson', 'gpkg']);
    const zip = await get(`/api/v1/batches/${started.body.jobId}/reviewed.zip`);
    expect(zip.statusCode).toBe(404);
    expect(zip.json().message).toMatch(/was a CSV upload/);
  });
});

describe('a stop during an archive batch', () => {
  it('SIGTERM stops the service; the next start resumes the job over the core, and the archive has every row once', async () => {
    const path = join(files, 'many.zip');
    await writeManyRowArchive(path);
    const { jobId, uploadStatus, exitCode } = await uploadThenStop(db.dbPath, readFileSync(path), 'many.zip');
    expect(uploadStatus).toBe(202);
    expect(exitCode).toBe(0);
    expect(jobProgress(jobsDatabasePath(db.dbPath), jobId).state).not.toBe('done'); // it was stopped part-way

    const second = await buildServer({ dbPath: db.dbPath, rateLimit: false });
    try {
      const progress = await finished(jobId, second);
      expect(progress.state).toBe('done');
      expect(progress.input).toBe('darwin-core-archive');
      const zip = await second.inject({ url: `/api/v1/batches/${jobId}/reviewed.zip` });
      writeFileSync(join(files, 'many-reviewed.zip'), zip.rawPayload);
      const entries = await unzip(join(files, 'many-reviewed.zip'));
      expect(entries.map((e) => e.name)).toEqual(['meta.xml', 'occurrence.csv', 'eml.xml']);
      const [header, ...body] = parse(entries[1].bytes, { delimiter: '\t', record_delimiter: '\r\n' }) as string[][];
      expect(body.map((r) => r[0])).toEqual(Array.from({ length: 4000 }, (_, i) => `o-${i}`));
      expect(body.every((r) => r[header.indexOf('georeferenceVerificationStatus')] !== '')).toBe(true);
      // The core table and the job's note of its archive are gone once the job is done; the upload stays for the download.
      expect(readdirSync(dirname(db.dbPath)).filter((f) => f.startsWith('whereabouts-archive-'))).toEqual([]);
      expect(readdirSync(batchFolderPath(db.dbPath)).filter((f) => f.endsWith('.archive.json'))).toEqual([]);
    } finally {
      await second.close();
    }
  }, 180_000);
});
