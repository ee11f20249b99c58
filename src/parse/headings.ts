/**
 * Headings as written: compass points of the 4-, 8-, 16- and 32-point rose ("NE", "N.N.E.", "NbE"),
 * bearings in degrees, and "toward" bearings, each as a true azimuth with its half-width Δ (docs/method.md §5.2).
 * @example compassPoint('ne') // { azimuth: 45, kind: 'rose8' }
 */
import type { WrittenHeading } from './types.ts';
import { writtenText, type Token } from './tokens.ts';
import { powerOfTen } from './numbers.ts';

/** Half-widths Δ of the compass rose divisions [DERIVED, docs/method.md §5.2]. */
export const ROSE_HALF_WIDTH = { rose4: 45, rose8: 22.5, rose16: 11.25, rose32: 5.625 } as const;

const CARDINAL_AZIMUTH: Readonly<Record<string, number>> = { n: 0, e: 90, s: 180, w: 270 };

/**
 * Pieces of written-out direction words in the four languages, each naming one cardinal letter.
 * "noreste" = nor+este, "sud-ouest" = sud+ouest, "lés-nordeste" = les+nord+este.
 */
const DIRECTION_PIECES: ReadonlyArray<[string, string]> = [
  ['north', 'n'], ['norte', 'n'], ['nord', 'n'], ['nor', 'n'],
  ['south', 's'], ['sud', 's'], ['sur', 's'], ['sul', 's'], ['su', 's'],
  ['east', 'e'], ['leste', 'e'], ['este', 'e'], ['est', 'e'], ['les', 'e'],
  ['west', 'w'], ['ouest', 'w'], ['oeste', 'w'], ['oest', 'w'], ['oes', 'w'],
];

/** Letters of abbreviated directions: O is oeste/ouest (west), L is leste (east). */
const LETTER_CARDINAL: Readonly<Record<string, string>> = { n: 'n', s: 's', e: 'e', w: 'w', o: 'w', l: 'e' };

/**
 * Words made of the pieces alone: what segmentDirectionWord splits, told at once for the many words it cannot
 * ("river", "sierra"), which would otherwise try every piece at every step.
 */
const PIECES_ONLY = new RegExp(`^(?:${DIRECTION_PIECES.map(([piece]) => piece).join('|')})*$`);

/** Splits a written-out direction word into cardinal letters, or null. Bounded: words over 24 letters are refused. */
function segmentDirectionWord(word: string): string | null {
  if (word.length > 24) return null;
  if (!PIECES_ONLY.test(word)) return null;
  if (word === '') return '';
  for (const [piece, letter] of DIRECTION_PIECES) {
    if (word.startsWith(piece)) {
      const rest = segmentDirectionWord(word.slice(piece.length));
      if (rest !== null) return letter + rest;
    }
  }
  return null;
}

/** Cardinal letters of an abbreviation written with the letters of LETTER_CARDINAL alone ("nne", "so", "l"), or null. */
function abbreviationLetters(word: string): string | null {
  let letters = '';
  for (const c of word) {
    const letter = LETTER_CARDINAL[c];
    if (letter === undefined) return null;
    letters += letter;
  }
  return letters;
}

/** Cardinal letters ("n", "ne", "nne") of one direction word or abbreviation, or null. */
export function directionLetters(norm: string): string | null {
  const word = norm.includes('-') ? norm.replace(/-/g, '') : norm;
  const abbreviation = word.length >= 1 && word.length <= 3 ? abbreviationLetters(word) : null;
  return abbreviation ?? segmentDirectionWord(word);
}

/** Mean of two azimuths along the shorter arc. */
function midAzimuth(a: number, b: number): number {
  const diff = ((b - a + 540) % 360) - 180;
  return (a + diff / 2 + 360) % 360;
}

/** Azimuth of an intercardinal pair of letters ("ne", "sw"), or null for any other pair. */
const intercardinal = (pair: string): number | null =>
  /^[ns][ew]$/.test(pair) ? midAzimuth(CARDINAL_AZIMUTH[pair[0]!]!, CARDINAL_AZIMUTH[pair[1]!]!) : null;

/**
 * Azimuth and rose division of cardinal letters: "n" (4-point), "ne" (8-point), "nne" (16-point).
 * Returns null for combinations that are not compass points ("ns", "nee").
 * @example compassPoint("nne") // { azimuth: 22.5, kind: 'rose16' }
 */
