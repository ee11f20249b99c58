/**
 * Geodetic datums found on specimen labels, how they are written, and their shift to WGS84 (docs/method.md §5.4).
 * proj4 knows no shift for most datums (`+datum=NAD27` silently applies none), so each entry carries
 * explicit `+towgs84` parameters with the EPSG transformation they come from. Where the best EPSG
 * transformation needs a grid file we do not ship (NADCON, NTv2, OSTN15), the published 3- or
 * 7-parameter one is used and its stated accuracy is carried into the datum term.
 * Parameters are those of the EPSG Geodetic Parameter Dataset transformation named in each entry;
 * test/geodesy/datums.test.ts checks every entry against the dataset: the proj4 strings packaged in
 * epsg-index where they carry the shift, the transformation record itself where epsg-index has only a grid.
 */
import { proj4 } from './proj4.ts';

export interface DatumDefinition {
  /** EPSG code of the geographic CRS, e.g. "EPSG:4267". */
  epsg: string;
  /** EPSG name. */
  name: string;
  /** Names and abbreviations as written on labels (matched ignoring case, spaces, hyphens, accents). */
  names: string[];
  /** proj4 ellipsoid parameters. */
  ellipsoid: string;
  /** proj4 `+towgs84` parameters (position-vector convention, as proj4 expects). */
  towgs84: string;
  /** The EPSG transformation the parameters come from, in words. */
  transformation: string;
  /** Stated accuracy of that transformation, meters (horizontal). */
  accuracyMeters: number;
  /** The CRS's area of use as EPSG gives it, [north, west, south, east] degrees (west > east crosses 180°). */
  areaOfUse: readonly [number, number, number, number];
}

const identity = '0,0,0,0,0,0,0';

