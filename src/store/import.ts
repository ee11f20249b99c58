/**
 * Streams a gazetteer file (CSV, GeoJSON FeatureCollection, or the world-gazetteer dump layout) into
 * the store in one transaction: constant memory for any file size, every refused row returned with its
 * row number and reason, the source recorded with its citation, licence and the file's sha256.
 * Shapefiles and GeoPackages (gis-import.ts) go the same way, but are read whole.
 */
import { accessSync, constants } from 'node:fs';
import { basename, extname } from 'node:path';
import { createInterface } from 'node:readline';
import type { Readable } from 'node:stream';
import { parse } from 'csv-parse';
import type { Feature as GeoJsonFeature } from 'geojson';
import { fileHead, notText } from './file-kind.ts';
import { decodedText, inspectInput, type InputFormat } from './input-format.ts';
import { readAdmin1Line, readDumpLine } from './dump-layout.ts';
import { checkFeature, type RawFeature } from './feature-record.ts';
import { gisContentHash, readGisFile, type GisFieldMap } from './gis-import.ts';
import type { GazetteerStore } from './gazetteer-store.ts';

export type ImportFormat = 'csv' | 'geojson' | 'geonames' | 'shapefile' | 'gpkg';

export interface ImportOptions {
  format: ImportFormat;
  /** How to cite the source; without one, a stand-in is built from the file (see `standInCitation`). */
  citation?: string;
  /** Defaults to the file name without its extension, e.g. "demo-towns". */
  sourceId?: string;
  licence?: string;
  /** The dump layout's admin1 companion file ("CC.code", name, asciiname, id). */
  adminCodesFile?: string;
  /** Default radius overrides for this source, meters by feature type (see default-radii.ts). */
  radii?: Readonly<Record<string, number>>;
  /** For a shapefile or GeoPackage: the layer, which attributes give the columns, the .dbf encoding. */
  gis?: GisFieldMap;
  /** Called every few thousand rows with the number read so far. */
  onProgress?: (rows: number) => void;
}

export interface ImportSummary {
  sourceId: string;
  /** The citation recorded, and whether it is a stand-in built from the file, to be replaced by a real one. */
  citation: string;
  citationIsStandIn: boolean;
  /** The file's text encoding, found as batch input's is (UTF-8, UTF-16, Windows-1252 or ISO-8859-1). */
  encoding: InputFormat['encoding'];
  rowsRead: number;
  imported: number;
  /** Row numbers are file line numbers for CSV and the dump layout, feature numbers (from 1) for GeoJSON. */
  rejected: { row: number; reason: string }[];
  seconds: number;
  /** What the reader chose, e.g. a GIS file's layer and the coordinate conversion used. */
  notes?: string[];
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
  if (options.adminCodesFile !== undefined) assertReadable(options.adminCodesFile);
  const gis = options.format === 'shapefile' || options.format === 'gpkg';
  const kind = gis ? null : notText(fileHead(filePath));
  if (kind) throw new Error(`${basename(filePath)} is ${kind.format}, not a gazetteer in ${options.format === 'geojson' ? 'GeoJSON' : 'CSV or tab-separated text'}: ${kind.advice}`);
  const sourceId = options.sourceId ?? defaultSourceId(filePath);
  const admin1Names = options.adminCodesFile === undefined ? new Map<string, string>() : await readAdmin1Names(options.adminCodesFile);
  // The file's encoding and sha256 in one pass, by the module batch input uses; UTF-8 with damaged
  // bytes is read as UTF-8, and its damaged rows refused (below), rather than all of it as Windows-1252.
  const inspected = await inspectInput(filePath);
  const format: InputFormat = inspected.damagedUtf8 ? { ...inspected, encoding: 'utf-8' } : inspected;
  const citation = options.citation?.trim() || standInCitation(filePath, format, new Date());
  // Small reads: the dump reader turns a whole read into rows at once, and rows that outlive a
  // young-generation collection cost heap until the next full one.
  const input = decodedText(filePath, format, READ_BYTES);
  const notes: string[] = [];
  const rows = gis ? readGisFile(filePath, options.format as 'shapefile' | 'gpkg', options.gis ?? {}, notes)
    : options.format === 'csv' ? readCsv(input) : options.format === 'geojson' ? readGeoJson(input) : readDump(input, admin1Names);
  const session = store.beginImport(sourceId);
  const rejected: { row: number; reason: string }[] = [];
  let rowsRead = 0;
  let imported = 0;
  try {
    for await (const batch of rows) {
      for (const { row, raw } of batch) {
        rowsRead++;
        const checked = typeof raw === 'string' ? raw : checkFeature(raw, `row-${row}`, options.radii);
        const reason = typeof checked === 'string' ? checked : session.add(checked);
        if (reason === null) imported++;
        else rejected.push({ row, reason });
        if (rowsRead % PROGRESS_EVERY === 0) options.onProgress?.(rowsRead);
      }
    }
    // A source with no feature would only look like a success: nothing is registered.
    if (imported === 0) throw new Error(nothingKept(filePath, rowsRead, rejected));
    if (gis) input.destroy(); // the GIS readers read the file themselves
    session.commit({ citation, licence: options.licence ?? null, contentHash: gis ? gisContentHash(filePath, format.sha256) : format.sha256, format: options.format });
  } catch (error) {
    session.rollback();
    input.destroy();
    throw error;
  }
  options.onProgress?.(rowsRead);
  return {
    sourceId, citation, citationIsStandIn: !options.citation?.trim(), encoding: format.encoding,
    rowsRead, imported, rejected, seconds: Number(process.hrtime.bigint() - started) / 1e9, ...(notes.length > 0 ? { notes } : {}),
  };
}

