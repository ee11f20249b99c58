/**
 * Features of GIS files for the gazetteer: shapefiles (a .shp with its .dbf, .prj and .cpg, or all of
 * them in a .zip; ESRI Shapefile Technical Description, 1998) and GeoPackages (OGC GeoPackage Encoding
 * Standard 1.3, OGC 12-128), their attributes mapped to the gazetteer's columns by the caller's field
 * names, their coordinates converted from the file's coordinate system to WGS84 (src/geodesy/crs.ts).
 * Each feature comes out as a RawFeature with GeoJSON geometry, checked and measured like a GeoJSON
 * import's (feature-record.ts).
 */
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { basename, dirname, extname, join } from 'node:path';
import Database from 'better-sqlite3';
import { unzipSync } from 'fflate';
import type { Geometry, Position } from 'geojson';
import iconv from 'iconv-lite';
import * as shapefile from 'shapefile';
import { crsToWgs84, type CrsToWgs84 } from '../geodesy/crs.ts';
import type { RawFeature } from './feature-record.ts';
import { withoutShp } from './file-input.ts';

/** Which attribute gives each gazetteer column, or a value for every feature. */
export interface GisFieldMap {
  /** The layer: a GeoPackage table, or the shapefile's name inside a zip holding several. */
  layer?: string;
  /** Attribute with the name (default "name"). */
  nameField?: string;
  /** Attribute with the feature id (default: the feature's number in the layer). */
  idField?: string;
  /**
   * Attributes with alternate names, each `|`-separated ("WA|Wash."), one or several (Natural Earth's
   * `name_alt`, `woe_name`, `gn_name`, `name_local`): names the feature is found by, and a state's or
   * county's names in the store's unit names (see `unitNamesOf`).
   */
  alternateNamesField?: string | readonly string[];
  /**
   * Attributes with codes of a state or county (an ISO 3166-2 code "US-WA", a postal code "WA"): the unit is
   * known by them in records' state and county fields and in other files' parent columns (a county's state
   * "WA"), but they are not names a locality text is matched against.
   */
  unitCodeFields?: readonly string[];
  /** Attribute with the feature type, or … */
  featureTypeField?: string;
  /** … one feature type for every feature (e.g. "county", "stateProvince"). */
  featureType?: string;
  countryCodeField?: string;
  /** One country code (ISO 3166-1 alpha-2) for every feature. */
  countryCode?: string;
  stateProvinceField?: string;
  countyField?: string;
  /**
   * Encoding of a shapefile's .dbf, over what its .cpg or header says: a name iconv-lite knows or a code
   * page as a .cpg writes it ("850", "CP437"); default the .cpg's, else the header's, else windows-1252.
   */
  encoding?: string;
}

export type GisFormat = 'shapefile' | 'gpkg';

/** A feature read, or why it could not be, with its number in the layer (from 1). */
export interface GisRow {
  row: number;
  raw: RawFeature | string;
}

/**
 * The features of a GIS file, converted to WGS84; `notes` gets the layer and coordinate system used, and
 * for a shapefile the encoding its .dbf was read in and why.
 * Errors that concern the whole file (no layer, unknown datum, missing .dbf) are thrown before any row.
 * @example for await (const rows of readGisFile('units.zip', 'shapefile', { featureType: 'county' }, notes)) …
 */
export async function* readGisFile(filePath: string, format: GisFormat, map: GisFieldMap, notes: string[]): AsyncGenerator<GisRow[]> {
  const layer = format === 'gpkg' ? geoPackageLayer(filePath, map) : await shapefileLayer(filePath, map);
  notes.push(`layer ${layer.name}: ${layer.crs.description}`, ...(layer.encodingNote === undefined ? [] : [layer.encodingNote]));
  const fields = new Set(layer.fields);
  for (const [option, field] of fieldOptions(map)) {
    if (!fields.has(field)) {
      throw new Error(`${filePath}: layer ${layer.name} has no attribute "${field}" (${option}); its attributes: ${layer.fields.join(', ')}`);
    }
  }
  if (!fields.has(map.nameField ?? 'name')) {
    throw new Error(`${filePath}: layer ${layer.name} has no attribute "name": give the one holding names with --name-field (attributes: ${layer.fields.join(', ')})`);
  }
  let row = 0;
  for await (const { properties, geometry, problem } of layer.features) {
    row++;
    yield [{ row, raw: problem ?? rawFeature(properties, geometry === null ? null : reproject(geometry, layer.crs), map, row) }];
  }
}

