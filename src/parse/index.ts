/**
 * The parser's front: one locality text in, one Interpretation out (its clauses, the clause used, the
 * locality type, feature names, offsets, written coordinates, administrative context and every
 * assumption in words). Pure and total: any text gets an answer, never an exception.
 * @example parseLocality('10 km NE of Vila Serena').type // 'offset-heading'
 */
import type { AdministrativeLevel, Clause, FeatureKind, ClauseReading, Interpretation, LocalityType, NamedUnit, Offset, RouteReading } from './types.ts';
import { fold, tokenize, type Token } from './tokens.ts';
import { findCoordinates, pairAtStart, writesCoordinates, type CoordinatesFound } from './coordinates.ts';
import { phraseLengthAt, readLocalityClause, type LocalityRead } from './locality.ts';
import { ADMINISTRATIVE_ORDER, detectLanguage, foldedWords, isRefusal, readAdministrative, readElevation, splitElevationTail, splitSegments, unitWordLevel, type Segment } from './clauses.ts';
import { countryCodeWritten, namesCountry } from './country-names.ts';
import * as L from './lexicon.ts';

export { parseCoordinates } from './coordinates.ts';
export { featureKindOf, protectedAreaNamesake, stationNamesake } from './locality.ts';
export { readDistanceNumber, type WrittenNumber } from './numbers.ts';
export { METERS_PER_UNIT, LEAGUE_METERS, LEAGUE_RANGE_METERS, LEAGUE_RELATIVE_SPREAD, toMeters } from './units.ts';
export type * from './types.ts';

/** Inputs longer than this are refused (method texts are labels; this bounds the work). */
export const MAX_LOCALITY_LENGTH = 10000;

/** The most specific locality type first (docs/method.md §2 step 2): coordinates, offsets, junction, ... named place. */
const SPECIFICITY: Readonly<Record<LocalityType, number>> = {
  coordinates: 0,
  'offset-orthogonal': 1,
  'offset-heading': 1,
  'offset-path': 1,
  junction: 2,
  'distance-only': 3,
  between: 4,
  near: 5,
  'heading-only': 6,
  'named-place': 7,
  'administrative-unit': 8,
  'no-locality': 9,
  unparseable: 9,
};

interface Piece {
  clause: Clause;
  reading?: LocalityRead;
  refusal?: boolean;
  /** A clause that names a unit by a unit word ("Alisos County"). */
  unit?: NamedUnit;
  /** A link of a hierarchy written into the text ("Brasil:" in "Brasil: Minas Gerais: Alisos"). */
  link?: boolean;
  /** Coordinates written ("Lat. 54° 15 N") that could not be read: never a place's name. */
  unreadCoordinates?: boolean;
}

/**
 * Reads a specimen-label locality text (English, Spanish, Portuguese or French) as one locality type of the
 * point-radius method, with every clause, the chosen clause, the feature names as written, and each offset's
 * number as written, unit, precision (docs/method.md §5.1) and heading with its half-width Δ (docs/method.md §5.2).
 * Never throws; linear in the length of the text; texts over 10,000 characters are refused.
 * @example parseLocality("10 km NE of Puerto Lindo")
 * // { type: 'offset-heading', features: ['Puerto Lindo'],
 * //   offsets: [{ distance: { value: 10, unit: 'km', precision: 1, uncertainty: 0.5, ... },
 * //               heading: { azimuth: 45, halfWidth: 22.5, kind: 'rose8', ... } }], ... }
 */
export function parseLocality(text: string): Interpretation {
  const verbatim = typeof text === 'string' ? text : '';
  try {
    return interpret(verbatim);
  } catch (error) {
    return { ...empty(verbatim), type: 'unparseable', reason: `internal parser error: ${(error as Error).message}` };
  }
}

function empty(verbatim: string): Interpretation {
  return { verbatim, clauses: [], chosenClause: null, type: 'unparseable', features: [], offsets: [], approximate: false, administrative: {}, otherClauses: [], notes: [] };
}

function clauseOf(text: string, tokens: Token[], from: number, to: number, kind: Clause['kind']): Clause {
  const start = tokens[from]!.start;
  const end = tokens[to - 1]!.end;
  return { text: text.slice(start, end), start, end, kind };
}

/**
 * A text that is nothing but a number pair ("-45.3, -131.0") is read as a coordinate field is, though in
 * running text a bare pair needs two decimals a value to count as coordinates.
 * @example wholeTextPair('-45.3, -131.0', tokenize('-45.3, -131.0'))?.coordinates.latitude // -45.3
 */
function wholeTextPair(text: string, tokens: Token[]): CoordinatesFound | null {
  const found = pairAtStart(text, tokens);
  return found && found.endToken === tokens.length ? found : null;
}

/**
 * The readings of spans of tokens of one text, each span read at most once, whether the clause split, the chain
 * rule or the loop over the clauses asks first (a class, where closures made anew for every text cost more).
 * @example new SpanReadings('Alisos', tokenize('Alisos')).read(0, 1).type // 'named-place'
 */
class SpanReadings {
  private readonly readings = new Map<number, LocalityRead>();
  constructor(private readonly text: string, private readonly tokens: Token[]) {}

  read(from: number, to: number): LocalityRead {
    const key = from * (this.tokens.length + 1) + to;
    let reading = this.readings.get(key);
    if (!reading) this.readings.set(key, (reading = readLocalityClause(this.text, this.tokens.slice(from, to))));
    return reading;
  }

