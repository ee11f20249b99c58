/**
 * One lookup as the HTTP API answers it: locate the text, then apply the curator's edits from the
 * page (another candidate, a distance precision) by adjusting the interpretation and running the
 * method core again, and add the Darwin Core fields.
 */
import type { MultiPolygon, Polygon } from 'geojson';
import type { Candidate, CandidateFinder, Feature, FeatureKey, Source } from '../match/types.ts';
import { inverse } from '../geodesy/geodesic.ts';
import { georeference } from '../georef/georeference.ts';
import { locate, type LocateOptions, type LocateRequest, type LocateResult } from '../locate.ts';
import type { Interpretation, Offset } from '../parse/types.ts';
import { darwinCoreFields, type GeoreferenceTerm } from '../record/darwin-core.ts';
import { VERSION } from '../version.ts';
import { RequestError } from './errors.ts';
import type { ResultCache } from './result-cache.ts';
import { footprintGeometry } from '../geodesy/wkt.ts';

/** What the server needs of a gazetteer store (src/store/gazetteer-store.ts implements it). */
export interface ServedGazetteer extends CandidateFinder {
  sources(): Source[];
  getFeature(sourceId: string, featureId: string, options?: { withGeometry?: boolean }): Feature | null;
}

/** A feature by its source and id, as a candidate names it. */
export type { FeatureKey };

/** The edits the page offers on top of the method's own settings. */
export interface LookupOptions extends Pick<LocateOptions, 'mapScale' | 'datum' | 'measurementErrorMeters' | 'coverAmbiguous' | 'administrativeFallback'> {
  /** Use this candidate instead of the one the matcher chose (or for an ambiguous name). */
  candidate?: FeatureKey;
  /** Distance precision in the written unit of the distance (method §5.1: δ = precision / 2). */
  distancePrecision?: number;
}

/** The body of POST /api/v1/georeference. */
export interface LookupRequest extends Omit<LocateRequest, 'options'> {
  /** The record's own coordinates, if it has any: compared with the proposed point, never changed. */
  decimalLatitude?: number;
  decimalLongitude?: number;
  /** Who is georeferencing, for georeferencedBy. */
  georeferencedBy?: string;
  options?: LookupOptions;
}

/** The answer: the locate result, its Darwin Core fields, and the footprint as GeoJSON for the map. */
export interface LookupResponse extends LocateResult {
  darwinCore: Record<GeoreferenceTerm, string>;
  footprint?: Polygon | MultiPolygon;
  /** How far the record's own coordinates lie from the proposed point. */
  recordPoint?: { latitude: number; longitude: number; distanceMeters: number; withinUncertainty: boolean };
}

/**
 * Georeference one request with the page's edits applied. With a cache, a repeated request (same
 * record, options and gazetteer sources) reuses its result; the Darwin Core fields are always new.
 * @example lookUp(store, { locality: '10 km NE of Puerto Lindo', countryCode: 'QV' }).status // 'georeferenced'
 */
export function lookUp(store: ServedGazetteer, request: LookupRequest, cache?: ResultCache<LocateResult>, now = new Date()): LookupResponse {
  const { options = {}, decimalLatitude, decimalLongitude, georeferencedBy, ...record } = request;
  const { candidate, distancePrecision, ...methodOptions } = options;
  const sources = store.sources();
  const compute = () => {
    const located = locate(store, { ...record, options: methodOptions });
    return candidate || distancePrecision ? applyEdits(store, located, options, methodOptions) : located;
  };
  const key = JSON.stringify([sources.map((s) => s.contentHash), record, options]);
  const result = cache ? cache.get(key, compute) : compute();
  const darwinCore = darwinCoreFields(result, {
    georeferencedBy: georeferencedBy?.trim() || `whereabouts ${VERSION}`,
    georeferencedDate: now.toISOString(),
    sources,
  });
  const g = result.georeference;
  const response: LookupResponse = { ...result, candidates: result.candidates.map(withoutGeometry), darwinCore };
  if (g) response.footprint = footprintGeometry(g.footprintWKT);
  if (g && decimalLatitude !== undefined && decimalLongitude !== undefined) {
    const distanceMeters = inverse(g.latitude, g.longitude, decimalLatitude, decimalLongitude).meters;
    response.recordPoint = { latitude: decimalLatitude, longitude: decimalLongitude, distanceMeters, withinUncertainty: distanceMeters <= g.uncertaintyMeters };
  }
  return response;
}

function applyEdits(store: ServedGazetteer, located: LocateResult, edits: LookupOptions, methodOptions: LocateOptions): LocateResult {
  let interpretation = located.interpretation;
  if (edits.distancePrecision) interpretation = withDistancePrecision(interpretation, edits.distancePrecision);
  const features = edits.candidate ? [chosenFeature(store, located, edits.candidate)] : usedFeatures(store, located);
  if (!features) return { ...located, interpretation };
  if (edits.candidate) {
    const f = features[0];
    interpretation = { ...interpretation, notes: [...interpretation.notes, `feature chosen by the georeferencer: ${f.name} (${f.sourceId}:${f.featureId})`] };
  }
  const outcome = georeference({ interpretation, features, options: methodOptions });
  if (!outcome.ok) return { status: 'unparseable', interpretation, candidates: located.candidates, reason: outcome.reason };
  return { status: 'georeferenced', georeference: outcome.georeference, components: outcome.georeference.components, interpretation, candidates: located.candidates };
}

/** The chosen candidate, which must be one the matcher offered for a text that names one feature. */
function chosenFeature(store: ServedGazetteer, located: LocateResult, key: FeatureKey): Feature {
  if (located.interpretation.features.length !== 1) {
    throw new RequestError(400, `options.candidate applies to a locality that names one feature; this one names ${located.interpretation.features.length}`, 'options.candidate');
  }
  const offered = located.candidates.some((c) => c.feature.sourceId === key.sourceId && c.feature.featureId === key.featureId);
  const feature = offered ? store.getFeature(key.sourceId, key.featureId, { withGeometry: true }) : undefined;
  if (!feature) throw new RequestError(400, `options.candidate ${key.sourceId}:${key.featureId} is not among the candidates for this locality`, 'options.candidate');
  return feature;
}

/** The features the first result rests on, with geometry, to compute it again with an edit. */
function usedFeatures(store: ServedGazetteer, located: LocateResult): Feature[] | undefined {
  const used = located.georeference?.features;
  if (!used?.length) return undefined;
  const features = used.map((f) => store.getFeature(f.sourceId, f.featureId, { withGeometry: true }));
  return features.every((f): f is Feature => f !== null) ? features : undefined;
}

/** Method §5.1 with the curator's precision: δ = precision / 2 (+ half a written range), in the written unit. */
function withDistancePrecision(interpretation: Interpretation, precision: number): Interpretation {
  const offsets = interpretation.offsets.map((offset): Offset => {
    const d = offset.distance;
    if (!d || d.value <= 0) return offset;
    const uncertainty = precision / 2 + (d.range ? (d.range.high - d.range.low) / 2 : 0);
    return { ...offset, distance: { ...d, precision, uncertainty, uncertaintyMeters: uncertainty * (d.meters / d.value) } };
  });
  const unit = interpretation.offsets.find((o) => o.distance)?.distance?.unit ?? '';
  return { ...interpretation, offsets, notes: [...interpretation.notes, `distance precision set by the georeferencer to ${precision} ${unit}`.trim()] };
}

function withoutGeometry(candidate: Candidate): Candidate {
  if (!candidate.feature.geometry) return candidate;
  const { geometry: _geometry, ...feature } = candidate.feature;
  return { ...candidate, feature };
}
