/**
 * Reading one locality clause: the feature names and the offsets from them (distance, heading, path),
 * place-first and terse forms included, and the kind of place a generic word names ("Laguna", "Fazenda").
 * @example featureKindOf('Laguna Negra') // 'water'
 */
import type { DistanceUnit, FeatureKind, LocalityType, Offset, PathQualifier, RouteReading, WrittenDistance, WrittenHeading } from './types.ts';
import { fold, someTokenIn, writtenText, type Token } from './tokens.ts';
import { ordinalAt, readNumberAt } from './numbers.ts';
import { directionLetters, readHeadingAt } from './headings.ts';
import { LEAGUE_RELATIVE_SPREAD, UNIT_WORDS, toMeters } from './units.ts';
import * as L from './lexicon.ts';

/**
 * How one clause reads on its own. `bare` marks a clause that qualifies a neighbour and is joined to it: an
 * offset or path with no feature, "by air", "arredores" (near), "(town)" (what the place before it is).
 */
export interface LocalityRead {
  type: LocalityType | 'habitat';
  features: string[];
  offsets: Offset[];
  approximate: boolean;
  reason?: string;
  notes: string[];
  featureKind?: FeatureKind;
  /** A second name of the one feature, written in brackets after it ("Alisos (Alisitos)"). */
  secondName?: string;
  bare?: 'offset' | 'path' | 'air' | 'near' | 'kind';
  /** A named place that may also be a route between two places (see RouteReading). */
  route?: RouteReading;
  /** A road kilometre post read as the whole clause ("km 12"), as written. */
  kilometrePost?: string;
}

/** The verbatim text and the tokens of one clause; `featureKind` is set when a place-type word was taken off a name. */
interface Source {
  text: string;
  tokens: Token[];
  featureKind?: FeatureKind;
}

const norm = (s: Source, i: number): string | undefined => s.tokens[i]?.norm;

/** Length of the phrase of `list` that starts at i (longest first), or 0. */
const matchPhrase = (s: Source, i: number, list: L.PhraseList): number => phraseLengthAt(s.tokens, i, list);

/**
 * Length of the phrase of `list` that starts at token i (longest first), or 0.
 * @example phraseLengthAt(tokenize('close to Alisos'), 0, L.INNER_NEAR_PHRASES) // 2
 */
export function phraseLengthAt(tokens: Token[], i: number, list: L.PhraseList): number {
  let best = 0;
  const phrases = list.get(tokens[i]?.norm ?? '');
  if (!phrases) return 0;
  for (const phrase of phrases) {
    if (phrase.length <= best) continue;
    let k = 0;
    while (k < phrase.length && tokens[i + k]?.norm === phrase[k]) k++;
    if (k === phrase.length) best = phrase.length;
  }
  return best;
}

/** The feature name as written between tokens [from, to), outer punctuation trimmed; null when empty. */
function nameBetween(s: Source, from: number, to: number): string | null {
  while (from < to && s.tokens[from]!.kind === 'symbol' && !'"“«('.includes(s.tokens[from]!.text)) from++;
  while (to > from && s.tokens[to - 1]!.kind === 'symbol' && !'"”»)'.includes(s.tokens[to - 1]!.text)) to--;
  if (from >= to || !someTokenIn(s.tokens, from, to, (t) => t.kind === 'word')) return null;
  const written = writtenText(s.text, s.tokens, from, to);
  // A token starts and ends with no space, so only a quotation mark or bracket at either end is trimmed.
  const quoted = '"“«('.includes(written[0]!) || '"”»)'.includes(written[written.length - 1]!);
  const name = quoted ? written.replace(/^["“«(\s]+|["”»)\s]+$/g, '') : written;
  return name === '' ? null : name;
}

/**
 * Skips approximation words before a number ("ca. 5 km", "about 5 mi", "aprox. 3 km", "cerca de 5 km", "~5 km").
 * Before anything else they are left alone ("around X" is near; "cerca de X" is near, docs/method.md §3 note in lexicon).
 */
function skipApproximation(s: Source, i: number): { next: number; approximate: boolean } {
  let next = i;
  for (let guard = 0; guard < 4; guard++) {
    const t = s.tokens[next];
    if (!t || t.kind === 'number') break;
    if (t.norm === 'cerca' && norm(s, next + 1) === 'de') next += 2;
    else if (L.APPROXIMATION_WORDS.has(t.norm) && (t.norm !== 'c' || t.dotted)) next++;
    else break;
  }
  return s.tokens[next]?.kind === 'number' && next > i ? { next, approximate: true } : { next: i, approximate: false };
}

const NAUTICAL_WORDS = new Set(['nautical', 'nauticas', 'nauticos', 'marins', 'marinos']);

/**
 * Reads a distance (number or range + unit) at i, with precision from the number as written (docs/method.md §5.1).
 * `unitless`: a number followed directly by a heading ("0.5 NW of X") is read with no unit: marked
 * `unitAssumed`, provisionally in miles, the larger plausible unit (the method widens it, method-defaults.ts); so is
 * one before "of the road from" a place ("13.5 da estrada de X"), which with or without a unit ("km 12 da estrada de
 * X", "12 km del camino de X") is the distance along that road from the place (`fromRoadStart`).
 */
function readDistanceAt(s: Source, i: number, unitless = false): { distance: WrittenDistance; next: number; how?: 'air' | PathQualifier } | null {
  // "km 12 da estrada de X": a kilometre post of the road from X, its unit written before its number [CHOICE roadNumberFromPlace].
  const post = unitless && UNIT_WORDS.get(norm(s, i) ?? '') === 'km' ? readNumberAt(s.tokens, i + 1) : null;
  const postRoad = post ? roadFromPlaceAt(s, post.next) : -1;
  if (postRoad > 0) return alongRoadFrom(s, distanceOf(s, i, post!.next, post!, 'km'), post!.next, postRoad);
  const number = readNumberAt(s.tokens, i);
  if (!number) return null;
  // "17 air miles", "12 road km", "3.5 trail mi": how the distance was measured, written before its unit.
  const how = L.DISTANCE_HOW_WORDS.get(norm(s, number.next) ?? '');
  const measured = how && UNIT_WORDS.has(norm(s, number.next + 1) ?? '') ? number.next + 1 : number.next;
  const unitToken = s.tokens[measured];
  let unit: DistanceUnit | undefined = unitToken?.kind === 'word' ? UNIT_WORDS.get(unitToken.norm) : undefined;
  let next = measured + 1;
  if (!unit && unitless && !ordinalAt(s.tokens, i)) {
    const road = roadFromPlaceAt(s, number.next);
    if (road > 0) return alongRoadFrom(s, distanceOf(s, i, number.next, number, 'mi', true), number.next, road);
    if (readHeading(s, number.next)) return { distance: distanceOf(s, i, number.next, number, 'mi', true), next: number.next };
  }
  // "nautical miles", "millas náuticas", "milhas náuticas", "milles marins"
  if (unitToken?.norm === 'nautical' && UNIT_WORDS.get(norm(s, next) ?? '') === 'mi') {
    unit = 'nmi';
    next++;
  } else if (unit === 'mi' && NAUTICAL_WORDS.has(norm(s, next) ?? '')) {
    unit = 'nmi';
    next++;
  }
  if (!unit) return null;
  const distance = distanceOf(s, i, next, number, unit);
  const road = measured === number.next ? roadFromPlaceAt(s, next) : -1;
  if (road > 0) return alongRoadFrom(s, distance, next, road);
  if (measured === number.next) return { distance, next };
  return { distance, next, how: how === 'air' ? 'air' : pathOf(how!, s.tokens[number.next]!.text) };
}

