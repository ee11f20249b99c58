/**
 * Reading the world-gazetteer dump layout for an import on a thread of its own: the reading thread
 * (import-dump-thread.ts) reads the file, checks each row and works out what the store indexes it by,
 * while the importing thread only writes, so the two halves of the work run on two cores at once.
 * Rows cross between the threads in batches packed as a few strings and typed arrays: a structured
 * clone of the rows as objects would cost the writing thread about as much as the work it saves.
 */
import type { Readable } from 'node:stream';
import { Worker } from 'node:worker_threads';
import iconv from 'iconv-lite';
import { readDumpLine } from './dump-layout.ts';
import { checkFeature, type RawFeature } from './feature-record.ts';
import { openFileInput } from './file-input.ts';
import type { FeatureRecord } from './gazetteer-store.ts';
import { indexTerms, type IndexTerms } from './index-terms.ts';
import { storedTokenKeys } from '../match/edit-distance.ts';
import { decodedText, type InputFormat } from './input-format.ts';

/** One row as a reader yields it (in arrays of rows): a feature to check, or why it could not be read. */
export interface ReadRow {
  row: number;
  raw: RawFeature | string;
}

/** One row checked: the feature the store keeps, with its index terms when worked out already, or why it is refused. */
export interface CheckedRow {
  row: number;
  checked: FeatureRecord | string;
  terms?: IndexTerms;
  /** The row's unit codes (RawFeature.unitCodes), for the store's unit names. */
  unitCodes?: readonly string[];
}

/** What the reading thread is given. */
export interface DumpThreadData {
  filePath: string;
  zipped: boolean;
  format: InputFormat;
  adminNames: ReadonlyMap<string, string>;
  radii?: Readonly<Record<string, number>>;
  /** One counter, of the batches the writing thread has taken: the reading thread stays within BATCHES_AHEAD of it. */
  taken: Int32Array;
}

/** A batch of rows as it crosses between threads (see `packRows`). */
export interface PackedRows {
  /** The rows' text fields, joined. */
  text: string;
  /**
   * The rows' index keys and words, each a string of its own: they outlive the batch in the store's
   * buffers and token cache, and a piece cut from the joined text would keep all of it alive.
   */
  terms: string[];
  counts: Int32Array;
  numbers: Float64Array;
  /** For each row with words new to the reading thread: for each such word, its place among the row's words, the number of its keys, the keys. */
  deletionKeys: Int32Array;
}

/** What the reading thread posts: a batch, the end, or why it stopped. */
export type DumpThreadMessage = { rows: PackedRows } | { done: true } | { error: string };

/**
 * Bytes a read takes: small reads, because a reader turns a whole read into rows at once, and rows
 * that outlive a young-generation collection cost heap until the next full one.
 */
export const READ_BYTES = 16 * 1024;
/** Bytes a read takes on the reading thread (the importing thread reads other layouts in smaller reads, see import.ts). */
export const THREAD_READ_BYTES = 64 * 1024;
/**
 * Batches the reading thread may post before the writing thread has taken them: it reads ahead this
 * far, no further (some 25,000 rows, a few MB). Enough that neither thread waits for the other when
 * the system runs another process in between.
 */
export const BATCHES_AHEAD = 32;
/**
 * Integers a packed row starts with: row number, kind (0 refused, 1 feature), default radius (1) or
 * not, and the numbers of alternate names, keys, words and words with their deletion keys.
 */
const COUNTS_PER_ROW = 7;
/** Fields are joined by a tab, which no field of the dump layout holds (its lines are split at tabs). */
const FIELD_SEPARATOR = '\t';
/**
 * Words whose deletion keys the reading thread has sent, at most: the writing thread keeps as many
 * token ids (TOKEN_CACHE_LIMIT in gazetteer-store.ts), and works out the keys itself of a word sent before.
 */
const SENT_WORDS_LIMIT = 1_000_000;

/**
 * The module the reading thread loads. Compiled (dist/), the thread's module itself; run from the
 * TypeScript sources, an entry that registers tsx first (worker threads do not inherit the loader).
 */
const THREAD_ENTRY = import.meta.url.endsWith('.ts')
  ? new URL('./import-dump-thread-entry.js', import.meta.url)
  : new URL('./import-dump-thread.js', import.meta.url);

