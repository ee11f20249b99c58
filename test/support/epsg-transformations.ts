/**
 * The reference for every datum shift the tests check: the EPSG transformation of each geographic CRS of
 * the table (src/geodesy/datums.ts) and its parameters, read from the EPSG Geodetic Parameter Dataset as
 * packaged in the registry package epsg-index 2.0.0 (derhuerst, npm) wherever it carries them, transcribed
 * from the EPSG transformation record where it does not. Used by test/geodesy/datums.test.ts (the table
 * against the dataset) and test/geodesy/unknown-datum.test.ts (the unknown-datum term recomputed).
 */
import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);

/** epsg-index's entries: name, WKT, proj4 string, [north, west, south, east] area of use, accuracy. */
export const EPSG_INDEX = require('epsg-index/all.json') as Record<string, { name: string; wkt: string; proj4: string; accuracy: number | null; bbox: [number, number, number, number] }>;

/** proj4's WGS 84. */
export const WGS84_PROJ4 = '+proj=longlat +datum=WGS84 +no_defs';

/**
 * Each datum's reference: the EPSG transformation, its parameters in proj4's order (tx, ty, tz in m; rx, ry,
 * rz in arc-seconds, position-vector convention; ds in ppm) and where they were read. From epsg-index 2.0.0
 * (the proj4 string of the geographic CRS, or of the CRSs on the same datum when the geographic CRS has none)
 * where it carries them; transcribed from the EPSG transformation record where epsg-index has only a grid
 * file (NAD27, Corrego Alegre, OSGB36) or a mis-signed string (AGD66: see datums.test.ts).
 */
export const EPSG_TRANSFORMATIONS: Record<string, { transformation: string; parameters: number[] | { epsgIndexDatum: string }; source: string }> = {
  'EPSG:4326': { transformation: 'none', parameters: [0, 0, 0, 0, 0, 0, 0], source: 'WGS 84 itself' },
  'EPSG:4267': { transformation: 'EPSG:1173', parameters: [-8, 160, 176, 0, 0, 0, 0], source: 'EPSG record 1173 "NAD27 to WGS 84 (4)", geocentric translations (method 9603), from DMA TR8350.2; epsg-index gives only the NTv2 grid' },
  'EPSG:4269': { transformation: 'EPSG:1188', parameters: { epsgIndexDatum: 'North_American_Datum_1983' }, source: 'epsg-index, CRSs on NAD83' },
  'EPSG:4618': { transformation: 'EPSG:1864', parameters: { epsgIndexDatum: 'South_American_Datum_1969' }, source: 'epsg-index EPSG:4618 (the code is our table\'s, not printed in epsg-index)' },
  'EPSG:4674': { transformation: 'EPSG:15894', parameters: { epsgIndexDatum: 'Sistema_de_Referencia_Geocentrico_para_las_AmericaS_2000' }, source: 'epsg-index, CRSs on SIRGAS 2000' },
  'EPSG:4230': { transformation: 'EPSG:1133', parameters: { epsgIndexDatum: 'European_Datum_1950' }, source: 'epsg-index EPSG:4230 (code as in our table, not printed in epsg-index)' },
  'EPSG:4225': { transformation: 'EPSG:6194', parameters: [-206.05, 168.28, -3.82, 0, 0, 0, 0], source: 'EPSG record 6194 "Corrego Alegre 1970-72 to WGS 84 (4)", geocentric translations (method 9603); epsg-index gives only the IBGE grid' },
  'EPSG:4248': { transformation: 'EPSG:1209', parameters: { epsgIndexDatum: 'Provisional_South_American_Datum_1956' }, source: 'epsg-index EPSG:4248 (code as in our table, not printed in epsg-index)' },
  'EPSG:4202': { transformation: 'EPSG:15788', parameters: [-127.8, -52.3, 152.9, 0, 0, 0, 0], source: 'EPSG record 1278 "AGD66 to GDA94 (1)" (GDA Technical Manual), whose parameters EPSG names as the AGD66 to WGS 84 approximation, code 15788' },
  'EPSG:4283': { transformation: 'EPSG:1150', parameters: { epsgIndexDatum: 'Geocentric_Datum_of_Australia_1994' }, source: 'epsg-index, CRSs on GDA94' },
  'EPSG:4301': { transformation: 'EPSG:15484', parameters: { epsgIndexDatum: 'Tokyo' }, source: 'epsg-index EPSG:4301 = EPSG record 15484 "Tokyo to WGS 84 (108)"' },
  'EPSG:4277': { transformation: 'EPSG:1314', parameters: [446.448, -125.157, 542.06, 0.15, 0.247, 0.842, -20.489], source: 'EPSG record 1314 "OSGB36 to WGS 84 (6)", position vector (method 9606), as the dataset exports it in the TOWGS84 of EPSG:27700; epsg-index gives only the OSTN15 grid' },
  'EPSG:4258': { transformation: 'EPSG:1149', parameters: { epsgIndexDatum: 'European_Terrestrial_Reference_System_1989' }, source: 'epsg-index, CRSs on ETRS89' },
  'EPSG:4322': { transformation: 'EPSG:1238', parameters: { epsgIndexDatum: 'World_Geodetic_System_1972' }, source: 'epsg-index, CRSs on WGS 72 (e.g. the WGS 72 UTM zones) = EPSG record 1238 "WGS 72 to WGS 84 (2)", position vector (9606)' },
  'EPSG:4221': { transformation: 'EPSG:1127', parameters: { epsgIndexDatum: 'Campo_Inchauspe' }, source: 'epsg-index EPSG:4221 (code as in our table, not printed in epsg-index)' },
  'EPSG:4619': { transformation: 'EPSG:1879', parameters: { epsgIndexDatum: 'SWEREF99' }, source: 'epsg-index, CRSs on SWEREF99 (EPSG:3006 SWEREF99 TM, accuracy 1 m); the transformation code is from memory, not printed in epsg-index' },
  'EPSG:4171': { transformation: 'EPSG:1671', parameters: { epsgIndexDatum: 'Reseau_Geodesique_Francais_1993_v1' }, source: 'epsg-index, CRSs on RGF93 v1 (EPSG:2154 Lambert-93, accuracy 1 m); the transformation code is from memory, not printed in epsg-index' },
};

