/**
 * A reviewer choosing the feature of an answer reached through another reading than the text's first name:
 * a second name written in brackets ("Puerto Nada (Santa Rosa)", src/locate/second-name.ts) or a later clause
 * standing in for a place the gazetteer lacks ("Villa Quimera, Los Pinos"). Through the real service (fastify
 * inject) over a real SQLite gazetteer (the invented demo, gazetteer/README.md) and its real SQLite review
 * store: previewed, decided, and written in the reviewed file. Expected points are the chosen features' own
 * coordinates read from gazetteer/demo.geojson: a point feature's corrected center is its own position
 * (Chapman & Wieczorek 2020, Georeferencing Best Practices §3.4, point-radius method; section from memory),
 * as reported at the decimals of the reported latitude (the same check as test/server/batch.test.ts).
 */
import { readFileSync } from 'node:fs';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { useDemoServer } from './helpers.ts';

const demo = useDemoServer();
const DEMO = JSON.parse(readFileSync(new URL('../../gazetteer/demo.geojson', import.meta.url), 'utf8'));
const position = (featureId: string) => DEMO.features.find((f: any) => f.properties.id === featureId).geometry.coordinates as [number, number];

/** The reported value holds the feature's coordinate to the reported decimals (rounding only). */
function reports(reported: string, coordinate: number): void {
  const decimals = reported.split('.')[1]?.length ?? 0;
  expect(Math.abs(Number(reported) - coordinate)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-12);
}