export function compassPoint(letters: string): { azimuth: number; kind: 'rose4' | 'rose8' | 'rose16' } | null {
  if (letters.length === 1) return { azimuth: CARDINAL_AZIMUTH[letters]!, kind: 'rose4' };
  if (letters.length === 2) {
    const azimuth = intercardinal(letters);
    return azimuth === null ? null : { azimuth, kind: 'rose8' };
  }
  if (letters.length === 3) {
    const outer = letters[0]!;
    const pair = letters.slice(1);
    const azimuth = intercardinal(pair);
    if (azimuth === null || !pair.includes(outer)) return null;
    return { azimuth: midAzimuth(CARDINAL_AZIMUTH[outer]!, azimuth), kind: 'rose16' };
  }
  return null;
}

/** Words introducing an explicit bearing in degrees. */
const BEARING_WORDS = new Set(['bearing', 'brg', 'az', 'azimuth', 'azimut', 'azimute', 'rumbo', 'rumo', 'cap', 'gisement']);
const DEGREE_SIGNS = new Set(['°', 'º', '˚']);
const MINUTE_SIGNS = new Set(["'", '′', '’', '´']);

const isWord = (t: Token | undefined, norm?: string): t is Token => t !== undefined && t.kind === 'word' && (norm === undefined || t.norm === norm);
const isSymbolIn = (t: Token | undefined, set: Set<string>): boolean => t !== undefined && t.kind === 'symbol' && set.has(t.norm);

/** Degrees (and minutes) at i: "30", "30°", "30° 15'", "120.5°", with Δ = half the last written digit's unit. */
function readDegrees(tokens: Token[], i: number): { degrees: number; halfWidth: number; next: number } | null {
  const d = tokens[i];
  if (d?.kind !== 'number' || d.fraction) return null;
  let next = i + 1;
  let degrees = Number(d.norm);
  let halfWidth = 0.5 * powerOfTen(-d.decimals!.length);
  if (isSymbolIn(tokens[next], DEGREE_SIGNS)) next++;
  const m = tokens[next];
  if (m?.kind === 'number' && !m.fraction && isSymbolIn(tokens[next + 1], MINUTE_SIGNS) && d.decimals === '') {
    degrees += Number(m.norm) / 60;
    halfWidth = (0.5 * powerOfTen(-m.decimals!.length)) / 60;
    next += 2;
  }
  if (!Number.isFinite(degrees) || degrees >= 360) return null;
  return { degrees, halfWidth, next };
}

/**
 * Reads a heading at token i: compass words and abbreviations in four languages ("NE", "N.N.E.", "noreste",
 * "sud-ouest", "L"), "N by E" (32-point), quadrant bearings ("N 30° E"), "bearing 120°", "120°", "due N".
 * Δ per docs/method.md §5.2. `text` is the verbatim text the tokens point into.
 * @example readHeadingAt(text, tokenize("NE"), 0) // heading { azimuth: 45, halfWidth: 22.5, kind: 'rose8' }
 */
