/**
 * Tokens of a locality text (numbers, words, symbols) with their offsets into the verbatim text and a
 * folded form (lower case, accents removed) the lexicon is written in.
 * @example tokenize('10 km NE').map((t) => t.kind) // ['number', 'word', 'word']
 */
import { UNIT_WORDS } from './units.ts';
import { DOTTED_ONLY_ADMINISTRATIVE_WORDS } from './lexicon.ts';

/** One token of a locality text; offsets point into the verbatim text. */
export interface Token {
  kind: 'number' | 'word' | 'symbol';
  /** The characters as written (for a dotted abbreviation, including its period). */
  text: string;
  /** Lower case, accents removed, trailing period removed; numbers with "." as decimal separator. */
  norm: string;
  start: number;
  end: number;
  /** Whitespace stands between this token and the previous one (or it is the first). */
  spaceBefore: boolean;
  /** A word written with a period after it ("km.", "N.", "Sta."). */
  dotted?: boolean;
  /** Numbers only: digits after the decimal separator as written ("" for an integer). */
  decimals?: string;
  /** Unicode vulgar fractions ("½"): numerator and denominator. */
  fraction?: [number, number];
}

const VULGAR_FRACTIONS: ReadonlyMap<string, [number, number]> = new Map([
  ['½', [1, 2]], ['⅓', [1, 3]], ['⅔', [2, 3]], ['¼', [1, 4]], ['¾', [3, 4]],
  ['⅛', [1, 8]], ['⅜', [3, 8]], ['⅝', [5, 8]], ['⅞', [7, 8]],
]);

/** Abbreviations longer than four letters that keep their period as part of the word. */
const LONG_ABBREVIATIONS = new Set(['approx', 'aprox', 'depto', 'dept', 'depart', 'mpio', 'munic', 'confl', 'junct', 'prov', 'vicin', 'apprx', 'envir', 'aprx', 'distr']);

/**
 * Short generic words of places that are whole words, never cut short: a period after one ends a sentence
 * ("Lake City. Fall Creek", "Stevens Pass. Wenatchee National Forest", "Lago Azul. Campo", "Lac Vert. Route").
 */
const WHOLE_SHORT_WORDS = new Set(['city', 'town', 'lake', 'pass', 'park', 'peak', 'hill', 'bay', 'cove', 'mesa', 'lago', 'rio', 'pico', 'isla', 'ilha', 'lac', 'baie', 'ile']);

/**
 * A period followed by two spaces or more after a word of two letters or more ends a sentence, as typists wrote
 * it ("Reserva Biológica de Una.  Em fundo de vale"), and is no abbreviation's [our rule, no source]; an initial's
 * period may still be followed so ("Z. P.  Las Tablas"), and a unit word counts only dotted ("South Dist.  Swale Island").
 */
const typedSentenceEnd = (text: string, period: number, norm: string): boolean =>
  norm.length >= 2 && text[period + 1] === ' ' && text[period + 2] === ' ' && !DOTTED_ONLY_ADMINISTRATIVE_WORDS.has(norm);

const isDigit = (c: string): boolean => c >= '0' && c <= '9';
const LETTER = /\p{L}/u;
const MARK = /\p{M}/u;
const WHITESPACE = /\s/;
/** ASCII letters answered directly; other characters by their Unicode category. */
const isLetter = (c: string | undefined): boolean =>
  c !== undefined && ((c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c > '\u007f' && LETTER.test(c)));

/** Lower case with accents (combining marks) removed. */
export function fold(text: string): string {
  // ASCII needs no decomposition (told by a loop: faster than a pattern on the short words folded most).
  for (let k = 0; k < text.length; k++) {
    if (text.charCodeAt(k) > 0x7f) return text.normalize('NFD').replace(/\p{M}+/gu, '').toLowerCase();
  }
  return text.toLowerCase();
}

/**
 * The verbatim text of tokens [from, to): from the first one's start to the last one's end.
 * @example writtenText('10 km N of X', tokenize('10 km N of X'), 0, 3) // '10 km N'
 */
export function writtenText(text: string, tokens: Token[], from: number, to: number): string {
  return text.slice(tokens[from]!.start, tokens[to - 1]!.end);
}

/**
 * True when a token of [from, to) passes `test`: `some` over a span of tokens, without copying the span.
 * @example someTokenIn(tokenize('10 km N'), 1, 3, (t) => t.kind === 'number') // false
 */
export function someTokenIn(tokens: Token[], from: number, to: number, test: (t: Token) => boolean): boolean {
  for (let k = Math.max(from, 0); k < Math.min(to, tokens.length); k++) if (test(tokens[k]!)) return true;
  return false;
}

/**
 * Splits a locality text into numbers, words and single-character symbols in one left-to-right pass
 * (linear time, no backtracking). Every token is written with the same fields in the same order, the ones
 * its kind lacks left undefined: one shape of object, which the readers go through fastest.
 * @example tokenize("10 km. N of X").map(t => t.norm) // ['10', 'km', 'n', 'of', 'x']
 */
