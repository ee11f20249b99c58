/**
 * Streams a gazetteer file (CSV, GeoJSON FeatureCollection, or the world-gazetteer dump layout) into
 * the store in one transaction: constant memory for any file size, every refused row returned with its
 * row number and reason, the source recorded with its citation, licence and the file's sha256.
 * Shapefiles and GeoPackages (gis-import.ts) go the same way, but are read whole.
 */
import { createHash } from 'node:crypto';
import { accessSync, constants, createReadStream, readFileSync } from 'node:fs';
import { basename, extname } from 'node:path';
import { createInterface } from 'node:readline';
import { StringDecoder } from 'node:string_decoder';
import type { Readable } from 'node:stream';
import { finished } from 'node:stream/promises';
import { parse } from 'csv-parse';
import type { Feature as GeoJsonFeature } from 'geojson';
import { readAdmin1Line, readDumpLine } from './dump-layout.ts';
import { checkFeature, type RawFeature } from './feature-record.ts';
import { gisCompanionFiles, readGisFile, type GisFieldMap } from './gis-import.ts';
import type { GazetteerStore } from './gazetteer-store.ts';

export type ImportFormat = 'csv' | 'geojson' | 'geonames' | 'shapefile' | 'gpkg';

export interface ImportOptions {
  format: ImportFormat;
  citation: string;
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
  const sourceId = options.sourceId ?? defaultSourceId(filePath);
  const admin1Names = options.adminCodesFile === undefined ? new Map<string, string>() : await readAdmin1Names(options.adminCodesFile);
  // Small reads: the dump reader turns a whole read into rows at once, and rows that outlive a
  // young-generation collection cost heap until the next full one.
  const input = createReadStream(filePath, { highWaterMark: READ_BYTES });
  const hash = createHash('sha256');
  input.on('data', (chunk) => hash.update(chunk));
  const notes: string[] = [];
  const gis = options.format === 'shapefile' || options.format === 'gpkg';
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
    if (gis) {
      await finished(input); // the GIS readers read the file themselves; the hash still sees every byte …
      for (const companion of gisCompanionFiles(filePath)) hash.update(readFileSync(companion)); // … and a .shp's side files
    }
    session.commit({ citation: options.citation, licence: options.licence ?? null, contentHash: hash.digest('hex'), format: options.format });
  } catch (error) {
    session.rollback();
    input.destroy();
    throw error;
  }
  options.onProgress?.(rowsRead);
  return { sourceId, rowsRead, imported, rejected, seconds: Number(process.hrtime.bigint() - started) / 1e9, ...(notes.length > 0 ? { notes } : {}) };
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
  for await (const line of createInterface({ input: createReadStream(filePath, 'utf8'), crlfDelay: Infinity })) {
    const entry = readAdmin1Line(line);
    if (entry !== null) names.set(entry[0], entry[1]);
  }
  return names;
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
async function* readDump(input: Readable, admin1Names: ReadonlyMap<string, string>): AsyncGenerator<ReadRow[]> {
  const decoder = new StringDecoder('utf8');
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