/**
 * The distance `number` written over tokens [from, to) in `unit`, with δ from its precision (and a league's spread);
 * `unitAssumed` when the text wrote no unit and `unit` is the provisional one.
 */
function distanceOf(s: Source, from: number, to: number, number: NonNullable<ReturnType<typeof readNumberAt>>, unit: DistanceUnit, unitAssumed = false): WrittenDistance {
  const uncertainty = unit === 'league' ? number.uncertainty + number.value * LEAGUE_RELATIVE_SPREAD : number.uncertainty;
  const distance: WrittenDistance = {
    written: s.text.slice(s.tokens[from]!.start, s.tokens[to - 1]!.end),
    value: number.value,
    unit,
    precision: number.precision,
    uncertainty,
    meters: toMeters(number.value, unit),
    uncertaintyMeters: toMeters(uncertainty, unit),
  };
  if (unitAssumed) distance.unitAssumed = true;
  if (number.range) distance.range = number.range;
  return distance;
}

/** A distance before "of the road from" (tokens [at, from], `from` the last "de"/"from"): along that road from the place after it. */
function alongRoadFrom(s: Source, distance: WrittenDistance, at: number, from: number): { distance: WrittenDistance; next: number; how: PathQualifier } {
  return { distance: { ...distance, fromRoadStart: true }, next: from, how: pathOf('road', writtenText(s.text, s.tokens, at, from + 1)) };
}

/**
 * "13.5 da estrada de X", "12 km del camino de X", "km 12 de la carretera de X": after a number, "of the road
 * from" a place, which says where the road's count of distance begins [CHOICE roadNumberFromPlace]. The index of
 * the last "de"/"from" (the place follows it), or -1.
 * @example roadFromPlaceAt(source('13.5 da estrada de Alisos'), 1) // 3
 */
function roadFromPlaceAt(s: Source, k: number): number {
  if (!L.FROM_WORDS.has(norm(s, k) ?? '')) return -1;
  const noun = L.PATH_ARTICLES.has(norm(s, k + 1) ?? '') ? k + 2 : k + 1;
  return modeOfNoun(norm(s, noun)) === 'road' && L.FROM_WORDS.has(norm(s, noun + 1) ?? '') && startsCapitalised(s, noun + 2, s.tokens.length) ? noun + 1 : -1;
}

/** A heading at i, after optional "al", "ao", "au", "à l'", "to the". "sur la ..." is French "on", not south. */
function readHeading(s: Source, i: number): { heading: WrittenHeading; next: number } | null {
  const prefix = matchPhrase(s, i, L.HEADING_PREFIXES);
  for (const start of prefix > 0 ? [i + prefix, i] : [i]) {
    const t = s.tokens[start];
    if (t?.norm === 'sur' && ['la', 'le', 'les', "l'"].includes(norm(s, start + 1) ?? '')) return null;
    const read = readHeadingAt(s.text, s.tokens, start);
    if (read) return read;
  }
  return null;
}

const pathOf = (mode: PathQualifier['mode'], written: string, lineName?: string | null): PathQualifier =>
  lineName ? { mode, written, lineName } : { mode, written };

function modeOfNoun(n: string | undefined): PathQualifier['mode'] | undefined {
  if (n === undefined) return undefined;
  if (L.ROAD_NOUNS.has(n)) return 'road';
  if (L.TRAIL_NOUNS.has(n)) return 'trail';
  if (L.RIVER_NOUNS.has(n)) return 'river';
  return undefined;
}

/**
 * "Estrada do Sul de X", "Sentier des Crêtes de X": the "do"/"des" at k, after the capitalised generic word of a
 * line whose name starts at i, is part of its name, and so is the word after it, even a heading ("Sul"); the
 * next "de" is "from".
 */
const joinsLineName = (s: Source, i: number, k: number): boolean =>
  k > i && L.NAME_GENITIVES.has(s.tokens[k]!.norm) && !!modeOfNoun(norm(s, k - 1)) && /^\p{Lu}/u.test(s.tokens[k - 1]!.text);

/**
 * End of a line name starting at i: the clause end, or (when the place follows) a heading, "upstream", or the
 * first "from"/"desde" ("along Rio de Ouro from Vila Serena"), else the first "de" not followed by an article:
 * "de la" belongs to the name ("10 km along Rio de la Plata de Vila Serena").
 */
function lineEnd(s: Source, i: number, stopAtFrom: boolean): number {
  if (!stopAtFrom) return s.tokens.length;
  let stop = -1;
  for (let k = i; k < s.tokens.length && stop < 0; k++) if (L.STRONG_FROM_WORDS.has(s.tokens[k]!.norm)) stop = k;
  for (let k = i; k < s.tokens.length && stop < 0; k++) if (L.FROM_WORDS.has(s.tokens[k]!.norm) && !L.PATH_ARTICLES.has(norm(s, k + 1) ?? '') && !joinsLineName(s, i, k)) stop = k;
  let k = i;
  while (k < s.tokens.length && k !== stop && (joinsLineName(s, i, k - 1) || !(readHeading(s, k) || matchPhrase(s, k, L.UPSTREAM_PHRASES) || matchPhrase(s, k, L.DOWNSTREAM_PHRASES)))) k++;
  return k;
}

/**
 * Reads a path qualifier or "by air" at i: "by road", "by trail", "upstream", "río arriba", "en amont",
 * "along Rio Claro", "on Rd. 12", "por camino a Y", "pela estrada", "par la route".
 * `stopAtFrom`: the feature follows, so a line name ends at "from"/"de".
 */