/**
 * The attribute-name options given, each with its option name, for the message when one is missing.
 * @example fieldOptions({ nameField: 'NAME', unitCodeFields: ['postal'] }) // [['--name-field', 'NAME'], ['--unit-code-field', 'postal']]
 */
export function fieldOptions(map: GisFieldMap): [option: string, field: string][] {
  const options: [string, string | readonly string[] | undefined][] = [
    ['--name-field', map.nameField], ['--id-field', map.idField], ['--alternate-names-field', map.alternateNamesField],
    ['--unit-code-field', map.unitCodeFields], ['--type-field', map.featureTypeField], ['--country-code-field', map.countryCodeField],
    ['--state-province-field', map.stateProvinceField], ['--county-field', map.countyField],
  ];
  return options.flatMap(([option, fields]) => (fields === undefined ? [] : typeof fields === 'string' ? [fields] : fields).map((field): [string, string] => [option, field]));
}

function rawFeature(properties: Record<string, unknown>, geometry: Geometry | null, map: GisFieldMap, row: number): RawFeature {
  const columns = mappedColumns(properties, { ...map, nameField: map.nameField ?? 'name' });
  return { alternateNames: [], ...columns, id: columns.id ?? String(row), geometry };
}

/**
 * The gazetteer columns the attribute options give (`--name-field`, `--feature-type`, `--country-code-field`…),
 * only those whose option is set: a GIS layer's every column, or what overrides a GeoJSON feature's own
 * properties of the gazetteer's names.
 * @example mappedColumns({ NOMBRE: 'Alisos' }, { nameField: 'NOMBRE', featureType: 'county' }) // { name: 'Alisos', featureType: 'county' }
 */
export function mappedColumns(properties: Record<string, unknown>, map: GisFieldMap): Partial<RawFeature> {
  const value = (field: string | undefined) => {
    const v = field === undefined ? undefined : properties[field];
    return v === null || v === undefined ? undefined : typeof v === 'string' ? v.trim() : String(v);
  };
  const listed = (fields: string | readonly string[]) => (typeof fields === 'string' ? [fields] : fields).flatMap((field) => value(field)?.split('|') ?? []);
  return {
    ...(map.idField !== undefined && { id: value(map.idField) }),
    ...(map.nameField !== undefined && { name: value(map.nameField) }),
    ...(map.alternateNamesField !== undefined && { alternateNames: listed(map.alternateNamesField) }),
    ...(map.unitCodeFields !== undefined && { unitCodes: listed(map.unitCodeFields) }),
    ...((map.featureType ?? map.featureTypeField) !== undefined && { featureType: map.featureType ?? value(map.featureTypeField) }),
    ...((map.countryCode ?? map.countryCodeField) !== undefined && { countryCode: map.countryCode ?? value(map.countryCodeField) }),
    ...(map.stateProvinceField !== undefined && { stateProvince: value(map.stateProvinceField) }),
    ...(map.countyField !== undefined && { county: value(map.countyField) }),
  };
}

interface Layer {
  name: string;
  fields: string[];
  crs: CrsToWgs84;
  /** Each feature's attributes and geometry, or why its geometry cannot be read. */
  features: AsyncIterable<{ properties: Record<string, unknown>; geometry: Geometry | null; problem?: string }>;
  /** Which encoding a shapefile's attributes were read in, and why that one. */
  encodingNote?: string;
}

/** Every position of a geometry through the conversion to WGS84. */
function reproject(geometry: Geometry, crs: CrsToWgs84): Geometry {
  const each = (coordinates: unknown): unknown =>
    typeof (coordinates as Position)[0] === 'number' ? crs.forward(coordinates as Position) : (coordinates as unknown[]).map(each);
  if (geometry.type === 'GeometryCollection') return { ...geometry, geometries: geometry.geometries.map((g) => reproject(g, crs)) };
  return { ...geometry, coordinates: each(geometry.coordinates) } as Geometry;
}

