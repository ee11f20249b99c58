/**
 * One input cut into N parts for a cluster: a row goes to the part named by a hash of its locality's
 * key (the key rows already share a georeference by), so each distinct locality is georeferenced in
 * exactly one part. A part is written as a part file: a line naming the format, a line of JSON saying
 * what the part was made from (the merge's checks), then the output's header line and each of the
 * part's output rows as frames `<row number> <byte length>\n<bytes>`, so that the merge can put the rows
 * back in input order without reading the input again.
 */
import { createHash } from 'node:crypto';
import type { Source } from '../match/types.ts';

/** One of N parts: `index` counted from 0. */
export interface PartSpec {
  index: number;
  count: number;
}

/** The first line of every part file (its format and format version). */
export const PART_FILE_MAGIC = 'whereabouts part file 1';

/** What a part was made from, the part file's second line: parts merge only when all of it agrees. */
export interface PartMeta {
  part: number;
  parts: number;
  inputSha256: string;
  inputBytes: number;
  /** Rows of the whole input, the header not counted. */
  inputRows: number;
  settings: string;
  version: string;
  sources: Source[];
  runTimestamp: string;
  delimiter: string;
  encoding: string;
}

/** More parts than this is a typing error rather than a cluster [CHOICE]. */
export const MAX_PARTS = 100_000;

/**
 * Read `K/N` (part K of N, K counted from 0 as Slurm counts array tasks).
 * @example parsePartSpec('2/4') // { index: 2, count: 4 }
 */
export function parsePartSpec(text: string): PartSpec {
  const match = /^(\d+)\/(\d+)$/.exec(text.trim());
  const index = match ? Number(match[1]) : NaN;
  const count = match ? Number(match[2]) : NaN;
  if (!match || count < 1 || count > MAX_PARTS || index >= count) {
    throw new Error(`--part takes K/N, part K (from 0) of N parts with 0 <= K < N <= ${MAX_PARTS}, such as 0/4; not "${text}"`);
  }
  return { index, count };
}

/** The run timestamp as a job stores it: UTC to the second. */
const RUN_TIMESTAMP = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/;

/**
 * Refuse a run timestamp (georeferencedDate) that is not a UTC time to the second: every part of one
 * input must record the same one, as one machine would.
 * @example checkRunTimestamp('2026-05-01T09:30:00Z') // returns; '2026-05-01 09:30' throws
 */
export function checkRunTimestamp(text: string): void {
  if (!RUN_TIMESTAMP.test(text) || Number.isNaN(Date.parse(text))) {
    throw new Error(`the run timestamp must be a UTC time to the second, such as 2026-05-01T09:30:00Z; not "${text}"`);
  }
}

/**
 * The part a locality key belongs to: the first 6 bytes of its SHA-256 (FIPS 180-4), as a number, modulo
 * the part count. Rows that could not be read have no key; they go to part 0.
 * @example partOfKey('["Alba","","","","","","",""]', 4) // a whole number from 0 to 3, the same on every machine
 */
export function partOfKey(key: string | undefined, count: number): number {
  if (key === undefined || count === 1) return 0;
  return createHash('sha256').update(key, 'utf8').digest().readUIntBE(0, 6) % count;
}

/**
 * The start of a part file: the format line, the meta line and the output's header line as a frame.
 * @example partFileStart(meta, 'occurrenceID,locality,…\r\n') // 'whereabouts part file 1\n{"part":0,…}\nH 27\noccurrenceID,…'
 */
export function partFileStart(meta: PartMeta, headerLine: string): string {
  return `${PART_FILE_MAGIC}\n${JSON.stringify(meta)}\n${frame('H', headerLine)}`;
}

/**
 * One output row as a frame of a part file, named by its row number in the input (from 1).
 * @example partRowFrame(7, 'x1,Alba,…\r\n') // 'R 7 11\nx1,Alba,…\r\n'
 */
export function partRowFrame(rowNumber: number, line: string): string {
  return frame(`R ${rowNumber}`, line);
}

function frame(label: string, text: string): string {
  return `${label} ${Buffer.byteLength(text, 'utf8')}\n${text}`;
}
