/**
 * The front door from a record to its answer: the CLI, the HTTP routes, batch workers and review
 * recomputation all call `georeferenceRecord` and nothing else of the core. It locates the record with
 * the georeferencer's edits applied inside the pipeline, writes its Darwin Core terms, and checks the
 * coordinates the record already has. Pure: data comes through the finder, who and when from the caller.
 */
import type { CandidateFinder } from '../match/types.ts';
import type { MethodOptions } from '../georef/types.ts';
import { checkCoordinates, circleOf, recordPoint, type AdministrativeCenter, type CoordinateCheck, type RecordPoint } from '../record/coordinate-check.ts';
import { darwinCoreFields, type GeoreferenceTerm, type RecordContext } from '../record/darwin-core.ts';
import type { LocateEdits } from './edits.ts';
import { EditRefused } from './edits.ts';
import { locate, type LocateRequest, type LocateResult } from './locate.ts';
import { unreadableResult } from './unreadable.ts';

/** The edits a georeferencer may make to a record: the pipeline's own, and method settings that override the request's. */
export interface RecordEdits extends LocateEdits, Pick<MethodOptions, 'datum' | 'mapScale' | 'measurementErrorMeters'> {}

/** One record: what `locate` reads, the record's own coordinates, the edits, and who and when for its terms. */
export interface RecordRequest extends Omit<LocateRequest, 'edits'> {
  /** The record's own coordinates as numbers or as written; compared with the proposed point, never changed. */
  decimalLatitude?: number | string;
  decimalLongitude?: number | string;
  edits?: RecordEdits;
  /** georeferencedBy, georeferencedDate and the loaded sources, for the Darwin Core terms. */
  attribution: RecordContext;
  /** Also find the centers of the record's country and state, to check coordinates against them (the batch does). */
  administrativeCenters?: boolean;
}

/** The check of the record's own coordinates: flags and remarks, and the distance from the proposed point. */
export interface RecordCoordinateCheck extends CoordinateCheck {
  /** When both coordinates are numbers in range and there is a proposed point. */
  recordPoint?: RecordPoint;
}

export interface RecordAnswer {
  result: LocateResult;
  darwinCore: Record<GeoreferenceTerm, string>;
  /** When the request carried the record's coordinates. */
  coordinateCheck?: RecordCoordinateCheck;
  /** The record's administrative centers, when asked for. */
  centers: AdministrativeCenter[];
}

/** Reuses a result computed before for the same key (the HTTP service keeps recent results). */
export type Memo = (key: string, compute: () => LocateResult) => LocateResult;

/**
 * Georeference one record. An edit that does not fit the record throws `EditRefused`; any other
 * failure on the way is the record's answer ("unable to georeference", the reason in the remarks), so
 * one record can never stop a batch or fail a request.
 * @example
 *   georeferenceRecord(store, { locality: '5 km N of Puerto Lindo', stateProvince: 'Poniente', edits: { distancePrecision: 1 }, attribution })
 *     .darwinCore.georeferenceVerificationStatus // 'requires verification'
 */
export function georeferenceRecord(finder: CandidateFinder, request: RecordRequest, memo?: Memo): RecordAnswer {
  const { decimalLatitude, decimalLongitude, attribution, administrativeCenters: wantCenters, ...record } = request;
  const located = locateRequestOf(request);
  const compute = () => locateSafely(finder, located);
  const result = memo ? memo(memoKeyOf(attribution, located), compute) : compute();
  const darwinCore = darwinCoreFields(result, attribution);
  const centers = wantCenters ? administrativeCentersOf(finder, record) : [];
  const answer: RecordAnswer = { result, darwinCore, centers };
  if (decimalLatitude !== undefined || decimalLongitude !== undefined) {
    answer.coordinateCheck = checkRecordCoordinates(decimalLatitude, decimalLongitude, result, darwinCore, centers);
  }
  return answer;
}

/**
 * The Darwin Core terms of a record that could not be read at all (a malformed row), the reason in the remarks.
 * @example unreadableRecord('line 4: the row has 3 fields where the header has 5', attribution).georeferenceVerificationStatus // 'unable to georeference'
 */