  readSegment(segment: Segment | undefined): LocalityRead | undefined {
    return segment && this.read(segment.from, segment.to);
  }
}

function interpret(text: string): Interpretation {
  const result = empty(text);
  if (text.length > MAX_LOCALITY_LENGTH) return { ...result, reason: `text longer than ${MAX_LOCALITY_LENGTH} characters` };
  const tokens = tokenize(text);
  if (!tokens.some((t) => t.kind !== 'symbol')) {
    return { ...result, type: 'no-locality', reason: tokens.length === 0 ? 'empty locality text' : `no words in the text ("${text.trim()}")` };
  }
  const language = detectLanguage(text, tokens);
  if (language) result.language = language;

  const pieces: Piece[] = [];
  const spans = new SpanReadings(text, tokens);
  const found = findCoordinates(text, tokens) ?? wholeTextPair(text, tokens);
  const separated = found
    ? [...splitSegments(tokens, 0, found.startToken), ...splitSegments(tokens, found.endToken, tokens.length)]
    : splitSegments(tokens, 0, tokens.length);
  // Before any span is read: it may take a period back from a short word.
  result.notes.push(...splitDottedHierarchy(tokens, separated));
  const segments: Segment[] = [];
  for (const segment of separated) {
    for (const part of splitElevationTail(text, tokens, segment)) segments.push(...splitJoinedClauses(tokens, part, (from, to) => spans.read(from, to)));
  }
  const coordinatesPiece: Piece | undefined = found ? { clause: clauseOf(text, tokens, found.startToken, found.endToken, 'coordinates') } : undefined;
  const datumWritten = found?.coordinates.datumWritten;

  // Segments followed by ":" (or "|", spaced dashes, leading periods) form the chain "Country: State: County".
  let chainLevel = 0;
  const headings = segments.map((segment) => segment.separator === ':' && L.FIELD_HEADINGS.has(foldedWords(tokens, segment.from, segment.to)));
  const links = hierarchyLinks(text, tokens, segments, (k) => spans.readSegment(segments[k])).map((link, k) => link && !headings[k]);
  // "Mun.: Alisos", "Municipio: Alisos": a unit word alone before a colon says what the next clause names.
  let unitAhead: AdministrativeLevel | undefined;
  // After "Hab.:" or "Habitat:" every clause describes the habitat.
  let habitatAhead = false;
  for (const [index, segment] of segments.entries()) {
    if (coordinatesPiece && segment.from >= found!.endToken && !pieces.includes(coordinatesPiece)) pieces.push(coordinatesPiece);
    const { from, to } = segment;
    const clauseText = text.slice(tokens[from]!.start, tokens[to - 1]!.end);
    if (datumWritten && (clauseText === datumWritten || /^datum\b/i.test(clauseText) || clauseText.endsWith(datumWritten))) {
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'other') });
      continue;
    }
    if (headings[index]) {
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'other') });
      habitatAhead ||= ['habitat', 'hab'].includes(foldedWords(tokens, from, to));
      continue;
    }
    if (habitatAhead) {
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'habitat') });
      continue;
    }
    const lead = unitAhead;
    unitAhead = undefined;
    if (lead && spans.readSegment(segments[index])?.type === 'named-place') {
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'administrative'), unit: { name: clauseText, level: lead, written: text.slice(tokens[segments[index - 1]!.from]!.start, tokens[to - 1]!.end) } });
      continue;
    }
    if (segment.separator === ':' && to - from === 1 && unitWordLevel(tokens[from]) && segments[index + 1]) {
      unitAhead = unitWordLevel(tokens[from]);
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'other') });
      continue;
    }
    if (isRefusal(tokens, from, to)) {
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'other'), refusal: true });
      continue;
    }
    const elevation = readElevation(text, tokens, from, to);
    if (elevation) {
      result.elevation ??= elevation.elevation;
      result.notes.push(...elevation.notes);
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'elevation') });
      continue;
    }
    const unit = readAdministrative(text, tokens, from, to) ?? undefined;
    if (links[index]) {
      // A link's level is its unit word's when that is not above the levels already written ("Isla Verdemar |
      // Poniente | Depto. Alisos": a department after a state is the next level), else its place in the chain.
      const positional = ADMINISTRATIVE_ORDER[Math.min(chainLevel, ADMINISTRATIVE_ORDER.length - 1)]!;
      const field = unit && unit.level !== 'unit' && ADMINISTRATIVE_ORDER.indexOf(unit.level) >= chainLevel ? unit.level : positional;
      result.administrative[field] ??= unit?.name ?? clauseText;
      chainLevel = ADMINISTRATIVE_ORDER.indexOf(field) + 1;
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'administrative'), link: true, ...(unit ? { unit } : {}) });
      continue;
    }
    if (unit) {
      // Two units of one level ("Pcia. de Poniente, Dpto. Alisos": a department inside a province): the level of
      // the second is not what its word says in every country, so it names a bare unit.
      const sameLevel = unit.level !== 'unit' && pieces.some((p) => p.unit?.level === unit.level && !p.link);
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'administrative'), unit: sameLevel ? { ...unit, level: 'unit' } : unit });
      continue;
    }
    // "Alisos (county)", "Poniente (Prov.)": a unit word alone in brackets says what the name before it is.
    const previous = pieces[pieces.length - 1];
    const level = to - from === 1 && segments[index - 1]?.separator === '(' ? unitWordLevel(tokens[from]) : undefined;
    if (level && previous?.reading?.type === 'named-place' && previous.reading.features.length === 1) {
      const end = tokens[to]?.text === ')' ? tokens[to]!.end : tokens[to - 1]!.end;
      const clause: Clause = { text: text.slice(previous.clause.start, end), start: previous.clause.start, end, kind: 'administrative' };
      pieces[pieces.length - 1] = { clause, unit: { name: previous.reading.features[0]!, level, written: clause.text } };
      continue;
    }
    // "Apiahy [= Apiaí]": a name given in brackets with "=" is the name of the place before it, as now written.
    const glossed = previous?.reading && (previous.reading.type === 'named-place' || previous.reading.type === 'near') && previous.reading.features.length === 1;
    if (tokens[from]!.norm === '=' && glossed && ['(', '['].includes(segments[index - 1]?.separator ?? '')) {
      const name = readLocalityClause(text, tokens.slice(from + 1, to));
      if (name.type === 'named-place' && name.features.length === 1) {
        result.notes.push(`"${previous.reading!.features[0]}" read as "${name.features[0]}", the name given for it in brackets`);
        const { featureKind: _kind, route: _route, ...rest } = previous.reading!;
        previous.reading = { ...rest, features: name.features, ...(name.featureKind ? { featureKind: name.featureKind } : {}) };
        pieces.push({ clause: clauseOf(text, tokens, from, to, 'other') });
        continue;
      }
    }
    const reading = spans.readSegment(segments[index])!;
    if ((reading.type === 'named-place' || reading.type === 'unparseable') && writesCoordinates(tokens.slice(from, to))) {
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'other'), unreadCoordinates: true });
      continue;
    }
    const named = previous?.reading?.features.length === 1 && !previous.reading.bare && !previous.reading.secondName ? previous.reading : undefined;
    const second = named && segments[index - 1]?.separator === '(' && tokens[to]?.norm === ')' && previous!.clause.text.endsWith(named.features[0]!)
      ? secondNameIn(text, tokens.slice(L.SECOND_NAME_WORDS.has(tokens[from]!.norm) ? from + 1 : from, to), named.featureKind)
      : undefined;
    if (second) {
      // "Alisos (Alisitos)", "Puerto Viejo (antes Alisitos)": one name alone in brackets right after a place's
      // name is a second name of that place (an older or other name) [our rule, no source]. A name with a
      // generic word of its own ("(Rio Fundo)") is another feature, and unit words, "(by air)", "(environs)",
      // "(town)" keep their readings above and in joinBareClauses.
      previous!.reading = { ...named!, secondName: second };
      result.notes.push(`"${second}", in brackets after "${named!.features[0]}", read as a second name of it: tried only when "${named!.features[0]}" is not found`);
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'other') });
      continue;
    }
    pieces.push({ clause: clauseOf(text, tokens, from, to, reading.type === 'habitat' ? 'habitat' : 'locality'), reading });
  }
  if (coordinatesPiece && !pieces.includes(coordinatesPiece)) pieces.push(coordinatesPiece);

  joinBareClauses(text, pieces, result.notes);
  if (found) result.coordinates = found.coordinates;
  const chosen = choose(pieces, result, chainLevel);
  const whole = found ? undefined : wholeTextName(text, tokens, chosen);
  return whole ? { ...chosen, wholeName: whole } : chosen;
}