/** Datums we can convert, keyed by EPSG code. */
export const DATUMS: readonly DatumDefinition[] = [
  {
    epsg: 'EPSG:4326',
    name: 'WGS 84',
    names: ['WGS 84', 'WGS 1984', 'World Geodetic System 1984'],
    ellipsoid: '+ellps=WGS84',
    towgs84: identity,
    transformation: 'none (already WGS 84)',
    accuracyMeters: 0,
    areaOfUse: [90, -180, -90, 180],
  },
  {
    epsg: 'EPSG:4267',
    name: 'NAD27',
    names: ['NAD 27', 'NAD 1927', 'North American Datum 1927', 'North American 1927', 'North American Datum of 1927'],
    ellipsoid: '+ellps=clrk66',
    towgs84: '-8,160,176,0,0,0,0',
    transformation: 'EPSG:1173 NAD27 to WGS 84 (4), USA conterminous mean, 3-parameter (NADCON grid not shipped)',
    accuracyMeters: 10,
    areaOfUse: [83.17, 167.65, 7.15, -47.74],
  },
  {
    epsg: 'EPSG:4269',
    name: 'NAD83',
    names: ['NAD 83', 'NAD 1983', 'North American Datum 1983', 'North American 1983', 'North American Datum of 1983'],
    ellipsoid: '+ellps=GRS80',
    towgs84: identity,
    transformation: 'EPSG:1188 NAD83 to WGS 84 (1), null transformation',
    accuracyMeters: 4,
    areaOfUse: [86.45, 167.65, 14.92, -40.73],
  },
  {
    epsg: 'EPSG:4618',
    name: 'SAD69',
    names: ['SAD 69', 'SAD 1969', 'South American Datum 1969', 'South American 1969', 'Datum Sudamericano 1969', 'Datum Sul-Americano 1969'],
    ellipsoid: '+ellps=aust_SA',
    towgs84: '-57,1,-41,0,0,0,0',
    transformation: 'EPSG:1864 SAD69 to WGS 84 (1), South America mean, 3-parameter',
    accuracyMeters: 19,
    areaOfUse: [12.52, -91.72, -55.96, -25.28],
  },
  {
    epsg: 'EPSG:4674',
    name: 'SIRGAS 2000',
    names: ['SIRGAS 2000', 'SIRGAS', 'Sistema de Referencia Geocentrico para las Americas 2000'],
    ellipsoid: '+ellps=GRS80',
    towgs84: identity,
    transformation: 'EPSG:15894 SIRGAS 2000 to WGS 84 (1), null transformation',
    accuracyMeters: 1,
    areaOfUse: [32.72, -122.19, -59.87, -25.28],
  },
  {
    epsg: 'EPSG:4230',
    name: 'ED50',
    names: ['ED 50', 'ED 1950', 'European Datum 1950', 'European 1950'],
    ellipsoid: '+ellps=intl',
    towgs84: '-87,-98,-121,0,0,0,0',
    transformation: 'EPSG:1133 ED50 to WGS 84 (1), western Europe mean, 3-parameter',
    accuracyMeters: 10,
    areaOfUse: [84.73, -16.1, 25.71, 48.61],
  },
  {
    epsg: 'EPSG:4225',
    name: 'Corrego Alegre 1970-72',
    names: ['Corrego Alegre', 'Corrego Alegre 1970-72', 'Corrego Alegre 1970 72'],
    ellipsoid: '+ellps=intl',
    towgs84: '-206.05,168.28,-3.82,0,0,0,0',
    transformation: 'EPSG:6194 Corrego Alegre 1970-72 to WGS 84 (4), Brazil, 3-parameter (IBGE grid not shipped)',
    accuracyMeters: 5,
    areaOfUse: [-2.68, -58.16, -33.78, -34.74],
  },
  {
    epsg: 'EPSG:4248',
    name: 'PSAD56',
    names: ['PSAD 56', 'PSAD 1956', 'Provisional South American Datum 1956', 'Provisional South American 1956', 'Datum Provisional Sudamericano 1956'],
    ellipsoid: '+ellps=intl',
    towgs84: '-288,175,-376,0,0,0,0',
    transformation: 'EPSG:1209 PSAD56 to WGS 84 (1), South America mean, 3-parameter',
    accuracyMeters: 42,
    areaOfUse: [12.68, -81.41, -43.5, -47.99],
  },
  {
    epsg: 'EPSG:4202',
    name: 'AGD66',
    names: ['AGD 66', 'AGD 1966', 'Australian Geodetic Datum 1966', 'Australian Geodetic 1966'],
    ellipsoid: '+ellps=aust_SA',
    towgs84: '-127.8,-52.3,152.9,0,0,0,0',
    transformation: 'EPSG:15788, the parameters of EPSG:1278 AGD66 to GDA94 (1), Australia, 3-parameter (national grid not shipped)',
    accuracyMeters: 5,
    areaOfUse: [-1.3, 109.23, -47.2, 163.2],
  },
  {
    epsg: 'EPSG:4283',
    name: 'GDA94',
    names: ['GDA 94', 'GDA 1994', 'Geocentric Datum of Australia 1994'],
    ellipsoid: '+ellps=GRS80',
    towgs84: identity,
    // EPSG states 1 m; Australia has since moved about 1.8 m relative to WGS 84 [CHOICE: carry 3 m].
    transformation: 'EPSG:1150 GDA94 to WGS 84 (1), null transformation',
    accuracyMeters: 3,
    areaOfUse: [-8.47, 93.41, -60.55, 173.34],
  },
  {
    epsg: 'EPSG:4301',
    name: 'Tokyo',
    names: ['Tokyo', 'Tokyo Datum'],
    ellipsoid: '+ellps=bessel',
    towgs84: '-146.414,507.337,680.507,0,0,0,0',
    transformation: 'EPSG:15484 Tokyo to WGS 84 (108), Japan, 3-parameter',
    accuracyMeters: 9,
    areaOfUse: [45.54, 122.83, 20.37, 154.05],
  },
  {
    epsg: 'EPSG:4277',
    name: 'OSGB36',
    names: ['OSGB 36', 'OSGB 1936', 'Ordnance Survey Great Britain 1936', 'Ordnance Survey of Great Britain 1936'],
    ellipsoid: '+ellps=airy',
    towgs84: '446.448,-125.157,542.06,0.15,0.247,0.842,-20.489',
    transformation: 'EPSG:1314 OSGB36 to WGS 84 (6), 7-parameter (OSTN15 grid not shipped)',
    accuracyMeters: 2,
    areaOfUse: [61.01, -9, 49.75, 2.01],
  },
  {
    epsg: 'EPSG:4258',
    name: 'ETRS89',
    names: ['ETRS 89', 'ETRS 1989', 'European Terrestrial Reference System 1989'],
    ellipsoid: '+ellps=GRS80',
    towgs84: identity,
    transformation: 'EPSG:1149 ETRS89 to WGS 84 (1), null transformation',
    accuracyMeters: 1,
    areaOfUse: [84.73, -16.1, 32.88, 40.18],
  },
  {
    epsg: 'EPSG:4322',
    name: 'WGS 72',
    names: ['WGS 72', 'WGS 1972', 'World Geodetic System 1972'],
    ellipsoid: '+ellps=WGS72',
    towgs84: '0,0,4.5,0,0,0.554,0.219',
    transformation: 'EPSG:1238 WGS 72 to WGS 84 (2), 7-parameter, position vector',
    accuracyMeters: 2,
    areaOfUse: [90, -180, -90, 180],
  },
  {
    epsg: 'EPSG:4221',
    name: 'Campo Inchauspe',
    names: ['Campo Inchauspe', 'Campo Inchauspe 1969', 'Inchauspe'],
    ellipsoid: '+ellps=intl',
    towgs84: '-148,136,90,0,0,0,0',
    transformation: 'EPSG:1127 Campo Inchauspe to WGS 84 (1), Argentina mean, 3-parameter',
    accuracyMeters: 9,
    areaOfUse: [-21.78, -73.59, -54.93, -53.65],
  },
  {
    epsg: 'EPSG:4619',
    name: 'SWEREF99',
    names: ['SWEREF 99', 'SWEREF 1999'],
    ellipsoid: '+ellps=GRS80',
    towgs84: identity,
    transformation: 'EPSG:1879 SWEREF99 to WGS 84 (1), null transformation',
    accuracyMeters: 1,
    areaOfUse: [69.07, 10.03, 54.96, 24.17],
  },
  {
    epsg: 'EPSG:4171',
    name: 'RGF93 v1',
    names: ['RGF 93', 'RGF 1993', 'RGF93', 'Reseau Geodesique Francais 1993', 'Reseau Geodesique Francais 1993 v1'],
    ellipsoid: '+ellps=GRS80',
    towgs84: identity,
    transformation: 'EPSG:1671 RGF93 v1 to WGS 84 (1), null transformation',
    accuracyMeters: 1,
    areaOfUse: [51.56, -9.86, 41.15, 10.38],
  },
];