export function unreadableRecord(reason: string, attribution: RecordContext): Record<GeoreferenceTerm, string> {
  return darwinCoreFields(unreadableResult('', reason), attribution);
}

/**
 * The key under which a `Memo` keeps the record's result: the same for two requests that locate alike.
 * Lets a caller that computes elsewhere (the service's worker threads) look in its memo first.
 * @example recordMemoKey({ locality: 'Alba', attribution }) === recordMemoKey({ locality: 'Alba', attribution, decimalLatitude: 1 }) // true
 */
export function recordMemoKey(request: RecordRequest): string {
  return memoKeyOf(request.attribution, locateRequestOf(request));
}

// What an answer reads of the loaded sources is part of the key: their ids and content hashes (a
// gazetteer imported meanwhile) and their ranks (which source a place found in several is cited from).
function memoKeyOf(attribution: RecordContext, located: LocateRequest): string {
  return JSON.stringify([attribution.sources.map((s) => [s.id, s.contentHash, s.priority]), located]);
}

/** What `locate` reads of a record: its text and options, with the georeferencer's method edits over the options. */
function locateRequestOf(request: RecordRequest): LocateRequest {
  const { decimalLatitude: _lat, decimalLongitude: _lon, edits = {}, attribution: _by, administrativeCenters: _centers, ...record } = request;
  const { chosenFeatures, distancePrecision, ...methodEdits } = edits;
  return {
    ...record,
    options: { ...record.options, ...definedValues(methodEdits) },
    ...(chosenFeatures?.length || distancePrecision ? { edits: { chosenFeatures, distancePrecision } } : {}),
  };
}

function locateSafely(finder: CandidateFinder, request: LocateRequest): LocateResult {
  try {
    return locate(finder, request);
  } catch (error) {
    if (error instanceof EditRefused) throw error;
    return unreadableResult(request.locality, `whereabouts failed on this locality (${error instanceof Error ? error.message : String(error)})`);
  }
}

function definedValues<T extends object>(values: T): Partial<T> {
  return Object.fromEntries(Object.entries(values).filter(([, value]) => value !== undefined)) as Partial<T>;
}

/**
 * Flags against the circle as written (the batch's column), and the distance from the proposed point
 * at full precision (the API's recordPoint).
 */
function checkRecordCoordinates(
  latitude: number | string | undefined,
  longitude: number | string | undefined,
  result: LocateResult,
  darwinCore: Record<GeoreferenceTerm, string>,
  centers: AdministrativeCenter[],
): RecordCoordinateCheck {
  const check: RecordCoordinateCheck = checkCoordinates(String(latitude ?? ''), String(longitude ?? ''), circleOf(darwinCore), centers);
  const g = result.georeference;
  const lat = asNumber(latitude);
  const lon = asNumber(longitude);
  if (g && lat !== undefined && lon !== undefined && Math.abs(lat) <= 90 && Math.abs(lon) <= 180) {
    check.recordPoint = recordPoint(lat, lon, { latitude: g.latitude, longitude: g.longitude, radiusMeters: g.uncertaintyMeters });
  }
  return check;
}

function asNumber(value: number | string | undefined): number | undefined {
  return typeof value === 'string' ? (value.trim() === '' ? undefined : Number(value)) : value;
}

/** The corrected centers of the country and state the record names, when the gazetteer has exactly one of each. */
function administrativeCentersOf(finder: CandidateFinder, request: Pick<LocateRequest, 'stateProvince' | 'country' | 'countryCode'>): AdministrativeCenter[] {
  const levels = [
    { level: 'stateProvince', name: request.stateProvince },
    { level: 'country', name: request.country },
  ] as const;
  const centers: AdministrativeCenter[] = [];
  for (const { level, name } of levels) {
    if (!name) continue;
    const exact = finder.findCandidates({ name, context: { countryCode: request.countryCode }, featureTypes: [level], limit: 2 }).filter((c) => c.score >= 1);
    if (exact.length !== 1) continue;
    const f = exact[0].feature;
    centers.push({ level, name: f.name, latitude: f.latitude, longitude: f.longitude });
  }
  return centers;
}
