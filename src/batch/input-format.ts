/**
 * What an input file is, read from its bytes in one streaming pass: its sha256 (the job's identity) and
 * its text encoding. Constant memory whatever the file's size.
 */
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';

/** Encodings a batch file may come in; the names are the ones iconv-lite decodes. */
export type InputEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252' | 'latin1';

export interface InputFormat {
  sha256: string;
  bytes: number;
  encoding: InputEncoding;
  /** Length in bytes of the byte order mark to skip (0 when there is none). */
  bomBytes: number;
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
  let undefinedIn1252 = false;
  for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 }) as AsyncIterable<Buffer>) {
    hash.update(chunk);
    head ??= chunk.subarray(0, 4096);
    bytes += chunk.length;
    if (validUtf8) validUtf8 = decodes(utf8, chunk, false);
    if (!undefinedIn1252) undefinedIn1252 = chunk.some((b) => UNDEFINED_IN_WINDOWS_1252.has(b));
  }
  if (validUtf8) validUtf8 = decodes(utf8, new Uint8Array(0), true);
  const sha256 = hash.digest('hex');
  const start = head ?? Buffer.alloc(0);
  const byBom = encodingByBom(start);
  if (byBom) return { sha256, bytes, ...byBom };
  const utf16 = utf16WithoutBom(start);
  if (utf16) return { sha256, bytes, encoding: utf16, bomBytes: 0 };
  if (validUtf8) return { sha256, bytes, encoding: 'utf-8', bomBytes: 0 };
  return { sha256, bytes, encoding: undefinedIn1252 ? 'latin1' : 'windows-1252', bomBytes: 0 };
}

function decodes(decoder: TextDecoder, chunk: Uint8Array, last: boolean): boolean {
  try {
    decoder.decode(chunk, { stream: !last });
    return true;
  } catch {
    return false;
  }
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
