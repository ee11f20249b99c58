import type { FastifyPluginAsync } from 'fastify';
import { DATUMS } from '../../geodesy/datums.ts';

const datumSchema = {
  type: 'object',
  additionalProperties: false,
  required: ['epsg', 'name', 'names', 'transformation', 'accuracyMeters'],
  properties: {
    epsg: { type: 'string', pattern: '^EPSG:[0-9]{4,5}$', description: 'EPSG code of the geographic CRS; the value `options.datum` takes.' },
    name: { type: 'string', description: 'EPSG name.' },
    names: { type: 'array', items: { type: 'string' }, description: 'Names and abbreviations read in `geodeticDatum` and in locality text.' },
    transformation: { type: 'string', description: 'The EPSG transformation to WGS 84 that is applied, in words.' },
    accuracyMeters: { type: 'number', minimum: 0, description: "The transformation's stated accuracy, carried into the datum term of the radius." },
  },
} as const;

/**
 * GET /api/v1/datums: every datum the service converts to WGS 84, so that the page (or any client)
 * offers exactly the list the method knows, in the service's order.
 */
export const datumsRoutes: FastifyPluginAsync = async (app) => {
  const body = { datums: DATUMS.map(({ epsg, name, names, transformation, accuracyMeters }) => ({ epsg, name, names: [...names], transformation, accuracyMeters })) };
  app.get(
    '/api/v1/datums',
    {
      schema: {
        summary: 'The datums whose coordinates the service converts to WGS 84',
        tags: ['georeference'],
        response: { 200: { type: 'object', additionalProperties: false, required: ['datums'], properties: { datums: { type: 'array', items: datumSchema } } } },
      },
    },
    async () => body,
  );
};
