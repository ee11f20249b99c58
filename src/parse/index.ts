import type { Clause, Interpretation, LocalityType, Offset } from './types.ts';
import { tokenize, type Token } from './tokens.ts';
import { findCoordinates } from './coordinates.ts';
import { readLocalityClause, type ClauseReading } from './locality.ts';
import { ADMINISTRATIVE_ORDER, detectLanguage, isRefusal, readAdministrative, readElevation, splitSegments, type Segment } from './clauses.ts';

export { parseCoordinates } from './coordinates.ts';
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
  reading?: ClauseReading;
  refusal?: boolean;
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
  const found = findCoordinates(text, tokens);
  const segments: Segment[] = found
    ? [...splitSegments(tokens, 0, found.startToken), ...splitSegments(tokens, found.endToken, tokens.length)]
    : splitSegments(tokens, 0, tokens.length);
  const coordinatesPiece: Piece | undefined = found ? { clause: clauseOf(text, tokens, found.startToken, found.endToken, 'coordinates') } : undefined;
  const datumWritten = found?.coordinates.datumWritten;

  // Segments followed by ":" form the administrative chain "Country: State: County".
  let chainLevel = 0;
  for (const segment of segments) {
    if (coordinatesPiece && segment.from >= found!.endToken && !pieces.includes(coordinatesPiece)) pieces.push(coordinatesPiece);
    const { from, to } = segment;
    const clauseText = text.slice(tokens[from]!.start, tokens[to - 1]!.end);
    if (datumWritten && (clauseText === datumWritten || /^datum\b/i.test(clauseText) || clauseText.endsWith(datumWritten))) {
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
    const administrative = readAdministrative(text, tokens, from, to);
    if (administrative || segment.separator === ':') {
      const field = administrative?.field ?? ADMINISTRATIVE_ORDER[Math.min(chainLevel, ADMINISTRATIVE_ORDER.length - 1)]!;
      result.administrative[field] ??= administrative?.name ?? clauseText;
      if (segment.separator === ':') chainLevel = ADMINISTRATIVE_ORDER.indexOf(field) + 1;
      pieces.push({ clause: clauseOf(text, tokens, from, to, 'administrative') });
      continue;
    }
    const reading = readLocalityClause(text, tokens.slice(from, to));
    pieces.push({ clause: clauseOf(text, tokens, from, to, reading.type === 'habitat' ? 'habitat' : 'locality'), reading });
  }
  if (coordinatesPiece && !pieces.includes(coordinatesPiece)) pieces.push(coordinatesPiece);

  joinBareClauses(text, pieces, result.notes);
  if (found) result.coordinates = found.coordinates;
  return choose(pieces, result, chainLevel);
}

const isOffsetType = (type: ClauseReading['type']): boolean => SPECIFICITY[type as LocalityType] === 1 || type === 'distance-only';