/** The most words a text read whole as a place's name may hold ("Town and Country"). */
const MAX_WHOLE_NAME_WORDS = 4;

/**
 * The whole text as a place's name, beside a reading of its words that names no place ("Country Homes" read as a
 * country, "Woodland" as a habitat, "Forks" as a junction, "Summit" as a word qualifying nothing): a common word
 * or phrase a town may bear. Offered only when the text is one to four words, each capitalised (two letters or
 * more) or a small joining word, with no number and no mark but a final period; the locate step takes it only where
 * the gazetteer holds a settlement of that very name in the record's stated country and state [CHOICE wordNamedTown]. Undefined when the words already read as this one
 * name, or as anything else than no place ("summit of the ridge" is lower-case: a description, never a name).
 * @example wholeTextName('Forks', tokenize('Forks'), parseLocality('Forks')) // 'Forks'
 */
function wholeTextName(text: string, tokens: Token[], reading: Interpretation): string | undefined {
  const { type, unit } = reading;
  if (!(type === 'unparseable' || type === 'no-locality' || (type === 'administrative-unit' && unit?.level === 'country'))) return undefined;
  const words = tokens.filter((t) => t.kind !== 'symbol');
  if (words.length === 0 || words.length > MAX_WHOLE_NAME_WORDS || isRefusal(tokens, 0, tokens.length) || tokens.some((t, k) => t.kind === 'symbol' && !(t.text === '.' && k === tokens.length - 1))) return undefined;
  // A capital letter alone ("N", "N N N") is a heading's, never a name's word.
  if (!words.every((t, k) => t.kind === 'word' && ((/^\p{Lu}/u.test(t.text) && t.text.length > 1) || (k > 0 && k < words.length - 1 && L.SMALL_WORDS.has(t.norm))))) return undefined;
  return text.slice(words[0]!.start, words[words.length - 1]!.end);
}

/** A place's name read alone, not bare, for the clause split. */
const namedAlone = (r: LocalityRead): boolean => r.type === 'named-place' && !r.bare && r.features.length > 0;
/** An offset from a named place, not bare, for the clause split. */
const offsetFromPlace = (r: LocalityRead): boolean => isOffsetType(r.type) && !r.bare && r.features.length > 0;

