/**
 * A record's answer as the JSON body of POST /api/v1/georeference (and of `whereabouts locate --json`):
 * the locate result, its Darwin Core terms, the footprint as GeoJSON geometry for the map, and how far
 * the record's own coordinates lie from the proposed point.
 */
import type { MultiPolygon, Polygon } from 'geojson';
import type { Candidate } from '../match/types.ts';
import type { RecordAnswer } from '../locate/georeference-record.ts';
import type { LocateResult } from '../locate/locate.ts';
import type { RecordPoint } from '../record/coordinate-check.ts';
import type { GeoreferenceTerm } from '../record/darwin-core.ts';
import { footprintSummary, type FootprintSummary } from '../geodesy/wkt.ts';
import { footprintGeometry } from './footprint-geometry.ts';

/** The body: the locate result (candidates without their geometry), its Darwin Core fields, the footprint and the record's point. */
export interface AnswerBody extends LocateResult {
  darwinCore: Record<GeoreferenceTerm, string>;
  footprint?: Polygon | MultiPolygon;
  /** Type, vertex count and area of the footprint, to show instead of its coordinates. */
  footprintSummary?: FootprintSummary;
  /** How far the record's own coordinates lie from the proposed point. */
  recordPoint?: RecordPoint;
}

/**
 * The JSON body of one answer.
 * @example answerBody(georeferenceRecord(store, request)).darwinCore.georeferenceVerificationStatus // 'requires verification'
 */
export function answerBody(answer: RecordAnswer): AnswerBody {
  const { result, darwinCore, coordinateCheck } = answer;
  const body: AnswerBody = { ...result, candidates: result.candidates.map(withoutGeometry), darwinCore };
  const g = result.georeference;
  if (g) body.footprint = footprintGeometry(g.footprintWKT);
  if (body.footprint) body.footprintSummary = footprintSummary(body.footprint);
  if (coordinateCheck?.recordPoint) body.recordPoint = coordinateCheck.recordPoint;
  return body;
}

/** The body as text: two-space indented JSON and a line end, as the CLI prints it. */
export function answerJson(answer: RecordAnswer): string {
  return `${JSON.stringify(answerBody(answer), null, 2)}\n`;
}

function withoutGeometry(candidate: Candidate): Candidate {
  if (!candidate.feature.geometry) return candidate;
  const { geometry: _geometry, ...feature } = candidate.feature;
  return { ...candidate, feature };
}
