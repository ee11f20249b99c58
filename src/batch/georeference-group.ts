/**
 * One distinct locality of a batch, georeferenced once: the Darwin Core fields every row of the group
 * shares, and the centers of the country and state it names (for the coordinate check).
 */
import type { CandidateFinder } from '../match/types.ts';
import { locate, type LocateOptions, type LocateRequest, type LocateResult } from '../locate.ts';
import { darwinCoreFields, type GeoreferenceTerm, type RecordContext } from '../record/darwin-core.ts';
import type { AdministrativeCenter } from './coordinate-check.ts';

/** What a group's rows share; stored in the job as JSON. */
export interface GroupResult {
  fields: Record<GeoreferenceTerm, string>;
  centers: AdministrativeCenter[];
}

/** Settings of a batch that change its results (stored in the job; part of its identity). */
export interface BatchSettings {
  coverAmbiguous: boolean;
  administrativeFallback: boolean;
}

/**
 * Georeference one group. Pure but for the finder's reads.
 * @example georeferenceGroup(store, { locality: 'Alba', countryCode: 'QV' }, settings, context).fields.georeferenceVerificationStatus
 */
export function georeferenceGroup(finder: CandidateFinder, request: LocateRequest, settings: BatchSettings, context: RecordContext): GroupResult {
  const options: LocateOptions = { coverAmbiguous: settings.coverAmbiguous, administrativeFallback: settings.administrativeFallback };
  let result: LocateResult;
  try {
    result = locate(finder, { ...request, options });
  } catch (error) {
    // One locality that trips an error must not stop the other rows; it is reported in its remarks.
    result = unreadableResult(request.locality, `whereabouts failed on this locality (${error instanceof Error ? error.message : String(error)})`);
  }
  return { fields: darwinCoreFields(result, context), centers: administrativeCenters(finder, request) };
}

/** A result for a row that was not georeferenced, with the reason in plain words. */
export function unreadableResult(verbatim: string, reason: string): LocateResult {
  return {
    status: 'unparseable',
    interpretation: { verbatim, clauses: [], chosenClause: null, type: 'unparseable', features: [], offsets: [], approximate: false, administrative: {}, otherClauses: [], reason, notes: [] },
    candidates: [],
    reason,
  };
}

/** The corrected centers of the country and state the record names, when the gazetteer has exactly one of each. */
function administrativeCenters(finder: CandidateFinder, request: LocateRequest): AdministrativeCenter[] {
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
