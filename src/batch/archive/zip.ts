/**
 * Zip archives in and out: entries read with yauzl, archives written with yazl. An entry copied from
 * one archive to another is decompressed and compressed again, so its content is byte for byte the
 * same (its compressed bytes may differ).
 */
import { closeSync, openSync, readSync } from 'node:fs';
import { createWriteStream } from 'node:fs';
import { pipeline } from 'node:stream/promises';
import type { Readable } from 'node:stream';
import yauzl from 'yauzl';
import yazl from 'yazl';

export interface ZipEntryInfo {
  name: string;
  modified: Date;
  isDirectory: boolean;
  /** Bytes uncompressed, as the entry's header declares them (yauzl checks them as it reads). */
  size: number;
}

/** An open zip archive: its entries in stored order and their contents. */
export interface ZipReader {
  entries: ZipEntryInfo[];
  open(name: string): Promise<Readable>;
  read(name: string): Promise<Buffer>;
  close(): void;
}

/**
 * Whether bytes start like a zip archive (a local file header or an empty archive's end record,
 * APPNOTE.TXT 6.3 §4.3.7 and §4.3.16).
 * @example isZipStart(Buffer.from('PK\x03\x04')) // true
 */
export function isZipStart(head: Uint8Array): boolean {
  return head.length >= 4 && head[0] === 0x50 && head[1] === 0x4b && ((head[2] === 3 && head[3] === 4) || (head[2] === 5 && head[3] === 6));
}

/**
 * Whether a file starts like a zip archive (`isZipStart`).
 * @example isZipFile('records.zip') // true
 */
export function isZipFile(path: string): boolean {
  const fd = openSync(path, 'r');
  try {
    const head = Buffer.alloc(4);
    return isZipStart(head.subarray(0, readSync(fd, head, 0, 4, 0)));
  } finally {
    closeSync(fd);
  }
}

/**
 * Open a zip archive for reading.
 * @example const zip = await openZip('dwca.zip'); const meta = await zip.read('meta.xml'); zip.close();
 */
export async function openZip(path: string): Promise<ZipReader> {
  const zip = await new Promise<yauzl.ZipFile>((resolve, reject) =>
    yauzl.open(path, { lazyEntries: true, autoClose: false }, (error, file) => (error ? reject(new Error(`cannot read the zip archive ${path}: ${error.message}`)) : resolve(file))),
  );
  const byName = new Map<string, yauzl.Entry>();
  const entries: ZipEntryInfo[] = [];
  for await (const entry of zip.eachEntry()) {
    byName.set(entry.fileName, entry);
    entries.push({ name: entry.fileName, modified: entry.getLastModDate(), isDirectory: entry.fileName.endsWith('/'), size: entry.uncompressedSize });
  }
  const open = async (name: string) => {
    const entry = byName.get(name);
    if (!entry) throw new Error(`the zip archive ${path} has no file ${name}`);
    return zip.openReadStreamPromise(entry);
  };
  return {
    entries,
    open,
    async read(name) {
      const chunks: Buffer[] = [];
      for await (const chunk of await open(name)) chunks.push(chunk as Buffer);
      return Buffer.concat(chunks);
    },
    close: () => zip.close(),
  };
}

/** One entry of an archive to write: bytes, a file on disk, or a stream opened when its turn comes. */
export type ZipSource = { buffer: Buffer } | { file: string } | { stream: () => Promise<Readable> };

/**
 * Write a zip archive with the entries in the order given.
 * @example await writeZip('out.zip', [{ name: 'meta.xml', modified, source: { buffer } }])
 */
export async function writeZip(path: string, entries: { name: string; modified: Date; source: ZipSource }[]): Promise<void> {
  const zip = new yazl.ZipFile();
  for (const { name, modified, source } of entries) {
    if (name.endsWith('/')) zip.addEmptyDirectory(name, { mtime: modified });
    else if ('buffer' in source) zip.addBuffer(source.buffer, name, { mtime: modified });
    else if ('file' in source) zip.addFile(source.file, name, { mtime: modified });
    else zip.addReadStreamLazy(name, { mtime: modified }, (done) => source.stream().then((s) => done(null, s), (error: unknown) => done(error, undefined as never)));
  }
  zip.end();
  await pipeline(zip.outputStream, createWriteStream(path));
}
