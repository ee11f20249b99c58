/**
 * Coordinates written in a locality text or a verbatim coordinates field: decimal degrees, degrees and
 * minutes, degrees, minutes and seconds, and UTM references, each with the precision its writing gives
 * (docs/method.md §5.3). Values stay in the datum they were written in; src/georef converts them.
 * @example parseCoordinates('45°18′S 131°00′W') // { latitude: -45.3, longitude: -131, format: 'degrees-minutes', precisionDegrees: 1/60, … }
 */
import type { WrittenCoordinates } from './types.ts';
import { tokenize, type Token } from './tokens.ts';
import { ordinalAt, powerOfTen } from './numbers.ts';
import { utmToGeographic } from '../geodesy/utm.ts';

type Hemisphere = 'n' | 's' | 'e' | 'w';

/** Hemisphere letters and words in four languages: O = oeste/ouest (west), L = leste (east). */
const HEMISPHERES: ReadonlyMap<string, Hemisphere> = new Map<string, Hemisphere>([
  ['n', 'n'], ['s', 's'], ['e', 'e'], ['w', 'w'], ['o', 'w'], ['l', 'e'],
  ['north', 'n'], ['norte', 'n'], ['nord', 'n'], ['south', 's'], ['sur', 's'], ['sul', 's'], ['sud', 's'],
  ['east', 'e'], ['este', 'e'], ['leste', 'e'], ['est', 'e'], ['west', 'w'], ['oeste', 'w'], ['ouest', 'w'],
]);
const LATITUDE_LABELS = new Set(['lat', 'latitude', 'latitud']);
const LONGITUDE_LABELS = new Set(['long', 'lon', 'lng', 'longitude', 'longitud']);
const DEGREE_MARKS = new Set(['°', 'º', '˚', 'd', 'deg', 'degrees', 'grados', 'graus', 'degres']);
const MINUTE_MARKS = new Set(["'", '′', '’', '´', 'm', 'min', 'minutes', 'minutos']);
const SECOND_MARKS = new Set(['"', '″', '”', 's', 'sec', 'seconds', 'segundos', 'secondes']);
const PAIR_SEPARATORS = new Set([',', ';', '/', 'and', 'y', 'e', 'et', '-']);
/** Prime signs proper: a minutes mark only (the letters "m", "min" are read as marks elsewhere). */
const SINGLE_PRIMES = new Set(["'", '′', '’', '´']);
const DOUBLE_PRIMES = new Set(['"', '″', '”']);
const isDoublePrime = (t: Token | undefined): boolean => t?.kind === 'symbol' && DOUBLE_PRIMES.has(t.norm);

/**
 * "54° 15\" N" typed on a machine with no prime key: a double prime straight after the degrees, in a text
 * that writes no single prime after any number, is read as minutes [CHOICE typewriterMinutes: common practice,
 * no source]. Where the text does write single primes, the double prime keeps its standard reading, seconds.
 * @example doublePrimeAsMinutes(tokenize('Lat. 54° 15" N')) // true
 */
export function doublePrimeAsMinutes(tokens: Token[]): boolean {
  return !tokens.some((t, k) => t.kind === 'symbol' && SINGLE_PRIMES.has(t.norm) && tokens[k - 1]?.kind === 'number');
}

/** Meters per degree of latitude, rounded (WGS84 mean 111.1–111.7 km): used only to express UTM precision in degrees. */
const METERS_PER_DEGREE = 111320;

interface Angle {
  magnitude: number;
  negative: boolean;
  hemisphere?: Hemisphere;
  axis?: 'lat' | 'lon';
  /** Step of the last written digit, in degrees (docs/method.md §5.3). */
  precision: number;
  parts: 1 | 2 | 3;
  /** Marks, hemisphere or label make it unmistakably a coordinate. */
  marked: boolean;
  decimals: number;
  start: number;
  next: number;
  problems: string[];
  /** Degrees and minutes as written where a double prime was read as minutes (the typewriter's reading). */
  typewritten: string[];
}

const isNum = (t: Token | undefined): t is Token => t?.kind === 'number' && !t.fraction;
const normIn = (t: Token | undefined, set: ReadonlySet<string> | ReadonlyMap<string, unknown>): boolean => t !== undefined && t.kind !== 'number' && set.has(t.norm);
const hemisphereOf = (t: Token | undefined): Hemisphere | undefined => (t && t.kind === 'word' ? HEMISPHERES.get(t.norm) : undefined);

