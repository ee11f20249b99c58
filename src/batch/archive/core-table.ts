/**
 * The core file of a Darwin Core Archive as the batch reads any file: UTF-8, tab-separated, RFC 4180
 * quoting, one header line of column names. The metafile says how to read the core (Darwin Core text
 * guide, TDWG 2023, §2.2: delimiters, enclosure, encoding, header lines) and which term each column
 * holds (§2.4).
 */
import { createWriteStream, renameSync } from 'node:fs';
import { once } from 'node:events';
import { parse } from 'csv-parse';
import iconv from 'iconv-lite';
import { GEOREFERENCE_TERMS } from '../../record/darwin-core.ts';
import { termName } from '../../record/term-names.ts';
import { LOCALITY_COLUMNS, REQUEST_COLUMNS } from '../locality-group.ts';
import type { MetaField, MetaTable } from '../../output/darwin-core-archive.ts';
import { csvLine } from '../../output/csv.ts';
import type { ZipReader } from './zip.ts';

/** What the table holds beyond the core's own columns. */
export interface CoreTable {
  /** Column names, the core's columns first, then one for each constant (no-index) field. */
  header: string[];
  /** The core's constant fields, now a column each, with the column they were written to. */
  constants: { field: MetaField; index: number }[];
  rows: number;
}

/**
 * A column's name: the term's name for a Darwin Core or Dublin Core term (so the batch finds
 * `locality`, `countryCode`, …), the full URI for a term of another namespace, `id` for an identifier
 * column no field names, and for a column the metafile does not describe, its name in the file's header
 * line (when there is one and it is not a term the batch reads) or `column<N>`. A name already taken
 * keeps the term's full URI.
 * @example columnNames(core, 4, ['id', 'loc', 'cc', 'note']) // ['occurrenceID', 'locality', 'countryCode', 'note']
 */
export function columnNames(core: MetaTable, width: number, headerLine: readonly string[] = []): string[] {
  const names: string[] = [];
  const taken = new Set<string>();
  for (let i = 0; i < width; i++) {
    const field = core.fields.find((f) => f.index === i);
    // A header-line name the batch would read as a term (locality, decimalLatitude, …) is not taken: only meta.xml says what a column holds.
    const written = headerLine[i]?.trim();
    const usable = written && !READ_AS_TERMS.has(termName(written)) ? written : undefined;
    let name = field ? (isKnownTerm(field.term) ? termName(field.term) : field.term) : i === core.idIndex ? 'id' : usable ?? `column${i}`;
    if (taken.has(name)) name = field ? field.term : `column${i}`;
    taken.add(name);
    names.push(name);
  }
  return names;
}

/** Column names the batch reads or writes as Darwin Core terms. */
const READ_AS_TERMS = new Set<string>([...LOCALITY_COLUMNS, ...REQUEST_COLUMNS, 'decimalLatitude', 'decimalLongitude', ...GEOREFERENCE_TERMS]);

function isKnownTerm(term: string): boolean {
  return termName(term) !== term;
}

/** iconv-lite's name for a metafile's encoding; an error naming it when it is unknown. */
function codec(encoding: string): string {
  if (!iconv.encodingExists(encoding)) throw new Error(`meta.xml gives the core's encoding as "${encoding}", which whereabouts cannot read`);
  return encoding;
}

/**
 * Write the core of the archive to `path` as a batch input table. Every row of the core is one row of
 * the table, in order, its values unchanged but for an empty value of a field with a default, which is
 * written as the default; the header lines the metafile says to ignore are left out.
 * @example await writeCoreTable(zip, 'dwca/', meta.core, '/tmp/core.txt') // { header: [...], constants: [...], rows: 52 }
 */
export async function writeCoreTable(zip: ZipReader, metaDir: string, core: MetaTable, path: string): Promise<CoreTable> {
  if (core.locations.length !== 1) throw new Error(`the archive's core is split over ${core.locations.length} files (${core.locations.join(', ')}); whereabouts reads a core held in one file`);
  const location = metaDir + core.locations[0].replace(/^\.\//, '');
  if (!zip.entries.some((e) => e.name === location)) throw new Error(`meta.xml names the core file ${core.locations[0]}, which is not in the archive`);
  const described = Math.max(core.idIndex ?? -1, ...core.fields.map((f) => f.index ?? -1)) + 1;
  const lineEnd = core.linesTerminatedBy;
  const parser = (await zip.open(location)).pipe(iconv.decodeStream(codec(core.encoding))).pipe(
    parse({
      delimiter: core.fieldsTerminatedBy,
      // A core said to end its lines with \n may end them with \r\n (common practice, no source).
      record_delimiter: lineEnd === '\n' || lineEnd === '\r\n' ? ['\r\n', '\n'] : lineEnd,
      quote: core.fieldsEnclosedBy === '' ? false : core.fieldsEnclosedBy,
      relax_quotes: true,
      relax_column_count: true,
      skip_empty_lines: true,
      bom: true,
    }),
  );
  const partial = `${path}.partial`;
  const out = createWriteStream(partial);
  const write = async (text: string) => {
    if (!out.write(text)) await once(out, 'drain');
  };
  // The file's width is its first line's (a metafile need not describe every column), or the metafile's when wider.
  let width = described;
  let header: string[] | undefined;
  let constants: CoreTable['constants'] = [];
  let records = 0;
  let rows = 0;
  const defaults = core.fields.filter((f): f is MetaField & { index: number; default: string } => f.index !== undefined && f.default !== undefined);
  const start = async (first: string[]) => {
    width = Math.max(described, first.length);
    const names = columnNames(core, width, core.ignoreHeaderLines > 0 ? first : []);
    constants = core.fields.filter((f) => f.index === undefined).map((field, k) => ({ field, index: width + k }));
    header = [...names, ...constants.map(({ field }) => (isKnownTerm(field.term) && !names.includes(termName(field.term)) ? termName(field.term) : field.term))];
    await write(csvLine(header, '\t') + '\r\n');
  };
  try {
    for await (const record of parser as AsyncIterable<string[]>) {
      if (!header) await start(record);
      if (++records <= core.ignoreHeaderLines) continue;
      rows++;
      // An empty value of a field with a default is that default (guide §2.4 default), written out so the
      // batch reads it; the metafile keeps the default, so the record means what it meant.
      for (const { index, default: value } of defaults) if (index < record.length && record[index] === '') record[index] = value;
      // A row of the file's width gets the constants after it; a ragged row is kept as written, for the batch to report.
      const fields = record.length === width ? [...record, ...constants.map(({ field }) => field.default ?? '')] : record;
      await write(csvLine(fields, '\t') + '\r\n');
    }
    if (!header) await start([]);
  } catch (error) {
    out.destroy();
    throw new Error(`cannot read the archive's core file ${core.locations[0]} as meta.xml describes it: ${error instanceof Error ? error.message : String(error)}`);
  }
  out.end();
  await once(out, 'finish');
  renameSync(partial, path);
  return { header: header!, constants, rows };
}