/**
 * Two clauses written as one, split in two [our rule, no source]: a "near" word inside what was read as a place's
 * name alone ("Puente Alto near Alisos": no name holds "near", so it starts a clause, as "Puente Alto, near
 * Alisos" would), and two offsets from two places joined by "and" ("1 mi NE of
 * Wexley and 11 mi SE of Ashcombe", read as two clauses; "3 km N and 2 km E of X" stays one orthogonal offset).
 * `read` reads a span of tokens as a clause (memoised by the caller: the halves are read again as segments).
 * @example splitJoinedClauses(tokenize('Puente Alto near Alisos'), { from: 0, to: 4, separator: '' }, read) // [{ from: 0, to: 2, … }, { from: 2, to: 4, … }]
 */
function splitJoinedClauses(tokens: Token[], segment: Segment, read: (from: number, to: number) => LocalityRead): Segment[] {
  const { from, to } = segment;
  // Each split reads its halves again: a longer run of tokens is no label's clause, and is left whole to bound the work.
  if (to - from > MAX_JOINED_TOKENS) return [segment];
  // Most clauses hold neither word: they are not read twice.
  let some = false;
  for (let k = from + 1; k < to - 1 && !some; k++) some = phraseLengthAt(tokens, k, L.INNER_NEAR_PHRASES) > 0 || L.CONJUNCTIONS.has(tokens[k]!.norm);
  if (!some) return [segment];
  const whole = read(from, to);
  for (let k = from + 1; k < to - 1; k++) {
    const near = phraseLengthAt(tokens, k, L.INNER_NEAR_PHRASES);
    const inName = near > 0 && tokens[k + near]?.kind === 'word' && whole.features.some((f) => f.split(/\s+/).includes(tokens[k]!.text));
    // Only after a name alone: "3 km S of X near Z" stays one offset from "X near Z"; split too, it added two right
    // answers and one false on the real records (a label stating no state, whose X has a namesake in another state).
    if (inName && namedAlone(read(from, k))) return splitAt(tokens, segment, k, 0, read);
    const joined = whole.type === 'unparseable' && tokens[k]!.kind === 'word' && L.CONJUNCTIONS.has(tokens[k]!.norm);
    if (joined && offsetFromPlace(read(from, k)) && offsetFromPlace(read(k + 1, to))) return splitAt(tokens, segment, k, 1, read);
  }
  return [segment];
}

/** The segment split before token k, the second part from k + skip (past an "and") split again in its turn. */
function splitAt(tokens: Token[], segment: Segment, k: number, skip: number, read: (from: number, to: number) => LocalityRead): Segment[] {
  return [{ from: segment.from, to: k, separator: ',' }, ...splitJoinedClauses(tokens, { ...segment, from: k + skip }, read)];
}

/** The most tokens a clause split by splitJoinedClauses may hold (those split on the real records hold at most 17). */
const MAX_JOINED_TOKENS = 60;

/**
 * Which segments are links of an administrative hierarchy written into the text [our rule, no source]: those
 * followed by ":", "|" or a spaced dash ("Country: State: place", "Country | State | County", "Country - State -
 * place"); the last segment of a "|" export when it reads as a bare name; two or more leading segments ended
 * by a period that read as bare names, the first a country's name ("Brasil. Paraná. Curitiba"). "Place: 10 km
 * NE" is no chain: the colon introduces the offset.
 */
function hierarchyLinks(text: string, tokens: Token[], segments: Segment[], read: (k: number) => LocalityRead | undefined): boolean[] {
  const last = segments.length - 1;
  const links: boolean[] = [];
  for (let k = 0; k <= last; k++) {
    const separator = segments[k]!.separator;
    links.push(separator === '|' || separator === '-' || (separator === ':' && !(k + 1 === last && read(k + 1)?.bare === 'offset')));
  }
  if (last > 0 && segments[last - 1]!.separator === '|' && isBareName(text, tokens, segments[last]!, read(last))) links[last] = true;
  let periods = 0;
  while (periods < last && segments[periods]!.separator === '.' && isBareName(text, tokens, segments[periods]!, read(periods))) periods++;
  // A period also ends sentences ("Z. P. Las Tablas. Cordillera de Talamanca. San Vito."): only a first part
  // that is a country's name heads a hierarchy; other parts stay clauses, to be found or checked.
  const head = segments[0]!;
  if (periods >= 2 && headsCountry(tokens, head.from, head.to)) for (let k = 0; k < periods; k++) links[k] = true;
  return links;
}

/**
 * Tokens [from, to) name a country: its name (namesCountry), or its ISO 3166-1 code in capitals ("CR", "BRA")
 * before a clause not all in capitals ("MT. BAKER" is a mountain), that is no compass heading ("NE", "SO").
 */
function headsCountry(tokens: Token[], from: number, to: number): boolean {
  if (namesCountry(tokens.slice(from, to))) return true;
  const code = to - from === 1 ? tokens[from]!.text.replace(/\.$/, '') : '';
  const next = tokens[to]?.kind === 'symbol' ? tokens[to + 1] : tokens[to];
  return !/^[NSEWOL]+$/.test(code) && countryCodeWritten(code) !== null && next?.kind === 'word' && next.text !== next.text.toUpperCase();
}