/** A shapefile's parts, from a zip or from the files beside the .shp, read whole. */
async function shapefileLayer(filePath: string, map: GisFieldMap): Promise<Layer> {
  const parts = extname(filePath).toLowerCase() === '.zip' ? zippedShapefile(filePath, map.layer) : shapefileBeside(filePath);
  checkShapefileHeader(parts.shp, `${parts.name}.shp`);
  if (!parts.dbf) throw new Error(`${filePath}: the shapefile ${parts.name} has no .dbf beside it, so its features have no names`);
  if (!parts.prj) {
    throw new Error(`${filePath}: the shapefile ${parts.name} has no .prj, so its coordinate system is unknown: add the .prj (or reproject it to WGS84 with one)`);
  }
  const crs = crsToWgs84(Buffer.from(parts.prj).toString('utf8'), `${parts.name}.prj`);
  const { encoding, why, guessed } = chosenDbfEncoding(parts.dbf, parts.cpg, map.encoding);
  const encodingNote = `${parts.name}.dbf ${guessed ? 'has no .cpg: ' : ''}read as ${encoding} (${why}); give --encoding if its names look wrong`;
  if (!iconv.encodingExists(encoding)) {
    throw new Error(`${filePath}: the .dbf encoding "${encoding}" (${why}) is not one whereabouts knows; give --encoding, e.g. windows-1252, cp850, iso-8859-1 or utf-8`);
  }
  // The reader decodes each field as x-user-defined (WHATWG Encoding Standard, §14.5 from memory: one
  // character a byte, 0x80–0xFF as U+F780–U+F7FF, none of them white space, so its trim keeps them), which
  // its decoder (the text-encoding package it loads) knows; every byte then comes back and iconv-lite
  // decodes it, in code pages that decoder lacks too (the DOS ones, 437, 850, 852…).
  const source = await shapefile.open(toArrayBuffer(parts.shp), toArrayBuffer(parts.dbf), { encoding: 'x-user-defined' });
  const decode = (text: string) => iconv.decode(bytesOfUserDefined(text), encoding).trim();
  const fields = dbfFieldNames(parts.dbf, encoding);
  async function* features() {
    for (let next = await source.read(); !next.done; next = await source.read()) {
      const properties = Object.fromEntries(Object.entries(next.value.properties ?? {}).map(([field, value]) =>
        [decode(field), typeof value === 'string' ? decode(value) || null : value]));
      yield { properties, geometry: next.value.geometry as Geometry | null };
    }
  }
  return { name: parts.name, fields, crs, features: features(), encodingNote };
}

/** The bytes an x-user-defined decoding stands for (WHATWG Encoding Standard §14.5, decoder and encoder). */
function bytesOfUserDefined(text: string): Buffer {
  return Buffer.from(Array.from(text, (c) => {
    const code = c.charCodeAt(0);
    return code >= 0xf780 && code <= 0xf7ff ? code - 0xf700 : code;
  }));
}

/** Shape types a main file may hold (ESRI Shapefile Technical Description, 1998, p. 4). */
const SHAPE_TYPES = new Set([0, 1, 3, 5, 8, 11, 13, 15, 18, 21, 23, 25, 28, 31]);

/**
 * Refuses a .shp whose 100-byte header is not a shapefile's, naming what is wrong: file code 9994 (big-endian,
 * byte 0), version 1000 (little-endian, byte 28) and a known shape type (byte 32) (ESRI Shapefile Technical
 * Description, 1998, pp. 3–4). A file sent through a text channel has its bytes above 0x7F replaced, which
 * shifts the header; without this check the reader's own message ("unsupported shape type: 957") names
 * neither the file nor the cause.
 * @example checkShapefileHeader(readFileSync('units.shp'), 'units.shp') // returns, or throws naming the file
 */
function checkShapefileHeader(shp: Uint8Array, name: string): void {
  const header = Buffer.from(shp.buffer, shp.byteOffset, shp.byteLength);
  const problem =
    header.length < 100
      ? `it is ${header.length} bytes long, shorter than the 100-byte header`
      : header.readInt32BE(0) !== 9994
        ? `it does not begin with the shapefile file code 9994`
        : header.readInt32LE(28) !== 1000
          ? `its header gives version ${header.readInt32LE(28)}, not 1000`
          : !SHAPE_TYPES.has(header.readInt32LE(32))
            ? `its header gives shape type ${header.readInt32LE(32)}, which is none of the shapefile's`
            : undefined;
  if (problem !== undefined) {
    throw new Error(`${name} cannot be read as a shapefile: ${problem}. The file is damaged (a copy made as text replaces bytes) or is not a shapefile; take it again from its source`);
  }
}