function readAngle(tokens: Token[], start: number, typewriter: boolean): Angle | null {
  let i = start;
  let axis: Angle['axis'];
  if (normIn(tokens[i], LATITUDE_LABELS)) axis = 'lat';
  else if (normIn(tokens[i], LONGITUDE_LABELS)) axis = 'lon';
  if (axis) {
    i++;
    if (tokens[i]?.norm === ':' || tokens[i]?.norm === '=') i++;
  }
  let hemisphere = isNum(tokens[i + 1]) || tokens[i + 1]?.norm === '-' ? hemisphereOf(tokens[i]) : undefined;
  if (hemisphere) i++;
  let negative = false;
  const sign = tokens[i];
  if (sign?.kind === 'symbol' && (sign.norm === '-' || sign.norm === '−' || sign.norm === '+') && isNum(tokens[i + 1]) && !tokens[i + 1]!.spaceBefore) {
    negative = sign.norm !== '+';
    i++;
  }
  const degrees = tokens[i];
  if (!isNum(degrees) || ordinalAt(tokens, i)) return null;
  i++;
  const values = [Number(degrees.norm)];
  let decimals = degrees.decimals!.length;
  let marked = axis !== undefined || hemisphere !== undefined;
  const degreeMarked = normIn(tokens[i], DEGREE_MARKS);
  if (degreeMarked) {
    i++;
    marked = true;
  }
  // Minutes and seconds follow a whole number of degrees (or minutes), marked or, unmarked, before a hemisphere.
  const units = [MINUTE_MARKS, SECOND_MARKS];
  const typewritten: string[] = [];
  for (const marks of units) {
    if (decimals > 0 || !isNum(tokens[i])) break;
    const value = tokens[i]!;
    const mark = tokens[i + 1];
    if (marks === MINUTE_MARKS && degreeMarked && isDoublePrime(mark)) {
      // Degrees then a double prime: minutes on a typewriter [CHOICE typewriterMinutes], else seconds with no minutes.
      values.push(...(typewriter ? [Number(value.norm)] : [0, Number(value.norm)]));
      decimals = value.decimals!.length;
      if (typewriter) typewritten.push(`${degrees.text}${tokens[i - 1]!.text} ${value.text}${mark!.text}`);
      i += 2;
      marked = true;
      break;
    }
    const secondsLetter = marks === SECOND_MARKS && mark?.norm === 's' && hemisphereOf(tokens[i + 2]) === undefined && tokens[i - 1]?.norm !== 'm';
    if (normIn(mark, marks) && !secondsLetter) {
      values.push(Number(value.norm));
      decimals = value.decimals!.length;
      i += 2;
      marked = true;
    } else if ((degreeMarked || values.length > 1 || hemisphere === undefined) && lookaheadHemisphere(tokens, i + 1)) {
      values.push(Number(value.norm));
      decimals = value.decimals!.length;
      i += 1;
    } else break;
  }
  if (hemisphere === undefined) {
    // "1º e 2º": a small "e" or "o" with another number after it is "and" or "or", not a hemisphere.
    const conjunction = (tokens[i]?.text === 'e' || tokens[i]?.text === 'o') && isNum(tokens[i + 1]);
    hemisphere = conjunction ? undefined : hemisphereOf(tokens[i]);
    if (hemisphere) {
      i++;
      marked = true;
    }
  }
  const problems: string[] = [];
  if (values[1] !== undefined && values[1] >= 60) problems.push(`minutes ${values[1]} are 60 or more`);
  if (values[2] !== undefined && values[2] >= 60) problems.push(`seconds ${values[2]} are 60 or more`);
  const magnitude = values[0]! + (values[1] ?? 0) / 60 + (values[2] ?? 0) / 3600;
  if (!Number.isFinite(magnitude)) return null;
  const step = powerOfTen(-decimals) / [1, 60, 3600][values.length - 1]!;
  return { magnitude, negative, hemisphere, axis, precision: step, parts: values.length as 1 | 2 | 3, marked, decimals, start, next: i, problems, typewritten };
}

/** True when, from i, at most one more number and then a hemisphere word follow (unmarked "12 30 15 S"). */
function lookaheadHemisphere(tokens: Token[], i: number): boolean {
  if (hemisphereOf(tokens[i])) return true;
  return isNum(tokens[i]) && hemisphereOf(tokens[i + 1]) !== undefined;
}

const axisOf = (a: Angle): 'lat' | 'lon' | undefined => a.axis ?? (a.hemisphere === 'n' || a.hemisphere === 's' ? 'lat' : a.hemisphere ? 'lon' : undefined);

