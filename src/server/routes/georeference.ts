import type { FastifyInstance } from 'fastify';
import type { LocateResult } from '../../locate.ts';
import { lookUp, type LookupRequest, type ServedGazetteer } from '../lookup.ts';
import type { ResultCache } from '../result-cache.ts';
import { errorResponses, lookupBodySchema, lookupResponseSchema } from '../schemas.ts';

/** POST /api/v1/georeference: the public contract (issue 2), with the page's edits as `options`. */
export function registerGeoreferenceRoute(app: FastifyInstance, store: ServedGazetteer, cache: ResultCache<LocateResult>): void {
  app.post<{ Body: LookupRequest }>(
    '/api/v1/georeference',
    {
      schema: {
        summary: 'Georeference one locality',
        description:
          'Reads the locality text, finds candidate features in the loaded gazetteers and computes a point and an uncertainty radius ' +
          'with the point-radius method. The status says what happened; a georeference is an estimate to verify.',
        tags: ['georeference'],
        body: lookupBodySchema,
        response: { 200: lookupResponseSchema, ...errorResponses },
      },
    },
    async (request) => lookUp(store, request.body, cache),
  );
}