async function upload(csv: string): Promise<string> {
  const form = new FormData();
  form.append('file', new Blob([csv], { type: 'text/csv' }), 'records.csv');
  const request = new Request('http://127.0.0.1/', { method: 'POST', body: form });
  const payload = Buffer.from(await request.arrayBuffer());
  const response = await demo.server.app.inject({ method: 'POST', url: '/api/v1/batches', payload, headers: { 'content-type': request.headers.get('content-type')! } });
  expect(response.statusCode).toBe(202);
  const { jobId } = response.json() as { jobId: string };
  for (let i = 0; i < 600; i++) {
    const progress = (await demo.server.app.inject({ url: `/api/v1/batches/${jobId}` })).json() as any;
    if (progress.state === 'done') return jobId;
    if (progress.state === 'failed') throw new Error(`the job failed: ${JSON.stringify(progress)}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('the job did not finish in 60 s');
}

describe('choosing the feature of an answer reached through a second name or a stand-in clause', () => {
  // Row 1: both Santa Rosas (qv-0015 in Poniente, qv-0053 in Serra Alta) are the second name's; row 2: both
  // Los Pinos in Poniente (qv-0016, qv-0039) are the next clause's; row 3: the second name is one town in Poniente.
  let jobId: string;
  const inject = (url: string, init: { method?: 'GET' | 'PUT'; payload?: object } = {}) => demo.server.app.inject({ url, ...init });
  const review = (row: number, body: object) => inject(`/api/v1/batches/${jobId}/records/${row}/review`, { method: 'PUT', payload: { decision: 'accepted', reviewer: 'D. Curator', ...body } });
  const reviewed = async () => parse((await inject(`/api/v1/batches/${jobId}/reviewed.csv`)).body, { columns: true }) as Record<string, string>[];
  const term = (row: Record<string, string>, name: string) => row[`proposed_${name}`] ?? row[name]!;

  it('runs the batch, each record offering the candidates of the reading it tried', async () => {
    jobId = await upload(['occurrenceID,locality,countryCode,stateProvince', 'r1,Puerto Nada (Santa Rosa),QV,', 'r2,"Villa Quimera, Los Pinos",QV,Poniente', 'r3,Puerto Nada (Santa Rosa),QV,Poniente'].join('\r\n'));
    const first = (await inject(`/api/v1/batches/${jobId}/records/1`)).json() as any;
    expect(first.answer.status).toBe('not-found');
    expect(first.answer.candidates.map((c: any) => c.feature.featureId)).toEqual(expect.arrayContaining(['qv-0015', 'qv-0053']));
    expect(first.answer.reason).toMatch(/its second name written in brackets, "Santa Rosa", was tried: "Santa Rosa" matches several features/);
    const second = (await inject(`/api/v1/batches/${jobId}/records/2`)).json() as any;
    expect(second.answer.candidates.map((c: any) => c.feature.featureId)).toEqual(expect.arrayContaining(['qv-0016', 'qv-0039']));
    expect(second.answer.reason).toMatch(/the next clause, "Los Pinos", was tried: "Los Pinos" matches several features/);
  });

  it('previews and accepts a candidate of the second name, the remarks saying which was chosen and why that name', async () => {
    const preview = (await inject(`/api/v1/batches/${jobId}/records/1?candidateSource=demo&candidateFeature=qv-0053`)).json() as any;
    expect(preview.answer.status).toBe('georeferenced');
    expect(preview.answer.georeference.features.map((f: any) => f.featureId)).toContain('qv-0053');
    const accepted = await review(1, { candidate: { sourceId: 'demo', featureId: 'qv-0053' } });
    expect(accepted.statusCode).toBe(200);
    const row = (await reviewed())[0]!;
    expect(term(row, 'georeferenceVerificationStatus')).toBe('verified by data custodian');
    expect(term(row, 'georeferencedBy')).toBe('D. Curator');
    expect(term(row, 'georeferenceSources')).toContain('qv-0053');
    expect(term(row, 'georeferenceRemarks')).toMatch(/"Puerto Nada" is not in the loaded gazetteers: its second name written in brackets, "Santa Rosa", is used/);
    expect(term(row, 'georeferenceRemarks')).toMatch(/feature chosen by the georeferencer: Santa Rosa \(demo:qv-0053\) for "Santa Rosa"/);
    const [longitude, latitude] = position('qv-0053');
    reports(term(row, 'decimalLatitude'), latitude);
    reports(term(row, 'decimalLongitude'), longitude);
  });

  it('accepts a candidate of the stand-in clause, widened for the place the gazetteer lacks as an unchosen stand-in is', async () => {
    expect((await review(2, { candidate: { sourceId: 'demo', featureId: 'qv-0039' } })).statusCode).toBe(200);
    const detail = (await inject(`/api/v1/batches/${jobId}/records/2`)).json() as any;
    expect(detail.review.candidate).toEqual({ sourceId: 'demo', featureId: 'qv-0039' });
    // The missing first place widens the radius by the [CHOICE] unusedFeatureMeters (common practice, no source).
    expect(detail.answer.components.unusedFeature).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
    const row = (await reviewed())[1]!;
    expect(term(row, 'georeferenceSources')).toContain('qv-0039');
    expect(term(row, 'georeferenceRemarks')).toMatch(/"Villa Quimera" is not in the loaded gazetteers: the next clause, "Los Pinos", is used instead/);
    expect(term(row, 'georeferenceRemarks')).toMatch(/feature chosen by the georeferencer: Los Pinos \(demo:qv-0039\)/);
    const [longitude, latitude] = position('qv-0039');
    reports(term(row, 'decimalLatitude'), latitude);
    reports(term(row, 'decimalLongitude'), longitude);
  });

  it('takes again the feature the second name already gave, and refuses one no reading of the text offers', async () => {
    const same = await review(3, { candidate: { sourceId: 'demo', featureId: 'qv-0015' } });
    expect(same.statusCode).toBe(200);
    expect(term((await reviewed())[2]!, 'georeferenceRemarks')).toMatch(/feature chosen by the georeferencer: Santa Rosa \(demo:qv-0015\)/);
    // The river Rio Fundo (qv-0161) is a candidate of no reading of the text.
    const other = await review(3, { candidate: { sourceId: 'demo', featureId: 'qv-0161' } });
    expect(other.statusCode).toBe(400);
    expect(other.json().message).toMatch(/demo:qv-0161 is not among the candidates for this locality/);
  });
});