/**
 * "Costa Rica. Puntarenas. San Vito", "CR. Puntarenas. San Vito", "Brasil. Serra Alta. Vila Serena": the
 * tokenizer keeps the period of a word of four letters or fewer as an abbreviation's ("Sta. Rosa"), so the
 * clause runs on. In a text headed by a country's name or code and a period, such a period ends the clause
 * [our rule, no source]: the head's, and one after the last word of a name of two or more words that is no
 * unit word and has three letters or more with a vowel (abbreviations written after a name, "Co.", "Mts.",
 * "Rd.", seldom have), before a capitalised word. In any other text it ends the clause only after a capitalised
 * word so ended that follows a capitalised word or a joining word of the same name and is no road, trail or river
 * word nor a short form names are written with ("Reserva do Alisos. Trilha …", "Vila Nova Lima. Fazenda …"; not
 * "Rod. Alisos", "Cerro Sta. Rosa") [CHOICE periodEndsName, common practice, no source]. The word loses its
 * period; the segments change in place.
 */
function splitDottedHierarchy(tokens: Token[], segments: Segment[]): string[] {
  const notes: string[] = [];
  let headed = segments[0]?.separator === '.' && headsCountry(tokens, segments[0].from, segments[0].to);
  for (let index = 0; index < segments.length; index++) {
    const segment = segments[index]!;
    const chain = headed && (index === 0 || segments[index - 1]!.separator === '.');
    for (let k = segment.from; k < segment.to - 1; k++) {
      const t = tokens[k]!;
      const next = tokens[k + 1]!;
      if (t.kind !== 'word' || !t.dotted || next.kind !== 'word' || next.text[0] === next.text[0]!.toLowerCase()) continue;
      const nameEnd = k > segment.from && t.norm.length >= 3 && /[aeiou]/.test(t.norm) && !unitWordLevel(t) && !L.DOTTED_ONLY_ADMINISTRATIVE_WORDS.has(t.norm);
      const country = !headed && index === 0 && headsCountry(tokens, segment.from, k + 1);
      if (!(country || (nameEnd && (chain || periodEndsName(t, tokens[k - 1]!))))) continue;
      if (!country && !chain) notes.push(`the period after "${t.text.slice(0, -1)}" read as ending a name, no short form's [CHOICE periodEndsName, docs/method.md]`);
      tokens[k] = { ...t, text: t.text.slice(0, -1), end: t.end - 1, dotted: false };
      segments.splice(index, 1, { from: segment.from, to: k + 1, separator: '.' }, { ...segment, from: k + 1 });
      headed ||= country;
      break;
    }
  }
  return notes;
}

/** Outside a country-headed chain, the tests splitDottedHierarchy adds before a period ends a name ([CHOICE periodEndsName]). */
const periodEndsName = (t: Token, before: Token): boolean =>
  t.text[0] !== t.text[0]!.toLowerCase() && before.kind === 'word' && (before.text[0] !== before.text[0]!.toLowerCase() || L.SMALL_WORDS.has(before.norm))
  && !L.ROAD_NOUNS.has(t.norm) && !L.TRAIL_NOUNS.has(t.norm) && !L.RIVER_NOUNS.has(t.norm) && !L.NAME_ABBREVIATIONS.has(t.norm);

/** A segment that is only a name: a unit by its unit word, or a named place with nothing else. */
function isBareName(text: string, tokens: Token[], segment: Segment, reading: LocalityRead | undefined): boolean {
  return readAdministrative(text, tokens, segment.from, segment.to) !== null || (reading?.type === 'named-place' && !reading.bare);
}

const isOffsetType = (type: LocalityRead['type']): boolean => SPECIFICITY[type as LocalityType] === 1 || type === 'distance-only';

/** The reading without its `bare` mark, once it has been joined or judged on its own. */
function standing(reading: LocalityRead): LocalityRead {
  const { bare: _bare, ...rest } = reading;
  return rest;
}

/** Two single offsets on perpendicular cardinal headings (4-point rose), each with a distance: one orthogonal pair. */
function orthogonalPair(a: Offset, b: Offset): boolean {
  return (
    a.distance !== undefined && b.distance !== undefined && a.heading?.kind === 'rose4' && b.heading?.kind === 'rose4' &&
    Math.abs(a.heading.azimuth - b.heading.azimuth) % 180 === 90
  );
}

/** A heading-only and a distance-only reading, in either order, that together make one offset at a heading. */
function halves(a: LocalityRead, b: LocalityRead): boolean {
  const kinds = new Set([a.type, b.type]);
  return kinds.has('heading-only') && kinds.has('distance-only') && !a.offsets[0]?.toward && !b.offsets[0]?.toward && a.offsets.length === 1 && b.offsets.length === 1;
}

function spanning(text: string, a: Clause, b: Clause): Clause {
  return { text: text.slice(a.start, b.end), start: a.start, end: b.end, kind: 'locality' };
}

/**
 * Joins clauses that cannot stand alone to their neighbour: "Puerto Lindo, 10 km NE" (offset after its place),
 * "3 km N, 2 km E of X" (first of two orthogonal offsets), "12 km NO de X, camino a Y" (a road after an offset).
 */
