/**
 * Records as CSV (RFC 4180, csv-stringify): the batch's appended Darwin Core columns and coordinate
 * flags, the reviewed file, and the page's one-record download. Every CSV whereabouts writes is
 * written here.
 *
 * A distinct locality's appended fields are rendered once (in the worker that georeferenced it) so the
 * batch's row writer only joins strings: the fields before georeferenceRemarks, the remarks (to which a
 * row's coordinate check may add), and the status after them.
 */
import { parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import { GEOREFERENCE_TERMS, type GeoreferenceTerm } from '../record/darwin-core.ts';
import { circleOf, type AdministrativeCenter, type Circle } from '../record/coordinate-check.ts';
import { termName } from '../record/term-names.ts';

/** The name of the output column that holds the flags; not a Darwin Core term (see the README). */
export const COORDINATE_FLAGS_COLUMN = 'whereabouts_coordinateFlags';

/** Flags are joined with the separator Darwin Core recommends for lists (Darwin Core Text Guide §2.3.1.1, from memory). */
export const FLAG_SEPARATOR = ' | ';

export type Delimiter = ',' | ';' | '\t';

/** A distinct locality's answer as the batch stores it: its Darwin Core fields and the record's administrative centers. */
export interface GroupFields {
  fields: Record<GeoreferenceTerm, string>;
  centers: AdministrativeCenter[];
  /** What the plausibility checks found about the proposed point (the flags column); absent in jobs stored before them. */
  flags?: string[];
}

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
  /** The locality type the text was read as, for the review list's facets. */
  localityType?: string;
  /** The plausibility flags of the proposed point, shared by every row of the group. */
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

/** Rows as a whole CSV document, each line ended by a line feed. */
export function csvDocument(rows: string[][]): string {
  return stringify(rows);
}

/**
 * Output column names for an input header: `proposed_<term>` where the record already has the term
 * (by name or by its full URI, as a portal's download may write it).
 * @example appendedColumnNames(['locality', 'decimalLatitude'])[0] // 'proposed_decimalLatitude'
 * @example appendedColumnNames(['http://rs.tdwg.org/dwc/terms/decimalLatitude'])[0] // 'proposed_decimalLatitude'
 */
export function appendedColumnNames(inputHeader: readonly string[], moreTerms: readonly string[] = []): string[] {
  const present = new Set(inputHeader.map(termName));
  return [...GEOREFERENCE_TERMS, ...moreTerms].map((term) => (present.has(term) ? `proposed_${term}` : term));
}

/**
 * The batch output's header: the input's columns, the appended terms (and any more asked for, such as the
 * generalisation terms), the flags column.
 * @example outputHeader(['locality']).at(-1) // 'whereabouts_coordinateFlags'
 */
export function outputHeader(inputHeader: readonly string[], moreTerms: readonly string[] = []): string[] {
  return [...inputHeader, ...appendedColumnNames(inputHeader, moreTerms), COORDINATE_FLAGS_COLUMN];
}

/**
 * Render a group's result for the writer.
 * @example renderGroup(result, ',').head // '-45.5000,-131.0000,EPSG:4326,2000,…'
 */
export function renderGroup(result: GroupFields, delimiter: Delimiter, localityType?: string): RenderedGroup {
  const values = GEOREFERENCE_TERMS.map((term) => result.fields[term]);
  return {
    head: csvLine(values.slice(0, REMARKS_AT), delimiter),
    remarks: result.fields.georeferenceRemarks,
    tail: csvLine(values.slice(REMARKS_AT + 1), delimiter),
    status: result.fields.georeferenceVerificationStatus,
    circle: circleOf(result.fields),
    centers: result.centers,
    flags: result.flags ?? [],
    ...(localityType ? { localityType } : {}),
  };
}

/**
 * One row's appended fields with more remarks, and its flags, as the end of a CSV line.
 * @example appendedLine(group, ['the record\'s coordinates … lie inside …'], ['agrees-with-locality'], ',')
 */
export function appendedLine(group: RenderedGroup, moreRemarks: string[], flags: string[], delimiter: Delimiter, moreTerms: string[] = []): string {
  const remarks = moreRemarks.length === 0 ? group.remarks : [group.remarks, ...moreRemarks].filter(Boolean).join('; ');
  return [group.head, csvLine([remarks], delimiter), group.tail, ...(moreTerms.length ? [csvLine(moreTerms, delimiter)] : []), csvLine([flags.join(FLAG_SEPARATOR)], delimiter)].join(delimiter);
}

/**
 * A rendered group's Darwin Core fields read back (the inverse of renderGroup's text parts).
 * @example groupFields(renderGroup(result, ','), ',').decimalLatitude // '-45.5000'
 */
export function groupFields(group: RenderedGroup, delimiter: Delimiter): Record<GeoreferenceTerm, string> {
  const [head] = parse(group.head, { delimiter, relax_quotes: false }) as string[][];
  const [tail] = parse(group.tail, { delimiter }) as string[][];
  const values = [...head, group.remarks, ...tail];
  return Object.fromEntries(GEOREFERENCE_TERMS.map((term, i) => [term, values[i] ?? ''])) as Record<GeoreferenceTerm, string>;
}

/**
 * The flags column read back into its flags.
 * @example readFlags('outside-locality-circle | fits-if-latitude-sign-flipped') // ['outside-locality-circle', 'fits-if-latitude-sign-flipped']
 */
export function readFlags(text: string | undefined): string[] {
  return text ? text.split(FLAG_SEPARATOR).map((f) => f.trim()).filter(Boolean) : [];
}

/**
 * One record's Darwin Core fields as a two-line CSV (header, values), every field quoted, lines ended
 * by CR LF (RFC 4180 §2): the page's "Download CSV row".
 * @example recordCsv('Alba', { decimalLatitude: '-45.5', … }) // '"locality","decimalLatitude",…\r\n"Alba","-45.5",…\r\n'
 */
export function recordCsv(locality: string, darwinCore: Record<string, string>): string {
  const entries = Object.entries(darwinCore);
  return stringify([['locality', ...entries.map(([k]) => k)], [locality, ...entries.map(([, v]) => v)]], { quoted: true, quoted_empty: true, record_delimiter: '\r\n' });
}
