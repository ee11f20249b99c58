/**
 * POST /api/v1/georeference/records: many records in, one NDJSON line each out, in order; through inject
 * and through a real server on 127.0.0.1 (read line by line as the stream arrives), over a real SQLite
 * file holding the demo gazetteer. Each answer is checked against the one-record route's answer.
 */
import { describe, expect, it } from 'vitest';
import { RECORDS_LIMITS } from '../../src/server/routes/records.ts';
import { useDemoServer } from './helpers.ts';

const demo = useDemoServer();

const RECORDS = [
  { occurrenceID: 'QV-1', locality: '10 km NE of Puerto Lindo', countryCode: 'QV' },
  { occurrenceID: 'QV-2', locality: 'Santa Rosa', countryCode: 'QV' },
  { occurrenceID: 'QV-3', locality: 'nowhere at all near Xyzzy', countryCode: 'QV' },
  { locality: '5 km N of Puerto Lindo', countryCode: 'QV', decimalLatitude: -45.18, decimalLongitude: -131.39 },
];

const lines = (text: string) => text.split('\n').filter(Boolean).map((line) => JSON.parse(line));
/** The Darwin Core terms apart from the date of the georeference, which is the time of each request. */
const withoutDate = ({ georeferencedDate: _date, ...terms }: Record<string, string>) => terms;

async function single(record: object) {
  const { occurrenceID: _id, ...body } = record as { occurrenceID?: string };
  return (await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference', payload: body })).json();
}

describe('POST /api/v1/georeference/records', () => {
  it('answers a JSON array with one NDJSON line a record, in order, each as the one-record route answers it', async () => {
    const response = await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference/records', payload: RECORDS });
    expect(response.statusCode).toBe(200);
    expect(response.headers['content-type']).toMatch(/^application\/x-ndjson/);
    expect(response.body.endsWith('\n')).toBe(true);
    const answers = lines(response.body);
    expect(answers.map((a) => a.index)).toEqual([0, 1, 2, 3]);
    expect(answers.map((a) => a.occurrenceID)).toEqual(['QV-1', 'QV-2', 'QV-3', undefined]);
    expect(answers.map((a) => a.status)).toEqual(['georeferenced', 'ambiguous', 'not-found', 'georeferenced']);
    for (const [i, record] of RECORDS.entries()) {
      const one = await single(record);
      expect(answers[i].status).toBe(one.status);
      expect(withoutDate(answers[i].darwinCore)).toEqual(withoutDate(one.darwinCore));
      if (one.reason) expect(answers[i].reason).toBe(one.reason);
    }
    expect(Array.isArray(answers[3].flags)).toBe(true);
  });

  it('takes NDJSON, and answers a bad record or an unreadable line on its own line without losing the others', async () => {
    const body = [
      JSON.stringify(RECORDS[0]),
      '{"occurrenceID": "QV-bad", "locality": 42}',
      '{not json',
      JSON.stringify({ occurrenceID: 'QV-extra', locality: 'Puerto Lindo', colour: 'green' }),
      JSON.stringify(RECORDS[1]),
      '',
    ].join('\n');
    const response = await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference/records', payload: body, headers: { 'content-type': 'application/x-ndjson' } });
    expect(response.statusCode).toBe(200);
    const answers = lines(response.body);
    expect(answers).toHaveLength(5);
    expect(answers.map((a) => a.status)).toEqual(['georeferenced', 'invalid', 'invalid', 'invalid', 'ambiguous']);
    expect(answers[1]).toMatchObject({ index: 1, occurrenceID: 'QV-bad', error: { message: 'records[1].locality must be string', field: 'locality' } });
    expect(answers[2].error.message).toBe('records[2]: this line is not valid JSON');
    expect(answers[3]).toMatchObject({ index: 3, occurrenceID: 'QV-extra', error: { field: 'colour' } });
    expect(answers[3].error.message).toContain('"colour" is not a field of this request');
    expect(answers[4].occurrenceID).toBe('QV-2');
  });

  it('answers an edit that does not fit its record with an error line naming the field', async () => {
    const payload = [{ occurrenceID: 'e', locality: 'Puerto Lindo', countryCode: 'QV', options: { candidate: { sourceId: 'demo', featureId: 'no-such' } } }, RECORDS[0]];
    const answers = lines((await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference/records', payload })).body);
    expect(answers[0]).toMatchObject({ index: 0, occurrenceID: 'e', status: 'invalid', error: { field: 'options.candidate' } });
    expect(answers[1].status).toBe('georeferenced');
  });

  it('refuses more records than the limit with 413 naming it, and a body that is no list with 400', async () => {
    const many = Array.from({ length: RECORDS_LIMITS.maxRecords + 1 }, () => ({ locality: 'Puerto Lindo' }));
    const tooMany = await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference/records', payload: many });
    expect(tooMany.statusCode).toBe(413);
    expect(tooMany.json().message).toContain(`limit of ${RECORDS_LIMITS.maxRecords} records`);
    const notList = await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference/records', payload: { locality: 'Puerto Lindo' } });
    expect(notList.statusCode).toBe(400);
    expect(notList.json().message).toMatch(/not a list of records/);
  });

  it('refuses a body over the byte limit with 413 naming the limit', async () => {
    const big = `${JSON.stringify({ locality: 'x'.repeat(3000) })}\n`.repeat(Math.ceil(RECORDS_LIMITS.maxBytes / 3000) + 10);
    const response = await demo.server.app.inject({ method: 'POST', url: '/api/v1/georeference/records', payload: big, headers: { 'content-type': 'application/x-ndjson' } });
    expect(response.statusCode).toBe(413);
    expect(response.json().message).toContain(`limit of ${RECORDS_LIMITS.maxBytes} bytes`);
  });

  it('is in the OpenAPI document with its record schema and limits', async () => {
    const doc = (await demo.server.app.inject({ method: 'GET', url: '/api/v1/openapi.json' })).json();
    const route = doc.paths['/api/v1/georeference/records'].post;
    const body = route.requestBody.content['application/json'].schema;
    expect(body.type).toBe('array');
    expect(body.maxItems).toBe(RECORDS_LIMITS.maxRecords);
    expect(Object.keys(body.items.properties)).toEqual(expect.arrayContaining(['locality', 'occurrenceID', 'options']));
    expect(route.requestBody.content['application/x-ndjson']).toBeDefined();
    expect(route.responses['200'].content['application/x-ndjson'].schema.properties.index).toBeDefined();
    expect(route.responses['413']).toBeDefined();
  });

  it('streams lines from a real server on 127.0.0.1, read as they arrive', async () => {
    const payload = Array.from({ length: 200 }, (_, i) => ({ ...RECORDS[i % RECORDS.length], occurrenceID: `R-${i}` }));
    const response = await fetch(`${demo.server.url}/api/v1/georeference/records`, { method: 'POST', body: JSON.stringify(payload), headers: { 'content-type': 'application/json' } });
    expect(response.status).toBe(200);
    expect(response.headers.get('transfer-encoding')).toBe('chunked');
    const received: any[] = [];
    const decoder = new TextDecoder();
    let pending = '';
    for await (const chunk of response.body!) {
      pending += decoder.decode(chunk, { stream: true });
      const complete = pending.split('\n');
      pending = complete.pop()!;
      received.push(...complete.map((line) => JSON.parse(line)));
    }
    expect(pending).toBe('');
    expect(received.map((a) => a.occurrenceID)).toEqual(payload.map((r) => r.occurrenceID));
    expect(received.map((a) => a.index)).toEqual(payload.map((_, i) => i));
  });
});
