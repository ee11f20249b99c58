/**
 * POST /api/v1/georeference and the map's routes, through inject and through a real server on
 * 127.0.0.1, over a real SQLite file holding the demo gazetteer.
 */
import geographiclib from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { GEOREFERENCE_TERMS } from '../../src/record/darwin-core.ts';
import { buildServer } from '../../src/server/app.ts';
import { post, useDemoServer } from './helpers.ts';

// Puerto Lindo as the demo gazetteer gives it (gazetteer/demo.geojson, feature qv-0013).
const PUERTO_LINDO = { latitude: -45.226495, longitude: -131.3876, radiusMeters: 3500 };

const demo = useDemoServer();

describe('POST /api/v1/georeference', () => {
  it('georeferences an offset from a demo town at the geodesic offset point, through a real server', async () => {
    const { status, json, headers } = await post(`${demo.server.url}/api/v1/georeference`, { locality: '10 km NE of Puerto Lindo', countryCode: 'QV' });
    expect(status).toBe(200);
    expect(headers.get('content-type')).toMatch(/^application\/json/);
    expect(json.status).toBe('georeferenced');
    // Reference point from geographiclib directly (Karney 2013, "Algorithms for geodesics"): 10 000 m at azimuth 45°.
    const expected = geographiclib.Geodesic.WGS84.Direct(PUERTO_LINDO.latitude, PUERTO_LINDO.longitude, 45, 10_000);
    const off = geographiclib.Geodesic.WGS84.Inverse(expected.lat2!, expected.lon2!, json.georeference.latitude, json.georeference.longitude);
    expect(off.s12!).toBeLessThan(1);
    // Method §5.2 derived check: 10 km NE with δ 0.5 km → offset term 4.029 km; extent is the feature's 3500 m.
    expect(json.components.offset).toBeCloseTo(4029, -1);
    expect(json.components.extent).toBeCloseTo(PUERTO_LINDO.radiusMeters, 0);
    // Each term from its own source, not re-added from the answer (so a wrong term cannot pass):
    // offset, Method §5.2 (WGH2004): U(d=10, δ=0.5, Δ=22.5°) = sqrt(10.5² + 10² − 2·10·10.5·cos 22.5°) km;
    // extent, gazetteer/demo.geojson qv-0013 radiusMeters; no coordinates, datum, map or measurement given → 0.
    const offsetTerm = Math.sqrt(10.5 ** 2 + 10 ** 2 - 2 * 10 * 10.5 * Math.cos((22.5 * Math.PI) / 180)) * 1000;
    const terms = { extent: PUERTO_LINDO.radiusMeters, offset: offsetTerm, coordinatePrecision: 0, datum: 0, mapScale: 0, measurement: 0 };
    for (const [name, value] of Object.entries(terms)) {
      expect(Math.abs(json.components[name] - value), name).toBeLessThanOrEqual(0.005 * value);
    }
    const total = Object.values(terms).reduce((a, b) => a + b, 0);
    expect(Math.abs(json.georeference.uncertaintyMeters - total)).toBeLessThanOrEqual(0.005 * total);
    // Method §6 (docs/method.md, decimalLatitude/coordinateUncertaintyInMeters): the distance the reported
    // decimals move the point (geographiclib Inverse, Karney 2013) is added, then the total is rounded up.
    const shift = geographiclib.Geodesic.WGS84.Inverse(json.georeference.latitude, json.georeference.longitude, Number(json.darwinCore.decimalLatitude), Number(json.darwinCore.decimalLongitude)).s12!;
    expect(Number(json.darwinCore.coordinateUncertaintyInMeters)).toBe(Math.ceil(json.georeference.uncertaintyMeters + shift));
    expect(Math.abs(Number(json.darwinCore.coordinateUncertaintyInMeters) - Math.ceil(total + shift))).toBeLessThanOrEqual(0.005 * total);
    expect(Object.keys(json.darwinCore).sort()).toEqual([...GEOREFERENCE_TERMS].sort());
    expect(json.darwinCore.georeferenceVerificationStatus).toBe('requires verification');
    expect(json.footprint.type).toMatch(/Polygon/);
    expect(json.interpretation.type).toBe('offset-heading');
    expect(json.candidates[0].feature.geometry).toBeUndefined();
  });

  it('lists the candidates of a shared name as ambiguous, and georeferences the one chosen', async () => {
    const ambiguous = await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference', payload: { locality: 'Santa Rosa', countryCode: 'QV' } });
    expect(ambiguous.statusCode).toBe(200);
    const first = ambiguous.json();
    expect(first.status).toBe('ambiguous');
    expect(first.darwinCore.georeferenceVerificationStatus).toBe('requires georeference');
    const ids = first.candidates.map((c: any) => c.feature.featureId).sort();
    expect(ids).toEqual(['qv-0015', 'qv-0053']);

    const pick = async (featureId: string) =>
      (await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference', payload: { locality: 'Santa Rosa', countryCode: 'QV', options: { candidate: { sourceId: 'demo', featureId } } } })).json();
    const town = await pick('qv-0015');
    const village = await pick('qv-0053');
    expect(town.status).toBe('georeferenced');
    expect(town.georeference.features[0].featureId).toBe('qv-0015');
    expect(town.georeference.latitude).toBeCloseTo(-45.337213, 5);
    expect(village.georeference.latitude).toBeCloseTo(-45.213296, 5);
    expect(town.georeferenceRemarks ?? town.darwinCore.georeferenceRemarks).toMatch(/chosen by the georeferencer/);
  });

  it('recomputes with a distance precision, a map scale and a datum given as options', async () => {
    const base = { locality: '10 km NE of Puerto Lindo', countryCode: 'QV' };
    const plain = (await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference', payload: base })).json();
    const coarse = (await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference', payload: { ...base, options: { distancePrecision: 10 } } })).json();
    // Method §5.2: U(d=10, δ=5, Δ=22.5°) = sqrt(15² + 10² − 2·10·15·cos 22.5°) km = 6.617 km (computed from the formula).
    const expected = Math.sqrt(15 ** 2 + 10 ** 2 - 2 * 10 * 15 * Math.cos((22.5 * Math.PI) / 180)) * 1000;
    expect(coarse.components.offset).toBeCloseTo(expected, -1);
    expect(coarse.components.offset).toBeGreaterThan(plain.components.offset);
    const mapped = (await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference', payload: { ...base, options: { mapScale: 24000 } } })).json();
    // Method §5.5 (BP2020 §Uncertainty in Paper Map Measurements): the HTTP body names no map standard, so the
    // default `mapStandard: 'unknown'` applies and the term is 1 mm on the map only: 0.001 m × 24 000 = 24 m.
    // (With US NMAS 1947 it would be 1/50 inch × 24 000 = 12.192 m + 24 m = 36.192 m; not settable over HTTP.)
    expect(Math.abs(mapped.components.mapScale - 24) / 24).toBeLessThanOrEqual(0.005);
  });

  it('adds the unknown-datum term to written coordinates unless a datum is given', async () => {
    const base = { locality: 'Puerto Lindo', countryCode: 'QV', verbatimCoordinates: '45.2265 S, 131.3876 W' };
    const unknown = (await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference', payload: base })).json();
    // Method §5.4 (Chapman & Wieczorek 2020, §Uncertainty from Unknown Datum): 5359 m when no datum is stated.
    expect(unknown.components.datum).toBe(5359);
    const stated = (await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference', payload: { ...base, options: { datum: 'EPSG:4326' } } })).json();
    expect(stated.components.datum).toBe(0);
  });

  it('compares the record\'s own coordinates with the proposed point', async () => {
    const answer = (await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference', payload: { locality: 'Puerto Lindo', countryCode: 'QV', decimalLatitude: -45.2265, decimalLongitude: -131.3876 } })).json();
    expect(answer.recordPoint.withinUncertainty).toBe(true);
    expect(answer.recordPoint.distanceMeters).toBeLessThan(10);
  });
});

describe('map routes, OpenAPI and the page', () => {
  it('serves a feature with its geometry, and 404 for an unknown one', async () => {
    const county = await demo.server.app.inject({ url: '/api/v1/features/demo/qv-0005' });
    expect(county.statusCode).toBe(200);
    expect(county.json().geometry.type).toBe('Polygon');
    expect(county.json().properties.name).toBe('Alisos');
    const missing = await demo.server.app.inject({ url: '/api/v1/features/demo/no-such' });
    expect(missing.statusCode).toBe(404);
    expect(missing.json().message).toMatch(/no feature no-such in source demo/);
  });

  it('serves the polygons and lines of the gazetteer as one FeatureCollection (RFC 7946)', async () => {
    const layers = (await demo.server.app.inject({ url: '/api/v1/layers' })).json();
    expect(layers.type).toBe('FeatureCollection');
    const types = new Set(layers.features.map((f: any) => f.geometry.type));
    expect(types.has('Polygon')).toBe(true);
    expect(types.has('LineString')).toBe(true);
    expect(types.has('Point')).toBe(false);
  });

  it('documents the routes as OpenAPI 3, generated from their schemas', async () => {
    const doc = (await demo.server.app.inject({ url: '/api/v1/openapi.json' })).json();
    expect(doc.openapi).toMatch(/^3\./);
    const body = doc.paths['/api/v1/georeference'].post.requestBody.content['application/json'].schema;
    expect(body.required).toEqual(['locality']);
    expect(Object.keys(body.properties)).toEqual(expect.arrayContaining(['locality', 'countryCode', 'country', 'stateProvince', 'county', 'municipality', 'options']));
    expect(Object.keys(doc.paths)).toEqual(expect.arrayContaining(['/api/v1/batches', '/api/v1/layers', '/api/v1/features/{sourceId}/{featureId}']));
  });

  it('serves the page and its vendor files from memory, and nothing outside them', async () => {
    const page = await demo.server.app.inject({ url: '/' });
    expect(page.statusCode).toBe(200);
    expect(page.headers['content-type']).toMatch(/text\/html/);
    expect(page.body).toContain('/api/v1/openapi.json');
    expect(page.body).not.toMatch(/<script>(?!<\/script>)|<script(?![^>]*src=)[^>]*>/);
    for (const url of ['/vendor/leaflet.js', '/vendor/leaflet.css', '/vendor/topojson-client.js', '/vendor/countries-110m.json', '/js/main.js', '/style.css']) {
      expect((await demo.server.app.inject({ url })).statusCode, url).toBe(200);
    }
    for (const url of ['/../package.json', '/%2e%2e/package.json', '/vendor/..%2f..%2fpackage.json', '/js/../../src/server/app.ts', '/etc/passwd']) {
      expect((await demo.server.app.inject({ url })).statusCode, url).toBe(404);
    }
  });

  it('sends security headers with a CSP that forbids inline scripts, and no CORS unless configured', async () => {
    const page = await demo.server.app.inject({ url: '/', headers: { origin: 'https://elsewhere.example' } });
    const csp = String(page.headers['content-security-policy']);
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toContain('unsafe-inline');
    expect(csp).toContain("frame-ancestors 'none'");
    expect(page.headers['x-content-type-options']).toBe('nosniff');
    expect(page.headers['access-control-allow-origin']).toBeUndefined();

    const withCors = await buildServer({ dbPath: demo.db.dbPath, corsOrigin: 'https://collections.example' });
    try {
      const allowed = await withCors.inject({ method: 'OPTIONS', url: '/api/v1/georeference', headers: { origin: 'https://collections.example', 'access-control-request-method': 'POST' } });
      expect(allowed.headers['access-control-allow-origin']).toBe('https://collections.example');
    } finally {
      await withCors.close();
    }
  });
});

describe('GET /api/v1/datums', () => {
  it('lists every datum the service converts, each one accepted by the georeference endpoint', async () => {
    const response = await demo.server.app.inject({ url: '/api/v1/datums' });
    expect(response.statusCode).toBe(200);
    const { datums } = response.json() as { datums: { epsg: string; name: string; accuracyMeters: number }[] };
    expect(datums.length).toBeGreaterThanOrEqual(15);
    // EPSG Geodetic Parameter Dataset: EPSG:4326 is "WGS 84", EPSG:4267 "NAD27" (codes and names as EPSG gives them).
    expect(datums).toContainEqual(expect.objectContaining({ epsg: 'EPSG:4326', name: 'WGS 84', accuracyMeters: 0 }));
    expect(datums).toContainEqual(expect.objectContaining({ epsg: 'EPSG:4267', name: 'NAD27' }));
    for (const d of datums) {
      const answer = await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference', payload: { locality: 'Puerto Lindo, 45.2265 S, 131.3876 W', countryCode: 'QV', options: { datum: d.epsg } } });
      expect(answer.statusCode, d.epsg).toBe(200);
    }
  });
});

describe('the footprint summary', () => {
  it('gives the type, vertices and geodesic area of the footprint beside its geometry', async () => {
    const { json } = await post(`${demo.server.url}/api/v1/georeference`, { locality: '10 km NE of Puerto Lindo', countryCode: 'QV' });
    expect(json.footprintSummary).toMatchObject({ type: json.footprint.type, parts: 1, vertices: json.footprint.coordinates[0].length - 1 });
    // An inscribed n-gon of radius r has area (n/2) r² sin(2π/n) (elementary geometry); geodesic edges on a circle this small differ by < 0.1 %.
    const n = json.footprintSummary.vertices;
    const r = json.georeference.uncertaintyMeters;
    expect(json.footprintSummary.areaSquareMeters / ((n / 2) * r * r * Math.sin((2 * Math.PI) / n))).toBeCloseTo(1, 3);
  });
});