export function tokenize(text: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  let space = true;
  while (i < text.length) {
    const c = text[i]!;
    if (c === ' ' || ((c < '!' || c > '~') && WHITESPACE.test(c))) {
      space = true;
      i++;
      continue;
    }
    const start = i;
    if (isDigit(c)) {
      while (i < text.length && isDigit(text[i]!)) i++;
      let decimals = '';
      const sep = text[i];
      if ((sep === '.' || sep === ',') && isDigit(text[i + 1] ?? '')) {
        i++;
        const d0 = i;
        while (i < text.length && isDigit(text[i]!)) i++;
        decimals = text.slice(d0, i);
      }
      const written = text.slice(start, i);
      tokens.push({ kind: 'number', text: written, norm: written.replace(',', '.'), start, end: i, spaceBefore: space, dotted: false, decimals, fraction: undefined });
    } else if (VULGAR_FRACTIONS.has(c)) {
      i++;
      tokens.push({ kind: 'number', text: c, norm: c, start, end: i, spaceBefore: space, dotted: false, decimals: '', fraction: VULGAR_FRACTIONS.get(c)! });
    } else if (isLetter(c)) {
      while (i < text.length && (isLetter(text[i]) || (text[i]! > '\u007f' && MARK.test(text[i]!)) || (text[i] === '-' && isLetter(text[i + 1])))) i++;
      // French elision: "d'", "l'", "qu'" stay one word so "au nord d'Aubrac" reads "d'" as "of".
      if ((text[i] === "'" || text[i] === '’') && isLetter(text[i + 1]) && /^(d|l|qu|j|s)$/i.test(text.slice(start, i))) i++;
      let word = text.slice(start, i);
      const norm = fold(word).replace('’', "'");
      let dotted = false;
      if (text[i] === '.' && (norm.length <= 4 || LONG_ABBREVIATIONS.has(norm)) && !WHOLE_SHORT_WORDS.has(norm) && !typedSentenceEnd(text, i, norm)) {
        i++;
        dotted = true;
        word = text.slice(start, i);
      }
      tokens.push({ kind: 'word', text: word, norm, start, end: i, spaceBefore: space, dotted, decimals: undefined, fraction: undefined });
    } else {
      i++;
      // Two apostrophes written for seconds ('') read as one double prime.
      // A double quote doubled ("") is one double prime, as a CSV export may leave it.
      if ((c === "'" || c === '′' || c === '"') && text[i] === c) i++;
      const written = text.slice(start, i);
      tokens.push({ kind: 'symbol', text: written, norm: written.length === 2 ? '″' : c, start, end: i, spaceBefore: space, dotted: false, decimals: undefined, fraction: undefined });
    }
    space = false;
  }
  return withNumberWords(tokens);
}

/**
 * Whole numbers written out in the four languages. Left out: words that are also articles or other words
 * ("un", "uno", "una", "um", "uma", "une"; Portuguese "dois" stays, Spanish "dos" is also Portuguese "of the").
 */
const NUMBER_WORDS: ReadonlyMap<string, number> = new Map([
  ...'one two three four five six seven eight nine ten eleven twelve thirteen fourteen fifteen sixteen seventeen eighteen nineteen twenty'.split(' ').map((w, k) => [w, k + 1] as const),
  ...'thirty forty fifty sixty seventy eighty ninety'.split(' ').map((w, k) => [w, (k + 3) * 10] as const),
  ...'tres cuatro cinco seis siete ocho nueve diez once doce quince veinte treinta cuarenta cincuenta'.split(' ').map((w, k) => [w, [3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 15, 20, 30, 40, 50][k]!] as const),
  ...'dois duas quatro sete oito dez doze quinze vinte trinta quarenta cinquenta'.split(' ').map((w, k) => [w, [2, 2, 4, 7, 8, 10, 12, 15, 20, 30, 40, 50][k]!] as const),
  ...'deux trois quatre cinq sept huit neuf dix douze quinze vingt trente quarante cinquante'.split(' ').map((w, k) => [w, [2, 3, 4, 5, 7, 8, 9, 10, 12, 15, 20, 30, 40, 50][k]!] as const),
]);

/**
 * "Forty miles S of X", "doce km al N de X": a number written out right before a distance unit becomes a
 * number token (its text as written), read with the precision of the same number written in digits. The
 * unit must be in lower case: "Twelve Mile Creek" is a name.
 */
function withNumberWords(tokens: Token[]): Token[] {
  return tokens.map((t, k) => {
    const value = t.kind === 'word' ? NUMBER_WORDS.get(t.norm) : undefined;
    const unit = tokens[k + 1];
    // A capitalised unit makes a name: "Twelve Mile Creek", "Forty Mile".
    const lowerUnit = unit?.kind === 'word' && unit.text[0] === unit.text[0]!.toLowerCase();
    return value !== undefined && lowerUnit && UNIT_WORDS.has(unit!.norm) ? { ...t, kind: 'number', norm: String(value), decimals: '', dotted: undefined } : t;
  });
}