const byCode = new Map(DATUMS.map((datum) => [datum.epsg, datum]));

/** Lower case, no accents, only letters and digits, without filler words, so "North American Datum of 1927" ~ "NAD-27". */
function nameKey(text: string): string {
  return text
    .normalize('NFD')
    .replace(/\p{M}/gu, '')
    .toLowerCase()
    .replace(/\b(datum|of|the|de|do|del|para|las)\b/g, '')
    .replace(/[^a-z0-9]/g, '');
}

const byName = new Map<string, string>();
for (const datum of DATUMS) {
  for (const name of [datum.name, ...datum.names]) byName.set(nameKey(name), datum.epsg);
}

/**
 * The EPSG code of a datum as written on a label, or undefined when it is not one we can convert.
 * Accepts EPSG codes ("EPSG:4267", "epsg 4267", "4267") and names or abbreviations in any case, with or
 * without spaces, hyphens and accents ("NAD27", "NAD 1927", "wgs-84", "SIRGAS2000", "Córrego Alegre").
 * @example datumFromName('North American Datum 1927') // 'EPSG:4267'
 */
export function datumFromName(text: string): string | undefined {
  const code = /^\s*(?:epsg\s*:{0,2}\s*)?(\d{4,5})\s*$/i.exec(text);
  if (code) return byCode.has(`EPSG:${code[1]}`) ? `EPSG:${code[1]}` : undefined;
  return byName.get(nameKey(text));
}

/** The table entry for an EPSG code; throws a clear error for a datum we cannot convert. */
export function datumDefinition(datumEpsg: string): DatumDefinition {
  const datum = byCode.get(datumEpsg.trim().toUpperCase());
  if (!datum) {
    throw new Error(`unsupported datum ${JSON.stringify(datumEpsg)}: known are ${DATUMS.map((d) => d.epsg).join(', ')}`);
  }
  return datum;
}

/** proj4 definition of the geographic CRS, with its explicit shift to WGS84. */
function geographicProj4(datum: DatumDefinition): string {
  return `+proj=longlat ${datum.ellipsoid} +towgs84=${datum.towgs84} +no_defs`;
}

const WGS84_PROJ4 = '+proj=longlat +datum=WGS84 +no_defs';

export interface Wgs84Position {
  latitude: number;
  longitude: number;
  /** Stated accuracy of the transformation used, meters (0 for WGS84 itself). */
  accuracyMeters: number;
  /** Which transformation was applied, in words. */
  transformation: string;
  /** False when the point lies outside the datum's EPSG area of use: the stated datum is then doubtful. */
  withinAreaOfUse: boolean;
}

/** Whether a point lies in an EPSG bounding box [north, west, south, east] (west > east wraps past 180°). */
export function withinArea(latitude: number, longitude: number, [north, west, south, east]: DatumDefinition['areaOfUse']): boolean {
  const inLongitude = west <= east ? longitude >= west && longitude <= east : longitude >= west || longitude <= east;
  return latitude <= north && latitude >= south && inLongitude;
}

/**
 * Coordinates in a stated datum converted to WGS84 (proj4 with the table's explicit +towgs84; heights
 * taken as 0, which changes the horizontal result by well under a millimetre). The result is as good as
 * the transformation, `accuracyMeters` (e.g. 10 m for NAD27 by the 3-parameter mean), and only inside the
 * datum's area of use (`withinAreaOfUse`).
 * @example toWgs84(38, -98, 'EPSG:4267') // ≈ { latitude: 38.00004, longitude: -98.00044, accuracyMeters: 10, … }
 */
export function toWgs84(latitude: number, longitude: number, datumEpsg: string): Wgs84Position {
  const datum = datumDefinition(datumEpsg);
  const withinAreaOfUse = withinArea(latitude, longitude, datum.areaOfUse);
  if (datum.epsg === 'EPSG:4326') return { latitude, longitude, accuracyMeters: 0, transformation: datum.transformation, withinAreaOfUse };
  const [lon, lat] = proj4()(geographicProj4(datum), WGS84_PROJ4, [longitude, latitude]);
  return { latitude: lat!, longitude: lon!, accuracyMeters: datum.accuracyMeters, transformation: datum.transformation, withinAreaOfUse };
}