/**
 * A citation for a file imported without one, from what is known of it: its name (never its folder,
 * which is the importer's machine), size, the start of its sha256 and the import date. It identifies
 * the file; it does not say who made the data, so it is to be replaced by a real citation.
 * @example standInCitation('/home/a/towns.csv', { bytes: 2048, sha256: '9f86d08…' }, new Date('2026-12-02'))
 *   // 'towns.csv (2,048 bytes, sha256 9f86d081884c, imported 2026-12-02; no citation given)'
 */
export function standInCitation(filePath: string, format: Pick<InputFormat, 'bytes' | 'sha256'>, when: Date): string {
  return `${basename(filePath)} (${format.bytes.toLocaleString('en')} bytes, sha256 ${format.sha256.slice(0, 12)}, imported ${when.toISOString().slice(0, 10)}; no citation given)`;
}

function nothingKept(filePath: string, rowsRead: number, rejected: { row: number; reason: string }[]): string {
  if (rowsRead === 0) return `${basename(filePath)} holds no rows to import; nothing was registered`;
  const first = rejected.slice(0, 3).map(({ row, reason }) => `row ${row}: ${reason}`).join('; ');
  return `none of the ${rowsRead} rows of ${basename(filePath)} could be imported, so nothing was registered (${first}${rejected.length > 3 ? '; …' : ''})`;
}

/**
 * The import format a file name suggests, or null.
 * @example formatFromFileName('world.txt') // 'geonames'
 */
export function formatFromFileName(filePath: string): ImportFormat | null {
  const extension = extname(filePath).toLowerCase();
  if (extension === '.csv') return 'csv';
  if (extension === '.geojson' || extension === '.json') return 'geojson';
  if (extension === '.txt' || extension === '.tsv') return 'geonames';
  if (extension === '.shp' || extension === '.zip') return 'shapefile';
  if (extension === '.gpkg') return 'gpkg';
  return null;
}

function defaultSourceId(filePath: string): string {
  return basename(filePath, extname(filePath)).toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'gazetteer';
}

async function readAdmin1Names(filePath: string): Promise<Map<string, string>> {
  const names = new Map<string, string>();
  for await (const line of createInterface({ input: decodedText(filePath, await inspectInput(filePath)), crlfDelay: Infinity })) {
    const entry = readAdmin1Line(line);
    if (entry !== null) names.set(entry[0], entry[1]);
  }
  return names;
}

const CSV_COLUMNS = ['id', 'name', 'alternateNames', 'latitude', 'longitude', 'featureType', 'countryCode', 'stateProvince', 'county', 'radiusMeters'];

async function* readCsv(input: Readable): AsyncGenerator<ReadRow[]> {
  const parser = input.pipe(parse({ info: true, relax_column_count: true, skip_empty_lines: true, relax_quotes: true }));
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
      yield [{ row: info.lines, raw: 'not valid UTF-8 (damaged bytes in a UTF-8 file)' }];
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
async function* readDump(input: Readable, admin1Names: ReadonlyMap<string, string>): AsyncGenerator<ReadRow[]> {
  let row = 0;
  let rest = '';
  const read = (lines: string[]): ReadRow[] => {
    const rows: ReadRow[] = [];
    for (const line of lines) {
      row++;
      const text = line.endsWith('\r') ? line.slice(0, -1) : line;
      if (text !== '') rows.push({ row, raw: readDumpLine(text, admin1Names) });
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
 * Streams the members of a FeatureCollection's "features" array: a scanner keeps only the feature
 * being read, so memory stays constant however large the collection.
 */
async function* readGeoJson(input: Readable): AsyncGenerator<ReadRow[]> {
  let depth = 0;
  let inString = false;
  let escaped = false;
  let topLevelString = '';
  let awaitingFeatures = false;
  let featuresDepth = -1;
  let buffer = '';
  let count = 0;
  for await (const chunk of input as AsyncIterable<string>) {
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
