/**
 * Generalisation of sensitive rows through the HTTP batch upload (fastify inject): the same options as
 * `whereabouts batch` (a taxa list as a second file, a marking column with one way to generalise), refused
 * with a 400 naming the field when they do not read, recorded in the job with the method choices, and the
 * precise point in nothing the service answers for a generalised row: the review list and record (JSON),
 * the reviewed CSV, GeoJSON and GeoPackage, also after a reviewer re-georeferenced the row. The precise
 * values come from the job's private store (batch_withheld); the Darwin Core terms are TDWG's.
 */
import { parse } from 'csv-parse/sync';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { jobsDatabasePath } from '../../src/batch/index.ts';
import { methodChoiceValues } from '../../src/georef/method-choices.ts';
import { DEMO_LOCALITIES, useDemoServer } from './helpers.ts';
import { asNumber, holdsCoordinate, withheldRows } from '../support/withheld.ts';
import { ARCHIVE_FILES, coreBytes, zipFiles } from '../support/demo-archive.ts';
import { unzip } from '../batch/helpers.ts';

const demo = useDemoServer();

/** Only the rows of the listed taxa, whose own columns hold no coordinates: any precise value found is a leak, not another record's own. */
const LISTED = (() => {
  const rows = parse(readFileSync(DEMO_LOCALITIES)) as string[][];
  const listed = rows.filter((r, i) => i === 0 || (['Verdemaria lindoensis', 'Serenella alticola', 'Telmoa ambigua'].includes(r[2]!) && r[8] === '' && r[11] === ''));
  return listed.map((r) => r.map((f) => (/[",\n]/.test(f) ? `"${f.replace(/"/g, '""')}"` : f)).join(',')).join('\n') + '\n';
})();

const TAXA = 'scientificName,gridDegrees,gridMeters,distanceMeters\nVerdemaria lindoensis,,2000,\nSerenella alticola,,,5000\nTelmoa ambigua,0.1,,\n';

/** A multipart upload as a browser's FormData encodes it, sent through inject. */
async function upload(query: string, files: Record<string, string | Buffer>) {
  const form = new FormData();
  for (const [field, bytes] of Object.entries(files)) form.append(field, new Blob([typeof bytes === 'string' ? bytes : new Uint8Array(bytes)], { type: 'text/csv' }), `${field}.csv`);
  const request = new Request('http://127.0.0.1/', { method: 'POST', body: form });
  const payload = Buffer.from(await request.arrayBuffer());
  const response = await demo.server.app.inject({ method: 'POST', url: `/api/v1/batches${query}`, payload, headers: { 'content-type': request.headers.get('content-type')! } });
  return { status: response.statusCode, json: response.json() as any };
}

async function finished(jobId: string) {
  for (let i = 0; i < 600; i++) {
    const progress = (await demo.server.app.inject({ method: 'GET', url: `/api/v1/batches/${jobId}` })).json() as any;
    if (progress.state === 'done' || progress.state === 'failed') return progress;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('the job did not finish in 60 s');
}

const withheld = (jobId: string) => withheldRows(jobsDatabasePath(demo.db.dbPath), jobId);
/** Telmoa ambigua is listed with a 0.1° grid: a value on a 0.1° line may be a cell's corner. */
const holds = (bytes: Buffer, value: string) => holdsCoordinate(bytes, value, 0.1);

describe('POST /api/v1/batches with a list of sensitive taxa', () => {
  let jobId: string;
  let precise: string[];

  it('starts a job that records its generalisation and method choices, and withholds the listed rows', async () => {
    const started = await upload('', { file: LISTED, sensitiveTaxa: TAXA });
    expect(started.status).toBe(202);
    jobId = started.json.jobId;
    const progress = await finished(jobId);
    expect(progress.state).toBe('done');
    expect(progress.methodChoices).toEqual(methodChoiceValues());
    expect(progress.generalise).toEqual({ taxa: { 'verdemaria lindoensis': { gridMeters: 2000 }, 'serenella alticola': { distanceMeters: 5000 }, 'telmoa ambigua': { gridDegrees: 0.1 } } });
    const rows = withheld(jobId);
    expect(rows.size).toBeGreaterThanOrEqual(12);
    precise = [...rows.values()].flatMap((p) => [p.decimalLatitude!, p.decimalLongitude!]);
    for (const value of precise) expect(LISTED.includes(value)).toBe(false);
  }, 90_000);

  it('answers no precise point in the review list or in any record (JSON)', async () => {
    const list = await demo.server.app.inject({ method: 'GET', url: `/api/v1/batches/${jobId}/records` });
    for (const value of precise) expect(list.body).not.toMatch(asNumber(value));
    for (const row of withheld(jobId).keys()) {
      const detail = await demo.server.app.inject({ method: 'GET', url: `/api/v1/batches/${jobId}/records/${row}` });
      expect(detail.statusCode).toBe(200);
      for (const value of precise) expect(detail.body, `row ${row}`).not.toMatch(asNumber(value));
      const body = detail.json() as any;
      expect(body.proposed.dataGeneralizations).toMatch(/^Coordinates generalized from the original georeference/);
      expect(body.answer.darwinCore.decimalLatitude).toBe(body.proposed[Object.keys(body.proposed).find((k) => k.endsWith('decimalLatitude'))!]);
      expect(body.answer.candidates).toEqual([]);
    }
  }, 90_000);

  it('keeps a row generalised when the reviewer re-georeferences it, in the reviewed CSV, GeoJSON and GeoPackage', async () => {
    const [row] = [...withheld(jobId).keys()];
    const detail = (await demo.server.app.inject({ method: 'GET', url: `/api/v1/batches/${jobId}/records/${row}` })).json() as any;
    const decided = await demo.server.app.inject({ method: 'PUT', url: `/api/v1/batches/${jobId}/records/${row}/review`, payload: { decision: 'accepted', reviewer: 'tester', locality: detail.original.locality } });
    expect(decided.statusCode).toBe(200);
    const csv = await demo.server.app.inject({ method: 'GET', url: `/api/v1/batches/${jobId}/reviewed.csv` });
    const rows = parse(csv.body) as string[][];
    expect(rows[row]!.at(-3)).toMatch(/^Coordinates generalized from the original georeference/);
    expect(rows[row]).toContain('verified by data custodian');
    for (const format of ['csv', 'geojson', 'gpkg']) {
      const file = await demo.server.app.inject({ method: 'GET', url: `/api/v1/batches/${jobId}/reviewed.${format}` });
      expect(file.statusCode).toBe(200);
      for (const value of precise) expect(holds(file.rawPayload, value), `${format}: ${value}`).toBe(false);
    }
  }, 90_000);
});

describe('POST /api/v1/batches with a Darwin Core Archive and a list of sensitive taxa', () => {
  it('generalises the core\'s listed rows; the reviewed archive holds no precise point in any file (Darwin Core text guide, TDWG 2023)', async () => {
    const path = join(mkdtempSync(join(tmpdir(), 'whereabouts-dwca-')), 'records.zip');
    await zipFiles(path, ARCHIVE_FILES);
    const started = await upload('', { file: readFileSync(path), sensitiveTaxa: TAXA });
    expect(started.status).toBe(202);
    expect((await finished(started.json.jobId)).state).toBe('done');
    const precise = [...withheld(started.json.jobId).values()].flatMap((p) => [p.decimalLatitude!, p.decimalLongitude!]).filter((v) => !asNumber(v).test(coreBytes.toString('latin1')));
    expect(precise.length).toBeGreaterThan(0);
    const archive = await demo.server.app.inject({ method: 'GET', url: `/api/v1/batches/${started.json.jobId}/reviewed.zip` });
    expect(archive.statusCode).toBe(200);
    const zipped = join(path, '..', 'reviewed.zip');
    writeFileSync(zipped, archive.rawPayload);
    const entries = await unzip(zipped);
    const core = entries.find((e) => e.name === 'occurrence.txt')!.bytes.toString('utf8');
    expect(core).toContain('Coordinates generalized from the original georeference');
    // An unlisted record may name the same place (its remarks give the place's centre): that value is its own, not a leak.
    const unlisted = (parse(core, { delimiter: '\t', relax_quotes: true }) as string[][]).filter((r) => !/^(Verdemaria lindoensis|Serenella alticola|Telmoa ambigua)$/.test(r[2]!)).flat().join('\t');
    const onlyListed = precise.filter((v) => !asNumber(v).test(unlisted));
    expect(onlyListed.length).toBeGreaterThan(0);
    for (const { name, bytes } of entries) for (const value of onlyListed) expect(holds(bytes, value), `${name}: ${value}`).toBe(false);
  }, 90_000);
});

describe('POST /api/v1/batches with a marking column', () => {
  const marked = () => {
    const rows = parse(readFileSync(DEMO_LOCALITIES)) as string[][];
    return rows.map((r, i) => [...r, i === 0 ? 'withhold' : r[2] === 'Aubracia marina' ? 'yes' : ''].join(',')).join('\n') + '\n';
  };

  it('generalises the marked rows by a grid in meters', async () => {
    const started = await upload('?sensitiveColumn=withhold&gridMeters=1000', { file: marked() });
    expect(started.status).toBe(202);
    const progress = await finished(started.json.jobId);
    expect(progress.generalise).toEqual({ column: 'withhold', gridMeters: 1000 });
    expect(withheld(started.json.jobId).size).toBeGreaterThan(0);
  }, 90_000);

  const refusals: [string, Record<string, string>, number, RegExp, string][] = [
    ['a column with no way to generalise', { query: '?sensitiveColumn=withhold' }, 400, /give exactly one of gridDegrees/, 'sensitiveColumn'],
    ['two ways', { query: '?sensitiveColumn=withhold&gridDegrees=0.1&distanceMeters=500' }, 400, /not gridDegrees and distanceMeters/, 'sensitiveColumn'],
    ['a grid in meters out of its limits', { query: '?sensitiveColumn=withhold&gridMeters=5' }, 400, /from 10 to 100000, not "5"/, 'sensitiveColumn'],
    ['a way without the column (schema)', { query: '?gridMeters=1000' }, 400, /sensitiveColumn/, ''],
    ['an unknown query field (schema)', { query: '?generaliseTo=0.1' }, 400, /additional|generaliseTo/, ''],
    ['a column the input lacks', { query: '?sensitiveColumn=nosuch&gridDegrees=0.1' }, 400, /no column "nosuch"/, 'file'],
    ['a taxa list without a way for each taxon', { query: '', taxa: 'scientificName,gridKm\nTelmoa ambigua,1\n' }, 400, /needs the column scientificName and at least one of/, 'sensitiveTaxa'],
  ];
  for (const [what, { query, taxa }, status, message, field] of refusals) {
    it(`refuses ${what} with ${status}`, async () => {
      const answer = await upload(query!, { file: marked(), ...(taxa ? { sensitiveTaxa: taxa } : {}) });
      expect(answer.status).toBe(status);
      expect(answer.json.message).toMatch(message);
      if (field) expect(answer.json.field).toBe(field);
    });
  }

  it('is described in the OpenAPI document: the query fields and the taxa file', async () => {
    const doc = (await demo.server.app.inject({ method: 'GET', url: '/api/v1/openapi.json' })).json() as any;
    const post = doc.paths['/api/v1/batches'].post;
    expect(post.parameters.filter((p: any) => p.in === 'query').map((p: any) => p.name)).toEqual(['sensitiveColumn', 'gridDegrees', 'gridMeters', 'distanceMeters']);
    expect(post.description).toContain('sensitiveTaxa');
  });
});
