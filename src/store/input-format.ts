/**
 * What an input file is, read from its bytes in one streaming pass: its sha256 (the job's identity) and
 * its text encoding. Constant memory whatever the file's size.
 */
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import type { Readable } from 'node:stream';
import iconv from 'iconv-lite';

/** Encodings a batch file may come in; the names are the ones iconv-lite decodes. */
export type InputEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252' | 'latin1';

export interface InputFormat {
  sha256: string;
  bytes: number;
  encoding: InputEncoding;
  /** Length in bytes of the byte order mark to skip (0 when there is none). */
  bomBytes: number;
  /**
   * Not valid UTF-8, yet holding well-formed multi-byte UTF-8 sequences: most likely UTF-8 with some
   * damaged bytes rather than Windows-1252 text (which forms such a sequence only where a capital
   * accented letter stands before a symbol of 0x80–0xBF). Batches still read it as Windows-1252, so
   * that no byte is lost; the gazetteer importer reads it as UTF-8 and refuses the damaged rows.
   */
  damagedUtf8?: boolean;
  /** A first line declaring the delimiter ("sep=;"), which is not the header (see `delimiterDeclaration`). */
  delimiterDeclaration?: DelimiterDeclaration;
}

/** The line "sep=X" and its line end as written, the delimiter it names, and its length in the file's bytes. */
export interface DelimiterDeclaration {
  delimiter: HeaderDelimiter;
  line: string;
  bytes: number;
}

/**
 * Byte values Windows-1252 leaves undefined (Microsoft's code page table, bestfit1252.txt, from memory):
 * a file holding any of them is read as ISO-8859-1, where every byte is a character, so nothing is lost.
 */
const UNDEFINED_IN_WINDOWS_1252 = new Set([0x81, 0x8d, 0x8f, 0x90, 0x9d]);

/**
 * Hash the file and decide its encoding: a byte order mark first (Unicode Standard §23.8: EF BB BF,
 * FF FE, FE FF), then UTF-16 without one when every other byte of the start is zero, then UTF-8 when
 * every byte sequence is valid UTF-8 (RFC 3629), otherwise Windows-1252 (or ISO-8859-1, see above).
 * @example await inspectInput('records.csv') // { sha256: '9f…', bytes: 1204, encoding: 'utf-8', bomBytes: 3 }
 */
export async function inspectInput(path: string): Promise<InputFormat> {
  const hash = createHash('sha256');
  const utf8 = new TextDecoder('utf-8', { fatal: true });
  let bytes = 0;
  let head: Buffer | undefined;
  let validUtf8 = true;
  for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 }) as AsyncIterable<Buffer>) {
    hash.update(chunk);
    head ??= chunk.subarray(0, 4096);
    bytes += chunk.length;
    if (validUtf8) validUtf8 = decodes(utf8, chunk, false);
  }
  if (validUtf8) validUtf8 = decodes(utf8, new Uint8Array(0), true);
  const sha256 = hash.digest('hex');
  const start = head ?? Buffer.alloc(0);
  const byBom = encodingByBom(start);
  const utf16 = utf16WithoutBom(start);
  const format: InputFormat = byBom
    ? { sha256, bytes, ...byBom }
    : utf16
      ? { sha256, bytes, encoding: utf16, bomBytes: 0 }
      : validUtf8
        ? { sha256, bytes, encoding: 'utf-8', bomBytes: 0 }
        : await singleByteFormat(path, sha256, bytes);
  const declaration = delimiterDeclaration(start, format);
  return declaration ? { ...format, delimiterDeclaration: declaration } : format;
}

/**
 * A first line "sep=;", "sep=," or "sep=" and a tab, written by some spreadsheet exports to tell the
 * delimiter (common practice, no published source): the delimiter it names and the line as written with
 * its line end. The reading starts at the header after it, and a batch writes the line back before its
 * output's header, so that the output opens as the input did. Other delimiters after "sep=" are not read
 * as a declaration.
 * @example delimiterDeclarationLine('sep=;\r\nid;locality\r\n') // { delimiter: ';', line: 'sep=;\r\n' }
 */
export function delimiterDeclarationLine(text: string): Omit<DelimiterDeclaration, 'bytes'> | undefined {
  const match = /^sep=([,;\t])(\r?\n)/i.exec(text);
  return match ? { delimiter: match[1] as HeaderDelimiter, line: match[0] } : undefined;
}

/** The declaration at the file's start (after its byte order mark), with its length in the file's bytes. */
function delimiterDeclaration(start: Buffer, format: InputFormat): DelimiterDeclaration | undefined {
  const declared = delimiterDeclarationLine(iconv.decode(start.subarray(format.bomBytes, format.bomBytes + 64), format.encoding));
  return declared && { ...declared, bytes: iconv.encode(declared.line, format.encoding).length };
}

/**
 * Windows-1252 or ISO-8859-1 for a file that is not UTF-8, from its high bytes (see tallyHighBytes),
 * read again: few files are not UTF-8, and a tally in the first reading would cost every UTF-8 file
 * a loop over its bytes on the importing thread (0.6 s of CPU for an 80 MB dump).
 * @example await singleByteFormat('fichas.csv', '9f…', 1204) // { sha256: '9f…', bytes: 1204, encoding: 'windows-1252', bomBytes: 0, damagedUtf8: false }
 */