interface ShapefileParts {
  name: string;
  shp: Uint8Array;
  dbf?: Uint8Array;
  prj?: Uint8Array;
  cpg?: Uint8Array;
}

function zippedShapefile(filePath: string, layer: string | undefined): ShapefileParts {
  const files = unzipSync(readFileSync(filePath), { filter: (f) => /\.(shp|dbf|prj|cpg)$/i.test(f.name) && !f.name.startsWith('__MACOSX/') });
  const stems = [...new Set(Object.keys(files).filter((f) => /\.shp$/i.test(f)).map((f) => f.slice(0, -4)))];
  const named = layer === undefined ? stems : stems.filter((s) => basename(s).toLowerCase() === layer.toLowerCase());
  if (named.length !== 1) {
    const listed = stems.map((s) => basename(s)).join(', ') || 'none';
    if (stems.length === 0 && Object.keys(files).length > 0) {
      throw new Error(withoutShp(filePath, Object.keys(files)));
    }
    throw new Error(
      layer === undefined && stems.length > 1
        ? `${filePath} holds several shapefiles (${listed}): choose one with --layer`
        : `${filePath} holds no shapefile${layer === undefined ? '' : ` named ${layer}`} (shapefiles in it: ${listed})`,
    );
  }
  const stem = named[0]!;
  const part = (ext: string) => files[Object.keys(files).find((f) => f.toLowerCase() === `${stem}.${ext}`.toLowerCase()) ?? ''];
  return { name: basename(stem), shp: part('shp')!, dbf: part('dbf'), prj: part('prj'), cpg: part('cpg') };
}

function shapefileBeside(shpPath: string): ShapefileParts {
  const [dbf, prj, cpg] = SIDE_FILES.map((ext) => {
    const path = sideFile(shpPath, ext);
    return path === undefined ? undefined : readFileSync(path);
  });
  return { name: basename(shpPath, extname(shpPath)), shp: readFileSync(shpPath), dbf, prj, cpg };
}

const SIDE_FILES = ['dbf', 'prj', 'cpg'] as const;

/** The file beside a .shp with another extension (any case), if there is one. */
function sideFile(shpPath: string, ext: string): string | undefined {
  const stem = basename(shpPath, extname(shpPath));
  const found = readdirSync(dirname(shpPath)).find((f) => f.toLowerCase() === `${stem}.${ext}`.toLowerCase());
  return found && existsSync(join(dirname(shpPath), found)) ? join(dirname(shpPath), found) : undefined;
}

/**
 * The source's content hash: the file's own sha256, or for a .shp with side files (.dbf, .prj, .cpg) the
 * sha256 of all of them in that order, so that a changed name or coordinate system changes it too.
 * @example gisContentHash('units.zip', '9f86d0…') // '9f86d0…'
 */
export function gisContentHash(filePath: string, fileSha256: string): string {
  const sides = extname(filePath).toLowerCase() === '.shp' ? SIDE_FILES.flatMap((ext) => sideFile(filePath, ext) ?? []) : [];
  if (sides.length === 0) return fileSha256;
  const hash = createHash('sha256');
  for (const path of [filePath, ...sides]) hash.update(readFileSync(path));
  return hash.digest('hex');
}

/**
 * The encoding of a shapefile's .dbf and why: `--encoding` when given, else its .cpg, else what
 * `dbfEncoding` finds in the file (`guessed`): a .cpg is written by the program that wrote the .dbf, so
 * it is trusted over the header's language driver, which many writers leave at a default.
 * @example chosenDbfEncoding(dbf, Buffer.from('850'), undefined) // { encoding: 'cp850', why: 'its .cpg says "850"', guessed: false }
 */
