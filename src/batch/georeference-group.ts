/**
 * One distinct locality of a batch, georeferenced once through the front door: the Darwin Core fields
 * every row of the group shares, and the centers of the country and state it names (for each row's
 * coordinate check).
 */
import type { CandidateFinder } from '../match/types.ts';
import { georeferenceRecord } from '../locate/georeference-record.ts';
import type { LocateRequest } from '../locate/locate.ts';
import type { GroupFields } from '../output/csv.ts';
import type { RecordContext } from '../record/darwin-core.ts';
import type { RouteKilometrePostRule } from '../georef/types.ts';

/** What a group's rows share, and the locality type the text was read as. */
export interface GroupResult extends GroupFields {
  localityType: string;
}

/** Settings of a batch that change its results (stored in the job; part of its identity). */
export interface BatchSettings {
  coverAmbiguous: boolean;
  administrativeFallback: boolean;
  /** The method choice routeKilometrePost when the job set it (stored only then, so that other jobs keep their identity). */
  routeKilometrePost?: RouteKilometrePostRule;
}

/**
 * Georeference one group. Pure but for the finder's reads.
 * @example georeferenceGroup(store, { locality: 'Alba', countryCode: 'QV' }, settings, context).fields.georeferenceVerificationStatus
 */
export function georeferenceGroup(finder: CandidateFinder, request: LocateRequest, settings: BatchSettings, context: RecordContext): GroupResult {
  const options = { coverAmbiguous: settings.coverAmbiguous, administrativeFallback: settings.administrativeFallback, routeKilometrePost: settings.routeKilometrePost };
  const answer = georeferenceRecord(finder, { ...request, options, attribution: context, administrativeCenters: true });
  return { fields: answer.darwinCore, centers: answer.centers, flags: answer.result.flags ?? [], localityType: answer.result.interpretation.type };
}