function readPath(s: Source, i: number, stopAtFrom: boolean): { path?: PathQualifier; byAir?: true; next: number } | null {
  const air = matchPhrase(s, i, L.BY_AIR_PHRASES);
  if (air) return { byAir: true, next: i + air };
  for (const [list, mode] of [[L.UPSTREAM_PHRASES, 'upstream'], [L.DOWNSTREAM_PHRASES, 'downstream']] as const) {
    const n = matchPhrase(s, i, list);
    if (n) return { path: pathOf(mode, writtenText(s.text, s.tokens, i, i + n)), next: i + n };
  }
  const along = matchPhrase(s, i, L.ALONG_PHRASES);
  if (along) {
    const start = i + along;
    // The line's own first word may be a direction: "along east shore of the island from X".
    const end = lineEnd(s, readHeading(s, start) && start + 1 < s.tokens.length ? start + 1 : start, stopAtFrom);
    if (end === start) return null;
    const nounMode = end - start === 1 ? modeOfNoun(norm(s, start)) : undefined;
    if (nounMode) return { path: pathOf(nounMode, writtenText(s.text, s.tokens, i, end)), next: end };
    const first = modeOfNoun(norm(s, start));
    return { path: pathOf(first ?? 'along', writtenText(s.text, s.tokens, i, end), nameBetween(s, start, end)), next: end };
  }
  if (L.PATH_PREPOSITIONS.has(norm(s, i) ?? '')) {
    let k = i + 1;
    if (L.PATH_ARTICLES.has(norm(s, k) ?? '')) k++;
    if (L.TRAIL_QUALIFIERS.has(norm(s, k) ?? '') && modeOfNoun(norm(s, k + 1)) === 'trail') k++;
    const mode = modeOfNoun(norm(s, k));
    const preposition = norm(s, i)!;
    // "on", "en", "na", "no", "sur" take only roads and trails ("on Rd. 12"), not rivers ("on river bank").
    const onlyRoads = ['on', 'en', 'na', 'no', 'sur'].includes(preposition);
    if (!mode || (onlyRoads && mode === 'river')) return null;
    const end = lineEnd(s, k + 1, stopAtFrom);
    return { path: pathOf(mode, writtenText(s.text, s.tokens, i, end), end > k + 1 ? nameBetween(s, k, end) : null), next: end };
  }
  return null;
}

/** A clause that is only a road: "camino a Y", "road to Y", "estrada para Y". */
function readRoadClause(s: Source, i: number): PathQualifier | null {
  const mode = modeOfNoun(norm(s, i));
  if (mode !== 'road' && mode !== 'trail') return null;
  if (!L.ROAD_TOWARD_WORDS.has(norm(s, i + 1) ?? '')) return null;
  const name = nameBetween(s, i, s.tokens.length);
  return name ? pathOf(mode, name, name) : null;
}

const reading = (type: LocalityRead['type'], features: string[], extra: Partial<LocalityRead> = {}): LocalityRead => ({
  type,
  features,
  offsets: [],
  approximate: false,
  notes: [],
  ...extra,
});

const unparseable = (reason: string, approximate = false): LocalityRead => reading('unparseable', [], { reason, approximate });

/** Splits tokens [from, to) at the first conjunction into two names ("X and Y", "R. A y R. B"). */
function twoNames(s: Source, from: number, to: number): [string, string] | null {
  for (let k = from + 1; k < to - 1; k++) {
    const t = s.tokens[k]!;
    // A capital one-letter word ("E", "X") is a direction or a name, not "e"/"x" joining two names.
    const joins = L.CONJUNCTIONS.has(t.norm) && !(t.norm.length === 1 && t.kind === 'word' && t.text !== t.norm);
    if (joins || (t.norm === '/' && t.kind === 'symbol')) {
      const a = nameBetween(s, from, k);
      // "de la Liane et du Ruisseau Noir": the second name's own "du"/"del"/"do" is not part of it.
      const b = nameBetween(s, L.FROM_WORDS.has(norm(s, k + 1) ?? '') && k + 2 < to ? k + 2 : k + 1, to);
      if (a && b) return [a, b];
    }
  }
  return null;
}

const hasDistance = (s: Source, from: number, to: number): boolean => {
  for (let k = from; k < to; k++) if (s.tokens[k]!.kind === 'number' && readDistanceAt(s, k)) return true;
  return false;
};

/** True when tokens [from, to) hold a word that is neither a small word nor a direction ("de de de", "N N" name nothing). */
function hasNameWord(s: Source, from: number, to: number): boolean {
  for (let k = from; k < to; k++) {
    const t = s.tokens[k]!;
    if (t.kind !== 'word') continue;
    const small = L.SMALL_WORDS.has(t.norm);
    // Most words are long and no small word: no need to ask whether they are directions.
    if (!small && t.norm.length > 3) return true;
    const direction = directionLetters(t.norm) !== null;
    if (!small && !direction) return true;
    // A direction word counts as a name when written like one ("El Sur"), not as an abbreviation ("NNE").
    if (direction && t.text.length >= 3 && t.text[0] !== t.text[0]!.toLowerCase() && t.text.slice(1) !== t.text.slice(1).toUpperCase()) return true;
  }
  return false;
}

/**
 * Reads a place name at [from, end): null when it is empty, names nothing, or holds a distance (then the clause
 * is not understood). A feature-type word before or after the name is not part of it ("town of X", "ciudad de
 * X", "X town"): it is taken off and kept as the feature's kind.
 */
function placeAt(s: Source, from: number, end: number): string | null {
  const prefix = matchPhrase(s, from, L.PLACE_TYPE_PREFIXES);
  const part = matchPhrase(s, from, L.MOUNTAIN_PART_PREFIXES);
  if (prefix && from + prefix < end) {
    s.featureKind = 'populated-place';
    from += prefix;
  } else if (part && from + part < end) {
    s.featureKind = 'mountain';
    from += part;
  } else if (mountainPartAtEnd(s, from, end) < end) {
    s.featureKind = 'mountain';
    end = mountainPartAtEnd(s, from, end);
  } else if (end - from >= 2 && L.PLACE_TYPE_SUFFIXES.has(norm(s, end - 1)!) && s.tokens[end - 1]!.text === s.tokens[end - 1]!.norm && hasNameWord(s, from, end - 1)) {
    // Only a lower-case suffix: "Millbrook town" is the town of Millbrook, "Puerto Ciudad" a name; "the town",
    // "la ciudad" alone keep their word (the town of a municipality named elsewhere, see seatOf).
    s.featureKind = 'populated-place';
    end--;
  }
  return hasDistance(s, from, end) || !hasNameWord(s, from, end) ? null : nameBetween(s, from, end);
}