export function readHeadingAt(text: string, tokens: Token[], i: number): { heading: WrittenHeading; next: number } | null {
  const first = tokens[i];
  // A bare bearing in degrees: "45°", "120.5°" (the degree sign is required).
  if (first?.kind === 'number' && isSymbolIn(tokens[i + 1], DEGREE_SIGNS)) {
    const degrees = readDegrees(tokens, i);
    if (!degrees) return null;
    return { heading: { written: writtenText(text, tokens, i, degrees.next), azimuth: degrees.degrees, halfWidth: degrees.halfWidth, kind: 'degrees' }, next: degrees.next };
  }
  if (!isWord(first)) return null;

  if (BEARING_WORDS.has(first.norm)) {
    const degrees = readDegrees(tokens, i + 1);
    if (!degrees) return null;
    return { heading: { written: writtenText(text, tokens, i, degrees.next), azimuth: degrees.degrees, halfWidth: degrees.halfWidth, kind: 'degrees' }, next: degrees.next };
  }
  if (first.norm === 'due' || first.norm === 'exactly') {
    const rest = readHeadingAt(text, tokens, i + 1);
    if (!rest || rest.heading.kind === 'degrees' || rest.heading.kind === 'due') return null;
    return { heading: { ...rest.heading, written: writtenText(text, tokens, i, rest.next), halfWidth: 0, kind: 'due' }, next: rest.next };
  }
  // Quadrant bearing: N 30° E, S45W.
  if ((first.norm === 'n' || first.norm === 's') && tokens[i + 1]?.kind === 'number') {
    const degrees = readDegrees(tokens, i + 1);
    const side = tokens[degrees?.next ?? -1];
    const sideLetter = isWord(side) && side.norm.length === 1 ? LETTER_CARDINAL[side.norm] : undefined;
    if (degrees && (sideLetter === 'e' || sideLetter === 'w') && degrees.degrees <= 90) {
      const base = first.norm === 'n' ? 0 : 180;
      const sign = (first.norm === 'n') === (sideLetter === 'e') ? 1 : -1;
      const azimuth = (base + sign * degrees.degrees + 360) % 360;
      return { heading: { written: writtenText(text, tokens, i, degrees.next + 1), azimuth, halfWidth: degrees.halfWidth, kind: 'degrees' }, next: degrees.next + 1 };
    }
  }
  // "NbE", "NEbN": a 32-point written as one word.
  const joined = first.norm.length <= 4 && first.norm.charAt(first.norm.length - 2) === 'b' ? /^([nsew]{1,2})b([nsew])$/.exec(first.norm) : null;
  if (joined && first.text.toLowerCase() !== first.text) {
    const compass = compassPoint(joined[1]!);
    const azimuth = compass ? byPoint(compass, joined[2]!) : null;
    if (azimuth !== null) return { heading: { written: writtenText(text, tokens, i, i + 1), azimuth, halfWidth: ROSE_HALF_WIDTH.rose32, kind: 'rose32' }, next: i + 1 };
  }
  const point = readCompassWords(tokens, i);
  if (!point) return null;
  const compass = compassPoint(point.letters);
  if (!compass) return null;
  const by = tokens[point.next];
  if (isWord(by, 'by') || isWord(by, 'b')) {
    const toward = readCompassWords(tokens, point.next + 1);
    const azimuth = toward && toward.letters.length === 1 ? byPoint(compass, toward.letters) : null;
    if (azimuth !== null) return { heading: { written: writtenText(text, tokens, i, toward!.next), azimuth, halfWidth: ROSE_HALF_WIDTH.rose32, kind: 'rose32' }, next: toward!.next };
  }
  return { heading: { written: writtenText(text, tokens, i, point.next), azimuth: compass.azimuth, halfWidth: ROSE_HALF_WIDTH[compass.kind], kind: compass.kind }, next: point.next };
}

/**
 * Azimuth of a 32-point "X by C" ("N by E", "NbE", "NE by N"): 11.25° from X toward cardinal C, Δ = 5.625°
 * [DERIVED, docs/method.md §5.2 from BP2020 §Uncertainty Related to Heading];
 * null when X is a 16-point or C is not beside it.
 */
function byPoint(compass: { azimuth: number; kind: string }, cardinal: string): number | null {
  if (compass.kind === 'rose16') return null;
  const diff = ((CARDINAL_AZIMUTH[cardinal]! - compass.azimuth + 540) % 360) - 180;
  return Math.abs(diff) === 45 || Math.abs(diff) === 90 ? (compass.azimuth + Math.sign(diff) * 11.25 + 360) % 360 : null;
}

/**
 * Cardinal letters of the direction words at i: one word ("NNE", "noreste", "nord-est"), or dotted or
 * touching single letters ("N.N.E.", "N.E").
 */
function readCompassWords(tokens: Token[], i: number): { letters: string; next: number } | null {
  const first = tokens[i];
  if (!isWord(first)) return null;
  if (first.norm.length === 1 && first.norm in LETTER_CARDINAL) {
    let letters = LETTER_CARDINAL[first.norm]!;
    let next = i + 1;
    while (letters.length < 3) {
      const prev = tokens[next - 1]!;
      const t = tokens[next];
      // Joined letters are capitals ("N.E."), so a lower-case "e" (Portuguese "and") after "N." is not read as east.
      if (!isWord(t) || t.norm.length !== 1 || !(t.norm in LETTER_CARDINAL) || t.text[0] === t.norm || !(prev.dotted || !t.spaceBefore)) break;
      letters += LETTER_CARDINAL[t.norm];
      next++;
    }
    return { letters, next };
  }
  const letters = directionLetters(first.norm);
  return letters ? { letters, next: i + 1 } : null;
}
