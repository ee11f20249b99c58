/**
 * Splitting a locality text into its clauses and reading the ones that are not a locality: unit words
 * ("County", "Municipio de"), written hierarchies ("COUNTRY: State: place"), elevations, and texts that
 * name no place at all.
 * @example unitWordLevel(tokenize('Municipio')[0]) // 'municipality'
 */
import type { AdministrativeContext, AdministrativeLevel, Language, NamedUnit } from './types.ts';
import { someTokenIn, writtenText, type Token } from './tokens.ts';
import * as L from './lexicon.ts';

/** A run of tokens between separators, [from, to), with the separator that ended it. */
export interface Segment {
  from: number;
  to: number;
  /** The separator after the segment (":", "|" and a spaced dash mark an administrative chain), or "" at the end. */
  separator: string;
}

const SEPARATORS = new Set([',', ';', '.', ':', '(', ')', '[', ']', '|']);
const DASHES = new Set(['-', '–', '—']);

/** A dash with spaces on both sides between two words: "Brasil - Minas Gerais - Alisos" (not "5 - 8 km"). */
const isSpacedDash = (tokens: Token[], k: number): boolean =>
  DASHES.has(tokens[k]!.norm) && tokens[k]!.kind === 'symbol' && tokens[k]!.spaceBefore && tokens[k + 1]?.spaceBefore === true &&
  tokens[k - 1]?.kind === 'word' && tokens[k + 1]?.kind === 'word';

/**
 * Splits tokens [from, to) at clause separators (, ; . : | brackets). Spaced dashes separate too when there are
 * two or more of them ("Country - State - place"); one alone may join two names. Empty segments are dropped.
 */
export function splitSegments(tokens: Token[], from: number, to: number): Segment[] {
  let dashes = 0;
  for (let k = from; k < to && dashes < 2; k++) if (isSpacedDash(tokens, k)) dashes++;
  const segments: Segment[] = [];
  let start = from;
  for (let k = from; k <= to; k++) {
    const t = tokens[k];
    const atEnd = k === to;
    const dash = !atEnd && dashes >= 2 && isSpacedDash(tokens, k);
    if (atEnd || dash || (t!.kind === 'symbol' && SEPARATORS.has(t!.norm))) {
      const separator = atEnd ? '' : dash ? '-' : t!.norm;
      if (k > start) segments.push({ from: start, to: k, separator });
      else if (!atEnd && separator === ':' && segments.length > 0) segments[segments.length - 1]!.separator = ':';
      start = k + 1;
    }
  }
  return segments;
}

/**
 * A clause that ends in an elevation marked by its word ("unnamed peak 1900 m in height", "Mont X à 1200 m
 * d'altitude") split in two: the place, then the elevation, which is a height and never an offset.
 * @example splitElevationTail(text, tokenize('summit 1200 m high'), { from: 0, to: 4, separator: '' }) // [{ from: 0, to: 1, … }, { from: 1, to: 4, … }]
 */
export function splitElevationTail(text: string, tokens: Token[], segment: Segment): Segment[] {
  // An elevation holds a number: most clauses hold none and are not tried at every token.
  if (!someTokenIn(tokens, segment.from, segment.to, (t) => t.kind === 'number')) return [segment];
  if (readElevation(text, tokens, segment.from, segment.to)) return [segment];
  for (let k = segment.from + 1; k < segment.to - 1; k++) {
    // "colline de 300 m de haut": the preposition before the number goes with the elevation.
    const start = k - 1 > segment.from && L.ELEVATION_LEAD_WORDS.has(tokens[k - 1]!.norm) ? k - 1 : k;
    if (readElevation(text, tokens, k, segment.to, true)) return [{ from: segment.from, to: start, separator: ',' }, { ...segment, from: start }];
  }
  return [segment];
}

/** Words (and numbers) of tokens [from, to) joined by single spaces, punctuation dropped: "s. loc." → "s loc". */
export function foldedWords(tokens: Token[], from: number, to: number): string {
  let words = '';
  let first = true;
  for (let k = from; k < to; k++) {
    if (tokens[k]!.kind === 'symbol') continue;
    words = first ? tokens[k]!.norm : `${words} ${tokens[k]!.norm}`;
    first = false;
  }
  return words;
}

