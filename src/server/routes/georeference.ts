import type { FastifyPluginAsyncTypebox } from '@fastify/type-provider-typebox';
import { Type } from 'typebox';
import type { LocateResult } from '../../locate/locate.ts';
import { recordCsv } from '../../output/csv.ts';
import { answerGeoJsonText } from '../../output/geojson.ts';
import { answerBody } from '../../output/json.ts';
import { lookUp, type ServedGazetteer } from '../lookup.ts';
import type { ResultCache } from '../result-cache.ts';
import { errorResponses, lookupBodySchema, lookupResponseSchema } from '../schemas.ts';

export interface GeoreferenceRoutesOptions {
  gazetteer: ServedGazetteer;
  results?: ResultCache<LocateResult>;
}

const DESCRIPTION =
  'Reads the locality text, finds candidate features in the loaded gazetteers and computes a point and an uncertainty radius ' +
  'with the point-radius method. The status says what happened; a georeference is an estimate to verify.';

/**
 * POST /api/v1/georeference: the public contract (issue 2), with the page's edits as `options`; and the
 * same answer as a file to download: POST /api/v1/georeference.csv (one row of Darwin Core fields) and
 * POST /api/v1/georeference.geojson (RFC 7946 FeatureCollection).
 * @example await app.register(georeferenceRoutes, { gazetteer: store, results: new ResultCache(100) })
 */
export const georeferenceRoutes: FastifyPluginAsyncTypebox<GeoreferenceRoutesOptions> = async (app, { gazetteer, results }) => {
  app.post(
    '/api/v1/georeference',
    {
      schema: { summary: 'Georeference one locality', description: DESCRIPTION, tags: ['georeference'], body: lookupBodySchema, response: { 200: lookupResponseSchema, ...errorResponses } },
    },
    async (request) => answerBody(lookUp(gazetteer, request.body, results)),
  );
  app.post(
    '/api/v1/georeference.csv',
    { schema: { summary: 'Georeference one locality, as a CSV row of Darwin Core fields', tags: ['georeference'], body: lookupBodySchema, produces: ['text/csv'], response: { 200: Type.String({ description: 'A header line and one row, every field quoted.' }), ...errorResponses } } },
    async (request, reply) =>
      reply
        .header('content-type', 'text/csv; charset=utf-8')
        .header('content-disposition', 'attachment; filename="georeference.csv"')
        .send(recordCsv(request.body.locality, lookUp(gazetteer, request.body, results).darwinCore)),
  );
  app.post(
    '/api/v1/georeference.geojson',
    { schema: { summary: 'Georeference one locality, as a GeoJSON FeatureCollection (RFC 7946)', tags: ['georeference'], body: lookupBodySchema, produces: ['application/geo+json'], response: { 200: Type.String({ description: 'The point with the Darwin Core terms as properties, and the footprint.' }), ...errorResponses } } },
    async (request, reply) =>
      reply
        .header('content-type', 'application/geo+json; charset=utf-8')
        .header('content-disposition', 'attachment; filename="georeference.geojson"')
        .send(answerGeoJsonText(lookUp(gazetteer, request.body, results), request.body.locality)),
  );
};