/**
 * The dump's text, plain or the data member of a zip archive (read as UTF-8, as published), in reads of `readBytes`.
 * @example for await (const text of await openDumpText('QX.zip', true, format)) …
 */
export async function openDumpText(filePath: string, zipped: boolean, format: InputFormat, readBytes = READ_BYTES): Promise<Readable> {
  return zipped
    ? (await openFileInput(filePath, readBytes)).stream.pipe(iconv.decodeStream('utf-8')) as unknown as Readable
    : decodedText(filePath, format, readBytes);
}

/**
 * The dump's lines (ending in LF or CRLF), a chunk of the file at a time: one await a chunk rather
 * than one a line, which matters at millions of rows.
 */
export async function* readDump(input: Readable, adminNames: ReadonlyMap<string, string>): AsyncGenerator<ReadRow[]> {
  let row = 0;
  let rest = '';
  const read = (lines: string[]): ReadRow[] => {
    const rows: ReadRow[] = [];
    for (const line of lines) {
      row++;
      const text = line.endsWith('\r') ? line.slice(0, -1) : line;
      if (text !== '') rows.push({ row, raw: readDumpLine(text, adminNames) });
    }
    return rows;
  };
  for await (const chunk of input as AsyncIterable<string>) {
    const lines = (rest + chunk).split('\n');
    rest = lines.pop() ?? '';
    yield read(lines);
  }
  if (rest !== '') yield read([rest]);
}

/**
 * Checks a read row (with its alternate names staged from a side file, if any) as the store keeps it.
 * @example checkRow({ row: 2, raw: { name: 'Alto', latitude: '95', longitude: '10' } }) // { row: 2, checked: 'latitude 95 is outside −90…90' }
 */
export function checkRow({ row, raw }: ReadRow, radii?: Readonly<Record<string, number>>): CheckedRow {
  return { row, checked: typeof raw === 'string' ? raw : checkFeature(raw, `row-${row}`, radii) };
}

/**
 * The dump's rows checked and with their index terms, read on a thread of its own (import-dump-thread.ts);
 * at most BATCHES_AHEAD batches wait. The thread ends when the rows do, or when the caller stops early.
 * @example for await (const batch of checkedDumpRows({ filePath, zipped: false, format, adminNames: new Map() })) …
 */
export async function* checkedDumpRows(data: Omit<DumpThreadData, 'taken'>): AsyncGenerator<CheckedRow[]> {
  const taken = new Int32Array(new SharedArrayBuffer(4));
  const thread = new Worker(THREAD_ENTRY, { workerData: { ...data, taken } satisfies DumpThreadData });
  const waiting: (PackedRows | Error | null)[] = [];
  let wake: (() => void) | null = null;
  const arrive = (item: PackedRows | Error | null) => {
    waiting.push(item);
    wake?.();
    wake = null;
  };
  thread.on('message', (message: DumpThreadMessage) => arrive('rows' in message ? message.rows : 'error' in message ? new Error(message.error) : null));
  thread.on('error', arrive);
  thread.on('exit', (code) => arrive(new Error(`the import's reading thread stopped (exit code ${code})`)));
  try {
    for (;;) {
      while (waiting.length === 0) await new Promise<void>((resolve) => { wake = resolve; });
      const item = waiting.shift()!;
      if (item === null) return;
      if (item instanceof Error) throw item;
      // The batch is taken: the reading thread may read one more ahead (a shared counter costs less than a message).
      Atomics.add(taken, 0, 1);
      Atomics.notify(taken, 0);
      yield unpackRows(item);
    }
  } finally {
    // Stopped early (a failure), the thread may be waiting for a batch to be taken: it is let go first.
    Atomics.store(taken, 0, 2 ** 30);
    Atomics.notify(taken, 0);
    await thread.terminate();
  }
}

/**
 * Packs checked rows with their index terms (a point feature of the dump layout, or a reason) for the
 * other thread: the strings joined in one, counts and numbers in typed arrays (transferred, not copied),
 * and the deletion keys of the words not in `sentWords`, which are then added to it.
 */