function signedValue(a: Angle, axisName: string, problems: string[]): number {
  const hemisphereNegative = a.hemisphere === 's' || a.hemisphere === 'w';
  if (a.negative && a.hemisphere && !hemisphereNegative) problems.push(`${axisName}: minus sign and hemisphere ${a.hemisphere.toUpperCase()} disagree; hemisphere used`);
  return (a.hemisphere ? hemisphereNegative : a.negative) ? -a.magnitude : a.magnitude;
}

/** A coordinate pair found in a token stream: the reading and the token span it covers. */
export interface CoordinatesFound {
  coordinates: WrittenCoordinates;
  startToken: number;
  endToken: number;
}

/** One whole degree with no hemisphere and no axis: it does not say whether it is latitude or longitude. */
const unplaced = (a: Angle): boolean => a.parts === 1 && a.decimals === 0 && !a.hemisphere && !a.axis;

function readPair(text: string, tokens: Token[], i: number, lenient: boolean, typewriter: boolean): CoordinatesFound | null {
  const first = readAngle(tokens, i, typewriter);
  if (!first) return null;
  let j = first.next;
  if (normIn(tokens[j], PAIR_SEPARATORS) && tokens[j]!.norm !== '-') j++;
  const second = readAngle(tokens, j, typewriter);
  if (!second) return null;
  const plainDecimals = !first.marked && !second.marked;
  // In running text a bare pair must look like coordinates (two decimals each); a coordinate field may be plainer.
  if (plainDecimals && !lenient && (first.decimals < 2 || second.decimals < 2 || first.parts > 1 || second.parts > 1)) return null;
  if (!plainDecimals && (!first.marked || !second.marked)) return null;
  // In running text, two whole degrees that say neither which is latitude nor which longitude are no pair ("1° e 2°").
  if (!lenient && unplaced(first) && unplaced(second)) return null;
  const problems = [...first.problems, ...second.problems];
  const axisA = axisOf(first);
  const axisB = axisOf(second);
  let lat = first;
  let lon = second;
  if ((axisA === 'lon' && axisB !== 'lon') || (axisB === 'lat' && axisA !== 'lat')) [lat, lon] = [second, first];
  if (axisA && axisA === axisB) problems.push(`both values are marked as ${axisA === 'lat' ? 'latitude' : 'longitude'}`);
  const latitude = signedValue(lat, 'latitude', problems);
  const longitude = signedValue(lon, 'longitude', problems);
  if (Math.abs(latitude) > 90) {
    problems.push(`latitude ${latitude} is outside ±90°${Math.abs(longitude) <= 90 && !axisA && !axisB ? '; latitude and longitude may be swapped' : ''}`);
  }
  if (Math.abs(longitude) > 180) problems.push(`longitude ${longitude} is outside ±180°`);
  const parts = Math.max(first.parts, second.parts);
  const typewritten = [...first.typewritten, ...second.typewritten];
  const coordinates: WrittenCoordinates = {
    written: text.slice(tokens[i]!.start, tokens[second.next - 1]!.end),
    latitude,
    longitude,
    format: parts === 3 ? 'degrees-minutes-seconds' : parts === 2 ? 'degrees-minutes' : 'decimal',
    precisionDegrees: Math.min(first.precision, second.precision),
    problems,
    ...(typewritten.length > 0 ? { notes: [`double prime read as minutes in ${typewritten.join(', ')}, as typewritten labels write minutes when no single prime is written [CHOICE typewriterMinutes: common practice, no source]`] } : {}),
  };
  return { coordinates, startToken: i, endToken: second.next };
}

/** UTM latitude bands C–X (no I, O), 8° each from 80°S; X spans 72°N–84°N. */
const UTM_BANDS = 'CDEFGHJKLMNPQRSTUVWX';
const UTM_WORDS = new Set(['utm']);
const ZONE_WORDS = new Set(['zone', 'zona', 'fuso', 'fuseau', 'z']);

