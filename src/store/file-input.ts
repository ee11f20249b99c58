/**
 * A gazetteer file as its publisher distributes it, plain or zipped: a zip archive (told by its first
 * bytes, not its name) is read in place through yauzl, streaming the one data file it holds.
 */
import { closeSync, createReadStream, openSync, readSync } from 'node:fs';
import { basename, extname } from 'node:path';
import type { Readable } from 'node:stream';
import yauzl from 'yauzl';

/** Zip local-file-header signature, "PK\x03\x04" (APPNOTE.TXT 6.3, §4.3.7). */
const ZIP_SIGNATURE = 0x04034b50;
/** Files the publisher puts beside the data in its archives: never the data itself. */
const NOT_DATA = /(^|\/)(readme|iso-languagecodes)\.txt$/i;

/** A readable file and what it is: `entry` names the member read when the file is a zip archive. */
export interface FileInput {
  stream: Readable;
  entry: string | null;
}

/**
 * True when the file starts with a zip local-file header.
 * @example isZipFile('allCountries.zip') // true
 */
export function isZipFile(path: string): boolean {
  const fd = openSync(path, 'r');
  try {
    const head = Buffer.alloc(4);
    return readSync(fd, head, 0, 4, 0) === 4 && head.readUInt32LE(0) === ZIP_SIGNATURE;
  } finally {
    closeSync(fd);
  }
}

/**
 * The data file of an archive: the only text file besides the publisher's readme and language list,
 * or the one named like the archive ("QX.zip" → "QX.txt"); an error names the members otherwise.
 * @example dataEntry('QX.zip', ['QX.txt', 'readme.txt']) // 'QX.txt'
 */
export function dataEntry(archive: string, members: readonly string[]): string {
  const texts = members.filter((name) => !name.endsWith('/') && /\.(txt|tsv|csv)$/i.test(name) && !NOT_DATA.test(name));
  if (texts.length === 1) return texts[0];
  const named = `${basename(archive, extname(archive))}.txt`.toLowerCase();
  const same = texts.find((name) => basename(name).toLowerCase() === named);
  if (same !== undefined) return same;
  throw new Error(`${archive}: cannot tell which member of the zip archive is the data (members: ${members.join(', ') || 'none'})`);
}

/**
 * Opens a file for reading in chunks of `highWaterMark` bytes (a plain file), or the data member of a
 * zip archive, decompressed as it is read.
 * @example const { stream, entry } = await openFileInput('QX.zip', 16384) // entry 'QX.txt'
 */
export async function openFileInput(path: string, highWaterMark: number): Promise<FileInput> {
  if (!isZipFile(path)) return { stream: createReadStream(path, { highWaterMark }), entry: null };
  let zip: yauzl.ZipFile;
  try {
    zip = await yauzl.openPromise(path, { lazyEntries: true, autoClose: false });
  } catch (error) {
    throw new Error(`${path}: not a readable zip archive: ${(error as Error).message}`);
  }
  const entries: yauzl.Entry[] = [];
  for await (const entry of zip.eachEntry()) entries.push(entry);
  const name = dataEntry(path, entries.map((entry) => entry.fileName));
  const stream = await zip.openReadStreamPromise(entries.find((entry) => entry.fileName === name)!);
  let open = true;
  const close = () => {
    if (open) zip.close();
    open = false;
  };
  stream.once('end', close);
  stream.once('error', close);
  stream.once('close', close);
  return { stream, entry: name };
}
