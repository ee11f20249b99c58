import { simplify } from '@turf/simplify';
import type { FastifyPluginAsyncTypebox } from '@fastify/type-provider-typebox';
import type { Feature as GeoJsonFeature, FeatureCollection, Geometry } from 'geojson';
import type { Feature } from '../../match/types.ts';
import { openObject } from '../schemas.ts';

/** About 50 m at the equator: finer than the map draws at county scale [CHOICE]. */
const SIMPLIFY_TOLERANCE_DEGREES = 0.0005;

/** What the layers route needs: every polygon and line of the loaded gazetteers, with geometry. */
export interface LayerSource {
  shapedFeatures(): Feature[];
}

/**
 * GET /api/v1/layers: the gazetteers' polygons and lines, simplified (Douglas–Peucker, turf), for the
 * map's reference layers. Built once, on the first request; the store is read-only while serving.
 * @example await app.register(layersRoutes, { layers: { shapedFeatures: () => [] } })
 */
export const layersRoutes: FastifyPluginAsyncTypebox<{ layers: LayerSource }> = async (app, { layers }) => {
  let cached: FeatureCollection | undefined;
  app.get(
    '/api/v1/layers',
    {
      schema: {
        summary: "The gazetteers' polygons and lines as one simplified GeoJSON FeatureCollection",
        tags: ['gazetteer'],
        response: { 200: openObject() },
      },
    },
    async () => (cached ??= layerCollection(layers.shapedFeatures())),
  );
};

function layerCollection(features: Feature[]): FeatureCollection {
  return {
    type: 'FeatureCollection',
    features: features
      .filter((f) => f.geometry && f.geometryType !== 'Point')
      .map((f): GeoJsonFeature => ({
        type: 'Feature',
        id: `${f.sourceId}:${f.featureId}`,
        geometry: simplify(f.geometry as Geometry, { tolerance: SIMPLIFY_TOLERANCE_DEGREES, mutate: false }) as Geometry,
        properties: { sourceId: f.sourceId, featureId: f.featureId, name: f.name, featureType: f.featureType, geometryType: f.geometryType },
      })),
  };
}
