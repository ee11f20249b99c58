/**
 * The page's edits through the real HTTP service (fastify inject) over a real SQLite file holding the
 * demo gazetteer, with the stores opened here and injected into the routes (no review or job files):
 * an edited record keeps its bounding unit and its clip. Expected behaviour from the method: a heading
 * alone is georeferenced only within a bounding unit, and the footprint is the circle clipped to the
 * stated administrative unit (Chapman & Wieczorek 2020, Georeferencing Best Practices §3.4.6 and §3.4.1,
 * section numbers from memory). Areas by turf (@turf/area), GeoJSON structure by RFC 7946 §3.
 */
import { area, circle } from '@turf/turf';
import { parse } from 'csv-parse/sync';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { GEOREFERENCE_TERMS } from '../../src/record/darwin-core.ts';
import { buildApp } from '../../src/server/app.ts';
import { demoDatabase, type TempDatabase } from './helpers.ts';

let db: TempDatabase;
let store: GazetteerStore;
let app: FastifyInstance;

beforeAll(async () => {
  db = await demoDatabase();
  store = openGazetteer(db.dbPath, { readonly: true });
  app = await buildApp({ gazetteer: store, layers: { shapedFeatures: () => [], sources: () => [] } }, {});
});
afterAll(async () => {
  await app?.close();
  store?.close();
  db?.remove();
});

const ask = async (payload: object, url = '/api/v1/georeference') => app.inject({ method: 'POST', url, payload });
const PUERTO_LINDO = { sourceId: 'demo', featureId: 'qv-0013' };
const record = { countryCode: 'QV', stateProvince: 'Poniente' };