function joinBareClauses(text: string, pieces: Piece[], notes: string[]): void {
  for (let k = 0; k < pieces.length; k++) {
    const piece = pieces[k]!;
    const reading = piece.reading;
    if (!reading?.bare) continue;
    const previous = pieces[k - 1];
    const next = pieces[k + 1];
    const joinable = previous?.reading && !previous.reading.bare ? previous.reading : undefined;
    if (reading.bare === 'air' && joinable && isOffsetType(joinable.type)) {
      // "10 km N of X (by air)", "12 km NE de Alisos, en línea recta"
      joinable.offsets = [{ ...joinable.offsets[0]!, byAir: true }, ...joinable.offsets.slice(1)];
      previous!.clause = spanning(text, previous!.clause, piece.clause);
      pieces.splice(k--, 1);
    } else if ((reading.bare === 'near' && joinable?.type === 'named-place') || (reading.bare === 'kind' && joinable?.features.length === 1)) {
      // "Vila Serena, arredores" is near it; "Alisos (town)", "near Alisos (town)" say what Alisos is.
      previous!.reading = reading.bare === 'near' ? { ...joinable!, type: 'near' } : { ...joinable!, featureKind: reading.featureKind! };
      previous!.clause = spanning(text, previous!.clause, piece.clause);
      pieces.splice(k--, 1);
    } else if (reading.bare === 'offset' && joinable && joinable.features.length > 0 && joinable.offsets.length === 1 && orthogonalPair(joinable.offsets[0]!, reading.offsets[0]!)) {
      // "Millbrook 3 mi N, 1 mi W": the second offset of an orthogonal pair after the first with its place.
      previous!.reading = { ...joinable, type: 'offset-orthogonal', offsets: [joinable.offsets[0]!, reading.offsets[0]!], approximate: reading.approximate || joinable.approximate };
      previous!.clause = spanning(text, previous!.clause, piece.clause);
      pieces.splice(k--, 1);
    } else if (reading.bare === 'offset' && joinable && joinable.features.length > 0 && halves(joinable, reading)) {
      // "NE of Millbrook, 10 km", "5 km de Alisos, rumbo 214°": a heading and a distance written apart.
      const offset: Offset = { ...joinable.offsets[0]!, ...reading.offsets[0]! };
      previous!.reading = { ...joinable, type: 'offset-heading', offsets: [offset], approximate: reading.approximate || joinable.approximate };
      previous!.clause = spanning(text, previous!.clause, piece.clause);
      pieces.splice(k--, 1);
    } else if (reading.bare === 'offset' && previous?.reading?.type === 'named-place' && !previous.reading.bare) {
      const { featureKind } = previous.reading;
      previous.reading = { ...standing(reading), features: previous.reading.features, approximate: reading.approximate || previous.reading.approximate, ...(featureKind ? { featureKind } : {}) };
      previous.clause = spanning(text, previous.clause, piece.clause);
      pieces.splice(k--, 1);
    } else if (reading.bare === 'offset' && next?.reading && isOffsetType(next.reading.type) && !next.reading.bare && reading.offsets.length === 1 && next.reading.offsets.length === 1) {
      const [a] = reading.offsets;
      const [b] = next.reading.offsets;
      if (orthogonalPair(a!, b!)) {
        piece.reading = { ...next.reading, type: 'offset-orthogonal', offsets: [a!, b!], approximate: reading.approximate || next.reading.approximate };
        piece.clause = spanning(text, piece.clause, next.clause);
        pieces.splice(k + 1, 1);
      }
    } else if (reading.bare === 'path' && reading.offsets[0]?.path?.lineName && next?.reading?.type === 'offset-path' && !next.reading.offsets[0]!.path!.lineName) {
      // "along Silver River, 5 km upstream of Wexley": the line named before the offset it belongs to.
      const offset: Offset = { ...next.reading.offsets[0]!, path: { ...next.reading.offsets[0]!.path!, lineName: reading.offsets[0].path.lineName } };
      piece.reading = { ...next.reading, offsets: [offset] };
      piece.clause = spanning(text, piece.clause, next.clause);
      notes.push(`"${reading.offsets[0].path.written}" read as the line of the offset`);
      pieces.splice(k + 1, 1);
    } else if (reading.bare === 'path' && reading.type === 'named-place' && joinable?.offsets[0]?.heading && joinable.offsets[0].distance && joinable.features.length > 0) {
      // "X, 2 km al S, camino a Y": the road the place lies on, after an offset at a heading. The heading is kept
      // (an offset at a heading, by air); the road is noted, never turned into the path of the distance.
      notes.push(`"${piece.clause.text}" read as the road the place lies on; the heading "${joinable.offsets[0].heading.written}" is kept and the distance taken by air`);
      previous!.clause = spanning(text, previous!.clause, piece.clause);
      pieces.splice(k--, 1);
    } else if (reading.bare === 'path' && previous?.reading && isOffsetType(previous.reading.type) && !previous.reading.bare && previous.reading.features.length > 0) {
      const offset: Offset = { ...previous.reading.offsets[0]!, path: previous.reading.offsets[0]!.path ?? reading.offsets[0]!.path! };
      previous.reading = { ...previous.reading, type: previous.reading.offsets.length === 2 ? 'offset-orthogonal' : 'offset-path', offsets: [offset, ...previous.reading.offsets.slice(1)] };
      previous.clause = spanning(text, previous.clause, piece.clause);
      notes.push(`"${piece.clause.text}" read as the path of the offset`);
      pieces.splice(k--, 1);
    }
  }
  for (const piece of pieces) {
    const reading = piece.reading;
    if (!reading?.bare) continue;
    if (reading.bare === 'offset') piece.reading = { ...standing(reading), type: 'unparseable', reason: `offset "${piece.clause.text}" with no place to measure it from` };
    else if (reading.bare === 'air' || reading.bare === 'near' || reading.bare === 'kind') piece.reading = { ...standing(reading), type: 'unparseable', reason: `"${piece.clause.text}" qualifies no place or offset before it` };
    else if (reading.type === 'offset-path') piece.reading = { ...standing(reading), type: 'unparseable', reason: `path "${piece.clause.text}" with no distance or place` };
    else piece.reading = standing(reading);
  }
}

