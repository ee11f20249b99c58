/**
 * The open world-gazetteer dump layout: 19 tab-separated columns, no header; its alternate-names file
 * (10 columns) and its admin1 and admin2 code files (4 columns). Reading a line is pure; the importer
 * does the I/O. The layouts are those of the dump's readme ("The main 'geoname' table has the following
 * fields", "Table alternate names", "admin1CodesASCII.txt", "admin2Codes.txt").
 */
import type { RawFeature } from './feature-record.ts';
import { foldName } from '../match/fold.ts';
import type { AlternateName } from '../match/types.ts';

/** Columns of the dump layout, in order. */
export const DUMP_COLUMNS = [
  'id', 'name', 'asciiname', 'alternatenames', 'latitude', 'longitude', 'feature class', 'feature code',
  'country code', 'cc2', 'admin1', 'admin2', 'admin3', 'admin4', 'population', 'elevation', 'dem', 'timezone',
  'modification date',
] as const;

/**
 * Feature codes of the dump layout mapped to whereabouts' feature types, whose default radii
 * (src/georef/default-radii.ts, each a [CHOICE] of docs/method.md §4) a point without an extent of its
 * own gets. Codes not listed take the type of their feature class (CLASS_TYPES); populated places are
 * split by population in dumpFeatureType. The code meanings are the layout's published feature-code
 * list (from memory); administrative units by level: ADM1 state, ADM2 county, ADM3 municipality, ADM4
 * and ADM5 district.
 */
const FEATURE_CODE_TYPES: Readonly<Record<string, string>> = {
  PPLC: 'city', PPLA: 'city', PPLG: 'city',
  PPLX: 'locality', PPLL: 'locality', LCTY: 'locality', AREA: 'locality', PPLF: 'village', PPLQ: 'village',
  PPLH: 'town', PPLW: 'village', PPLS: 'village', PPLR: 'village', STLMT: 'village',
  PCLI: 'country', PCL: 'country', PCLD: 'country', PCLF: 'country', PCLS: 'country', PCLIX: 'country', TERR: 'country',
  ADM1: 'stateProvince', ADM1H: 'stateProvince', ADM2: 'county', ADM2H: 'county', ADM3: 'municipality', ADM3H: 'municipality',
  ADM4: 'district', ADM4H: 'district', ADM5: 'district', ADM5H: 'district', ADMD: 'district', ADMDH: 'district',
  LK: 'lake', LKS: 'lake', LKI: 'lake', LKN: 'lake', RSV: 'lake', PND: 'lake', PNDS: 'lake', LGN: 'lake', LKO: 'lake',
  STM: 'river', STMS: 'river', STMI: 'stream', STMB: 'stream', STMH: 'stream', STMX: 'stream', STMD: 'stream', CNL: 'stream',
  STMM: 'river mouth', ESTY: 'river mouth',
  BAY: 'bay', BAYS: 'bay', COVE: 'bay', GULF: 'bay', FLLS: 'waterfall', FLLSX: 'waterfall',
  OCN: 'sea', SEA: 'sea', STRT: 'channel', CHN: 'channel', CHNM: 'channel', SD: 'channel', SWMP: 'wetland', MRSH: 'wetland',
  BOG: 'wetland', SPNG: 'spring', SPNS: 'spring', WLL: 'spring', WLLS: 'spring', SPNT: 'spring',
  MT: 'mountain', MTS: 'mountain', PK: 'peak', PKS: 'peak', VLC: 'mountain', HLL: 'hill', HLLS: 'hill', MND: 'hill',
  PASS: 'pass', GAP: 'pass', CAPE: 'cape', PT: 'cape', PEN: 'cape', ISL: 'island', ISLS: 'island', ISLET: 'island',
  ISLM: 'island', BCH: 'beach', BCHS: 'beach', VAL: 'valley', VALS: 'valley', CNYN: 'valley', GRGE: 'valley',
  RDGE: 'ridge', ESCT: 'ridge', CLF: 'ridge', PLN: 'plain', PLAT: 'plain', DSRT: 'plain', UPLD: 'plain',
  FRM: 'farm', FRMS: 'farm', FRMT: 'farm', RNCH: 'farm', EST: 'estate', ESTB: 'estate', ESTC: 'estate', ESTSG: 'estate',
  RSTN: 'station', RSTP: 'station', STNB: 'station', STNM: 'station', BDG: 'bridge', AIRP: 'airport', AIRF: 'airport',
  CH: 'building', SCH: 'building', HSP: 'building', HTL: 'building', HUT: 'building', MN: 'building', MSTY: 'building',
  BLDG: 'building', RUIN: 'building', CMTY: 'building', LTHSE: 'building',
  RD: 'road', RDA: 'road', RDB: 'road', TRL: 'trail',
  PRK: 'park', RESN: 'park', RESF: 'park', RESW: 'park', RES: 'park', RESV: 'park', RESH: 'park',
  FRST: 'forest', FRSTF: 'forest', GRSLD: 'forest', SCRB: 'forest', VIN: 'farm', ORCH: 'farm',
};

/**
 * The type of a feature class whose code is not listed (the layout's nine classes: A administrative,
 * H water, L area, P populated place, R road, S spot, T terrain, U undersea, V vegetation).
 */
const CLASS_TYPES: Readonly<Record<string, string>> = {
  A: 'administrative unit', H: 'water body', L: 'area', R: 'road', S: 'spot', T: 'terrain feature', U: 'undersea feature', V: 'forest',
};

/** Population above which a populated place counts as a city, then a town (common practice, no source). */
const CITY_POPULATION = 100_000;
const TOWN_POPULATION = 5_000;

