/**
 * GET /api/v1/method and the OpenAPI document carry the list of choices (src/georef/method-choices.ts), through inject.
 */
import { describe, expect, it } from 'vitest';
import { methodChoices } from '../../src/georef/method-choices.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { useDemoServer } from './helpers.ts';

const demo = useDemoServer();

describe('GET /api/v1/method', () => {
  it('answers the list of choices with the values in force', async () => {
    const response = await demo.server.app.inject({ method: 'GET', url: '/api/v1/method' });
    expect(response.statusCode).toBe(200);
    const body = response.json() as { id: string; value: unknown }[];
    expect(body).toEqual(methodChoices());
    expect(body.find((c) => c.id === 'unknownDatumMeters')!.value).toBe(METHOD_DEFAULTS.unknownDatumMeters);
  });

  it('is described in the OpenAPI document with its schema', async () => {
    const doc = (await demo.server.app.inject({ method: 'GET', url: '/api/v1/openapi.json' })).json() as any;
    const get = doc.paths['/api/v1/method'].get;
    const schema = get.responses['200'].content['application/json'].schema;
    expect(schema.type).toBe('array');
    expect(Object.keys(schema.items.properties)).toEqual(expect.arrayContaining(['id', 'value', 'source', 'changedBy']));
  });

  it('holds the same list as the route answers: the answer\'s example, and one line a choice in the description', async () => {
    const doc = (await demo.server.app.inject({ method: 'GET', url: '/api/v1/openapi.json' })).json() as any;
    const get = doc.paths['/api/v1/method'].get;
    const answered = (await demo.server.app.inject({ method: 'GET', url: '/api/v1/method' })).json() as { id: string; value: unknown; changedBy: string }[];
    expect(get.responses['200'].content['application/json'].example).toEqual(answered);
    const lines = (get.description as string).split('\n').filter((l) => l.startsWith('- '));
    expect(lines).toHaveLength(answered.length);
    answered.forEach((c, i) => {
      expect(lines[i]).toContain(`\`${c.id}\`: `);
      expect(lines[i]).toContain(` = ${c.value}`);
    });
  });
});
