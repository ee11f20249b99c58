/**
 * Streams a gazetteer file (CSV, GeoJSON FeatureCollection, or the world-gazetteer dump layout, plain or
 * zipped as distributed, with its alternate-names and admin code files) into the store in one
 * transaction: constant memory for any file size, every refused row returned with its row number and
 * reason, the source recorded with its citation, licence and the file's sha256.
 * Shapefiles and GeoPackages (gis-import.ts) go the same way, but are read whole.
 */
import { accessSync, closeSync, constants, fstatSync, openSync, readSync } from 'node:fs';
import { basename, extname } from 'node:path';
import { createInterface } from 'node:readline';
import type { Readable } from 'node:stream';
import { parse } from 'csv-parse';
import type { Feature as GeoJsonFeature } from 'geojson';
import type { AlternateName, Source } from '../match/types.ts';
import { readAdminCodeLine, readAlternateNameLine } from './dump-layout.ts';
import { fileHead, notText } from './file-kind.ts';
import { isZipFile, openFileInput } from './file-input.ts';
import { decodedText, detectDelimiter, inspectInput, type HeaderDelimiter, type InputFormat } from './input-format.ts';
import type { RawFeature } from './feature-record.ts';
import { checkRow, checkedDumpRows, openDumpText, readDump, READ_BYTES, type CheckedRow, type ReadRow } from './import-dump.ts';
import { fieldOptions, gisContentHash, mappedColumns, readGisFile, type GisFieldMap } from './gis-import.ts';
import { administrativeKey } from '../match/context.ts';
import { parentCodeNote, recordsUnitsByRow, unitNamesOf } from './unit-names.ts';
import type { GazetteerStore, ImportSession } from './gazetteer-store.ts';

export type ImportFormat = 'csv' | 'geojson' | 'geonames' | 'shapefile' | 'gpkg';

export interface ImportOptions {
  format: ImportFormat;
  /** How to cite the source; without one, a stand-in is built from the file (see `standInCitation`). */
  citation?: string;
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
  /** The alternate-names file, when one was given: its lines read, the names kept, the lines refused. */
  alternateNames?: { rowsRead: number; kept: number; rejected: { row: number; reason: string }[] };
  seconds: number;
  /** What the reader chose, e.g. a GIS file's layer and the coordinate conversion used. */
  notes?: string[];
  /**
   * The source of the same id this import replaced, when there was one: a second layer of one GeoPackage
   * or zip imported without --source-id takes the first layer's id, and the user must be told.
   */
  replaced?: Pick<Source, 'importedAt' | 'featureCount'>;
}

const PROGRESS_EVERY = 5000;

/**
 * Imports a file as one source (replacing a source of the same id); a failure leaves the store as it was.
 * @example await importGazetteer(store, 'towns.csv', { format: 'csv', citation: 'Survey of towns, 2024' })
 */