function readUtm(text: string, tokens: Token[], i: number): CoordinatesFound | null {
  let j = i;
  const hasUtmWord = normIn(tokens[j], UTM_WORDS);
  if (hasUtmWord) j++;
  if (normIn(tokens[j], ZONE_WORDS)) j++;
  const zoneToken = tokens[j];
  if (!isNum(zoneToken) || zoneToken.decimals !== '') return null;
  const zone = Number(zoneToken.norm);
  if (zone < 1 || zone > 60) return null;
  j++;
  const bandToken = tokens[j];
  const band = bandToken?.kind === 'word' && bandToken.norm.length === 1 && UTM_BANDS.includes(bandToken.norm.toUpperCase()) ? bandToken.norm.toUpperCase() : undefined;
  if (band) j++;
  if (!hasUtmWord && !band) return null;
  const readMeters = (k: number, suffixes: string[]): { value: number; decimals: number; digits: number; next: number } | null => {
    if (tokens[k]?.norm === ',') k++;
    const t = tokens[k];
    if (!isNum(t)) return null;
    k++;
    if (tokens[k]?.norm === 'm' && suffixes.includes(tokens[k + 1]?.norm ?? '')) k += 2;
    else if (tokens[k] && suffixes.includes(tokens[k]!.norm) && tokens[k]!.kind === 'word') k++;
    return { value: Number(t.norm), decimals: t.decimals!.length, digits: t.norm.split('.')[0]!.length, next: k };
  };
  const easting = readMeters(j, ['e', 'me', 'l']);
  if (!easting) return null;
  const northing = readMeters(easting.next, ['n', 'mn']);
  if (!northing) return null;
  if (!hasUtmWord && (easting.digits !== 6 || northing.digits < 6)) return null;
  const problems: string[] = [];
  // "18N" is read as the northern hemisphere (band N, 0°–8°N, is north too, so no band check for it).
  const south = band !== undefined && band < 'N';
  if (band === 'S') problems.push('zone letter S read as latitude band S (northern hemisphere, 32°N–40°N), not as "south"');
  if (band === undefined) problems.push('no latitude band written: northern hemisphere assumed');
  if (easting.value < 100000 || easting.value > 900000) problems.push(`easting ${easting.value} is outside 100000–900000 m`);
  // A reference no UTM grid can hold is not read as one.
  if (!(easting.value > 0 && easting.value < 1000000 && northing.value >= 0 && northing.value <= 10000000)) return null;
  const utm = { zone, hemisphere: south ? 'S' as const : 'N' as const, ...(band ? { band } : {}), easting: easting.value, northing: northing.value };
  // A preview on the WGS84 ellipsoid: georef converts the grid again in the datum it finally uses.
  const { latitude, longitude } = utmToGeographic(utm, 'EPSG:4326');
  if (band && band !== 'N') {
    const index = UTM_BANDS.indexOf(band);
    const low = -80 + 8 * index;
    const high = band === 'X' ? 84 : low + 8;
    if (latitude < low - 0.01 || latitude > high + 0.01) problems.push(`latitude ${latitude.toFixed(4)} is outside band ${band} (${low}° to ${high}°)`);
  }
  const precisionMeters = powerOfTen(-Math.max(easting.decimals, northing.decimals));
  const coordinates: WrittenCoordinates = {
    written: text.slice(tokens[i]!.start, tokens[northing.next - 1]!.end),
    latitude,
    longitude,
    format: 'utm',
    utm,
    precisionDegrees: precisionMeters / METERS_PER_DEGREE,
    problems,
  };
  return { coordinates, startToken: i, endToken: northing.next };
}

/** Datum names as written: "WGS84", "WGS 84", "NAD27", "SAD69", "SIRGAS 2000", "Corrego Alegre", "datum X". */
const DATUM_NAMES = new Set(['wgs', 'nad', 'sad', 'psad', 'ed', 'sirgas', 'etrs', 'rgf', 'ntf', 'pulkovo', 'corrego', 'gda', 'ch']);

function findDatum(text: string, tokens: Token[]): string | undefined {
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i]!;
    if (t.kind !== 'word') continue;
    if (t.norm === 'datum' || t.norm === 'dat') {
      let k = i + 1;
      if (tokens[k]?.norm === ':' || tokens[k]?.norm === '=') k++;
      const name = tokens[k];
      if (name?.kind === 'word') {
        const end = isNum(tokens[k + 1]) ? k + 2 : k + 1;
        return text.slice(name.start, tokens[end - 1]!.end);
      }
    }
    if (DATUM_NAMES.has(t.norm) && isNum(tokens[i + 1]) && t.text.toUpperCase() === t.text) {
      return text.slice(t.start, tokens[i + 1]!.end);
    }
    if (t.norm === 'corrego' && tokens[i + 1]?.norm === 'alegre') return text.slice(t.start, tokens[i + 1]!.end);
  }
  return undefined;
}

const DEGREE_SIGNS = new Set(['°', 'º', '˚', 'degrees', 'grados', 'graus', 'degres']);

/** A hemisphere after degrees: a word ("sur", "ouest"), or a capital letter ("N", "O"), not the small "e" or "o" of running text. */
const hemisphereAfterDegrees = (t: Token | undefined): boolean => hemisphereOf(t) !== undefined && (t!.norm.length > 1 || t!.text[0] !== t!.text[0]!.toLowerCase());