/** How specific a unit word's level is: the lowest level named is the unit a text names ("…, Mun. Alisos"). */
const LEVEL_DEPTH: Readonly<Record<AdministrativeLevel, number>> = { country: 0, stateProvince: 1, unit: 2, county: 2, municipality: 3 };

/**
 * Chooses the most specific clause (docs/method.md §2 step 2, SPECIFICITY above); ties go to the first clause written, so
 * "Puerto Lindo, Laguna Negra" uses Puerto Lindo and lists Laguna Negra in `otherClauses` for the locate policy.
 * With no locality clause, a clause naming a unit by a unit word is the place ('administrative-unit', the lowest
 * level named); a hierarchy alone ("Isla Verdemar | Poniente | Alisos") names no place within it.
 */
function choose(pieces: Piece[], result: Interpretation, chainLevel: number): Interpretation {
  result.clauses = pieces.map((p) => p.clause);
  result.approximate = pieces.some((p) => p.reading?.approximate);
  let best = -1;
  let bestRank = 9;
  // After "Country: State:" a first named place followed by another one is the county ("…: Millbrook, Ashcombe").
  const namedPlaces = pieces.filter((p) => p.reading?.type === 'named-place');
  const countyLevel = chainLevel >= 2 && namedPlaces.length >= 2 ? namedPlaces[0] : undefined;
  pieces.forEach((piece, index) => {
    const rank = piece.clause.kind === 'coordinates' ? 0 : piece.reading && piece.reading.type !== 'habitat' && piece !== countyLevel ? SPECIFICITY[piece.reading.type] : 9;
    if (rank < bestRank) {
      best = index;
      bestRank = rank;
    }
  });
  // Coordinates written but not readable: the place they give is not known, so no other clause stands in for them.
  const unread = pieces.find((p) => p.unreadCoordinates);
  if (unread && !result.coordinates) {
    return { ...result, type: 'unparseable', reason: `coordinates written but not readable: "${unread.clause.text}"; no other clause is used in their place, a person must read them` };
  }
  if (unread) result.notes.push(`"${unread.clause.text}" looks like coordinates but could not be read (not used; check it agrees)`);
  const refusal = pieces.find((p) => p.refusal);
  if (refusal && bestRank > 0) {
    return { ...result, type: 'no-locality', reason: `the text says "${refusal.clause.text}"` };
  }
  // A kilometre post beside no route a clause reads ("Manaus, km 23"; "km 23" alone): a route carries its own.
  const post = pieces.find((p, k) => k !== best && p.reading?.kilometrePost)?.reading!.kilometrePost;
  if (post && !pieces.some((p) => p.reading?.route)) result.kilometrePost = post;
  if (best < 0) {
    const unreadable = pieces.find((p) => p.reading?.type === 'unparseable');
    if (unreadable) return { ...result, type: 'unparseable', reason: unreadable.reading!.reason ?? 'clause could not be read' };
    let unitIndex = -1;
    pieces.forEach((piece, index) => {
      if (piece.unit && !piece.link && (unitIndex < 0 || LEVEL_DEPTH[piece.unit.level] >= LEVEL_DEPTH[pieces[unitIndex]!.unit!.level])) unitIndex = index;
    });
    if (unitIndex >= 0) {
      const unit = pieces[unitIndex]!.unit!;
      fillUnits(pieces, result, unitIndex);
      result.notes.push(`only an administrative unit is named: "${unit.written}" is the place, read as a unit, not a town`);
      return { ...result, type: 'administrative-unit', chosenClause: unitIndex, features: [unit.name], unit };
    }
    fillUnits(pieces, result, -1);
    const written = ADMINISTRATIVE_ORDER.filter((field) => result.administrative[field]).map((field) => `${field} "${result.administrative[field]}"`);
    if (written.length > 0) return { ...result, type: 'no-locality', reason: `only an administrative hierarchy is written (${written.join(', ')}): it names no place within it` };
    if (pieces.some((p) => p.clause.kind === 'habitat')) return { ...result, type: 'no-locality', reason: 'habitat description only: the text names no place' };
    if (pieces.some((p) => p.clause.kind === 'elevation')) return { ...result, type: 'no-locality', reason: 'only an elevation: the text names no place' };
    return { ...result, type: 'unparseable', reason: 'no clause could be read as a locality' };
  }
  fillUnits(pieces, result, -1);
  const chosen = pieces[best]!;
  result.chosenClause = best;
  if (chosen.clause.kind === 'coordinates') {
    result.type = 'coordinates';
    result.notes.push(...(result.coordinates?.notes ?? []));
  } else {
    delete result.coordinates;
    const reading = chosen.reading!;
    result.type = reading.type as LocalityType;
    result.features = reading.features.map((feature) => seatOf(feature, result));
    result.offsets = reading.offsets;
    if (reading.featureKind) result.featureKind = reading.featureKind;
    if (reading.route && reading.type === 'named-place') result.route = routeWithPost(reading.route, pieces);
    if (reading.secondName) result.secondName = reading.secondName;
    result.notes.push(...reading.notes);
    if (reading.type === 'offset-heading' && !reading.offsets[0]!.byAir) result.notes.push('no path qualifier: by air assumed (docs/method.md §3)');
  }
  // Named places after an administrative chain continue it: "Country: State: County, 12 km S of X".
  const others: ClauseReading[] = [];
  pieces.forEach((piece, index) => {
    if (index === best || !piece.reading || piece.reading.type === 'habitat' || piece.reading.type === 'unparseable') return;
    if (piece.reading.type !== 'named-place') {
      result.notes.push(`also read: "${piece.clause.text}" as ${piece.reading.type} (not used for the point; check it agrees)`);
      others.push(clauseReading(piece.reading, index, pieces));
      return;
    }
    // "Alisos: Fazenda Boa Vista, …": a name whose generic word says farm, water, mountain, road or park is a
    // feature, never a unit of the chain.
    const kind = piece.reading.featureKind;
    const field = chainLevel > 0 && index < best && (!kind || UNIT_LIKE_KINDS.has(kind)) ? ADMINISTRATIVE_ORDER[chainLevel] : undefined;
    if (field && !result.administrative[field] && index === pieces.findIndex((p) => p.reading?.type === 'named-place')) {
      result.administrative[field] = piece.reading.features[0]!;
      piece.clause.kind = 'administrative';
    } else {
      result.notes.push(`also named: "${piece.clause.text}" (not used for the point)`);
      others.push(clauseReading(piece.reading, index, pieces));
    }
  });
  result.otherClauses = others.sort((a, b) => SPECIFICITY[a.type] - SPECIFICITY[b.type] || a.clause - b.clause);
  for (const piece of pieces) {
    if (piece !== chosen && piece.reading?.type === 'unparseable') result.notes.push(`clause "${piece.clause.text}" not read: ${piece.reading.reason}`);
  }
  return result;
}