function chosenDbfEncoding(dbf: Uint8Array, cpgFile: Uint8Array | undefined, option: string | undefined): { encoding: string; why: string; guessed: boolean } {
  if (option !== undefined) return { encoding: codePageEncoding(option), why: '--encoding', guessed: false };
  const cpg = cpgFile && Buffer.from(cpgFile).toString('latin1').trim();
  if (cpg) {
    return { encoding: codePageEncoding(cpg), why: /^OEM$/i.test(cpg) ? 'its .cpg says "OEM", taken as the US DOS code page 437' : `its .cpg says "${cpg}"`, guessed: false };
  }
  return { ...dbfEncoding(dbf), guessed: true };
}

/**
 * A code page as a .cpg, `--encoding` or a language driver names it, as iconv-lite's name: a number
 * alone or after CP, IBM, ANSI or OEM ("850", "CP850", "IBM850", "ANSI 1251") is that code page
 * (125x and 874 windows-…, 65001 UTF-8, 10000–10029 the Mac ones, any other cp…); "8859_1" and
 * "ISO 8859-1" ISO-8859; "OEM" alone the US DOS code page 437 (from memory: a .cpg says "OEM" for the
 * machine's DOS code page, most often 437; no source); anything else is passed on as written
 * ("UTF-8", "windows-1252", "koi8-r").
 * @example codePageEncoding('CP850') // 'cp850'
 * @example codePageEncoding('1252') // 'windows-1252'
 */
function codePageEncoding(name: string): string {
  const text = name.trim();
  const number = /^(?:CP|IBM|ANSI|OEM)?[\s_-]?(\d+)$/i.exec(text)?.[1];
  if (number) {
    const n = Number(number);
    if (n === 65001) return 'utf-8';
    if ((n >= 1250 && n <= 1258) || n === 874) return `windows-${n}`;
    return MAC_CODE_PAGES.get(n) ?? `cp${n}`;
  }
  const iso = /^(?:ISO[\s_-]?)?8859[\s_-]?(\d+)$/i.exec(text)?.[1];
  if (iso) return `iso-8859-${iso}`;
  if (/^OEM$/i.test(text)) return 'cp437';
  return text;
}

/** The Mac code pages by their Windows numbers, as iconv-lite names them. */
const MAC_CODE_PAGES: ReadonlyMap<number, string> = new Map([[10000, 'macroman'], [10006, 'macgreek'], [10007, 'maccyrillic'], [10029, 'maccenteuro']]);

/**
 * Code pages named by a .dbf header's language driver id (byte 29). Values: the table LangId_To_CodePage
 * of the open TDbf sources (dbf_lang.pas, as in github.com/mse-org/mseide-msegui,
 * lib/common/fpccompatibility/dbf_lang.pas, commit 0876eb8), every id whose code page iconv-lite decodes;
 * left out: 0x20 (867), 0x68 (895), 0x69 (620), 0x8E (868), which it does not, and 0x86, which TDbf itself
 * marks as doubtful (437 or 737). GDAL's ogr2ogr writes 0x01 for `ENCODING=LDID/1` and reads it as
 * CP437, 0x02 as CP850 (test/store/dbf-language-driver.test.ts reads such files).
 */
const DBF_LANGUAGE_DRIVERS: ReadonlyMap<number, number> = new Map([
  [0x01, 437], [0x02, 850], [0x03, 1252], [0x04, 10000], [0x08, 865], [0x09, 437], [0x0a, 850], [0x0b, 437],
  [0x0c, 850], [0x0d, 437], [0x0e, 850], [0x0f, 437], [0x10, 850], [0x11, 437], [0x12, 850], [0x13, 932],
  [0x14, 850], [0x15, 437], [0x16, 850], [0x17, 865], [0x18, 437], [0x19, 437], [0x1a, 850], [0x1b, 437],
  [0x1c, 863], [0x1d, 850], [0x1f, 852], [0x22, 852], [0x23, 852], [0x24, 860], [0x25, 850], [0x26, 866],
  [0x37, 850], [0x4d, 936], [0x4e, 949], [0x4f, 950], [0x50, 874], [0x56, 932], [0x57, 1252], [0x58, 1252],
  [0x59, 1252], [0x5e, 437], [0x5f, 437], [0x60, 850], [0x61, 1252], [0x62, 1252], [0x64, 852], [0x65, 866],
  [0x66, 865], [0x67, 861], [0x6a, 737], [0x6b, 857], [0x78, 950], [0x79, 949], [0x7a, 936], [0x7b, 932],
  [0x7c, 874], [0x7d, 1255], [0x7e, 1256], [0x85, 862], [0x87, 852], [0x88, 857], [0x96, 10007], [0x97, 10029],
  [0x98, 10006], [0x9b, 1250], [0x9c, 850], [0xc8, 1250], [0xc9, 1251], [0xca, 1254], [0xcb, 1253],
]);

