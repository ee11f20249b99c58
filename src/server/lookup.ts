/**
 * One lookup as the HTTP API answers it: the request body turned into a record for the front door
 * (`georeferenceRecord`), the page's edits passed as edits; the routes write the answer through src/output.
 */
import type { CandidateFinder, Feature, Source } from '../match/types.ts';
import { readDatumOption } from '../geodesy/datum-option.ts';
import { EditRefused, type EditProblem, type FeatureKey } from '../locate/edits.ts';
import { georeferenceRecord, type RecordAnswer, type RecordRequest } from '../locate/georeference-record.ts';
import type { LocateResult } from '../locate/locate.ts';
import { VERSION } from '../version.ts';
import { RequestError } from './errors.ts';
import type { RecordPool } from './record-pool.ts';
import type { ResultCache } from './result-cache.ts';
import type { LookupRequest } from './schemas.ts';

export type { FeatureKey };

/** What the server needs of a gazetteer store (src/store/gazetteer-store.ts implements it). */
export interface ServedGazetteer extends CandidateFinder {
  sources(): Source[];
  /** `read()` against the store as it stood at its first statement, whatever another process commits meanwhile. */
  asOfOneMoment<T>(read: () => T): T;
  getFeature(sourceId: string, featureId: string, options?: { withGeometry?: boolean }): Feature | null;
}

/**
 * Georeference one request with the page's edits applied, against the store as of one moment. With a
 * cache, a repeated request (same record, options and gazetteer sources) reuses its result; the Darwin
 * Core fields are always new.
 * An edit that does not fit the record is a 400 naming `options.candidate`.
 * @example lookUp(store, { locality: '10 km NE of Puerto Lindo', countryCode: 'QV' }).result.status // 'georeferenced'
 */
export function lookUp(store: ServedGazetteer, request: LookupRequest, cache?: ResultCache<LocateResult>, now = new Date()): RecordAnswer {
  // The sources read for the cache's key and the answer's terms, and the rows the answer is found in, are of one store.
  return store.asOfOneMoment(() => {
    const record = recordRequestOf(store, request, now);
    try {
      return georeferenceRecord(store, record, cache && ((key, compute) => cache.get(key, compute)));
    } catch (error) {
      throw asRequestError(error, request);
    }
  });
}

/**
 * `lookUp` with the computing done by the service's worker threads, when it has them; the same answer.
 * @example (await lookUpIn(pool, store, { locality: '10 km NE of Puerto Lindo', countryCode: 'QV' })).result.status // 'georeferenced'
 */
export async function lookUpIn(pool: RecordPool | undefined, store: ServedGazetteer, request: LookupRequest, cache?: ResultCache<LocateResult>, now = new Date()): Promise<RecordAnswer> {
  if (!pool) return lookUp(store, request, cache, now);
  const record = recordRequestOf(store, request, now);
  try {
    return await pool.answer(store, record, cache);
  } catch (error) {
    throw asRequestError(error, request);
  }
}

/** The request body as the front door's record: the page's edits as edits, who and when as its attribution. A bad datum is a 400. */
function recordRequestOf(store: ServedGazetteer, request: LookupRequest, now: Date): RecordRequest {
  const { options = {}, georeferencedBy, ...record } = request;
  const { candidate, candidates, distancePrecision, mapScale, datum, measurementErrorMeters, ...locateOptions } = options;
  const chosenFeatures = [...(candidate ? [candidate] : []), ...(candidates ?? [])];
  for (const [field, value] of [['geodeticDatum', record.geodeticDatum], ['options.datum', datum]] as const) {
    const read = readDatumOption(value, field);
    if ('problem' in read) throw new RequestError(400, read.problem, field);
  }
  return {
    ...record,
    options: locateOptions,
    edits: { chosenFeatures, distancePrecision, mapScale, datum, measurementErrorMeters },
    attribution: { georeferencedBy: georeferencedBy?.trim() || `whereabouts ${VERSION}`, georeferencedDate: now.toISOString(), sources: store.sources() },
  };
}

/** A refused edit as the 400 naming the request's field; any other error as it came. */
function asRequestError(error: unknown, request: LookupRequest): unknown {
  if (!(error instanceof EditRefused)) return error;
  return editError(error.problem, request.options?.candidates?.length ? 'options.candidates' : 'options.candidate');
}

function editError(problem: EditProblem, field: string): RequestError {
  switch (problem.kind) {
    case 'names-no-place':
    case 'names-several-places':
      return new RequestError(400, `${field} applies to a locality that names one feature; this one names ${problem.namesInText}`, field);
    case 'not-offered':
      return new RequestError(400, `${field} ${problem.chosen.sourceId}:${problem.chosen.featureId} is not among the candidates for this locality`, field);
    case 'unknown-name':
      return new RequestError(400, `${field}: ${new EditRefused(problem).message}`, field);
  }
}
