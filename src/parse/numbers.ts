/**
 * Numbers and ranges as written ("10", "1.5", "1 1/2", "3-5", "2,5"), with the precision read from how
 * they are written, never from a converted value (docs/method.md §5.1).
 * @example readDistanceNumber('1 1/2') // { value: 1.5, precision: 0.5, … }
 */
import { tokenize, type Token } from './tokens.ts';
import { ORDINAL_ENDINGS, ORDINAL_JOINS, ORDINAL_NOUNS } from './lexicon.ts';

/** A number or range as written, with its precision read from the writing (docs/method.md §5.1). */
export interface WrittenNumber {
  /** The value; the midpoint for a range. */
  value: number;
  /** Precision in the written unit (for a range: the coarser of the two ends). */
  precision: number;
  /** δ: precision / 2, plus half the range for a range. */
  uncertainty: number;
  range?: { low: number; high: number };
  /** Index of the first token after the number. */
  next: number;
}

/** 1e-24 … 1e24, each read from its decimal literal once: the powers that written numbers ask for. */
const POWERS_FROM = 24;
const POWERS_OF_TEN: readonly number[] = Array.from({ length: 2 * POWERS_FROM + 1 }, (_, k) => Number(`1e${k - POWERS_FROM}`));

/** 10^k as the decimal literal reads it (1e-4 is exactly the double nearest 0.0001, unlike 10 ** -4 on some engines). */
export function powerOfTen(k: number): number {
  return POWERS_OF_TEN[k + POWERS_FROM] ?? Number(`1e${k}`);
}

/** Words that join the two ends of a range ("5 a 8 km", "5 to 8 km", "5 à 8 km", "entre 5 y 8 km"). */
const RANGE_JOINERS = new Set(['-', '–', '—', 'to', 'a', 'ate', 'au', 'or', 'ou', 'o', 'and', 'y', 'e', 'et']);
/** "between 5 and 8 km", "entre 5 y 8 km": a range may open with this word. */
const RANGE_OPENERS = new Set(['between', 'entre']);

interface Single {
  value: number;
  precision: number;
  next: number;
}

/**
 * Precision of a decimal from its written decimals [DOC, BP2020 §Uncertainty Related to Offset Precision]:
 * .5 → 1/2; .25, .75 → 1/4; eighths → 1/8 [CHOICE]; otherwise 10^-k for k decimals.
 */
function decimalPrecision(decimals: string): number {
  const fractional = Number(`0.${decimals}`);
  if (fractional === 0.5) return 0.5;
  if (fractional === 0.25 || fractional === 0.75) return 0.25;
  if (fractional * 8 === Math.round(fractional * 8) && fractional !== 0) return 0.125;
  return powerOfTen(-decimals.length);
}

/** Integer precision, max(1, 10^(floor(log10 d) − 1)) [CHOICE reproducing every BP2020 row, docs/method.md §5.1]. */
function integerPrecision(value: number): number {
  return value < 1 ? 1 : Math.max(1, powerOfTen(Math.floor(Math.log10(value)) - 1));
}

const isNumber = (t: Token | undefined): t is Token => t !== undefined && t.kind === 'number';
const isSlash = (t: Token | undefined): boolean => t !== undefined && t.kind === 'symbol' && t.norm === '/';

/** Reads "p/q" starting at i (no spaces around the slash), or a vulgar fraction. */
function readFraction(tokens: Token[], i: number): Single | null {
  const t = tokens[i];
  if (!isNumber(t)) return null;
  if (t.fraction) return { value: t.fraction[0] / t.fraction[1], precision: 1 / t.fraction[1], next: i + 1 };
  const slash = tokens[i + 1];
  const q = tokens[i + 2];
  if (t.decimals === '' && isSlash(slash) && !slash!.spaceBefore && isNumber(q) && !q.spaceBefore && q.decimals === '' && !q.fraction) {
    const denominator = Number(q.norm);
    if (denominator > 0) return { value: Number(t.norm) / denominator, precision: 1 / denominator, next: i + 3 };
  }
  return null;
}