/** Where a lower-case word for a part of a mountain that closes a name starts ("Monte Verdemar summit area"), else `end`. */
function mountainPartAtEnd(s: Source, from: number, end: number): number {
  for (let k = Math.max(from + 1, end - 3); k < end; k++) {
    const lowerCase = !someTokenIn(s.tokens, k, end, (t) => t.text !== t.norm);
    if (lowerCase && matchPhrase(s, k, L.MOUNTAIN_PART_WORDS) === end - k && hasNameWord(s, from, k)) return k;
  }
  return end;
}

/**
 * What the generic word of a name says it is: the first word ("Laguna Negra", "Fazenda Boa Vista") or the last
 * ("Otter Creek", "Alisos Ranch", "Verdemar National Park"). A hint for matching, never a reason to refuse.
 * @example featureKindOf("Laguna Negra") // 'water'
 * @example featureKindOf("R. B. Alisos") // 'protected-area'
 */
export function featureKindOf(name: string): FeatureKind | undefined {
  const firstSpace = name.indexOf(' ');
  if (firstSpace < 0) return undefined;
  const firstKind = L.FEATURE_KIND_WORDS.get(wordOf(name, 0, firstSpace));
  if (firstKind) return firstKind;
  // The lead's two words, or its two initials written without a space ("P.N. La Amistad").
  const initials = name.charAt(firstSpace - 1) === '.' ? /^(\p{L})\.(\p{L})\.$/u.exec(name.slice(0, firstSpace)) : null;
  const secondSpace = name.indexOf(' ', firstSpace + 1);
  const lead = initials ? fold(`${initials[1]}-${initials[2]}`) : secondSpace > 0 ? `${wordOf(name, 0, firstSpace)}-${wordOf(name, firstSpace + 1, secondSpace)}` : '';
  if (L.PROTECTED_AREA_LEADS.has(lead)) return 'protected-area';
  const lastSpace = name.lastIndexOf(' ');
  // A last word after "de"/"del" is part of a name ("San Aurelio del Monte"), not its generic word.
  if (L.FROM_WORDS.has(wordOf(name, name.lastIndexOf(' ', lastSpace - 1) + 1, lastSpace))) return undefined;
  return L.FEATURE_KIND_WORDS.get(wordOf(name, lastSpace + 1, name.length));
}

const PLURAL_OF_WORDS = new Set(['des', 'dos', 'das']);

/**
 * The name a protected area bears, without its lead and the words saying which kind of area it is, when the text
 * names one ("Reserva Biológica de Una" → Una, "P. N. Alisos" → Alisos, "Verdemar National Park" → Verdemar,
 * "Parc national de la Gaspésie" → la Gaspésie), and whether a singular "of" joins it to them (`of`: "de", "do",
 * "of"…, not "des", "dos", "das"): the area of a place, often a town's, which locate may stand in for the area
 * ([CHOICE protectedAreaTown]); a name in apposition is the area's own, often an honoree's. Undefined for other
 * names or when nothing is left.
 * @example protectedAreaNamesake('Parque Nacional do Itatiaia') // { name: 'Itatiaia', of: true }
 */
export function protectedAreaNamesake(name: string): { name: string; of: boolean } | undefined {
  if (featureKindOf(name) !== 'protected-area') return undefined;
  const words = name.trim().split(/\s+/);
  const folded = words.map((word) => fold(word.replace(/\.$/, '')));
  const kind = (k: number) => L.FEATURE_KIND_WORDS.get(folded[k] ?? '') === 'protected-area';
  const skipped = (k: number) => L.PROTECTED_AREA_QUALIFIERS.has(folded[k] ?? '') || L.FROM_WORDS.has(folded[k] ?? '') ||
    // An article or "and" only between such words ("Reserva de la Biosfera", "Reserva Florestal e Indígena").
    (L.SMALL_WORDS.has(folded[k] ?? '') && L.PROTECTED_AREA_QUALIFIERS.has(folded[k + 1] ?? ''));
  let from = /^\p{L}\.\p{L}\.$/u.test(words[0]!) ? 1 : L.PROTECTED_AREA_LEADS.has(`${folded[0]}-${folded[1]}`) ? 2 : kind(0) ? 1 : 0;
  let to = words.length;
  if (from === 0 && kind(to - 1)) for (to -= 1; to > 0 && L.PROTECTED_AREA_QUALIFIERS.has(folded[to - 1]!); to--);
  else while (from < to && skipped(from)) from++;
  const rest = words.slice(from, to).join(' ').replace(/\.$/, '');
  if (rest === '' || (from === 0 && to === words.length)) return undefined;
  // "Of the" in the plural ("Réserve faunique des Laurentides", "Parque Estadual das Fontes") names a range, lakes
  // or springs, not the one town a name of the same words may be.
  return { name: rest, of: from > 0 && L.FROM_WORDS.has(folded[from - 1]!) && !PLURAL_OF_WORDS.has(folded[from - 1]!) };
}

/**
 * The name a station bears after its station word, when the text names a station after a place ("Alisos Station",
 * "Estación Alisos", "Estação de Alisos", "Gare de Alisos"): the town it is named after may stand in for it
 * ([CHOICE stationTown]). Undefined for other names, for a station of a kind ("Biological Station", "Estación
 * Biológica de X": a research station, not a town's), and when no capitalised name is left.
 * @example stationNamesake('Estación de San Telmo') // 'San Telmo'
 * @example stationNamesake('Millbrook Station') // 'Millbrook'
 */
export function stationNamesake(name: string): string | undefined {
  const words = name.trim().split(/\s+/);
  const folded = words.map((word) => fold(word.replace(/\.$/, '')));
  if (words.length < 2) return undefined;
  const first = L.STATION_WORDS.has(folded[0]!);
  const last = !first && L.STATION_WORDS.has(folded[words.length - 1]!);
  if (!first && !last) return undefined;
  const from = first ? (L.FROM_WORDS.has(folded[1]!) ? 2 : 1) : 0;
  const kept = words.slice(from, last ? -1 : undefined);
  if (kept.length === 0 || !/^\p{Lu}/u.test(kept[0]!) || folded.some((word) => L.STATION_QUALIFIERS.has(word))) return undefined;
  return kept.join(' ');
}

/** The word of `name` at [from, to), folded, without a trailing period ("Mt." → "mt"). */
function wordOf(name: string, from: number, to: number): string {
  return fold(name.charAt(to - 1) === '.' ? name.slice(from, to - 1) : name.slice(from, to));
}