export async function importGazetteer(store: GazetteerStore, filePath: string, options: ImportOptions): Promise<ImportSummary> {
  const started = process.hrtime.bigint();
  assertReadable(filePath);
  const adminCodeFiles = options.adminCodesFile === undefined ? [] : typeof options.adminCodesFile === 'string' ? [options.adminCodesFile] : options.adminCodesFile;
  for (const side of [...adminCodeFiles, ...(options.alternateNamesFile === undefined ? [] : [options.alternateNamesFile])]) assertReadable(side);
  // Shapefiles and GeoPackages are binary by nature; their readers check them.
  const gis = options.format === 'shapefile' || options.format === 'gpkg';
  // The attribute options map a GIS layer's or a GeoJSON feature's properties; a CSV or the dump layout
  // names its columns itself, and an option it would ignore is refused rather than silently dropped.
  const map = options.gis ?? {};
  const given = [...new Set(fieldOptions(map).map(([option]) => option)), ...(map.featureType === undefined ? [] : ['--feature-type']), ...(map.countryCode === undefined ? [] : ['--country-code'])];
  if (!gis && options.format !== 'geojson' && given.length > 0) {
    throw new Error(`${given.join(', ')} map a GIS file's or a GeoJSON feature's attributes; a ${options.format === 'csv' ? 'CSV gazetteer names its columns in its header' : 'file of the dump layout has fixed columns'} (${options.format === 'csv' ? CSV_COLUMNS.join(', ') : 'see the README'}): rename its columns instead`);
  }
  // A zip archive (not a workbook) given as the dump layout is the dump as distributed: its data member
  // is read (file-input.ts).
  const notTextKind = gis ? undefined : notText(fileHead(filePath));
  const zipped = options.format === 'geonames' && notTextKind !== undefined && isZipFile(filePath) && !/workbook|spreadsheet|Office/.test(notTextKind.format);
  const kind = zipped ? undefined : notTextKind;
  if (kind) throw new Error(`${basename(filePath)} is ${kind.format}, not a gazetteer in ${options.format === 'geojson' ? 'GeoJSON' : 'CSV or tab-separated text'}: ${kind.advice}`);
  const sourceId = options.sourceId ?? defaultSourceId(filePath);
  // The file's encoding and sha256 in one pass, by the module batch input uses; UTF-8 with damaged
  // bytes is read as UTF-8, and its damaged rows refused (below), rather than all of it as Windows-1252.
  // A zip archive's sha256 is of the archive as downloaded; its member is read as UTF-8, as published.
  const inspected = await inspectInput(filePath);
  const format: InputFormat = inspected.damagedUtf8 || zipped ? { ...inspected, encoding: 'utf-8', bomBytes: zipped ? 0 : inspected.bomBytes } : inspected;
  const citation = options.citation?.trim() || standInCitation(filePath, format, new Date());
  const notes: string[] = [];
  const previous = store.sources().find((source) => source.id === sourceId);
  const session = store.beginImport(sourceId);
  const rejected: { row: number; reason: string }[] = [];
  let alternateNames: ImportSummary['alternateNames'];
  let rowsRead = 0;
  let imported = 0;
  let input: Readable | undefined;
  try {
    if (options.alternateNamesFile !== undefined) alternateNames = await stageAlternateNames(session, options.alternateNamesFile);
    const adminNames = await readAdminCodes(session, adminCodeFiles);
    // The dump is read and checked on a thread of its own while this one writes; its rows wait for
    // staged alternate names, which only this thread's transaction can read, when there are some.
    const onThread = options.format === 'geonames' && alternateNames === undefined;
    if (!gis && !onThread) input = options.format === 'geonames' ? await openDumpText(filePath, zipped, format) : decodedText(filePath, format, READ_BYTES);
    const rows = onThread ? checkedDumpRows({ filePath, zipped, format, adminNames, radii: options.radii })
      : checkedRows(input === undefined ? readGisFile(filePath, options.format as 'shapefile' | 'gpkg', options.gis ?? {}, notes)
        : options.format === 'csv' ? readCsv(input, await detectDelimiter(filePath, format), format.delimiterDeclaration ? 1 : 0) : options.format === 'geojson' ? readGeoJson(input, options.gis ?? {}) : readDump(input, adminNames),
      (raw) => (alternateNames !== undefined && raw.id !== undefined ? withStagedNames(raw, session.stagedAlternateNames(raw.id)) : raw), options.radii);
    // The states, counties and municipalities of a GIS file, a GeoJSON or a CSV gazetteer are recorded with
    // all their names and codes, as the dump's admin code files record theirs (the dump's own unit rows are
    // not: its admin code files name its units), and the state codes its features record are checked.
    const recordsUnits = recordsUnitsByRow(options.format);
    const statesRecorded = new Map<string, number>();
    for await (const batch of rows) {
      for (const { row, checked, terms, unitCodes } of batch) {
        rowsRead++;
        const reason = typeof checked === 'string' ? checked : session.add(checked, terms);
        if (reason !== null) {
          rejected.push({ row, reason });
        } else {
          imported++;
          if (recordsUnits && typeof checked !== 'string') {
            const unit = unitNamesOf(checked, unitCodes);
            if (unit !== null) session.addUnitNames(unit.level, unit.name, unit.names, checked.featureId);
            if (checked.stateProvince !== null) statesRecorded.set(checked.stateProvince, (statesRecorded.get(checked.stateProvince) ?? 0) + 1);
          }
        }
        if (rowsRead % PROGRESS_EVERY === 0) options.onProgress?.(rowsRead);
      }
    }
    // A source with no feature would only look like a success: nothing is registered.
    if (imported === 0) throw new Error(nothingKept(filePath, rowsRead, rejected));
    const unknownStates = parentCodeNote(statesRecorded, (code) => store.unitNames(1, administrativeKey(code)).length > 0);
    if (unknownStates !== null) notes.push(unknownStates);
    session.commit({ citation, licence: options.licence ?? null, contentHash: gis ? gisContentHash(filePath, format.sha256) : format.sha256, format: options.format, priority: options.priority });
  } catch (error) {
    session.rollback();
    input?.destroy();
    throw error;
  }
  options.onProgress?.(rowsRead);
  return {
    sourceId, citation, citationIsStandIn: !options.citation?.trim(), encoding: format.encoding,
    rowsRead, imported, rejected, ...(alternateNames !== undefined && { alternateNames }),
    seconds: Number(process.hrtime.bigint() - started) / 1e9, ...(notes.length > 0 ? { notes } : {}),
    ...(previous !== undefined && { replaced: { importedAt: previous.importedAt, featureCount: previous.featureCount } }),
  };
}