/** True when the clause says no place is known ("locality unknown", "sin localidad", "s. loc."). */
export function isRefusal(tokens: Token[], from: number, to: number): boolean {
  const words = foldedWords(tokens, from, to);
  return L.REFUSAL_PHRASES.has(words) || (words === '' && someTokenIn(tokens, from, to, (t) => t.norm === '?'));
}

/** Value of an elevation number; "1.200" with three decimals after a period is read as 1200 (thousands separator). */
const isThousands = (t: Token): boolean => t.decimals!.length === 3 && t.text.includes('.');
function elevationValue(t: Token): number {
  return isThousands(t) ? Number(t.text.replace('.', '')) : Number(t.norm);
}

/**
 * Reads an elevation clause: "800 m", "alt. 1200-1500 m", "1200 msnm", "elev. 2500 ft", "800 m a.s.l.",
 * "1900 m in height", "à 1200 m d'altitude". Feet are converted with the international foot (0.3048 m,
 * 1959 agreement). Returns null for other clauses; with `marked`, also for a bare "800 m" (no elevation word).
 */
export function readElevation(
  text: string,
  tokens: Token[],
  from: number,
  to: number,
  needsMark = false,
): { elevation: { minimumMeters: number; maximumMeters: number; written: string }; notes: string[] } | null {
  // "à 1200 m", "at 1200 m": after a preposition only an elevation word makes the number a height.
  const led = L.ELEVATION_LEAD_WORDS.has(tokens[from]?.norm ?? '') && tokens[from + 1]?.kind === 'number';
  let k = led ? from + 1 : from;
  let marked = false;
  while (k < to && (L.ELEVATION_WORDS.has(tokens[k]!.norm) || L.APPROXIMATION_WORDS.has(tokens[k]!.norm) || tokens[k]!.norm === ':' || tokens[k]!.norm === '=')) {
    if (L.ELEVATION_WORDS.has(tokens[k]!.norm)) marked = true;
    k++;
  }
  const low = tokens[k];
  if (low?.kind !== 'number' || low.fraction) return null;
  k++;
  let high = low;
  const joiner = tokens[k];
  if (joiner && ['-', '–', 'a', 'to', 'e', 'y', 'et'].includes(joiner.norm) && tokens[k + 1]?.kind === 'number') {
    high = tokens[k + 1]!;
    k += 2;
  }
  const unit = tokens[k] ? L.ELEVATION_UNITS.get(tokens[k]!.norm) : undefined;
  if (!unit) return null;
  if (tokens[k]!.norm === 'msnm' || tokens[k]!.norm === 'masl' || tokens[k]!.norm === 'msm') marked = true;
  k++;
  for (; k < to; k++) {
    if (tokens[k]!.kind === 'symbol') continue;
    const t = tokens[k]!;
    // One-letter pieces count only as dotted abbreviations ("a.s.l.", "s.n.m."): "500 m N" is an offset.
    if (t.norm.length === 1 && !t.dotted) return null;
    if (L.SEA_LEVEL_WORDS.has(t.norm) || L.ELEVATION_WORDS.has(t.norm)) marked = true;
    else if (!L.ELEVATION_LINK_WORDS.has(t.norm)) return null;
  }
  const alone = !led && !needsMark && to - from <= 3;
  if (!marked && !alone) return null;
  const factor = unit === 'ft' ? 0.3048 : 1;
  const a = elevationValue(low) * factor;
  const b = elevationValue(high) * factor;
  if (!Number.isFinite(a) || !Number.isFinite(b)) return null;
  const written = text.slice(tokens[from]!.start, tokens[to - 1]!.end);
  const notes = isThousands(low) || isThousands(high) ? [`elevation "${written}": a period before three digits read as a thousands separator`] : [];
  return { elevation: { minimumMeters: Math.min(a, b), maximumMeters: Math.max(a, b), written }, notes };
}

/** The level a unit word at token t names, or undefined ("Par." and "Est." only dotted and capitalised, "mun." dotted). */
export function unitWordLevel(t: Token | undefined): AdministrativeLevel | undefined {
  if (t?.kind !== 'word') return undefined;
  if (L.DOTTED_ONLY_ADMINISTRATIVE_WORDS.has(t.norm) && !(t.dotted && (t.text[0] !== t.norm[0] || L.LOWER_CASE_DOTTED_ADMINISTRATIVE_WORDS.has(t.norm)))) return undefined;
  return L.ADMINISTRATIVE_WORDS.get(t.norm);
}

