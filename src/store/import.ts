/**
 * Streams a gazetteer file (CSV, GeoJSON FeatureCollection, or the world-gazetteer dump layout, plain or
 * zipped as distributed, with its alternate-names and admin code files) into the store in one
 * transaction: constant memory for any file size, every refused row returned with its row number and
 * reason, the source recorded with its citation, licence and the file's sha256.
 */
import { createHash } from 'node:crypto';
import { accessSync, constants, createReadStream } from 'node:fs';
import { finished } from 'node:stream/promises';
import { basename, extname } from 'node:path';
import { createInterface } from 'node:readline';
import { StringDecoder } from 'node:string_decoder';
import type { Readable } from 'node:stream';
import { parse } from 'csv-parse';
import type { Feature as GeoJsonFeature } from 'geojson';
import type { AlternateName } from '../match/types.ts';
import { readAdminCodeLine, readAlternateNameLine, readDumpLine } from './dump-layout.ts';
import { openFileInput } from './file-input.ts';
import { checkFeature, type RawFeature } from './feature-record.ts';
import type { GazetteerStore, ImportSession } from './gazetteer-store.ts';

export type ImportFormat = 'csv' | 'geojson' | 'geonames';

export interface ImportOptions {
  format: ImportFormat;
  citation: string;
  /** Defaults to the file name without its extension, e.g. "demo-towns". */
  sourceId?: string;
  licence?: string;
  /**
   * The dump layout's admin code files, admin1 ("CC.A1", name, asciiname, id) and admin2 ("CC.A1.A2",
   * …), one or several: records' state and county names then match the units by any of their names.
   */
  adminCodesFile?: string | readonly string[];
  /** The dump layout's alternate-names file (10 columns, plain or zipped): names with language and flags. */
  alternateNamesFile?: string;
  /** Default radius overrides for this source, meters by feature type (see default-radii.ts). */
  radii?: Readonly<Record<string, number>>;
  /** Rank of the source where several hold the same place (1 first); kept from the replaced source when not given. */
  priority?: number | null;
  /** Called every few thousand rows with the number read so far. */
  onProgress?: (rows: number) => void;
}

export interface ImportSummary {
  sourceId: string;
  rowsRead: number;
  imported: number;
  /** Row numbers are file line numbers for CSV and the dump layout, feature numbers (from 1) for GeoJSON. */
  rejected: { row: number; reason: string }[];
  /** The alternate-names file, when one was given: its lines read, the names kept, the lines refused. */
  alternateNames?: { rowsRead: number; kept: number; rejected: { row: number; reason: string }[] };
  seconds: number;
}

/** One row as a reader yields it (in arrays of rows): a feature to check, or why it could not be read. */
interface ReadRow {
  row: number;
  raw: RawFeature | string;
}

const PROGRESS_EVERY = 5000;
const READ_BYTES = 16 * 1024;

/**
 * Imports a file as one source (replacing a source of the same id); a failure leaves the store as it was.
 * @example await importGazetteer(store, 'towns.csv', { format: 'csv', citation: 'Survey of towns, 2024' })
 */
export async function importGazetteer(store: GazetteerStore, filePath: string, options: ImportOptions): Promise<ImportSummary> {
  const started = process.hrtime.bigint();
  assertReadable(filePath);
  const adminCodeFiles = options.adminCodesFile === undefined ? [] : typeof options.adminCodesFile === 'string' ? [options.adminCodesFile] : options.adminCodesFile;
  for (const side of [...adminCodeFiles, ...(options.alternateNamesFile === undefined ? [] : [options.alternateNamesFile])]) assertReadable(side);
  const sourceId = options.sourceId ?? defaultSourceId(filePath);
  const session = store.beginImport(sourceId);
  const rejected: { row: number; reason: string }[] = [];
  let alternateNames: ImportSummary['alternateNames'];
  let rowsRead = 0;
  let imported = 0;
  let input: Readable | undefined;
  try {
    if (options.alternateNamesFile !== undefined) alternateNames = await stageAlternateNames(session, options.alternateNamesFile);
    const adminNames = await readAdminCodes(session, adminCodeFiles);
    // Small reads: the dump reader turns a whole read into rows at once, and rows that outlive a
    // young-generation collection cost heap until the next full one.
    const opened = await openFileInput(filePath, READ_BYTES);
    input = opened.stream;
    // The hash is of the file as distributed: a zip archive's own bytes, not its member's. Nothing may
    // await between attaching a 'data' listener and the reader's first read (the stream then flows).
    const hash = createHash('sha256');
    const hashed = opened.entry === null ? null : finished(createReadStream(filePath).on('data', (chunk) => hash.update(chunk)));
    if (opened.entry === null) input.on('data', (chunk) => hash.update(chunk));
    const rows = options.format === 'csv' ? readCsv(input) : options.format === 'geojson' ? readGeoJson(input) : readDump(input, adminNames);
    for await (const batch of rows) {
      for (const { row, raw } of batch) {
        rowsRead++;
        if (alternateNames !== undefined && typeof raw !== 'string' && raw.id !== undefined) withStagedNames(raw, session.stagedAlternateNames(raw.id));
        const checked = typeof raw === 'string' ? raw : checkFeature(raw, `row-${row}`, options.radii);
        const reason = typeof checked === 'string' ? checked : session.add(checked);
        if (reason === null) imported++;
        else rejected.push({ row, reason });
        if (rowsRead % PROGRESS_EVERY === 0) options.onProgress?.(rowsRead);
      }
    }
    await hashed;
    session.commit({ citation: options.citation, licence: options.licence ?? null, contentHash: hash.digest('hex'), format: options.format, priority: options.priority });
  } catch (error) {
    session.rollback();
    input?.destroy();
    throw error;
  }
  options.onProgress?.(rowsRead);
  return {
    sourceId, rowsRead, imported, rejected, ...(alternateNames !== undefined && { alternateNames }),
    seconds: Number(process.hrtime.bigint() - started) / 1e9,
  };
}

