import { simplify } from '@turf/simplify';
import type { FastifyPluginAsyncTypebox } from '@fastify/type-provider-typebox';
import type { Feature as GeoJsonFeature, FeatureCollection, Geometry } from 'geojson';
import type { Feature, Source } from '../../match/types.ts';
import { openObject } from '../schemas.ts';

/** About 50 m at the equator: finer than the map draws at county scale [CHOICE]. */
const SIMPLIFY_TOLERANCE_DEGREES = 0.0005;

/** What the layers route needs: every polygon and line of the loaded gazetteers, with geometry, and the sources they come from. */
export interface LayerSource {
  shapedFeatures(): Feature[];
  sources(): Source[];
}

/**
 * GET /api/v1/layers: the gazetteers' polygons and lines, simplified (Douglas–Peucker, turf), for the
 * map's reference layers. Built on the first request and again whenever the loaded sources differ
 * (another process imported, replaced or removed one while the service runs).
 * @example await app.register(layersRoutes, { layers: { shapedFeatures: () => [], sources: () => [] } })
 */
export const layersRoutes: FastifyPluginAsyncTypebox<{ layers: LayerSource }> = async (app, { layers }) => {
  let cached: { sources: string; collection: FeatureCollection } | undefined;
  const current = (): FeatureCollection => {
    const sources = JSON.stringify(layers.sources().map((s) => [s.id, s.contentHash]));
    if (cached?.sources !== sources) cached = { sources, collection: layerCollection(layers.shapedFeatures()) };
    return cached.collection;
  };
  app.get(
    '/api/v1/layers',
    {
      schema: {
        summary: "The gazetteers' polygons and lines as one simplified GeoJSON FeatureCollection",
        tags: ['gazetteer'],
        response: { 200: openObject() },
      },
    },
    async () => current(),
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
