import type { FastifyPluginAsyncTypebox } from '@fastify/type-provider-typebox';
import { Type } from 'typebox';
import type { LocateResult } from '../../locate/locate.ts';
import { ANSWER_FORMATS } from '../../output/formats.ts';
import { answerBody } from '../../output/json.ts';
import { lookUpIn, type ServedGazetteer } from '../lookup.ts';
import type { RecordPool } from '../record-pool.ts';
import type { ResultCache } from '../result-cache.ts';
import { errorResponses, lookupBodySchema, lookupResponseSchema } from '../schemas.ts';

export interface GeoreferenceRoutesOptions {
  gazetteer: ServedGazetteer;
  results?: ResultCache<LocateResult>;
  /** Worker threads that compute the answers; without them the main thread does. */
  pool?: RecordPool;
}

const DESCRIPTION =
  'Reads the locality text, finds candidate features in the loaded gazetteers and computes a point and an uncertainty radius ' +
  'with the point-radius method. The status says what happened; a georeference is an estimate to verify.';

/**
 * POST /api/v1/georeference: the public contract (issue 2), with the page's edits as `options`; and the
 * same answer as a file to download in each of src/output's formats: POST /api/v1/georeference.csv
 * (one row of Darwin Core fields), POST /api/v1/georeference.geojson (RFC 7946 FeatureCollection).
 * @example await app.register(georeferenceRoutes, { gazetteer: store, results: new ResultCache(100) })
 */
export const georeferenceRoutes: FastifyPluginAsyncTypebox<GeoreferenceRoutesOptions> = async (app, { gazetteer, results, pool }) => {
  app.post(
    '/api/v1/georeference',
    {
      schema: { summary: 'Georeference one locality', description: DESCRIPTION, tags: ['georeference'], body: lookupBodySchema, response: { 200: lookupResponseSchema, ...errorResponses } },
    },
    async (request) => answerBody(await lookUpIn(pool, gazetteer, request.body, results)),
  );
  for (const format of ANSWER_FORMATS) {
    app.post(
      `/api/v1/georeference.${format.extension}`,
      {
        schema: {
          summary: `Georeference one locality, as a file: ${format.description}`,
          tags: ['georeference'],
          body: lookupBodySchema,
          produces: [format.mediaType],
          response: { 200: Type.String({ description: format.description }), ...errorResponses },
        },
      },
      async (request, reply) =>
        reply
          .header('content-type', `${format.mediaType}; charset=utf-8`)
          .header('content-disposition', `attachment; filename="georeference.${format.extension}"`)
          .send(format.write(await lookUpIn(pool, gazetteer, request.body, results), request.body.locality)),
    );
  }
};