/**
 * The encoding of a .dbf that has no .cpg: UTF-8 when its bytes hold a non-ASCII character and are valid
 * UTF-8 throughout (RFC 3629; text in a single-byte code page almost never is, as for batch input in
 * input-format.ts), else the code page its header's language driver id names (byte 29, see
 * `DBF_LANGUAGE_DRIVERS`), else windows-1252, the dBASE convention. GIS programs write UTF-8 .dbf files
 * and a .cpg beside them, and the .cpg is the file most often left out when a shapefile is zipped by hand.
 * UTF-8 is tried before the driver byte because a writer may leave its default id on a UTF-8 file.
 * @example dbfEncoding(readFileSync('ufs.dbf')).encoding // 'utf-8' when it holds "São Paulo" as C3 A3; 'cp850' for driver 0x02
 */
function dbfEncoding(dbf: Uint8Array): { encoding: string; why: string } {
  // the records only: the header's counts and lengths are binary (dBASE III: its length at bytes 8–9)
  const records = dbf.subarray(dbf.length >= 10 ? dbf[8]! | (dbf[9]! << 8) : dbf.length);
  const driver = dbf.length >= 32 ? DBF_LANGUAGE_DRIVERS.get(dbf[29]!) : undefined;
  const byDriver = driver === undefined
    ? { encoding: 'windows-1252', why: 'the dBASE convention' }
    : { encoding: codePageEncoding(String(driver)), why: `its header's language driver 0x${dbf[29]!.toString(16).padStart(2, '0')}` };
  if (!records.some((byte) => byte >= 0x80)) return byDriver;
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(records);
    return { encoding: 'utf-8', why: 'its bytes are UTF-8' };
  } catch {
    return byDriver;
  }
}

/** The .dbf's field names from its header (dBASE III: 32-byte descriptors from byte 32, ended by 0x0D). */
function dbfFieldNames(dbf: Uint8Array, encoding: string): string[] {
  const names: string[] = [];
  for (let at = 32; at + 32 <= dbf.length && dbf[at] !== 0x0d; at += 32) {
    const raw = dbf.subarray(at, at + 11);
    const end = raw.indexOf(0);
    names.push(iconv.decode(Buffer.from(raw.subarray(0, end < 0 ? 11 : end)), encoding).trim());
  }
  return names;
}

function toArrayBuffer(bytes: Uint8Array): ArrayBuffer {
  return bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
}

/** A GeoPackage feature table (§2.1.6) with its geometry column (§2.1.5) and coordinate system (§1.1.2). */
function geoPackageLayer(filePath: string, map: GisFieldMap): Layer {
  const db = new Database(filePath, { readonly: true, fileMustExist: true });
  try {
    const tables = db.prepare("SELECT table_name FROM gpkg_contents WHERE data_type = 'features' ORDER BY table_name").pluck().all() as string[];
    const name = map.layer ?? (tables.length === 1 ? tables[0] : undefined);
    if (name === undefined || !tables.includes(name)) {
      db.close();
      throw new Error(
        tables.length === 0 ? `${filePath} has no feature layer`
          : map.layer === undefined ? `${filePath} has several layers (${tables.join(', ')}): choose one with --layer`
          : `${filePath} has no layer ${map.layer} (its layers: ${tables.join(', ')})`,
      );
    }
    const column = db.prepare('SELECT column_name, srs_id FROM gpkg_geometry_columns WHERE table_name = ?').get(name) as { column_name: string; srs_id: number };
    const srs = db.prepare('SELECT organization, organization_coordsys_id AS code, definition FROM gpkg_spatial_ref_sys WHERE srs_id = ?').get(column.srs_id) as
      { organization: string; code: number; definition: string } | undefined;
    const where = `${basename(filePath)} layer ${name}`;
    if (!srs || srs.definition.trim().toLowerCase() === 'undefined') throw new Error(`${where}: its coordinate system (srs_id ${column.srs_id}) is undefined, so its coordinates cannot be placed`);
    const crs = crsToWgs84(srs.definition, `${where} (${srs.organization}:${srs.code})`);
    const fields = (db.prepare(`SELECT name FROM pragma_table_info(?)`).pluck().all(name) as string[]).filter((f) => f !== column.column_name);
    const statement = db.prepare(`SELECT * FROM "${name.replace(/"/g, '""')}"`);
    async function* features() {
      try {
        for (const record of statement.iterate() as Iterable<Record<string, unknown>>) {
          const blob = record[column.column_name] as Buffer | null;
          delete record[column.column_name];
          try {
            yield { properties: record, geometry: blob === null ? null : geoPackageGeometry(blob) };
          } catch (error) {
            yield { properties: record, geometry: null, problem: (error as Error).message };
          }
        }
      } finally {
        db.close();
      }
    }
    return { name, fields, crs, features: features() };
  } catch (error) {
    if (db.open) db.close();
    throw error;
  }
}