/**
 * The area closing a clause after an offset's place, from the "in" at `k` ("in Jocko Mountains", "en la Sierra
 * Jocko", "na Serra do Jocko", "dans le parc Jocko"): a capitalised name whose generic word makes it a mountain
 * range or a protected area, with a capital, where the point lies, not part of the place's name; else null
 * [CHOICE areaAfterOffset].
 */
function areaAt(s: Source, k: number): string | null {
  const start = L.PATH_ARTICLES.has(norm(s, k + 1) ?? '') ? k + 2 : k + 1;
  const capitalised = s.tokens.slice(start).some((t) => t.kind === 'word' && t.text[0] !== t.text[0]!.toLowerCase());
  if (!capitalised) return null;
  const name = nameBetween(s, start, s.tokens.length);
  const kind = name ? featureKindOf(name) : undefined;
  return kind === 'mountain' || kind === 'protected-area' ? s.text.slice(s.tokens[k]!.start, s.tokens[s.tokens.length - 1]!.end) : null;
}

/** Where the feature name after an offset ends: the clause end, a trailing path qualifier ("on Rd. 12") or the area the point lies in ("in Jocko Mountains"). */
function placeEnd(s: Source, from: number): { end: number; path?: PathQualifier; byAir?: true; heading?: WrittenHeading; area?: string } {
  let named = false;
  let areaTried = false;
  for (let k = from + 1; k < s.tokens.length; k++) {
    named ||= hasNameWord(s, k - 1, k);
    // Only the first "in" after a name word may open the area, so that long texts stay linear.
    if (named && !areaTried && L.WITHIN_WORDS.has(norm(s, k) ?? '')) {
      areaTried = true;
      const area = areaAt(s, k);
      if (area) return { end: k, area };
    }
    const path = readPath(s, k, false);
    if (path && path.next === s.tokens.length && (path.path || path.byAir)) {
      return { end: k, ...(path.path ? { path: path.path } : {}), ...(path.byAir ? { byAir: true as const } : {}) };
    }
    // "5 km from X on a bearing of 214°": a bearing in degrees after the place.
    const heading = L.HEADING_PREFIXES.has(s.tokens[k]!.norm) ? readHeading(s, k) : null;
    if (heading?.next === s.tokens.length && heading.heading.kind === 'degrees') return { end: k, heading: heading.heading };
  }
  return { end: s.tokens.length };
}

const perpendicular = (a: WrittenHeading, b: WrittenHeading): boolean =>
  a.kind !== 'degrees' && a.halfWidth !== 22.5 && a.halfWidth !== 11.25 && a.azimuth % 90 === 0 && b.azimuth % 90 === 0 && Math.abs(a.azimuth - b.azimuth) % 180 === 90;

/** Offsets: distance, then optional path / heading / "by air", optional second orthogonal offset, then the feature. */
function readOffsets(s: Source, i: number, approximate: boolean, unitless = false): LocalityRead | null {
  const first = readDistanceAt(s, i, unitless);
  if (!first) return null;
  const offset: Offset = { distance: first.distance };
  if (first.how === 'air') offset.byAir = true;
  else if (first.how) offset.path = first.how;
  const notes: string[] = [];
  let j = first.next;
  let pathStart = -1;
  for (let guard = 0; guard < 4; guard++) {
    const approx = skipApproximation(s, j);
    if (approx.approximate) {
      approximate = true;
      j = approx.next;
      continue;
    }
    if (!offset.heading) {
      const heading = readHeading(s, j);
      if (heading) {
        offset.heading = heading.heading;
        j = heading.next;
        continue;
      }
    }
    if (!offset.path?.lineName && !offset.byAir) {
      const path = readPath(s, j, true);
      if (path && offset.path && path.path?.lineName) {
        // "5 km rio acima ao longo do Rio Claro": the second qualifier names the line of the first.
        offset.path = { ...offset.path, lineName: path.path.lineName, written: s.text.slice(s.tokens[pathStart]!.start, s.tokens[path.next - 1]!.end) };
        j = path.next;
        continue;
      }
      if (path && !offset.path) {
        pathStart = j;
        if (path.path) offset.path = path.path;
        if (path.byAir) offset.byAir = true;
        j = path.next;
        continue;
      }
    }
    break;
  }
  const offsets = [offset];
  // Second offset on the perpendicular axis: "3 km N and 2 km E of X", "3 km ao N e 2 km a L de X".
  if (offset.heading && L.CONJUNCTIONS.has(norm(s, j) ?? '')) {
    const second = readDistanceAt(s, j + 1);
    const secondHeading = second ? readHeading(s, second.next) : null;
    if (second && secondHeading) {
      if (!perpendicular(offset.heading, secondHeading.heading)) {
        return unparseable(`two offsets that are not on perpendicular cardinal headings ("${offset.heading.written}", "${secondHeading.heading.written}")`, approximate);
      }
      offsets.push({ distance: second.distance, heading: secondHeading.heading });
      j = secondHeading.next;
    }
  }
  let toward = false;
  const towardLength = offset.heading ? matchPhrase(s, j, L.TOWARD_PHRASES) : 0;
  if (towardLength) {
    toward = true;
    j += towardLength;
  } else if (L.FROM_WORDS.has(norm(s, j) ?? '')) j++;
  if (j >= s.tokens.length) {
    return { ...reading(typeOf(offsets), [], { offsets, approximate, notes }), bare: 'offset' };
  }
  const tail = placeEnd(s, j);
  // "10 km from X toward Y": Y's bearing from X is unknown until both are matched, so the offset stays a
  // distance from X (a heading is kept if written) and Y is kept as `toward` [our choice].
  let placeEndAt = tail.end;
  const kindBefore = s.featureKind;
  if (!toward) {
    for (let k = j + 1; k < tail.end - 1; k++) {
      // A slip is written in lower case, as "até" is: "Santo Ato" is a name.
      const slip = /^\p{Ll}/u.test(s.tokens[k]!.text) ? matchPhrase(s, k, L.UP_TO_SLIPS) : 0;
      const length = matchPhrase(s, k, L.TOWARD_PHRASES) || matchPhrase(s, k, L.UP_TO_WORDS) || slip;
      const aim = length ? placeAt(s, k + length, tail.end) : null;
      if (aim) {
        offset.toward = aim;
        if (slip) offset.upToSlip = s.tokens[k]!.text;
        notes.push(`"${s.text.slice(s.tokens[k]!.start, s.tokens[tail.end - 1]!.end)}" read as the direction of travel: not used for the point until ${aim} is matched`);
        placeEndAt = k;
        break;
      }
    }
    s.featureKind = kindBefore;
  }
  const place = placeAt(s, j, placeEndAt);
  if (!place) return unparseable(`could not read the place after "${s.text.slice(s.tokens[i]!.start, s.tokens[j - 1]!.end)}"`, approximate);
  if (tail.path && !offset.path) offset.path = tail.path;
  // "12 km by road from X on Ruta 12", "a 12 km por carretera de X por la Ruta 12": the line named after the place.
  else if (tail.path?.lineName && offset.path && !offset.path.lineName) offset.path = { ...offset.path, lineName: tail.path.lineName, written: `${offset.path.written} … ${tail.path.written}` };
  if (tail.heading && !offset.heading && offsets.length === 1) offset.heading = tail.heading;
  if (tail.byAir) offset.byAir = true;
  if (tail.area) notes.push(`"${tail.area}" read as the area the point lies in, not part of the place's name [CHOICE areaAfterOffset]`);
  if (toward && offset.heading) {
    offset.heading = { ...offset.heading, azimuth: (offset.heading.azimuth + 180) % 360, toward: true };
    notes.push(`bearing written toward ${place}: heading from it reversed by 180°`);
  }
  return reading(typeOf(offsets), [place], { offsets, approximate, notes });
}