export function packRows(rows: readonly CheckedRow[], sentWords: Set<string>): PackedRows {
  const fields: string[] = [];
  const terms: string[] = [];
  const counts = new Int32Array(rows.length * COUNTS_PER_ROW);
  const numbers = new Float64Array(rows.length * 3);
  const deletionKeys: number[] = [];
  rows.forEach(({ row, checked }, i) => {
    counts[i * COUNTS_PER_ROW] = row;
    if (typeof checked === 'string') {
      fields.push(checked);
      return;
    }
    // The dump layout gives points with their names only: the rest of a FeatureRecord is not packed.
    if (checked.geometry !== null || checked.nameDetails !== undefined) throw new Error('packRows packs point features without name details');
    const { keys, tokens } = indexTerms(checked.name, checked.alternateNames);
    // Plain loops and stores, no array made a row: this thread's work bounds the import's rows phase.
    let newWords = 0;
    for (let place = 0; place < tokens.length; place++) {
      const token = tokens[place];
      if (sentWords.has(token)) continue;
      if (sentWords.size >= SENT_WORDS_LIMIT) sentWords.clear();
      sentWords.add(token);
      const hashes = storedTokenKeys(token);
      deletionKeys.push(place, hashes.length);
      for (const hash of hashes) deletionKeys.push(hash);
      newWords++;
    }
    const at = i * COUNTS_PER_ROW;
    counts[at + 1] = 1;
    counts[at + 2] = checked.radiusIsDefault ? 1 : 0;
    counts[at + 3] = checked.alternateNames.length;
    counts[at + 4] = keys.length;
    counts[at + 5] = tokens.length;
    counts[at + 6] = newWords;
    numbers[i * 3] = checked.latitude;
    numbers[i * 3 + 1] = checked.longitude;
    numbers[i * 3 + 2] = checked.radiusMeters;
    fields.push(checked.featureId, checked.name, checked.featureType ?? '', checked.countryCode ?? '', checked.stateProvince ?? '', checked.county ?? '');
    for (const name of checked.alternateNames) fields.push(name);
    for (const key of keys) terms.push(key);
    for (const token of tokens) terms.push(token);
  });
  return { text: fields.join(FIELD_SEPARATOR), terms, counts, numbers, deletionKeys: Int32Array.from(deletionKeys) };
}

/** The rows `packRows` packed. An empty text field stands for null: the checked record holds no empty text. */
function unpackRows({ text, terms, counts, numbers, deletionKeys }: PackedRows): CheckedRow[] {
  const fields = text.split(FIELD_SEPARATOR);
  const rows: CheckedRow[] = [];
  let at = 0;
  let termAt = 0;
  let keyAt = 0;
  const orNull = (field: string) => (field === '' ? null : field);
  for (let i = 0; i * COUNTS_PER_ROW < counts.length; i++) {
    const base = i * COUNTS_PER_ROW;
    const row = counts[base];
    if (counts[base + 1] === 0) {
      rows.push({ row, checked: fields[at++] });
      continue;
    }
    const featureId = fields[at];
    const name = fields[at + 1];
    const featureType = orNull(fields[at + 2]);
    const countryCode = orNull(fields[at + 3]);
    const stateProvince = orNull(fields[at + 4]);
    const county = orNull(fields[at + 5]);
    at += 6;
    const alternateNames = fields.slice(at, at += counts[base + 3]);
    const keys = terms.slice(termAt, termAt += counts[base + 4]);
    const tokens = terms.slice(termAt, termAt += counts[base + 5]);
    const indexed: IndexTerms = { keys, tokens };
    if (counts[base + 6] > 0) {
      const byWord = new Map<string, Int32Array>();
      for (let word = 0; word < counts[base + 6]; word++) {
        const length = deletionKeys[keyAt + 1];
        byWord.set(tokens[deletionKeys[keyAt]], deletionKeys.subarray(keyAt + 2, keyAt + 2 + length));
        keyAt += 2 + length;
      }
      indexed.deletionKeys = byWord;
    }
    rows.push({
      row,
      checked: {
        featureId, name, alternateNames, featureType, countryCode, stateProvince, county, nameDetails: undefined,
        latitude: numbers[i * 3], longitude: numbers[i * 3 + 1], radiusMeters: numbers[i * 3 + 2], radiusIsDefault: counts[base + 2] === 1,
        geometryType: 'Point', geometry: null,
      },
      terms: indexed,
    });
  }
  return rows;
}