/**
 * Our feature type for a dump feature code (by code, else by class); populated places (PPL, PPLA2…) by
 * population, and those of unknown population as towns (erring large, method §4).
 * @example dumpFeatureType('P', 'PPL', 250000) // 'city'
 * @example dumpFeatureType('T', 'PK', 0) // 'peak'
 * @example dumpFeatureType('U', 'SMU', 0) // 'undersea feature'
 */
export function dumpFeatureType(featureClass: string, featureCode: string, population: number): string | null {
  const mapped = FEATURE_CODE_TYPES[featureCode];
  if (mapped !== undefined) return mapped;
  if (featureClass === 'P') {
    if (population >= CITY_POPULATION) return 'city';
    if (population >= TOWN_POPULATION || population === 0) return 'town';
    return 'village';
  }
  return CLASS_TYPES[featureClass] ?? null;
}

/**
 * One line of the dump layout as a RawFeature, or the reason it cannot be read. The admin1 and admin2
 * codes are turned into names through `adminNames` ("CC.A1" and "CC.A1.A2" → name); without them the
 * state and county stay unknown.
 * @example readDumpLine('3435910\tBuenos Aires\t…', new Map([['AR.07', 'Buenos Aires F.D.']]))
 */
export function readDumpLine(line: string, adminNames: ReadonlyMap<string, string>): RawFeature | string {
  if (line.includes('\uFFFD')) return 'not valid UTF-8';
  const fields = line.split('\t');
  if (fields.length !== DUMP_COLUMNS.length) return `${fields.length} columns, the layout has ${DUMP_COLUMNS.length}`;
  const [id, name, asciiName, alternates, latitude, longitude, featureClass, featureCode, countryCode, , admin1, admin2, , , population] = fields;
  const populationNumber = Number(population);
  return {
    id,
    name,
    // The ASCII form adds nothing once names are folded, unless it is spelled differently.
    alternateNames: [...(asciiName === name || asciiName === '' || foldName(asciiName) === foldName(name) ? [] : [asciiName]), ...(alternates === '' ? [] : alternates.split(','))],
    latitude,
    longitude,
    featureType: dumpFeatureType(featureClass, featureCode, Number.isFinite(populationNumber) ? populationNumber : 0),
    countryCode,
    stateProvince: admin1 === '' ? null : adminNames.get(`${countryCode}.${admin1}`) ?? null,
    county: admin1 === '' || admin2 === '' ? null : adminNames.get(`${countryCode}.${admin1}.${admin2}`) ?? null,
  };
}

/** One administrative unit of an admin1 or admin2 code file. */
export interface AdminCode {
  /** "CC.A1" (level 1) or "CC.A1.A2" (level 2). */
  code: string;
  level: 1 | 2;
  name: string;
  asciiName: string;
  /** The unit's own feature id in the dump, whose alternate names are the unit's other names. */
  featureId: string;
}

/**
 * One line of an admin1 (`admin1CodesASCII.txt`) or admin2 (`admin2Codes.txt`) code file: code,
 * name, ASCII name and feature id, tab-separated; null when the line is not of that form.
 * @example readAdminCodeLine('AR.07\tBuenos Aires F.D.\tBuenos Aires F.D.\t3433955')
 * // { code: 'AR.07', level: 1, name: 'Buenos Aires F.D.', asciiName: 'Buenos Aires F.D.', featureId: '3433955' }
 */
export function readAdminCodeLine(line: string): AdminCode | null {
  const fields = line.split('\t');
  const code = /^([A-Z]{2})\.([^.\s]+)(\.[^.\s]+)?$/.exec(fields[0]);
  if (fields.length < 2 || code === null || fields[1].trim() === '') return null;
  return {
    code: fields[0], level: code[3] === undefined ? 1 : 2, name: fields[1].trim(), asciiName: (fields[2] ?? '').trim(), featureId: (fields[3] ?? '').trim(),
  };
}

/** Columns of the alternate-names file (the "V2" layout, with from and to). */
export const ALTERNATE_NAME_COLUMNS = [
  'alternateNameId', 'geonameid', 'isolanguage', 'alternate name', 'isPreferredName', 'isShortName', 'isColloquial', 'isHistoric', 'from', 'to',
] as const;

/**
 * Codes of the language column that mark something other than a name (a web link, a postal code,
 * airport and station codes, an identifier of another register, a pronunciation): not matched.
 */
const NOT_NAME_CODES = new Set(['link', 'post', 'iata', 'icao', 'faac', 'tcid', 'unlc', 'wkdt', 'phon']);

/**
 * One line of the alternate-names file: the feature it names and the name with its language and
 * flags; null for a line that holds no name (a link, a postal code…); or the reason it cannot be read.
 * @example readAlternateNameLine('1\t900010\tes\tPuerto Viejo\t\t\t\t1\t\t1921')
 * // { featureId: '900010', name: { name: 'Puerto Viejo', language: 'es', historic: true, to: '1921' } }
 */
export function readAlternateNameLine(line: string): { featureId: string; name: AlternateName } | null | string {
  if (line.includes('\uFFFD')) return 'not valid UTF-8';
  const fields = line.split('\t');
  if (fields.length !== ALTERNATE_NAME_COLUMNS.length) return `${fields.length} columns, the layout has ${ALTERNATE_NAME_COLUMNS.length}`;
  const [, featureId, language, written, preferred, short, colloquial, historic, from, to] = fields;
  if (NOT_NAME_CODES.has(language)) return null;
  const name = written.trim();
  if (featureId === '' || name === '') return 'feature id or name missing';
  return {
    featureId,
    name: {
      name, language: language === '' ? null : language,
      ...(preferred === '1' && { preferred: true }), ...(short === '1' && { short: true }),
      ...(colloquial === '1' && { colloquial: true }), ...(historic === '1' && { historic: true }),
      ...(from !== '' && { from }), ...(to !== '' && { to }),
    },
  };
}