function typeOf(offsets: Offset[]): LocalityType {
  if (offsets.length === 2) return 'offset-orthogonal';
  const [offset] = offsets;
  if (offset!.path) return 'offset-path';
  if (offset!.heading) return 'offset-heading';
  return 'distance-only';
}

/** True when every word of tokens [from, to) is a habitat or small word (and there is at least one habitat word). */
function isHabitat(tokens: Token[], from = 0, to = tokens.length): boolean {
  let habitat = false;
  for (let k = from; k < to; k++) {
    const t = tokens[k]!;
    if (t.kind === 'number') return false;
    if (t.kind === 'symbol') continue;
    if (L.HABITAT_WORDS.has(t.norm)) habitat = true;
    else if (!L.SMALL_WORDS.has(t.norm)) return false;
  }
  return habitat;
}

/**
 * Reads one clause of a locality text as one locality type of the point-radius method (docs/method.md §3):
 * between, junction, near, offsets (heading, orthogonal, distance only, path), heading only, named place.
 * Never guesses: text that fits no pattern is 'unparseable' with a reason.
 */
export function readLocalityClause(text: string, tokens: Token[]): LocalityRead {
  const s: Source = { text, tokens };
  const read = readClause(s);
  const featureKind = s.featureKind ?? (read.features.length === 1 ? featureKindOf(read.features[0]!) : undefined);
  return featureKind && !read.featureKind ? { ...read, featureKind } : read;
}

/** A place written before its offset in one clause: "Millbrook 3 mi S", "Vila Serena 5 km al N", "Millbrook on a bearing of 214°". */
function readPlaceFirst(s: Source, i: number, approximate: boolean): LocalityRead | null {
  const end = s.tokens.length;
  for (let k = i + 1; k < end; k++) {
    const t = s.tokens[k]!;
    if (t.kind === 'number') {
      const tail = readDistanceAt(s, k) ? readOffsets(s, k, approximate) : null;
      // "Fazenda Boa Vista entrance 8 km E of Vila Serena": a whole offset after a name locates that name.
      const whole = tail && !tail.bare && tail.type !== 'unparseable' && tail.features.length === 1 && hasNameWord(s, i, k);
      if (whole) return { ...tail, notes: [...tail.notes, `"${s.text.slice(s.tokens[i]!.start, s.tokens[k - 1]!.end)}" read as the place the offset locates`] };
      // A distance alone after a name ("Ashcombe 5 km") may be anything; a heading makes it an offset.
      if (tail?.bare !== 'offset' || !tail.offsets[0]!.heading) continue;
      const place = placeAt(s, i, k);
      return place ? { ...tail, features: [place], bare: undefined } : null;
    }
    const heading = L.HEADING_PREFIXES.has(t.norm) ? readHeading(s, k) : null;
    if (heading && heading.next === end && heading.heading.kind === 'degrees' && !L.FROM_WORDS.has(norm(s, k - 1) ?? '')) {
      const place = placeAt(s, i, k);
      if (place) return reading('heading-only', [place], { offsets: [{ heading: heading.heading }], approximate });
    }
  }
  return null;
}

