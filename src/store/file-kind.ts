/**
 * What a file is when it is not text: read from its first bytes (its "magic number"), never from its
 * name. The batch CLI, the upload route and the gazetteer importer all ask this one module, so a
 * workbook or an archive gets the same clear answer wherever it is given.
 */
import { closeSync, openSync, readSync } from 'node:fs';
import { isUtf16 } from './input-format.ts';

/** A file that is not delimited text: what it is, and what to do instead. */
export interface NotText {
  format: string;
  advice: string;
  /** A zip that is not a workbook: it may be a Darwin Core Archive, which a batch reads. */
  mayBeArchive?: boolean;
}

/** How many bytes of the start are looked at. */
export const HEAD_BYTES = 65_536;

const EXPORT_CSV = 'export the sheet as CSV (UTF-8) or tab-separated text and give that file';
/** Signatures from each format's specification (ZIP APPNOTE 4.3.7, Microsoft CFB §2.2, ISO 32000-1 §7.5.2, RFC 1952 §2.3.1, PNG §5.2, SQLite file format §1.3; others as the formats' documents give them). */
const SIGNATURES: { bytes: number[]; kind: NotText | ((head: Uint8Array) => NotText) }[] = [
  { bytes: [0x50, 0x4b, 0x03, 0x04], kind: zipKind },
  { bytes: [0x50, 0x4b, 0x05, 0x06], kind: zipKind },
  { bytes: [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1], kind: { format: 'an Excel 97–2003 workbook (.xls) or another Office document', advice: EXPORT_CSV } },
  { bytes: [...Buffer.from('%PDF')], kind: { format: 'a PDF document', advice: 'whereabouts reads the records as CSV or tab-separated text: export them from the program that made the PDF' } },
  { bytes: [0x1f, 0x8b], kind: { format: 'a gzip-compressed file', advice: 'decompress it (gunzip) and give the CSV or tab-separated file inside' } },
  { bytes: [...Buffer.from('BZh')], kind: { format: 'a bzip2-compressed file', advice: 'decompress it (bunzip2) and give the CSV or tab-separated file inside' } },
  { bytes: [0xfd, 0x37, 0x7a, 0x58, 0x5a, 0x00], kind: { format: 'an xz-compressed file', advice: 'decompress it (unxz) and give the CSV or tab-separated file inside' } },
  { bytes: [0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c], kind: { format: 'a 7-Zip archive', advice: 'unpack it and give the CSV or tab-separated file inside' } },
  { bytes: [...Buffer.from('Rar!')], kind: { format: 'a RAR archive', advice: 'unpack it and give the CSV or tab-separated file inside' } },
  { bytes: [...Buffer.from('PAR1')], kind: { format: 'a Parquet file', advice: 'write the table out as CSV and give that file' } },
  { bytes: [0x89, 0x50, 0x4e, 0x47], kind: { format: 'a PNG image', advice: 'give the records as CSV or tab-separated text' } },
  { bytes: [0xff, 0xd8, 0xff], kind: { format: 'a JPEG image', advice: 'give the records as CSV or tab-separated text' } },
  { bytes: [...Buffer.from('SQLite format 3\0')], kind: { format: 'an SQLite database', advice: 'export the table as CSV and give that file' } },
];

/**
 * What a ZIP archive most likely holds, from the entry names near its start: a workbook (.xlsx, .ods)
 * or some other archive (a Darwin Core Archive among them).
 */
function zipKind(head: Uint8Array): NotText {
  const names = Buffer.from(head).toString('latin1');
  if (names.includes('xl/workbook.xml') || names.includes('[Content_Types].xml')) return { format: 'an Excel workbook (.xlsx, a ZIP archive)', advice: EXPORT_CSV };
  if (names.includes('application/vnd.oasis.opendocument.spreadsheet')) return { format: 'an OpenDocument spreadsheet (.ods, a ZIP archive)', advice: EXPORT_CSV };
  return {
    format: 'a ZIP archive',
    advice: 'whereabouts reads a Darwin Core Archive (a zip with a meta.xml) or one CSV or tab-separated file at a time: unpack the archive and give the records file inside (for a workbook, export the sheet as CSV (UTF-8))',
    mayBeArchive: true,
  };
}

/**
 * The kind of a file's start when it is not text, or undefined when it may be text: a known signature,
 * or NUL bytes in a file without a UTF-16 byte order mark or UTF-16 layout (text in UTF-8 or
 * Windows-1252 never holds them).
 * @example notText(Buffer.from('%PDF-1.7 …'))?.format // 'a PDF document'
 */
export function notText(head: Uint8Array): NotText | undefined {
  for (const { bytes, kind } of SIGNATURES) {
    if (head.length >= bytes.length && bytes.every((b, i) => head[i] === b)) return typeof kind === 'function' ? kind(head) : kind;
  }
  if (!head.includes(0) || isUtf16(Buffer.from(head.buffer, head.byteOffset, Math.min(head.byteLength, 4096)))) return undefined;
  return { format: 'binary data (it holds NUL bytes)', advice: 'give the records as CSV or tab-separated text' };
}

/**
 * The first bytes of a file, for `notText`.
 * @example notText(fileHead('records.xlsx'))
 */
export function fileHead(path: string): Buffer {
  const fd = openSync(path, 'r');
  try {
    const buffer = Buffer.alloc(HEAD_BYTES);
    return buffer.subarray(0, readSync(fd, buffer, 0, HEAD_BYTES, 0));
  } finally {
    closeSync(fd);
  }
}
