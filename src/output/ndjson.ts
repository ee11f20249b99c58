/**
 * Answers as NDJSON lines (one JSON object a line, each ending in "\n"), as the many-records endpoint
 * streams them: the record's place in the request, its occurrenceID when it had one, the status, the
 * Darwin Core terms and the coordinate flags; or, for a record that could not be read, its error.
 */
import type { RecordAnswer } from '../locate/georeference-record.ts';
import type { GeoreferenceTerm } from '../record/darwin-core.ts';

/** One line of the stream. `status` is the locate status; "invalid" for a record refused before it was located; "failed" when the service could not answer it. */
export interface RecordLine {
  index: number;
  occurrenceID?: string;
  status: string;
  darwinCore?: Record<GeoreferenceTerm, string>;
  flags?: string[];
  /** Why no georeference was made. */
  reason?: string;
  /** For an invalid record: what is wrong, and the field it is about. */
  error?: { message: string; field?: string };
}

/**
 * The line for a record's answer.
 * @example answerLine(0, 'QV-1', answer) // '{"index":0,"occurrenceID":"QV-1","status":"georeferenced","darwinCore":{…},"flags":[]}\n'
 */
export function answerLine(index: number, occurrenceID: string | undefined, answer: RecordAnswer): string {
  const { result, darwinCore, coordinateCheck } = answer;
  return lineOf({ index, ...(occurrenceID === undefined ? {} : { occurrenceID }), status: result.status, darwinCore, flags: coordinateCheck?.flags ?? [], ...(result.reason ? { reason: result.reason } : {}) });
}

/**
 * The line for a record refused before it was located ("invalid") or one the service could not answer ("failed").
 * @example errorLine(3, undefined, { message: 'records[3].locality must be string', field: 'locality' }) // '{"index":3,"status":"invalid","error":{…}}\n'
 */
export function errorLine(index: number, occurrenceID: string | undefined, error: { message: string; field?: string }, status: 'invalid' | 'failed' = 'invalid'): string {
  return lineOf({ index, ...(occurrenceID === undefined ? {} : { occurrenceID }), status, error });
}

function lineOf(line: RecordLine): string {
  return `${JSON.stringify(line)}\n`;
}