async function singleByteFormat(path: string, sha256: string, bytes: number): Promise<InputFormat> {
  const high = { undefinedIn1252: false, utf8Sequences: 0 };
  for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 }) as AsyncIterable<Buffer>) tallyHighBytes(chunk, high);
  return { sha256, bytes, encoding: high.undefinedIn1252 ? 'latin1' : 'windows-1252', bomBytes: 0, damagedUtf8: high.utf8Sequences > 0 };
}

/**
 * Notes, over the bytes of 0x80 and above, whether one is undefined in Windows-1252 and how many
 * well-formed multi-byte UTF-8 sequences there are (RFC 3629 §4: a lead byte C2–F4 and its continuation
 * bytes 80–BF; a sequence cut by the chunk's end is not counted).
 */
function tallyHighBytes(chunk: Buffer, tally: { undefinedIn1252: boolean; utf8Sequences: number }): void {
  for (let i = 0; i < chunk.length; i++) {
    const b = chunk[i];
    if (b < 0x80) continue;
    if (!tally.undefinedIn1252 && UNDEFINED_IN_WINDOWS_1252.has(b)) tally.undefinedIn1252 = true;
    const length = b >= 0xc2 && b <= 0xdf ? 2 : b >= 0xe0 && b <= 0xef ? 3 : b >= 0xf0 && b <= 0xf4 ? 4 : 0;
    if (length === 0 || i + length > chunk.length) continue;
    let wellFormed = true;
    for (let k = 1; wellFormed && k < length; k++) wellFormed = (chunk[i + k] & 0xc0) === 0x80;
    if (!wellFormed) continue;
    tally.utf8Sequences++;
    for (let k = 1; k < length; k++) if (UNDEFINED_IN_WINDOWS_1252.has(chunk[i + k])) tally.undefinedIn1252 = true;
    i += length - 1;
  }
}

/**
 * The file's text, decoded from the encoding `inspectInput` found, after its byte order mark and its
 * delimiter declaration (a first line "sep=;"), if any: chunks of strings, in constant memory.
 * @example for await (const text of decodedText('in.csv', await inspectInput('in.csv'))) …
 */
export function decodedText(path: string, format: InputFormat, highWaterMark = 1 << 20): Readable {
  return createReadStream(path, { start: format.bomBytes + (format.delimiterDeclaration?.bytes ?? 0), highWaterMark }).pipe(iconv.decodeStream(format.encoding)) as unknown as Readable;
}

function decodes(decoder: TextDecoder, chunk: Uint8Array, last: boolean): boolean {
  try {
    decoder.decode(chunk, { stream: !last });
    return true;
  } catch {
    return false;
  }
}

/**
 * Whether a file's start is UTF-16 text, by its byte order mark or its layout (see below).
 * @example isUtf16(Buffer.from('\ufeffid', 'utf16le')) // true
 */
export function isUtf16(start: Buffer): boolean {
  return Boolean(encodingByBom(start)?.encoding.startsWith('utf-16') || utf16WithoutBom(start));
}

function encodingByBom(start: Buffer): { encoding: InputEncoding; bomBytes: number } | undefined {
  if (start[0] === 0xef && start[1] === 0xbb && start[2] === 0xbf) return { encoding: 'utf-8', bomBytes: 3 };
  if (start[0] === 0xff && start[1] === 0xfe) return { encoding: 'utf-16le', bomBytes: 2 };
  if (start[0] === 0xfe && start[1] === 0xff) return { encoding: 'utf-16be', bomBytes: 2 };
  return undefined;
}

/** A text of Latin letters in UTF-16 has a zero in every other byte [CHOICE: 90 % of the first 4 KB]. */
function utf16WithoutBom(start: Buffer): InputEncoding | undefined {
  const pairs = Math.floor(start.length / 2);
  if (pairs < 2) return undefined;
  let evenZeros = 0;
  let oddZeros = 0;
  for (let i = 0; i < pairs * 2; i += 2) {
    if (start[i] === 0) evenZeros++;
    if (start[i + 1] === 0) oddZeros++;
  }
  if (oddZeros >= pairs * 0.9 && evenZeros === 0) return 'utf-16le';
  if (evenZeros >= pairs * 0.9 && oddZeros === 0) return 'utf-16be';
  return undefined;
}

/** The delimiters a header line is told by (the batch writer's `Delimiter` in src/output/csv.ts). */
export type HeaderDelimiter = ',' | ';' | '\t';

/**
 * The delimiter a first line "sep=;" declares, else that of the header line: whichever of comma,
 * semicolon and tab occurs most often outside quotes (comma on a tie or when none occurs, as RFC 4180 has
 * it). Batches and gazetteer CSVs alike.
 * @example await detectDelimiter('records.tsv', format) // '\t'
 */
export async function detectDelimiter(path: string, format: InputFormat): Promise<HeaderDelimiter> {
  if (format.delimiterDeclaration) return format.delimiterDeclaration.delimiter;
  let header = '';
  for await (const chunk of decodedText(path, format) as AsyncIterable<string>) {
    header += chunk;
    const end = header.indexOf('\n');
    if (end >= 0 || header.length > 65_536) {
      header = end >= 0 ? header.slice(0, end) : header;
      break;
    }
  }
  const counts = new Map<HeaderDelimiter, number>([[',', 0], [';', 0], ['\t', 0]]);
  let quoted = false;
  for (const ch of header) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && counts.has(ch as HeaderDelimiter)) counts.set(ch as HeaderDelimiter, counts.get(ch as HeaderDelimiter)! + 1);
  }
  let best: HeaderDelimiter = ',';
  for (const [delimiter, count] of counts) if (count > counts.get(best)!) best = delimiter;
  return best;
}