/** One clause's reading by the first pattern that fits (see readLocalityClause). */
function readClause(s: Source): LocalityRead {
  const { text, tokens } = s;
  let { next: i, approximate } = skipApproximation(s, 0);
  // "a 5 km de X", "a cerca de 5 km de X": the preposition before a distance, approximate or not.
  if (L.LEADING_PREPOSITIONS.has(norm(s, i) ?? '') && (s.tokens[i + 1]?.kind === 'number' || skipApproximation(s, i + 1).approximate)) i++;
  const again = skipApproximation(s, i);
  i = again.next;
  approximate ||= again.approximate;
  const end = tokens.length;
  if (i >= end) return unparseable('only an approximation word, no place', approximate);

  if (L.BETWEEN_WORDS.has(norm(s, i)!) && s.tokens[i + 1]?.kind !== 'number') {
    const names = twoNames(s, i + 1, end);
    return names ? reading('between', names, { approximate }) : unparseable('"between" without two places joined by "and"', approximate);
  }

  if (L.SIDE_WORDS.has(norm(s, i) ?? '')) {
    const sideHeading = readHeading(s, i + 1);
    if (sideHeading) {
      let k = sideHeading.next;
      if (k === end) return { ...reading('heading-only', [], { offsets: [{ heading: sideHeading.heading }], approximate }), bare: 'offset' };
      if (L.FROM_WORDS.has(norm(s, k) ?? '')) k++;
      const place = placeAt(s, k, end);
      if (place) return reading('heading-only', [place], { offsets: [{ heading: sideHeading.heading }], approximate });
    }
  }

  let lead = i;
  while (lead < i + 3 && L.JUNCTION_LEAD.has(norm(s, lead) ?? '')) lead++;
  if (L.JUNCTION_WORDS.has(norm(s, lead) ?? '')) {
    let k = lead + 1;
    if (L.FROM_WORDS.has(norm(s, k) ?? '') || L.BETWEEN_WORDS.has(norm(s, k) ?? '')) k++;
    const names = twoNames(s, k, end);
    return names ? reading('junction', names, { approximate }) : unparseable('junction or confluence without two named lines', approximate);
  }

  const nearPrefix = matchPhrase(s, i, L.NEAR_PREFIXES);
  if (nearPrefix && s.tokens[i + nearPrefix]?.kind !== 'number') {
    // "near the junction of X and Y": the junction is the feature; "near" is kept as a note.
    const inner = readLocalityClause(text, tokens.slice(i + nearPrefix));
    const written = s.text.slice(s.tokens[i]!.start, s.tokens[i + nearPrefix - 1]!.end);
    if (inner.type === 'junction') return { ...inner, approximate: approximate || inner.approximate, notes: [`written as "${written}" the junction`] };
    const place = placeAt(s, i + nearPrefix, end);
    // "near the sand road 7 mi E of X", "près de la route à 7 milles à l'est de X": the offset locates what is
    // near, and "near" adds nothing the offset's own uncertainty does not hold [CHOICE offsetAfterNear].
    if (!place && inner.features.length > 0 && inner.offsets.some((o) => o.distance)) return { ...inner, approximate: approximate || inner.approximate, notes: [...inner.notes, `"${written}" before an offset: the offset's point is used [CHOICE offsetAfterNear]`] };
    const notes = norm(s, i) === 'cerca' ? [`"${written}" before a place read as "near" (before a number it means "about")`] : [];
    return place ? reading('near', [place], { approximate, notes }) : unparseable('"near" without a place', approximate);
  }

  // "Mountains near X", "Hills of X", "colinas cerca de X": an unnamed feature by X, read as near X.
  const relief = norm(s, i) === 'the' ? i + 1 : i;
  if (L.UNNAMED_RELIEF_WORDS.has(norm(s, relief) ?? '')) {
    const joiner = matchPhrase(s, relief + 1, L.NEAR_PREFIXES) || (L.UNNAMED_RELIEF_JOINERS.has(norm(s, relief + 1) ?? '') ? 1 : 0);
    const place = joiner && s.tokens[relief + 1 + joiner]?.kind !== 'number' ? placeAt(s, relief + 1 + joiner, end) : null;
    if (place) return reading('near', [place], { approximate, notes: [`"${s.text.slice(s.tokens[i]!.start, s.tokens[relief + joiner]!.end)}" read as an unnamed feature near ${place}`] });
  }

  const offsets = readOffsets(s, i, approximate, true);
  if (offsets) return offsets;

  // "Rio Azul and Rio Claro confluence", "X-Y jct."
  if (end - i >= 4 && L.JUNCTION_WORDS.has(norm(s, end - 1)!)) {
    const names = twoNames(s, i, end - 1);
    if (names) return reading('junction', names, { approximate });
  }

  const heading = readHeading(s, i);
  if (heading) {
    let k = heading.next;
    // "N side of X", "lado norte de X", "rive nord"; alone ("X, N side") it joins the place before it.
    if (L.SIDE_WORDS.has(norm(s, k) ?? '')) k++;
    if (k === end) return { ...reading('heading-only', [], { offsets: [{ heading: heading.heading }], approximate }), bare: 'offset' };
    const introduced = L.FROM_WORDS.has(norm(s, k) ?? '');
    if (introduced) k++;
    // Heading first, distance last: "N.N.E. of Millbrook 10 km", "al N de Alisos 5 km".
    for (let m = k + 1; introduced && m < end; m++) {
      const distance = s.tokens[m]!.kind === 'number' ? readDistanceAt(s, m) : null;
      const place = distance?.next === end ? placeAt(s, k, m) : null;
      if (place) return reading('offset-heading', [place], { offsets: [{ distance: distance!.distance, heading: heading.heading }], approximate });
    }
    // Without "of"/"de", only a capital abbreviation of two or three letters is a heading ("NE Vila Serena");
    // "O Cruzeiro", "E Ashcombe" begin with an article or are names.
    const abbreviation = /^[NSEWOL]{2,3}$/.test(heading.heading.written);
    if (introduced || (abbreviation && k < end)) {
      const place = placeAt(s, k, end);
      if (place) return reading('heading-only', [place], { offsets: [{ heading: heading.heading }], approximate });
    }
  }

  const path = readPath(s, i, false);
  if (path?.path && path.next === end) return { ...reading('offset-path', [], { offsets: [{ path: path.path }], approximate }), bare: 'path' };
  if (path?.byAir && path.next === end) return { ...reading('offset-heading', [], { approximate }), bare: 'air' };
  // "X, arredores", "X (environs)", "X (town)": a word that qualifies the place before it.
  const nearWord = matchPhrase(s, i, L.NEAR_SUFFIXES);
  if (nearWord && i + nearWord === end) return { ...reading('near', [], { approximate }), bare: 'near' };
  if (i + 1 === end && L.PLACE_TYPE_SUFFIXES.has(norm(s, i)!)) return { ...reading('named-place', [], { approximate, featureKind: 'populated-place' }), bare: 'kind' };
  // "Monte Verdemar, summit area": a part of the mountain before it, which stays the feature.
  if (matchPhrase(s, i, L.MOUNTAIN_PART_WORDS) === end - i) return { ...reading('named-place', [], { approximate, featureKind: 'mountain' }), bare: 'kind' };
  const placeFirst = readPlaceFirst(s, i, approximate);
  if (placeFirst) return placeFirst;
  const road = readRoadClause(s, i);
  // "camino de X a Y", "route de X à Y": a road named by its two ends may be the route between them.
  const roadRoute = road ? routeOf(s, i, end) : undefined;
  if (road) return { ...reading('named-place', [road.lineName!], roadRoute ? { approximate, route: roadRoute } : { approximate }), bare: 'path', offsets: [{ path: road }] };

  for (let k = Math.max(i + 1, end - 3); k < end; k++) {
    const suffix = matchPhrase(s, k, L.NEAR_SUFFIXES);
    // "X summit area" is the summit of X, not its vicinity.
    const place = suffix && k + suffix === end && mountainPartAtEnd(s, i, end) >= k ? placeAt(s, i, k) : null;
    if (place) return reading('near', [place], { approximate });
  }

  // "X hacia Y", "X rumo a Y", "X vers Y", no distance: on the way from X toward Y [CHOICE towardWithoutDistance].
  for (let k = i + 1; k < end - 1; k++) {
    const length = matchPhrase(s, k, L.TOWARD_WITHOUT_DISTANCE);
    const from = length && hasNameWord(s, i, k) ? placeAt(s, i, k) : null;
    const aim = from ? placeAt(s, k + length, end) : null;
    if (aim) return reading('between', [from!, aim], { approximate, notes: [`"${s.text.slice(s.tokens[k]!.start, s.tokens[end - 1]!.end)}" with no distance: read as on the way between ${from} and ${aim} [CHOICE towardWithoutDistance]`] });
  }
  if (isHabitat(tokens, i, end)) return reading('habitat', [], { approximate, reason: 'habitat description, names no place' });
  // "Paragem entre Alisos e Vila Serena", "camp between X and Y": a place named by the two it lies between.
  for (let k = i + 1; k < end - 3; k++) {
    const names = L.BETWEEN_WORDS.has(norm(s, k)!) && s.tokens[k + 1]?.kind !== 'number' ? twoNames(s, k + 1, end) : null;
    if (names && hasNameWord(s, i, k)) return reading('between', names, { approximate, notes: [`"${s.text.slice(s.tokens[i]!.start, s.tokens[k - 1]!.end)}" read as the place between ${names[0]} and ${names[1]}`] });
  }
  if (hasDistance(s, i, end)) return unparseable('a distance is written, but its heading or the place it is measured from could not be read', approximate);
  // "km 12 carretera a X": a road's kilometre post, measured from the road's own zero, which no clause gives.
  if (UNIT_WORDS.get(norm(s, i) ?? '') === 'km' && s.tokens[i + 1]?.kind === 'number') {
    const post = s.text.slice(s.tokens[i]!.start, s.tokens[i + 1]!.end);
    return { ...unparseable(`road kilometre post ("${post}"): its distance runs from the road's own origin, which the text does not give`, approximate), kilometrePost: post };
  }
  // "ca. Ashcombe": the approximation is recorded and changes nothing (docs/method.md §3).
  let placeStart = i;
  while (placeStart < end - 1 && L.APPROXIMATE_BEFORE_PLACE.has(norm(s, placeStart)!) && (s.tokens[placeStart]!.dotted || s.tokens[placeStart]!.kind === 'symbol' || norm(s, placeStart)!.length > 3)) placeStart++;
  approximate ||= placeStart > i;
  // "in Millbrook", "en Alisos", "em Vila Serena", "à Vaubrun": the preposition is not part of the name.
  const preposition = s.tokens[placeStart]!;
  const capitalNext = s.tokens[placeStart + 1]?.kind === 'word' && s.tokens[placeStart + 1]!.text[0] !== s.tokens[placeStart + 1]!.text[0]!.toLowerCase();
  if (placeStart < end - 1 && capitalNext && (L.PLACE_PREPOSITIONS.has(preposition.norm) || preposition.text === 'à')) placeStart++;
  // An opening quotation mark may stand before the name ('"Millbrook" (town)').
  const first = '"“«'.includes(tokens[placeStart]!.text) && placeStart < end - 1 ? tokens[placeStart + 1]! : tokens[placeStart]!;
  if (first.kind !== 'word') return unparseable(`no place name: the clause starts with "${tokens[placeStart]!.text}"`, approximate);
  const place = placeAt(s, placeStart, end);
  if (!place) return unparseable('no place name could be read', approximate);
  const route = routeOf(s, placeStart, end);
  return reading('named-place', [place], route ? { approximate, route } : { approximate });
}