/** Adds the names staged for a feature to its own, with their details (language, former…). */
function withStagedNames(raw: RawFeature, staged: AlternateName[]): RawFeature {
  if (staged.length === 0) return raw;
  const names = new Set(raw.alternateNames ?? []);
  for (const alternate of staged) names.add(alternate.name);
  raw.alternateNames = [...names];
  raw.nameDetails = staged;
  return raw;
}

/** A reader's rows checked on this thread, each completed first by `complete` (staged alternate names). */
async function* checkedRows(rows: AsyncIterable<ReadRow[]> | Iterable<ReadRow[]>, complete: (raw: RawFeature) => RawFeature,
  radii?: Readonly<Record<string, number>>): AsyncGenerator<CheckedRow[]> {
  for await (const batch of rows) {
    yield batch.map(({ row, raw }) => {
      const checked = checkRow({ row, raw: typeof raw === 'string' ? raw : complete(raw) }, radii);
      return typeof raw !== 'string' && raw.unitCodes !== undefined ? { ...checked, unitCodes: raw.unitCodes } : checked;
    });
  }
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
 * @example formatFromFileName('QX.zip') // 'geonames' (the dump is distributed zipped)
 */
export function formatFromFileName(filePath: string): ImportFormat | null {
  const extension = extname(filePath).toLowerCase();
  if (extension === '.csv') return 'csv';
  if (extension === '.geojson' || extension === '.json') return 'geojson';
  if (extension === '.txt' || extension === '.tsv') return 'geonames';
  if (extension === '.zip') return zipNamesShapefile(filePath) ? 'shapefile' : 'geonames';
  if (extension === '.shp') return 'shapefile';
  if (extension === '.gpkg') return 'gpkg';
  return null;
}

/** Central directory file header signature, "PK\x01\x02" (ZIP APPNOTE 4.3.12). */
const CENTRAL_HEADER = Buffer.from([0x50, 0x4b, 0x01, 0x02]);

/**
 * Whether a zip holds a shapefile: its central directory, at the end of the file (ZIP APPNOTE 4.3.12),
 * names a `.shp` member. Each header's name is read by its stated length, since the extra field that
 * follows it (Info-ZIP's "UT" timestamp) may begin with a letter. The tail read covers the directory of
 * any zip of a few hundred members; a zip that names none is taken as the world-gazetteer dump as
 * distributed.
 */
function zipNamesShapefile(filePath: string): boolean {
  const tailBytes = 64 * 1024;
  const fd = openSync(filePath, 'r');
  try {
    const size = fstatSync(fd).size;
    const tail = Buffer.alloc(Math.min(size, tailBytes));
    readSync(fd, tail, 0, tail.length, size - tail.length);
    for (let at = tail.indexOf(CENTRAL_HEADER); at >= 0 && at + 46 <= tail.length; at = tail.indexOf(CENTRAL_HEADER, at + 46)) {
      const name = tail.toString('latin1', at + 46, Math.min(tail.length, at + 46 + tail.readUInt16LE(at + 28)));
      if (/\.shp$/i.test(name)) return true;
    }
    return false;
  } finally {
    closeSync(fd);
  }
}

function defaultSourceId(filePath: string): string {
  return basename(filePath, extname(filePath)).toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'gazetteer';
}

/** The gazetteer CSV's columns; `alternateNames` and `unitCodes` (a unit's codes, "US-WA|WA") are `|`-separated. */
const CSV_COLUMNS = ['id', 'name', 'alternateNames', 'latitude', 'longitude', 'featureType', 'countryCode', 'stateProvince', 'county', 'radiusMeters', 'unitCodes'];

/**
 * The gazetteer CSV's rows, in the delimiter its header line uses (a spreadsheet of Spanish, Portuguese or
 * French settings saves a semicolon-delimited "CSV"). `linesBefore`: lines of the file before the text read
 * (a delimiter declaration "sep=;"), so that rows keep the file's line numbers.
 */
async function* readCsv(input: Readable, delimiter: HeaderDelimiter, linesBefore: number): AsyncGenerator<ReadRow[]> {
  const parser = input.pipe(parse({ delimiter, info: true, relax_column_count: true, skip_empty_lines: true, relax_quotes: true }));
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
      yield [{ row: info.lines + linesBefore, raw: `${record.length} columns, the header has ${header.length}` }];
      continue;
    }
    const fields: Record<string, string> = {};
    header.forEach((column, index) => { fields[column] = record[index]; });
    if (record.some((field) => field.includes('\uFFFD'))) {
      yield [{ row: info.lines + linesBefore, raw: 'not valid UTF-8 (damaged bytes in a UTF-8 file)' }];
      continue;
    }
    yield [{
      row: info.lines + linesBefore,
      raw: { ...fields, alternateNames: listedNames(fields.alternateNames), unitCodes: listedNames(fields.unitCodes) },
    }];
  }
}

