/**
 * Every polygon and line of the gazetteer, for the map's reference layers. The store has no listing
 * method yet, so the ids come from one read-only SELECT on its file and each feature is then read
 * through the store itself; to be replaced by a store method when src/store offers one.
 */
import Database from 'better-sqlite3';
import type { Feature } from '../match/types.ts';
import type { ServedGazetteer } from './lookup.ts';
import type { LayerSource } from './routes/layers.ts';

/** Read-only, prepared; geometry_type 0 is Point in the store's GEOMETRY_TYPES order. */
export function shapedFeatureLister(dbPath: string, store: ServedGazetteer): LayerSource {
  return {
    sources: () => store.sources(),
    shapedFeatures() {
      const db = new Database(dbPath, { readonly: true, fileMustExist: true });
      try {
        const rows = db
          .prepare('SELECT s.name AS sourceId, f.feature_id AS featureId FROM features f JOIN sources s ON s.id = f.source WHERE f.geometry_type <> 0 ORDER BY f.id')
          .all() as { sourceId: string; featureId: string }[];
        return rows.map((r) => store.getFeature(r.sourceId, r.featureId, { withGeometry: true })).filter((f): f is Feature => f !== null);
      } finally {
        db.close();
      }
    },
  };
}