function readSingle(tokens: Token[], i: number): Single | null {
  const t = tokens[i];
  if (!isNumber(t)) return null;
  const fraction = readFraction(tokens, i);
  if (fraction) return fraction;
  const whole = Number(t.norm);
  if (!Number.isFinite(whole)) return null;
  if (t.decimals === '') {
    // "1 1/2", "1½", "1-1/2": a whole number followed by a fraction.
    const hyphen = tokens[i + 1]?.norm === '-' && !tokens[i + 1]!.spaceBefore && !tokens[i + 2]?.spaceBefore;
    const mixed = readFraction(tokens, hyphen ? i + 2 : i + 1);
    if (mixed && mixed.value < 1) return { value: whole + mixed.value, precision: mixed.precision, next: mixed.next };
    return { value: whole, precision: integerPrecision(whole), next: i + 1 };
  }
  return { value: whole, precision: decimalPrecision(t.decimals!), next: i + 1 };
}

/**
 * Reads a number or a range of numbers at token i, with the precision of the number as written
 * (docs/method.md §5.1). Returns null when no number starts there. Exact: precision comes from the digits as written.
 */
export function readNumberAt(tokens: Token[], i: number): WrittenNumber | null {
  if (tokens[i]?.kind === 'word' && RANGE_OPENERS.has(tokens[i]!.norm) && tokens[i + 1]?.kind === 'number') {
    const range = readNumberAt(tokens, i + 1);
    return range?.range ? range : null;
  }
  const low = readSingle(tokens, i);
  if (!low) return null;
  const joiner = tokens[low.next];
  if (joiner && RANGE_JOINERS.has(joiner.norm) && (joiner.kind === 'symbol' || !joiner.dotted)) {
    const high = readSingle(tokens, low.next + 1);
    if (high && high.value > low.value) {
      const precision = Math.max(low.precision, high.precision);
      return {
        value: (low.value + high.value) / 2,
        precision,
        uncertainty: (high.value - low.value) / 2 + precision / 2,
        range: { low: low.value, high: high.value },
        next: high.next,
      };
    }
  }
  return { value: low.value, precision: low.precision, uncertainty: low.precision / 2, next: low.next };
}

/**
 * Reads a distance number as written, with its precision and δ (docs/method.md §5.1).
 * @example readDistanceNumber("1 1/2") // { value: 1.5, precision: 0.5, uncertainty: 0.25, next: 4 }
 * @example readDistanceNumber("100")   // precision 10, uncertainty 5
 * Returns null when the text is not a number or range.
 */
export function readDistanceNumber(written: string): WrittenNumber | null {
  const tokens = tokenize(written);
  const read = readNumberAt(tokens, 0);
  return read && read.next === tokens.length ? read : null;
}

/**
 * True when the number at `k` is an ordinal: an ordinal mark or ending is written on it, and an ordinal noun
 * comes before it or after its list ("1º e 2º distritos", "distrito 1º", "2ª seção", "2e district"): it counts
 * districts, not degrees or miles.
 * @example ordinalAt(tokenize('Alisos, 1º e 2º distritos'), 2) // true
 */
export function ordinalAt(tokens: Token[], k: number): boolean {
  if (!ordinalMarked(tokens, k)) return false;
  let first = k;
  while (ordinalMarked(tokens, first - 3) && wordAmong(tokens[first - 1], ORDINAL_JOINS)) first -= 3;
  let last = k;
  while (ordinalMarked(tokens, last + 3) && wordAmong(tokens[last + 2], ORDINAL_JOINS)) last += 3;
  return wordAmong(tokens[first - 1], ORDINAL_NOUNS) || wordAmong(tokens[last + 2], ORDINAL_NOUNS);
}

// Module-level rather than closures in ordinalAt: it runs on every number the coordinate reader tries.
/** A number at i with an ordinal mark or ending written right on it ("1º", "2e"). */
function ordinalMarked(tokens: Token[], i: number): boolean {
  const mark = tokens[i + 1];
  return tokens[i]?.kind === 'number' && mark !== undefined && !mark.spaceBefore && ORDINAL_ENDINGS.has(mark.norm);
}

/** A token other than a number whose folded form is one of `words`. */
function wordAmong(t: Token | undefined, words: ReadonlySet<string>): boolean {
  return t !== undefined && t.kind !== 'number' && words.has(t.norm);
}