const startsCapitalised = (s: Source, from: number, to: number): boolean => {
  const first = s.tokens.slice(from, to).find((t) => t.kind !== 'symbol' || '"“«('.includes(t.text));
  return first?.kind === 'word' && /^\p{Lu}/u.test(first.text);
};

/**
 * The ways a named place may be a route between two places: "Ipala to Amatillo", "Tlapa - Malinaltepec",
 * "estrada Juara a Juina", "camino que sigue de X a Y", "route de X à Y", "trecho X/Y", "X – Y road". A road
 * word and "from"/"de" before the first end, or a lower-case road word after the last, are not part of either
 * end. Each end must begin with a capital letter ("Morro da Canastra a base da escarpa" is no route).
 * Undefined when no split gives two names [CHOICE routeReading].
 * @example routeOf(source('Ipala to Amatillo'), 0, 3) // { written: 'Ipala to Amatillo', ends: [['Ipala', 'Amatillo']] }
 */
function routeOf(s: Source, from: number, end: number): RouteReading | undefined {
  let start = from;
  const roadFirst = modeOfNoun(norm(s, start)) === 'road' || modeOfNoun(norm(s, start)) === 'trail' || L.ROUTE_STRETCH_WORDS.has(norm(s, start) ?? '');
  if (roadFirst) {
    start++;
    start += matchPhrase(s, start, L.ROUTE_LINKS);
  }
  if ((L.STRONG_FROM_WORDS.has(norm(s, start) ?? '') || L.FROM_WORDS.has(norm(s, start) ?? '')) && startsCapitalised(s, start + 1, end)) start++;
  let stop = end;
  const last = s.tokens[end - 1]!;
  // Lower case as written, a sentence's period after it aside ("Ipala-Amatillo road.").
  if (stop - start >= 2 && last.text.replace(/\.$/, '') === last.norm && (modeOfNoun(last.norm) === 'road' || modeOfNoun(last.norm) === 'trail')) stop--;
  const ends: [string, string][] = [];
  for (let k = start + 1; k < stop - 1; k++) {
    if (!L.ROUTE_JOINERS.has(s.tokens[k]!.norm) || !startsCapitalised(s, start, k) || !startsCapitalised(s, k + 1, stop)) continue;
    const kind = s.featureKind;
    const a = placeAt(s, start, k);
    const b = placeAt(s, k + 1, stop);
    s.featureKind = kind;
    if (a && b) ends.push([a, b]);
  }
  // "road Ipala-Amatillo", "estrada Juara-Juina", "Ipala-Amatillo road": a hyphen inside a word joins two ends only
  // beside a road word and when no joiner between words does; else it is a name's own ("Biritiba-Mirim", "Lissac / Mont-Clairet").
  for (let k = start; ends.length === 0 && (roadFirst || stop < end) && k < stop; k++) {
    const t = s.tokens[k]!;
    const hyphen = t.kind === 'word' ? t.text.indexOf('-') : -1;
    if (hyphen <= 0 || hyphen === t.text.length - 1) continue;
    const a = s.text.slice(s.tokens[start]!.start, t.start + hyphen).trim();
    const b = s.text.slice(t.start + hyphen + 1, s.tokens[stop - 1]!.end).trim();
    if (/^\p{Lu}/u.test(a) && /^\p{Lu}/u.test(b)) ends.push([a, b]);
  }
  return ends.length ? { written: s.text.slice(s.tokens[start]!.start, s.tokens[stop - 1]!.end), ends } : undefined;
}