/**
 * Streams the members of a FeatureCollection's "features" array: a scanner keeps only the feature
 * being read, so memory stays constant however large the collection.
 */
async function* readGeoJson(input: Readable, map: GisFieldMap): AsyncGenerator<ReadRow[]> {
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
          yield [{ row: count, raw: readGeoJsonFeature(buffer + chunk.slice(featureStart, i + 1), map) }];
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

/**
 * A FeatureCollection member as a gazetteer row: its properties of the gazetteer's names (name,
 * featureType, countryCode…), each overridden by the attribute option given for it (`--name-field`,
 * `--feature-type`…), as for a shapefile.
 */
function readGeoJsonFeature(text: string, map: GisFieldMap): RawFeature | string {
  let feature: GeoJsonFeature;
  try {
    feature = JSON.parse(text) as GeoJsonFeature;
  } catch (error) {
    return `not valid JSON: ${(error as Error).message}`;
  }
  if (feature.type !== 'Feature') return `member of type '${String(feature.type)}', not a Feature`;
  const properties = (feature.properties ?? {}) as Record<string, unknown>;
  return {
    ...properties,
    id: properties.id !== undefined ? String(properties.id) : feature.id !== undefined ? String(feature.id) : undefined,
    alternateNames: listedNames(properties.alternateNames),
    unitCodes: listedNames(properties.unitCodes),
    ...mappedColumns(properties, map),
    geometry: feature.geometry,
  };
}

/**
 * A column or property of several names (alternate names, a unit's codes): a JSON array, or text
 * `|`-separated; none when absent.
 * @example listedNames('WA|Wash.') // ['WA', 'Wash.']
 */
function listedNames(value: unknown): string[] {
  return Array.isArray(value) ? value.map(String) : typeof value === 'string' && value !== '' ? value.split('|') : [];
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