/** The +towgs84 values of every epsg-index CRS on a datum (by its WKT datum name), with one CRS code for each value. */
export function towgs84OnDatum(datumName: string): Map<string, string> {
  const values = new Map<string, string>();
  for (const [code, crs] of Object.entries(EPSG_INDEX)) {
    if (!(crs.wkt ?? '').includes(`DATUM["${datumName}"`)) continue;
    const towgs84 = /\+towgs84=(\S+)/.exec(crs.proj4)?.[1];
    if (towgs84 && !values.has(towgs84)) values.set(towgs84, code);
  }
  return values;
}

/**
 * The reference parameters of a datum, and every value the dataset gives for it (one, for the check to mean
 * anything; the caller asserts it).
 * @example transformationParameters('EPSG:4230').parameters // [-87, -98, -121, 0, 0, 0, 0]
 */
export function transformationParameters(datum: string): { parameters: number[]; valuesInDataset: number } {
  const { parameters } = EPSG_TRANSFORMATIONS[datum]!;
  if (Array.isArray(parameters)) return { parameters, valuesInDataset: 1 };
  const values = [...towgs84OnDatum(parameters.epsgIndexDatum).keys()];
  return { parameters: values[0]!.split(',').map(Number), valuesInDataset: values.length };
}

/** proj4's geographic CRS for a datum: epsg-index's ellipsoid with the reference shift. */
export function referenceProj4(datum: string): string {
  const code = datum.slice('EPSG:'.length);
  const ellipsoid = /\+ellps=(\S+)/.exec(EPSG_INDEX[code]!.proj4)?.[1] ?? 'WGS84';
  return `+proj=longlat +ellps=${ellipsoid} +towgs84=${transformationParameters(datum).parameters.join(',')} +no_defs`;
}