/** Adds the names staged for a feature to its own, with their details (language, former…). */
function withStagedNames(raw: RawFeature, staged: AlternateName[]): void {
  if (staged.length === 0) return;
  const names = new Set(raw.alternateNames ?? []);
  for (const alternate of staged) names.add(alternate.name);
  raw.alternateNames = [...names];
  raw.nameDetails = staged;
}

/** Stages every name of the alternate-names file for the features to come; returns what was read. */
async function stageAlternateNames(session: ImportSession, filePath: string): Promise<NonNullable<ImportSummary['alternateNames']>> {
  const { stream } = await openFileInput(filePath, READ_BYTES);
  const rejected: { row: number; reason: string }[] = [];
  let rowsRead = 0;
  let kept = 0;
  for await (const line of createInterface({ input: stream, crlfDelay: Infinity })) {
    rowsRead++;
    if (line === '') continue;
    const read = readAlternateNameLine(line);
    if (typeof read === 'string') {
      rejected.push({ row: rowsRead, reason: read });
    } else if (read !== null) {
      session.stageAlternateName(read.featureId, read.name);
      kept++;
    }
  }
  return { rowsRead, kept, rejected };
}

/**
 * The names of the units of the admin code files by code, with every name of each unit (its ASCII
 * name and its alternate names, when an alternate-names file was staged) recorded for the context filter.
 */
async function readAdminCodes(session: ImportSession, filePaths: readonly string[]): Promise<Map<string, string>> {
  const names = new Map<string, string>();
  for (const filePath of filePaths) {
    const { stream } = await openFileInput(filePath, READ_BYTES);
    for await (const line of createInterface({ input: stream, crlfDelay: Infinity })) {
      const unit = readAdminCodeLine(line);
      if (unit === null) continue;
      names.set(unit.code, unit.name);
      const others = unit.featureId === '' ? [] : session.stagedAlternateNames(unit.featureId).map((alternate) => alternate.name);
      session.addUnitNames(unit.level, unit.name, [unit.asciiName, ...others].filter((name) => name !== ''));
    }
  }
  return names;
}

/**
 * The import format a file name suggests, or null.
 * @example formatFromFileName('world.txt') // 'geonames'
 * @example formatFromFileName('QX.zip') // 'geonames' (the dump is distributed zipped)
 */
export function formatFromFileName(filePath: string): ImportFormat | null {
  const extension = extname(filePath).toLowerCase();
  if (extension === '.csv') return 'csv';
  if (extension === '.geojson' || extension === '.json') return 'geojson';
  if (extension === '.txt' || extension === '.tsv' || extension === '.zip') return 'geonames';
  return null;
}

function defaultSourceId(filePath: string): string {
  return basename(filePath, extname(filePath)).toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'gazetteer';
}

const CSV_COLUMNS = ['id', 'name', 'alternateNames', 'latitude', 'longitude', 'featureType', 'countryCode', 'stateProvince', 'county', 'radiusMeters'];

