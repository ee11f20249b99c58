/**
 * The Darwin Core georeference terms whereabouts adds beside a record's own fields (method §6).
 * Originals are never touched: where a record already has a term, the proposal is `proposed_<term>`.
 */
import type { Source } from '../match/types.ts';
import { inverse } from '../geodesy/geodesic.ts';
import type { Georeference } from '../georef/types.ts';
import type { Interpretation } from '../parse/types.ts';
import { VERSION } from '../version.ts';
import { reportedPrecision } from './reported-precision.ts';
import { VERIFICATION_STATUS, type LocateStatus } from './verification-status.ts';

/** What the terms are written from: the outcome of locating a record (`LocateResult` has this shape). */
export interface LocatedRecord {
  status: LocateStatus;
  georeference?: Georeference;
  reason?: string;
  interpretation: Pick<Interpretation, 'notes' | 'type' | 'coordinates'>;
}

/** The appended terms, in output order. Every one is a Darwin Core term (TDWG, dwc terms list). */
export const GEOREFERENCE_TERMS = [
  'decimalLatitude',
  'decimalLongitude',
  'geodeticDatum',
  'coordinateUncertaintyInMeters',
  'coordinatePrecision',
  'footprintWKT',
  'footprintSRS',
  'georeferencedBy',
  'georeferencedDate',
  'georeferenceProtocol',
  'georeferenceSources',
  'georeferenceRemarks',
  'georeferenceVerificationStatus',
] as const;

export type GeoreferenceTerm = (typeof GEOREFERENCE_TERMS)[number];

/** Who and when, shared by every record of one run so that a rerun is byte-identical but for them. */
export interface RecordContext {
  georeferencedBy: string;
  /** ISO 8601 date-time of the run. */
  georeferencedDate: string;
  /** The loaded gazetteer sources, to cite with their content hash. */
  sources: Source[];
}

export const PROTOCOL = `point-radius method (Wieczorek, Guo & Hijmans 2004, doi:10.1080/13658810412331280211; Chapman & Wieczorek 2020, Georeferencing Best Practices, doi:10.15468/doc-gg7h-s853) as applied by whereabouts ${VERSION}`;

/**
 * The appended Darwin Core fields for one result.
 * @example
 *   darwinCoreFields(result, { georeferencedBy: 'whereabouts 0.1.0', georeferencedDate: '2026-12-01T12:00:00Z', sources })
 *   // { decimalLatitude: '-45.4321', ..., georeferenceVerificationStatus: 'requires verification' }
 */
export function darwinCoreFields(result: LocatedRecord, context: RecordContext): Record<GeoreferenceTerm, string> {
  const status = VERIFICATION_STATUS[result.status];
  const common = {
    georeferencedBy: context.georeferencedBy,
    georeferencedDate: context.georeferencedDate,
    georeferenceProtocol: PROTOCOL,
    georeferenceVerificationStatus: status,
  };
  const g = result.georeference;
  if (result.status !== 'georeferenced' || !g) {
    return {
      ...blankCoordinates(),
      ...common,
      georeferenceSources: citeSources(result, context.sources),
      georeferenceRemarks: [result.reason, ...result.interpretation.notes].filter(Boolean).join('; '),
    };
  }
  const written = result.interpretation.type === 'coordinates' ? result.interpretation.coordinates : undefined;
  const { decimals, coordinatePrecision, remark } = reportedPrecision(g.uncertaintyMeters, written);
  const latitude = roundTo(g.latitude, decimals);
  const longitude = roundTo(g.longitude, decimals);
  const shift = inverse(g.latitude, g.longitude, latitude, longitude).meters;
  return {
    decimalLatitude: latitude.toFixed(decimals),
    decimalLongitude: longitude.toFixed(decimals),
    geodeticDatum: 'EPSG:4326',
    coordinateUncertaintyInMeters: String(Math.ceil(g.uncertaintyMeters + shift)),
    coordinatePrecision,
    footprintWKT: g.footprintWKT,
    footprintSRS: 'EPSG:4326',
    ...common,
    georeferenceSources: citeSources(result, context.sources),
    georeferenceRemarks: [
      ...g.remarks,
      `${remark}; the ${shift.toFixed(1)} m this rounding moved the point is added before the radius is rounded up to whole meters [CHOICE] (docs/method.md §6)`,
    ].join('; '),
  };
}

function blankCoordinates() {
  return { decimalLatitude: '', decimalLongitude: '', geodeticDatum: '', coordinateUncertaintyInMeters: '', coordinatePrecision: '', footprintWKT: '', footprintSRS: '' };
}

function roundTo(value: number, decimals: number): number {
  const factor = 10 ** decimals;
  return Math.round(value * factor) / factor;
}

/** Each gazetteer source used, with its content hash and the feature ids, so the result can be reproduced. */
function citeSources(result: LocatedRecord, sources: Source[]): string {
  const used = result.georeference?.features ?? [];
  const bySource = new Map<string, string[]>();
  for (const f of used) bySource.set(f.sourceId, [...(bySource.get(f.sourceId) ?? []), f.featureId]);
  return [...bySource]
    .map(([id, featureIds]) => {
      const s = sources.find((x) => x.id === id);
      const cited = s ? `${s.citation} (source ${s.id}, sha256 ${s.contentHash.slice(0, 16)})` : `source ${id}`;
      return `${cited}: feature ${featureIds.join(', ')}`;
    })
    .join(' | ');
}