/** The reading without its `bare` mark, once it has been joined or judged on its own. */
function standing(reading: ClauseReading): ClauseReading {
  const { bare: _bare, ...rest } = reading;
  return rest;
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
    if (reading.bare === 'offset' && previous?.reading?.type === 'named-place' && !previous.reading.bare) {
      previous.reading = { ...standing(reading), features: previous.reading.features, approximate: reading.approximate || previous.reading.approximate };
      previous.clause = spanning(text, previous.clause, piece.clause);
      pieces.splice(k--, 1);
    } else if (reading.bare === 'offset' && next?.reading && isOffsetType(next.reading.type) && !next.reading.bare && reading.offsets.length === 1 && next.reading.offsets.length === 1) {
      const [a] = reading.offsets;
      const [b] = next.reading.offsets;
      if (a!.heading && b!.heading && a!.heading.azimuth % 90 === 0 && b!.heading.azimuth % 90 === 0 && Math.abs(a!.heading.azimuth - b!.heading.azimuth) % 180 === 90 && a!.heading.kind === 'rose4' && b!.heading.kind === 'rose4') {
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
    else if (reading.type === 'offset-path') piece.reading = { ...standing(reading), type: 'unparseable', reason: `path "${piece.clause.text}" with no distance or place` };
    else piece.reading = standing(reading);
  }
}

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
    // Ties go to the first clause: an offset before a second one, and a place before the larger units
    // written after it ("Puerto Lindo, Costa Verde"); the others are listed in the notes.
    if (rank < bestRank) {
      best = index;
      bestRank = rank;
    }
  });
  const refusal = pieces.find((p) => p.refusal);
  if (refusal && bestRank > 0) {
    return { ...result, type: 'no-locality', reason: `the text says "${refusal.clause.text}"` };
  }
  if (best < 0) {
    const unreadable = pieces.find((p) => p.reading?.type === 'unparseable');
    if (unreadable) return { ...result, type: 'unparseable', reason: unreadable.reading!.reason ?? 'clause could not be read' };
    const lowest = [...ADMINISTRATIVE_ORDER].reverse().find((field) => result.administrative[field]);
    const adminIndex = lowest ? pieces.findIndex((p) => p.clause.kind === 'administrative' && p.clause.text.includes(result.administrative[lowest]!)) : -1;
    if (lowest && adminIndex >= 0) {
      result.notes.push(`only administrative units are named: the ${lowest === 'stateProvince' ? 'state or province' : lowest} is the place`);
      return { ...result, type: 'named-place', chosenClause: adminIndex, features: [result.administrative[lowest]!] };
    }
    if (pieces.some((p) => p.clause.kind === 'habitat')) return { ...result, type: 'no-locality', reason: 'habitat description only: the text names no place' };
    if (pieces.some((p) => p.clause.kind === 'elevation')) return { ...result, type: 'no-locality', reason: 'only an elevation: the text names no place' };
    return { ...result, type: 'unparseable', reason: 'no clause could be read as a locality' };
  }
  const chosen = pieces[best]!;
  result.chosenClause = best;
  if (chosen.clause.kind === 'coordinates') {
    result.type = 'coordinates';
  } else {
    delete result.coordinates;
    const reading = chosen.reading!;
    result.type = reading.type as LocalityType;
    result.features = reading.features;
    result.offsets = reading.offsets;
    result.notes.push(...reading.notes);
    if (reading.type === 'offset-heading' && !reading.offsets[0]!.byAir) result.notes.push('no path qualifier: by air assumed (docs/method.md §3)');
  }
  // Named places after an administrative chain continue it: "Country: State: County, 12 km S of X".
  pieces.forEach((piece, index) => {
    if (index === best || !piece.reading || piece.reading.type === 'habitat' || piece.reading.type === 'unparseable') return;
    if (piece.reading.type !== 'named-place') {
      result.notes.push(`also read: "${piece.clause.text}" as ${piece.reading.type} (not used for the point; check it agrees)`);
      return;
    }
    const field = chainLevel > 0 && index < best ? ADMINISTRATIVE_ORDER[chainLevel] : undefined;
    if (field && !result.administrative[field] && index === pieces.findIndex((p) => p.reading?.type === 'named-place')) {
      result.administrative[field] = piece.reading.features[0]!;
      piece.clause.kind = 'administrative';
    } else result.notes.push(`also named: "${piece.clause.text}" (not used for the point)`);
  });
  result.otherClauses = pieces
    .map((piece, index) => ({ piece, index }))
    .filter(({ piece, index }) => index !== best && piece.clause.kind === 'locality' && piece.reading && !['habitat', 'unparseable'].includes(piece.reading.type))
    .map(({ piece, index }) => ({ clause: index, type: piece.reading!.type as LocalityType, features: piece.reading!.features, offsets: piece.reading!.offsets }))
    .sort((a, b) => SPECIFICITY[a.type] - SPECIFICITY[b.type] || a.clause - b.clause);
  for (const piece of pieces) {
    if (piece !== chosen && piece.reading?.type === 'unparseable') result.notes.push(`clause "${piece.clause.text}" not read: ${piece.reading.reason}`);
  }
  return result;
}