async function* readCsv(input: Readable): AsyncGenerator<ReadRow[]> {
  const parser = input.pipe(parse({ bom: true, info: true, relax_column_count: true, skip_empty_lines: true, relax_quotes: true }));
  let header: string[] | null = null;
  for await (const { record, info } of parser as AsyncIterable<{ record: string[]; info: { lines: number } }>) {
    if (header === null) {
      header = record.map((column) => column.trim());
      if (!header.includes('name')) throw new Error(`CSV header has no 'name' column (columns: ${header.join(', ')})`);
      const unknown = header.filter((column) => !CSV_COLUMNS.includes(column));
      if (unknown.length > 0) throw new Error(`CSV header has unknown columns: ${unknown.join(', ')} (known: ${CSV_COLUMNS.join(', ')})`);
      continue;
    }
    if (record.length !== header.length) {
      yield [{ row: info.lines, raw: `${record.length} columns, the header has ${header.length}` }];
      continue;
    }
    const fields: Record<string, string> = {};
    header.forEach((column, index) => { fields[column] = record[index]; });
    if (record.some((field) => field.includes('\uFFFD'))) {
      yield [{ row: info.lines, raw: 'not valid UTF-8' }];
      continue;
    }
    yield [{
      row: info.lines,
      raw: { ...fields, alternateNames: fields.alternateNames === undefined ? [] : fields.alternateNames.split('|') },
    }];
  }
}

/**
 * The dump's lines (ending in LF or CRLF), a chunk of the file at a time: one await a chunk rather
 * than one a line, which matters at millions of rows.
 */
async function* readDump(input: Readable, adminNames: ReadonlyMap<string, string>): AsyncGenerator<ReadRow[]> {
  const decoder = new StringDecoder('utf8');
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
  for await (const chunk of input as AsyncIterable<Buffer>) {
    const lines = (rest + decoder.write(chunk)).split('\n');
    rest = lines.pop() ?? '';
    yield read(lines);
  }
  rest += decoder.end();
  if (rest !== '') yield read([rest]);
}

/**
 * Streams the members of a FeatureCollection's "features" array: a scanner keeps only the feature
 * being read, so memory stays constant however large the collection.
 */
async function* readGeoJson(input: Readable): AsyncGenerator<ReadRow[]> {
  // Decoded here rather than with setEncoding, so that the import's hash still sees the file's bytes.
  const decoder = new StringDecoder('utf8');
  let depth = 0;
  let inString = false;
  let escaped = false;
  let topLevelString = '';
  let awaitingFeatures = false;
  let featuresDepth = -1;
  let buffer = '';
  let count = 0;
  for await (const bytes of input as AsyncIterable<Buffer>) {
    const chunk = decoder.write(bytes);
    let featureStart = buffer === '' ? -1 : 0;
    for (let i = 0; i < chunk.length; i++) {
      const c = chunk[i];
      if (inString) {
        if (escaped) escaped = false;
        else if (c === '\\') escaped = true;
        else if (c === '"') inString = false;
        else if (featuresDepth === -1 && depth === 1) topLevelString += c;
        continue;
      }
      if (c === '"') {
        inString = true;
        topLevelString = '';
      } else if (c === ':') {
        awaitingFeatures = featuresDepth === -1 && depth === 1 && topLevelString === 'features';
      } else if (c === '{' || c === '[') {
        if (c === '[' && awaitingFeatures) featuresDepth = depth + 1;
        else if (c === '{' && depth === featuresDepth) featureStart = i;
        awaitingFeatures = false;
        depth++;
      } else if (c === '}' || c === ']') {
        depth--;
        if (c === '}' && depth === featuresDepth && featureStart >= 0) {
          count++;
          yield [{ row: count, raw: readGeoJsonFeature(buffer + chunk.slice(featureStart, i + 1)) }];
          buffer = '';
          featureStart = -1;
        } else if (c === ']' && depth === featuresDepth - 1) {
          featuresDepth = -2;
        }
      }
    }
    if (featureStart >= 0) buffer += chunk.slice(featureStart);
  }
  if (featuresDepth === -1) throw new Error('not a GeoJSON FeatureCollection: no "features" array found');
  if (depth !== 0 || inString) throw new Error('GeoJSON ends before the FeatureCollection is closed');
}

function readGeoJsonFeature(text: string): RawFeature | string {
  let feature: GeoJsonFeature;
  try {
    feature = JSON.parse(text) as GeoJsonFeature;
  } catch (error) {
    return `not valid JSON: ${(error as Error).message}`;
  }
  if (feature.type !== 'Feature') return `member of type '${String(feature.type)}', not a Feature`;
  const properties = (feature.properties ?? {}) as Record<string, unknown>;
  const alternates = properties.alternateNames;
  return {
    ...properties,
    id: properties.id !== undefined ? String(properties.id) : feature.id !== undefined ? String(feature.id) : undefined,
    alternateNames: Array.isArray(alternates) ? alternates.map(String) : typeof alternates === 'string' ? alternates.split('|') : [],
    geometry: feature.geometry,
  };
}

/** A clear error before any work starts, rather than a stream error in the middle of the import. */
function assertReadable(path: string): void {
  try {
    accessSync(path, constants.R_OK);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new Error(`cannot read ${path}: ${code === 'ENOENT' ? 'no such file' : code === 'EACCES' ? 'permission denied' : String(code)}`);
  }
}
