/**
 * A distinct locality's appended fields, written as CSV once (in the worker that georeferenced it) so the
 * row writer only joins strings: the fields before georeferenceRemarks, the remarks (to which a row's
 * coordinate check may add), and the status after them.
 */
import { stringify } from 'csv-stringify/sync';
import { GEOREFERENCE_TERMS, type GeoreferenceTerm } from '../record/darwin-core.ts';
import type { AdministrativeCenter, Circle } from './coordinate-check.ts';
import type { GroupResult } from './georeference-group.ts';
import type { Delimiter } from './records.ts';

export interface RenderedGroup {
  /** The appended terms before georeferenceRemarks, as CSV. */
  head: string;
  remarks: string;
  /** georeferenceVerificationStatus, as CSV. */
  tail: string;
  status: string;
  /** The proposed circle as written (rounded point, radius rounded up), for the coordinate check. */
  circle?: Circle;
  centers: AdministrativeCenter[];
  /** The plausibility flags of the proposed point, shared by every row of the group (absent in groups stored before them). */
  flags?: string[];
}

const REMARKS_AT = GEOREFERENCE_TERMS.indexOf('georeferenceRemarks');

/**
 * Fields as one CSV line without its line end (csv-stringify quotes each field on its own, RFC 4180, so
 * lines can be joined from parts).
 * @example csvLine(['a', 'b,c'], ',') // 'a,"b,c"'
 */
export function csvLine(fields: string[], delimiter: Delimiter): string {
  return stringify([fields], { delimiter, eof: false });
}

/**
 * Render a group's result for the writer.
 * @example renderGroup(result, ',').head // '-45.5000,-131.0000,EPSG:4326,2000,…'
 */
export function renderGroup(result: GroupResult, delimiter: Delimiter): RenderedGroup {
  const values = GEOREFERENCE_TERMS.map((term) => result.fields[term]);
  return {
    head: csvLine(values.slice(0, REMARKS_AT), delimiter),
    remarks: result.fields.georeferenceRemarks,
    tail: csvLine(values.slice(REMARKS_AT + 1), delimiter),
    status: result.fields.georeferenceVerificationStatus,
    circle: circleOf(result.fields),
    centers: result.centers,
    flags: result.flags ?? [],
  };
}

/**
 * One row's appended fields with more remarks, and its flags, as the end of a CSV line.
 * @example appendedLine(group, ['the record\'s coordinates … lie inside …'], 'agrees-with-locality', ',')
 */
export function appendedLine(group: RenderedGroup, moreRemarks: string[], flags: string, delimiter: Delimiter): string {
  const remarks = moreRemarks.length === 0 ? group.remarks : [group.remarks, ...moreRemarks].filter(Boolean).join('; ');
  return [group.head, csvLine([remarks], delimiter), group.tail, csvLine([flags], delimiter)].join(delimiter);
}

function circleOf(fields: Record<GeoreferenceTerm, string>): Circle | undefined {
  if (fields.decimalLatitude === '' || fields.coordinateUncertaintyInMeters === '') return undefined;
  return { latitude: Number(fields.decimalLatitude), longitude: Number(fields.decimalLongitude), radiusMeters: Number(fields.coordinateUncertaintyInMeters) };
}