describe('edits through POST /api/v1/georeference', () => {
  it('an edited heading-only record with a state keeps its bounded answer', async () => {
    const first = (await ask({ locality: 'N of Puerto Lindo', ...record })).json();
    const edited = (await ask({ locality: 'N of Puerto Lindo', ...record, options: { candidate: PUERTO_LINDO } })).json();
    expect(first.status).toBe('georeferenced');
    expect(edited.status).toBe('georeferenced');
    expect(edited.georeference.features.map((f: any) => f.featureId)).toEqual(first.georeference.features.map((f: any) => f.featureId));
    expect(edited.georeference.features.map((f: any) => f.name)).toContain('Poniente');
    expect(edited.georeference.footprintWKT).toBe(first.georeference.footprintWKT);
  });

  it('an edited offset keeps its clipped footprint', async () => {
    const first = (await ask({ locality: '5 km N of Puerto Lindo', ...record })).json();
    const edited = (await ask({ locality: '5 km N of Puerto Lindo', ...record, options: { candidate: PUERTO_LINDO, distancePrecision: 4, mapScale: 50000 } })).json();
    for (const answer of [first, edited]) {
      const g = answer.georeference;
      expect(g.features.map((f: any) => f.name)).toContain('Poniente');
      const whole = area(circle([g.longitude, g.latitude], g.uncertaintyMeters / 1000, { steps: 256 }));
      expect(area(answer.footprint)).toBeLessThan(0.9 * whole);
    }
    // Method §5.5 (BP2020 §Uncertainty in Paper Map Measurements): no map standard over HTTP, so the default
    // 'unknown' gives 1 mm on the map only: 0.001 m × 50 000 = 50 m.
    expect(Math.abs(edited.components.mapScale - 50)).toBeLessThanOrEqual(0.005 * 50);
    expect(area(edited.footprint)).toBeGreaterThan(area(first.footprint));
  });

  it('takes a candidate for each name of a text that names two places', async () => {
    const body = { locality: 'between Santa Rosa and Puerto Lindo', countryCode: 'QV' };
    expect((await ask(body)).json().status).toBe('ambiguous');
    const picked = (await ask({ ...body, options: { candidates: [{ name: 'Santa Rosa', sourceId: 'demo', featureId: 'qv-0053' }] } })).json();
    expect(picked.status).toBe('georeferenced');
    expect(picked.georeference.features.map((f: any) => f.featureId)).toContain('qv-0053');
    const wrong = await ask({ ...body, options: { candidates: [{ name: 'Alba', sourceId: 'demo', featureId: 'qv-0053' }] } });
    expect(wrong.statusCode).toBe(400);
    expect(wrong.json().field).toBe('options.candidates');
  });

  it('takes a candidate of a second name in brackets, and of a later clause standing in for a missing place', async () => {
    // Two Santa Rosas in the demo (qv-0015, qv-0053): the second name alone cannot choose.
    const second = { locality: 'Puerto Nada (Santa Rosa)', countryCode: 'QV' };
    const unchosen = (await ask(second)).json();
    expect(unchosen.status).toBe('not-found');
    expect(unchosen.candidates.map((c: any) => c.feature.featureId)).toEqual(expect.arrayContaining(['qv-0015', 'qv-0053']));
    const chosen = (await ask({ ...second, options: { candidate: { sourceId: 'demo', featureId: 'qv-0053' } } })).json();
    expect(chosen.status).toBe('georeferenced');
    expect(chosen.georeference.features.map((f: any) => f.featureId)).toEqual(['qv-0053']);
    expect(chosen.georeference.remarks.join('\n')).toMatch(/feature chosen by the georeferencer: Santa Rosa \(demo:qv-0053\) for "Santa Rosa"/);
    // With no state stated a later clause is not taken for a missing place; the reviewer's choice of its feature is, and the remarks say so.
    const standIn = { locality: 'Villa Quimera, Puerto Lindo', countryCode: 'QV' };
    expect((await ask(standIn)).json().status).toBe('not-found');
    const taken = (await ask({ ...standIn, options: { candidate: PUERTO_LINDO } })).json();
    expect(taken.status).toBe('georeferenced');
    expect(taken.georeference.remarks.join('\n')).toMatch(/the next clause, "Puerto Lindo", is used instead on the georeferencer's choice of its feature \(else not taken: the record states no state/);
    const notOffered = await ask({ ...standIn, options: { candidate: { sourceId: 'demo', featureId: 'qv-0053' } } });
    expect(notOffered.statusCode).toBe(400);
    expect(notOffered.json().field).toBe('options.candidate');
  });
});

describe('the method choice routeKilometrePost in the request', () => {
  // [CHOICE routeKilometrePost] (docs/method.md, every choice in one list): a kilometre post is measured along the
  // road from its own origin, which no straight line between the route's ends can place (our choice, no source).
  const body = { locality: 'Puerto Lindo - Santa Rosa road, km 12', countryCode: 'QV', stateProvince: 'Poniente' };
  it("answers the whole route unless told 'decline', on the one-record and many-record routes alike", async () => {
    const unset = (await ask(body)).json();
    expect(unset.status).toBe('georeferenced');
    expect(unset.georeference.remarks.join('\n')).toContain('"km 12" not placed');
    expect((await ask({ ...body, options: { routeKilometrePost: 'route' } })).json().georeference.latitude).toBe(unset.georeference.latitude);
    const declined = (await ask({ ...body, options: { routeKilometrePost: 'decline' } })).json();
    expect(declined.status).toBe('not-found');
    expect(declined.reason).toMatch(/cannot be placed without the road's line \[CHOICE routeKilometrePost/);
    const many = await app.inject({ method: 'POST', url: '/api/v1/georeference/records', payload: [body, { ...body, options: { routeKilometrePost: 'decline' } }] });
    expect(many.statusCode).toBe(200);
    const lines = many.body.trim().split('\n').map((line) => JSON.parse(line));
    expect(lines.map((line: any) => line.status)).toEqual(['georeferenced', 'not-found']);
  });
  it('refuses a rule it does not know, naming the field', async () => {
    const wrong = await ask({ ...body, options: { routeKilometrePost: 'skip' } });
    expect(wrong.statusCode).toBe(400);
    expect(wrong.json().field).toBe('options.routeKilometrePost');
    expect(wrong.json().message).toMatch(/route, decline|allowed values/);
  });
});

describe('the answer as a file', () => {
  it('POST /api/v1/georeference.csv: a header and one row, every field quoted, CR LF line ends (RFC 4180 §2)', async () => {
    const response = await ask({ locality: '10 km NE of Puerto Lindo', countryCode: 'QV' }, '/api/v1/georeference.csv');
    expect(response.statusCode).toBe(200);
    expect(response.headers['content-type']).toMatch(/^text\/csv/);
    expect(response.body).toMatch(/^"locality","decimalLatitude",.*\r\n"10 km NE of Puerto Lindo","-45\.\d+",.*\r\n$/s);
    const [row] = parse(response.body, { columns: true }) as Record<string, string>[];
    expect(Object.keys(row).sort()).toEqual(['locality', ...GEOREFERENCE_TERMS].sort());
    expect(row.georeferenceVerificationStatus).toBe('requires verification');
  });

  it('POST /api/v1/georeference.geojson: a FeatureCollection of the point and the footprint (RFC 7946 §3.1.1, §3.2, §3.3)', async () => {
    const body = { locality: '10 km NE of Puerto Lindo', countryCode: 'QV', decimalLatitude: -45.16, decimalLongitude: -131.3 };
    const json = (await ask(body)).json();
    const response = await ask(body, '/api/v1/georeference.geojson');
    expect(response.headers['content-type']).toMatch(/^application\/geo\+json/);
    const collection = JSON.parse(response.body);
    expect(collection.type).toBe('FeatureCollection');
    const [point, footprint] = collection.features;
    expect(point.geometry).toEqual({ type: 'Point', coordinates: [Number(json.darwinCore.decimalLongitude), Number(json.darwinCore.decimalLatitude)] });
    expect(point.properties.locality).toBe(body.locality);
    expect(point.properties.whereabouts_coordinateFlags).toMatch(/agrees-with-locality|outside-locality-circle/);
    expect(footprint.geometry).toEqual(json.footprint);
    const notFound = JSON.parse((await ask({ locality: 'Nowhere Town', countryCode: 'QV' }, '/api/v1/georeference.geojson')).body);
    expect(notFound.features).toHaveLength(1);
    expect(notFound.features[0].geometry).toBeNull();
  });
});
