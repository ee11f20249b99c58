/**
 * Which rows share a georeference: the locality text, normalised, plus every field that changes what
 * `locate` is asked. Rows with the same key are georeferenced once.
 */
import type { LocateRequest } from '../locate/locate.ts';

/** The optional batch columns passed to `locate` (issue 2 batch CSV contract), in key order. */
export const REQUEST_COLUMNS = ['countryCode', 'country', 'stateProvince', 'county', 'municipality', 'geodeticDatum', 'verbatimCoordinates'] as const;

/** Columns holding the locality text, in order of preference. */
export const LOCALITY_COLUMNS = ['locality', 'verbatimLocality'] as const;

/** Where each column the batch reads stands in the header. */
export interface ColumnIndex {
  locality: number[];
  request: Partial<Record<(typeof REQUEST_COLUMNS)[number], number>>;
  decimalLatitude?: number;
  decimalLongitude?: number;
}

/**
 * Find the columns the batch reads; an error naming the missing column when there is no locality column.
 * @example indexColumns(['occurrenceID', 'locality', 'countryCode']).locality // [1]
 */
export function indexColumns(header: readonly string[]): ColumnIndex {
  const at = (name: string) => (header.indexOf(name) >= 0 ? header.indexOf(name) : undefined);
  const locality = LOCALITY_COLUMNS.map(at).filter((i): i is number => i !== undefined);
  if (locality.length === 0) {
    throw new Error(`the input has no "locality" or "verbatimLocality" column (its header is: ${header.map((h) => JSON.stringify(h)).join(', ')})`);
  }
  const request: ColumnIndex['request'] = {};
  for (const name of REQUEST_COLUMNS) if (at(name) !== undefined) request[name] = at(name);
  return { locality, request, decimalLatitude: at('decimalLatitude'), decimalLongitude: at('decimalLongitude') };
}

/** Unicode NFC, outer spaces trimmed, inner runs of white space made one space: nothing else changes. */
export function normaliseText(text: string): string {
  return text.normalize('NFC').replace(/\s+/g, ' ').trim();
}

/** A group's request and its key (the request as JSON, so equal requests share one key). */
export interface LocalityGroup {
  key: string;
  request: LocateRequest;
}

/**
 * The group a row belongs to: the first non-blank locality column, normalised, with the request columns.
 * @example groupOf(['x1', ' 10 km  NE of Alba '], indexColumns(['occurrenceID', 'locality'])).request.locality // '10 km NE of Alba'
 */
export function groupOf(fields: readonly string[], columns: ColumnIndex): LocalityGroup {
  const localities = columns.locality.map((i) => normaliseText(fields[i] ?? ''));
  const request: LocateRequest = { locality: localities.find((t) => t !== '') ?? '' };
  for (const name of REQUEST_COLUMNS) {
    const i = columns.request[name];
    const value = i === undefined ? '' : normaliseText(fields[i] ?? '');
    if (value !== '') request[name] = name === 'countryCode' ? value.toUpperCase() : value;
  }
  return { key: JSON.stringify([request.locality, ...REQUEST_COLUMNS.map((name) => request[name] ?? '')]), request };
}