/**
 * A clause that names an administrative unit by a unit word before or after the name, in four languages:
 * "Prov. Alta", "Depto. Norte", "Alisos County", "Municipio de Vila Serena", "State of Redmere", "Poniente Province".
 * @example readAdministrative(text, tokenize("Municipio de Alisos"), 0, 3) // { name: 'Alisos', level: 'municipality', written: 'Municipio de Alisos' }
 */
export function readAdministrative(text: string, tokens: Token[], from: number, to: number): NamedUnit | null {
  if (to - from < 2 || someTokenIn(tokens, from, to, (t) => t.kind === 'number')) return null;
  const written = writtenText(text, tokens, from, to);
  const head = unitWordLevel(tokens[from]);
  if (head && tokens[from + 1]!.kind === 'word') {
    // "Municipio de X", and "Municipio d X" with "de" cut short: a lone "d" after a unit word is no name's first word.
    const of = L.FROM_WORDS.has(tokens[from + 1]!.norm) || tokens[from + 1]!.norm === 'd';
    const nameFrom = of && to - from > 2 ? from + 2 : from + 1;
    return { name: writtenText(text, tokens, nameFrom, to), level: head, written };
  }
  const tail = unitWordLevel(tokens[to - 1]);
  // "Alisos County" names a unit; "Parque do Estado", "Reserva de la Provincia" name a place of the unit.
  if (tail && tokens[to - 2]!.kind === 'word' && !L.FROM_WORDS.has(tokens[to - 2]!.norm)) return { name: writtenText(text, tokens, from, to - 1), level: tail, written };
  return null;
}

/** Administrative levels in the order labels write them: "Country: State: County: Municipality". */
export const ADMINISTRATIVE_ORDER: Array<keyof AdministrativeContext> = ['country', 'stateProvince', 'county', 'municipality'];

const LANGUAGES: readonly Language[] = ['en', 'es', 'pt', 'fr'];

/** Each marker word of exactly one language, with that language; a word two languages share marks neither. */
const SOLE_MARKERS: ReadonlyMap<string, Language> = (() => {
  const sole = new Map<string, Language>();
  for (const language of LANGUAGES) {
    for (const word of L.LANGUAGE_MARKERS[language]) {
      if (LANGUAGES.filter((other) => L.LANGUAGE_MARKERS[other].has(word)).length === 1) sole.set(word, language);
    }
  }
  return sole;
})();

/**
 * The language of a text, when its words mark one language more than any other (marker words in
 * lexicon.ts; "à", "ç", "ã", "õ" and "ñ" count too). Undefined when unclear.
 * @example detectLanguage('5 km al norte del río', tokenize('5 km al norte del río')) // 'es'
 */
export function detectLanguage(text: string, tokens: Token[]): Language | undefined {
  const score: Record<Language, number> = { en: 0, es: 0, pt: 0, fr: 0 };
  for (const t of tokens) {
    // One-letter words ("e", "a", "o") are also direction letters and hemispheres: not counted.
    if (t.kind !== 'word' || t.norm.length < 2) continue;
    const marked = SOLE_MARKERS.get(t.norm);
    if (marked) score[marked] += 1;
  }
  // The marked letters are single UTF-16 units, so reading the text unit by unit counts them all.
  for (let k = 0; k < text.length; k++) {
    const c = text.charCodeAt(k);
    if (c < 0xe0) continue;
    if (c === 0xe0 || c === 0xe8) score.fr += 1; // à è
    if (c === 0xe3 || c === 0xf5 || c === 0xe7) score.pt += 1; // ã õ ç
    if (c === 0xf1) score.es += 1; // ñ
  }
  // The one language scoring highest, when no other scores as high.
  let best: Language | undefined;
  let tied = false;
  for (const language of LANGUAGES) {
    if (best === undefined || score[language] > score[best]) {
      best = language;
      tied = false;
    } else if (score[language] === score[best]) tied = true;
  }
  return best !== undefined && score[best] > 0 && !tied ? best : undefined;
}
