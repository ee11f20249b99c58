import type { FastifyPluginAsyncTypebox } from '@fastify/type-provider-typebox';
import { Type } from 'typebox';
import { RequestError } from '../errors.ts';
import type { ServedGazetteer } from '../lookup.ts';
import { errorSchema, identifier, openObject } from '../schemas.ts';

/**
 * GET /api/v1/features/:sourceId/:featureId: one feature with its geometry, as GeoJSON, for the map.
 * @example await app.register(featureRoutes, { gazetteer: store })
 */
export const featureRoutes: FastifyPluginAsyncTypebox<{ gazetteer: Pick<ServedGazetteer, 'getFeature'> }> = async (app, { gazetteer }) => {
  app.get(
    '/api/v1/features/:sourceId/:featureId',
    {
      schema: {
        summary: 'One gazetteer feature as a GeoJSON Feature',
        tags: ['gazetteer'],
        params: Type.Object({ sourceId: identifier, featureId: identifier }),
        response: { 200: openObject(), 404: errorSchema },
      },
    },
    async (request) => {
      const { sourceId, featureId } = request.params;
      const feature = gazetteer.getFeature(sourceId, featureId, { withGeometry: true });
      if (!feature) throw new RequestError(404, `no feature ${featureId} in source ${sourceId}`, 'featureId');
      const { geometry, latitude, longitude, ...properties } = feature;
      return {
        type: 'Feature',
        id: `${sourceId}:${featureId}`,
        geometry: geometry ?? { type: 'Point', coordinates: [longitude, latitude] },
        properties: { ...properties, latitude, longitude },
      };
    },
  );
};