/** After the number at k, a degree sign or word and then a number, a prime or a hemisphere ("54° 15", "54 grados S"). */
function degreesWrittenAt(tokens: Token[], k: number): boolean {
  const after = tokens[k + 2];
  return normIn(tokens[k + 1], DEGREE_SIGNS) && (isNum(after) || normIn(after, MINUTE_MARKS) || isDoublePrime(after) || hemisphereAfterDegrees(after));
}

/**
 * Whether tokens write coordinates, read or not: a number with a degree sign or word followed by a number, a
 * prime or a hemisphere ("54° 15", "54°'", "54 grados S"; not the ordinal "1º de Maio" nor "25°C"), or a
 * latitude or longitude word before a number ("Lat. 54", "longitud 66"), in four languages. Such a clause is
 * never a place's name.
 * @example writesCoordinates(tokenize('Lat. 54° 15 N')) // true
 */
export function writesCoordinates(tokens: Token[]): boolean {
  // A label counts when any number follows it: before the last number. Found once, so long texts stay linear.
  let lastNumber = -1;
  tokens.forEach((t, k) => { if (t.kind === 'number') lastNumber = k; });
  return tokens.some((t, k) => (t.kind === 'number' && degreesWrittenAt(tokens, k))
    || (k < lastNumber && (normIn(t, LATITUDE_LABELS) || normIn(t, LONGITUDE_LABELS))));
}

/**
 * Finds the first coordinate pair (decimal, degrees-minutes(-seconds) in any common punctuation, or UTM)
 * in tokens [from, to); `lenient` also accepts bare number pairs ("95.5, 45.2"), as in a coordinate field. A UTM
 * reference is kept as written (`utm`) with a preview on the WGS84 ellipsoid; georef converts it in its datum.
 */
export function findCoordinates(text: string, tokens: Token[], from = 0, to = tokens.length, lenient = false): CoordinatesFound | null {
  const window = tokens.slice(from, to);
  if (!window.some(isNum)) return null;
  const typewriter = doublePrimeAsMinutes(tokens);
  for (let i = 0; i < window.length; i++) {
    const found = coordinatesAt(text, window, i, lenient, typewriter);
    if (found) return { ...found, startToken: found.startToken + from, endToken: found.endToken + from };
  }
  return null;
}

/**
 * The coordinate pair that starts at the first token, read leniently as a coordinate field is (bare number
 * pairs too), or null: what findCoordinates(…, true) finds when its pair starts the text, without trying
 * every later token.
 * @example pairAtStart('-45.3, -131.0', tokenize('-45.3, -131.0'))?.endToken // 3
 */
export function pairAtStart(text: string, tokens: Token[]): CoordinatesFound | null {
  return !tokens.some(isNum) ? null : coordinatesAt(text, tokens, 0, true, doublePrimeAsMinutes(tokens));
}

/**
 * The UTM reference or coordinate pair that starts at token i, with the datum written anywhere in the tokens.
 * Each holds a number (a zone, degrees), so callers pass over a text with none at once.
 */
function coordinatesAt(text: string, tokens: Token[], i: number, lenient: boolean, typewriter: boolean): CoordinatesFound | null {
  const found = readUtm(text, tokens, i) ?? readPair(text, tokens, i, lenient, typewriter);
  if (!found) return null;
  const datumWritten = findDatum(text, tokens);
  if (datumWritten) found.coordinates.datumWritten = datumWritten;
  return found;
}

/**
 * Reads a verbatim coordinate field ("12°30'15\"S 45°20'W", "-12.5, -45.3", "UTM 18T 500000E 4649776N",
 * "10.5 N 66.2 W WGS84"). The whole field must be one coordinate pair (plus an optional datum).
 * @example parseCoordinates("12.5 S, 45.25 W") // { latitude: -12.5, longitude: -45.25, format: 'decimal', ... }
 */
export function parseCoordinates(text: string): WrittenCoordinates | { problem: string } {
  if (text.length > 10000) return { problem: 'coordinate field longer than 10000 characters' };
  const tokens = tokenize(text);
  if (tokens.length === 0) return { problem: 'empty coordinate field' };
  const found = findCoordinates(text, tokens, 0, tokens.length, true);
  if (!found) return { problem: 'no latitude and longitude pair could be read' };
  const rest = [...tokens.slice(0, found.startToken), ...tokens.slice(found.endToken)];
  const datum = found.coordinates.datumWritten;
  const stray = rest.filter((t) => t.kind !== 'symbol' && !(datum && datum.includes(t.text)) && t.norm !== 'datum');
  if (stray.length > 0) return { problem: `unexpected text beside the coordinates: "${stray.map((t) => t.text).join(' ')}"` };
  return found.coordinates;
}