/** A route with the road kilometre post another clause writes ("Ipala–Amatillo road, km 12"), if one does. */
function routeWithPost(route: RouteReading, pieces: Piece[]): RouteReading {
  const post = pieces.find((p) => p.reading?.kilometrePost)?.reading?.kilometrePost;
  return post ? { ...route, kilometrePost: post } : route;
}

/** Kinds of place a link of an administrative chain may be written as: a settlement or a locality. */
const UNIT_LIKE_KINDS: ReadonlySet<FeatureKind> = new Set(['populated-place', 'locality']);

/**
 * "Mun. Alisos, 17 km N da cidade": a place-type word alone ("the town", "la ciudad", "a cidade", "la ville")
 * where a place is read names the town of the municipality the text names, whose seat bears its name
 * [our rule, no source]. Any other name, or no municipality named, is left as written.
 * @example seatOf('cidade', { administrative: { municipality: 'Alisos' }, notes: [] }) // 'Alisos'
 */
function seatOf(feature: string, result: Pick<Interpretation, 'administrative' | 'notes'>): string {
  const municipality = result.administrative.municipality;
  if (!municipality) return feature;
  const words = fold(feature).split(/\s+/);
  const [kind] = words.slice(words.length - 1);
  const article = words.length === 2 && SMALL_ARTICLES.has(words[0]!);
  if (!municipality || !kind || !L.PLACE_TYPE_SUFFIXES.has(kind) || (words.length > 1 && !article)) return feature;
  result.notes.push(`"${feature}" read as the town of the municipality the text names, "${municipality}"`);
  return municipality;
}
const SMALL_ARTICLES = new Set(['the', 'la', 'el', 'a', 'o', 'le']);

/** The public reading of a clause other than the chosen one, a route with the kilometre post another clause writes. */
function clauseReading(reading: LocalityRead, clause: number, pieces: Piece[]): ClauseReading {
  const { type, features, offsets, featureKind, secondName, route } = reading;
  const routed = route && type === 'named-place' ? { route: routeWithPost(route, pieces) } : {};
  return { clause, type: type as LocalityType, features, offsets, ...(featureKind ? { featureKind } : {}), ...(secondName ? { secondName } : {}), ...routed };
}

/**
 * The name of a clause written in brackets when it is one name alone, a second name of the place before it
 * (whose generic word says `kind`); undefined otherwise, or when its own generic word says it is another
 * kind of place ("Porto Alegre (Rio Fundo)": a river by the town).
 * @example secondNameIn('Alisitos', tokenize('Alisitos'), undefined) // 'Alisitos'
 */
function secondNameIn(text: string, tokens: Token[], kind: FeatureKind | undefined): string | undefined {
  if (tokens.length === 0) return undefined;
  const reading = readLocalityClause(text, tokens);
  const ownKind = reading.featureKind;
  const sameKind = !ownKind || ownKind === kind || UNIT_LIKE_KINDS.has(ownKind);
  return reading.type === 'named-place' && !reading.bare && reading.features.length === 1 && sameKind ? reading.features[0] : undefined;
}

/** Unit clauses other than the chosen one fill their level's field, the first written winning; 'unit' fills none. */
function fillUnits(pieces: Piece[], result: Interpretation, chosen: number): void {
  for (let index = 0; index < pieces.length; index++) {
    const unit = pieces[index]!.unit;
    if (unit && !pieces[index]!.link && index !== chosen && unit.level !== 'unit') result.administrative[unit.level] ??= unit.name;
  }
}
