import type { FastifyInstance } from 'fastify';
import { RequestError } from '../errors.ts';
import type { ServedGazetteer } from '../lookup.ts';
import { errorSchema, identifier } from '../schemas.ts';

/** GET /api/v1/features/:sourceId/:featureId: one feature with its geometry, as GeoJSON, for the map. */
export function registerFeatureRoute(app: FastifyInstance, store: ServedGazetteer): void {
  app.get<{ Params: { sourceId: string; featureId: string } }>(
    '/api/v1/features/:sourceId/:featureId',
    {
      schema: {
        summary: 'One gazetteer feature as a GeoJSON Feature',
        tags: ['gazetteer'],
        params: { type: 'object', required: ['sourceId', 'featureId'], properties: { sourceId: identifier, featureId: identifier } },
        response: { 200: { type: 'object', additionalProperties: true }, 404: errorSchema },
      },
    },
    async (request) => {
      const { sourceId, featureId } = request.params;
      const feature = store.getFeature(sourceId, featureId, { withGeometry: true });
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
}
