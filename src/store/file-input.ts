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

/** Parts of a shapefile that may travel without their `.shp` (ESRI Shapefile Technical Description, 1998, p. 2). */
const SHAPEFILE_PARTS = /\.(dbf|shx|prj|cpg)$/i;

/**
 * The refusal of a zip that holds a shapefile's other parts but not its `.shp`.
 * @example withoutShp('units.zip', ['units.dbf', 'units.prj']) // 'units.zip: holds parts of a shapefile (units.dbf, units.prj) but no .shp, …'
 */
export function withoutShp(archive: string, parts: readonly string[]): string {
  return `${archive}: holds parts of a shapefile (${parts.join(', ')}) but no .shp, the file with the shapes: add the .shp to the zip and import it again`;
}

/**
 * The data file of an archive: the only text file besides the publisher's readme and language list,
 * or the one named like the archive ("QX.zip" → "QX.txt"); an error names the members otherwise. A
 * Darwin Core Archive (a `meta.xml` at its root: Darwin Core text guide, TDWG 2023, §2) holds records,
 * not a gazetteer, and a zip of a shapefile's parts without its `.shp` has no shapes: both are refused
 * saying so, rather than read as the dump layout.
 * @example dataEntry('QX.zip', ['QX.txt', 'readme.txt']) // 'QX.txt'
 */
export function dataEntry(archive: string, members: readonly string[]): string {
  if (members.some((name) => name.toLowerCase() === 'meta.xml')) {
    throw new Error(
      `${archive}: a Darwin Core Archive (it holds meta.xml): it holds records to georeference, not a gazetteer; give it to whereabouts batch`,
    );
  }
  const parts = members.filter((name) => SHAPEFILE_PARTS.test(name));
  if (parts.length > 0 && !members.some((name) => /\.(txt|tsv|csv)$/i.test(name) && !NOT_DATA.test(name))) {
    throw new Error(withoutShp(archive, parts));
  }
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
