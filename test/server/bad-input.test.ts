/**
 * The bad-input matrix (issue 7) through a real server on 127.0.0.1: each case gets its status code
 * and a message that says what is wrong (and names the field for a 400), and the server keeps answering.
 */
import { describe, expect, it } from 'vitest';
import { listen, post, useDemoServer } from './helpers.ts';

const demo = useDemoServer({ rateLimit: false });
const endpoint = () => `${demo.server.url}/api/v1/georeference`;

interface Case {
  name: string;
  body: unknown;
  status: number;
  message: RegExp;
  field?: string;
  headers?: Record<string, string>;
}

const nested = (depth: number) => `{"locality": ${'['.repeat(depth)}${']'.repeat(depth)}}`;

const CASES: Case[] = [
  { name: 'locality of the wrong type', body: { locality: 123 }, status: 400, message: /locality must be string/, field: 'locality' },
  { name: 'locality missing', body: { countryCode: 'QV' }, status: 400, message: /required property 'locality'/, field: 'locality' },
  { name: 'body is an array', body: [{ locality: 'x' }], status: 400, message: /body must be object/, field: 'body' },
  { name: 'body is a JSON string', body: '"Puerto Lindo"', status: 400, message: /body must be object/, field: 'body' },
  { name: 'countryCode of the wrong shape', body: { locality: 'x', countryCode: 'QVX' }, status: 400, message: /countryCode must match pattern/, field: 'countryCode' },
  // A country's name where the code goes: the pattern, then what it asks for in words (the page shows this beside the field).
  { name: "a country's name as countryCode", body: { locality: 'x', countryCode: 'Mexico' }, status: 400, message: /countryCode must match pattern "\^\[A-Za-z\]\{2\}\$": a two-letter ISO 3166-1 alpha-2 code such as MX; a country's name goes in "country"$/, field: 'countryCode' },
  { name: 'countryCode as a number', body: { locality: 'x', countryCode: 12 }, status: 400, message: /countryCode must be string/, field: 'countryCode' },
  { name: 'options as a string', body: { locality: 'x', options: 'fast' }, status: 400, message: /options must be object/, field: 'options' },
  { name: 'mapScale as a string', body: { locality: 'x', options: { mapScale: '24000' } }, status: 400, message: /options\.mapScale must be number/, field: 'options.mapScale' },
  { name: 'an unknown field', body: { locality: 'x', colour: 'red' }, status: 400, message: /"colour" is not a field/, field: 'colour' },
  { name: 'a locality over 4000 characters', body: { locality: 'a'.repeat(5000) }, status: 400, message: /locality must NOT have more than 4000 characters/, field: 'locality' },
  { name: 'a 10 MB locality', body: { locality: 'a'.repeat(10 * 1024 * 1024) }, status: 413, message: /larger than the limit of 65536 bytes/ },
  { name: 'invalid UTF-8', body: Buffer.concat([Buffer.from('{"locality": "Puerto '), Buffer.from([0xc3, 0x28]), Buffer.from('"}')]), status: 400, message: /not valid UTF-8 \(first bad byte at offset 21\)/, field: 'body' },
  { name: 'a lone continuation byte', body: Buffer.concat([Buffer.from('{"locality": "'), Buffer.from([0x80]), Buffer.from('"}')]), status: 400, message: /not valid UTF-8/, field: 'body' },
  { name: 'NaN', body: '{"locality": "x", "decimalLatitude": NaN}', status: 400, message: /not valid JSON/, field: 'body' },
  { name: 'Infinity as a bare word', body: '{"locality": "x", "options": {"mapScale": Infinity}}', status: 400, message: /not valid JSON/, field: 'body' },
  { name: 'a number that overflows to Infinity', body: '{"locality": "x", "options": {"mapScale": 1e999}}', status: 400, message: /options\.mapScale must be number \(a finite number\)/, field: 'options.mapScale' },
  { name: 'latitude beyond 90', body: { locality: 'x', decimalLatitude: 90.5, decimalLongitude: 0 }, status: 400, message: /decimalLatitude must be <= 90/, field: 'decimalLatitude' },
  { name: 'latitude beyond -90', body: { locality: 'x', decimalLatitude: -91, decimalLongitude: 0 }, status: 400, message: /decimalLatitude must be >= -90/, field: 'decimalLatitude' },
  { name: 'longitude beyond 180', body: { locality: 'x', decimalLatitude: 0, decimalLongitude: 180.01 }, status: 400, message: /decimalLongitude must be <= 180/, field: 'decimalLongitude' },
  { name: 'a negative distance precision', body: { locality: 'x', options: { distancePrecision: -1 } }, status: 400, message: /options\.distancePrecision must be > 0/, field: 'options.distancePrecision' },
  { name: 'a datum that is not an EPSG code', body: { locality: 'x', options: { datum: 'WGS84; DROP TABLE features' } }, status: 400, message: /options\.datum must match pattern "\^EPSG:\[0-9\]\{4,5\}\$": an EPSG code such as EPSG:4267 \(GET \/api\/v1\/datums lists those converted\)$/, field: 'options.datum' },
  { name: 'a candidate of the wrong shape', body: { locality: 'x', options: { candidate: { sourceId: 'demo' } } }, status: 400, message: /required property 'featureId'/, field: 'options.candidate.featureId' },
  { name: 'deeply nested arrays', body: nested(20_000), status: 400, message: /locality must be string|not valid JSON/ },
  { name: 'deeply nested objects', body: `{"locality": "x", "options": ${'{"candidate": '.repeat(2000)}{}${'}'.repeat(2000)}}`, status: 400, message: /options\.candidate\.sourceId must have required property/, field: 'options.candidate.sourceId' },
  { name: 'prototype poisoning', body: '{"locality": "x", "__proto__": {"admin": true}}', status: 400, message: /not valid JSON/, field: 'body' },
  { name: 'an empty body', body: '', status: 400, message: /body is empty/ },
  { name: 'a text/plain body', body: 'Puerto Lindo', status: 415, message: /send application\/json/, headers: { 'content-type': 'text/plain' } },
  { name: 'a candidate that was not offered', body: { locality: 'Puerto Lindo', countryCode: 'QV', options: { candidate: { sourceId: 'demo', featureId: 'qv-0053' } } }, status: 400, message: /qv-0053 is not among the candidates/, field: 'options.candidate' },
];

describe('bad input gets the right status and a specific message', () => {
  for (const c of CASES) {
    it(c.name, async () => {
      const { status, json } = await post(endpoint(), c.body, c.headers);
      expect(status).toBe(c.status);
      expect(json.message).toMatch(c.message);
      expect(json.statusCode).toBe(c.status);
      if (c.field) expect(json.field).toBe(c.field);
      expect(JSON.stringify(json)).not.toMatch(/\/work\/|node_modules|at .*\.ts:\d+/); // nothing internal leaks
    });
  }
});

// Text that tries SQL or markup is only text: it is looked up and answered, never executed.
const HOSTILE = ["'; DROP TABLE features; --", '" OR 1=1 --', '<script>alert(1)</script>', '<img src=x onerror=alert(1)>', 'Robert\'); DELETE FROM sources;--', '%00\u0000\u202e'];
const TEXT_FIELDS = ['locality', 'country', 'stateProvince', 'county', 'municipality', 'verbatimCoordinates', 'geodeticDatum', 'georeferencedBy'];

describe('SQL fragments and markup in every text field', () => {
  for (const field of TEXT_FIELDS) {
    it(`${field}`, async () => {
      for (const text of HOSTILE) {
        const body = { locality: 'Puerto Lindo', countryCode: 'QV', [field]: text };
        const { status, json } = await post(endpoint(), body);
        if (field === 'geodeticDatum') {
          // A datum whereabouts does not know is refused, naming the field (the one datum rule).
          expect(status, `${field}: ${text}`).toBe(400);
          expect(JSON.stringify(json)).toContain('geodeticDatum');
          continue;
        }
        expect(status, `${field}: ${text}`).toBe(200);
        expect(['georeferenced', 'ambiguous', 'not-found', 'unparseable']).toContain(json.status);
        if (field === 'locality') expect(json.interpretation.verbatim).toBe(text);
      }
    });
  }

  it('leaves the gazetteer whole and the server answering after the whole matrix', async () => {
    const { status, json } = await post(endpoint(), { locality: '10 km NE of Puerto Lindo', countryCode: 'QV' });
    expect(status).toBe(200);
    expect(json.status).toBe('georeferenced');
    const sources = await (await fetch(`${demo.server.url}/api/v1/features/demo/qv-0013`)).json();
    expect(sources.properties.name).toBe('Puerto Lindo');
  });
});

describe('rate limit', () => {
  it('answers 429 with the limit and when to retry once a client goes over it', async () => {
    const limited = await listen({ dbPath: demo.db.dbPath, rateLimit: { max: 5, timeWindowMs: 60_000 } });
    try {
      const statuses: number[] = [];
      let last: any;
      for (let i = 0; i < 7; i++) {
        const r = await post(`${limited.url}/api/v1/georeference`, { locality: 'Puerto Lindo' });
        statuses.push(r.status);
        last = r.json;
      }
      expect(statuses.slice(0, 5)).toEqual([200, 200, 200, 200, 200]);
      expect(statuses[6]).toBe(429);
      expect(last.message).toMatch(/more than 5 requests in 60 s from this client: try again in \d+ s/);
    } finally {
      await limited.close();
    }
  });
});