/**
 * §2.1.3 GeoPackageBinary: "GP", version, flags (bit 0 byte order of the header, bits 1–3 envelope kind,
 * bit 4 empty, bit 5 extended), srs_id, envelope, then the WKB (ISO 13249-3 / OGC Simple Features §8).
 */
function geoPackageGeometry(blob: Buffer): Geometry | null {
  if (blob.toString('latin1', 0, 2) !== 'GP') throw new Error('a geometry is not GeoPackageBinary (no "GP" magic)');
  const flags = blob[3]!;
  if (flags & 0b10_0000) throw new Error('an extended GeoPackageBinary geometry cannot be read');
  if (flags & 0b1_0000) return null;
  const envelopeBytes = [0, 32, 48, 48, 64][(flags >> 1) & 0b111];
  if (envelopeBytes === undefined) throw new Error('a GeoPackageBinary geometry has an invalid envelope code');
  return new WkbReader(blob, 8 + envelopeBytes).geometry();
}

/** Well-known binary (ISO and extended Z/M type codes) to GeoJSON; Z and M values are dropped. */
class WkbReader {
  constructor(private readonly bytes: Buffer, private at: number) {}

  geometry(): Geometry {
    const little = this.bytes[this.at] === 1;
    this.at += 1;
    const code = little ? this.bytes.readUInt32LE(this.at) : this.bytes.readUInt32BE(this.at);
    this.at += 4;
    const iso = code & 0x0fff_ffff;
    const type = iso % 1000;
    const isoDims = Math.floor(iso / 1000);
    const dims = 2 + (isoDims === 1 || isoDims === 3 || code & 0x8000_0000 ? 1 : 0) + (isoDims === 2 || isoDims === 3 || code & 0x4000_0000 ? 1 : 0);
    if (code & 0x2000_0000) this.at += 4; // an extended SRID, not needed here
    const uint = () => {
      const v = little ? this.bytes.readUInt32LE(this.at) : this.bytes.readUInt32BE(this.at);
      this.at += 4;
      return v;
    };
    const point = (): Position => {
      const p: number[] = [];
      for (let d = 0; d < dims; d++, this.at += 8) p.push(little ? this.bytes.readDoubleLE(this.at) : this.bytes.readDoubleBE(this.at));
      return p.slice(0, 2);
    };
    const points = () => Array.from({ length: uint() }, point);
    const rings = () => Array.from({ length: uint() }, points);
    const parts = <T extends Geometry>() => Array.from({ length: uint() }, () => this.geometry() as T);
    switch (type) {
      case 1: return { type: 'Point', coordinates: point() };
      case 2: return { type: 'LineString', coordinates: points() };
      case 3: return { type: 'Polygon', coordinates: rings() };
      case 4: return { type: 'MultiPoint', coordinates: parts<{ type: 'Point'; coordinates: Position }>().map((g) => g.coordinates) };
      case 5: return { type: 'MultiLineString', coordinates: parts<{ type: 'LineString'; coordinates: Position[] }>().map((g) => g.coordinates) };
      case 6: return { type: 'MultiPolygon', coordinates: parts<{ type: 'Polygon'; coordinates: Position[][] }>().map((g) => g.coordinates) };
      case 7: return { type: 'GeometryCollection', geometries: parts() };
      default: throw new Error(`WKB geometry type ${code} is not one whereabouts reads`);
    }
  }
}
