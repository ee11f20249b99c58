/**
 * Every georeferenceVerificationStatus whereabouts writes, from Darwin Core's recommended values
 * (TDWG, dwc terms list, georeferenceVerificationStatus): by the outcome of locating a record, and
 * after a person's review decision.
 */
/** What came of locating a record; `locate` reports it, the words below record it. */
export type LocateStatus = 'georeferenced' | 'ambiguous' | 'not-found' | 'unparseable';

/** Verification status by outcome. */
export const VERIFICATION_STATUS: Record<LocateStatus, string> = {
  georeferenced: 'requires verification',
  ambiguous: 'requires georeference',
  'not-found': 'requires georeference',
  unparseable: 'unable to georeference',
};

/** Status after a reviewer's decision (method §6), by decision (src/store/reviews.ts keeps the decisions). */
export const REVIEWED_STATUS: Record<'accepted' | 'rejected', string> = {
  accepted: 'verified by data custodian',
  rejected: 'requires georeference',
};
