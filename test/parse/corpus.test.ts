import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseLocality } from '../../src/parse/index.ts';
import { expectedFixture } from '../support/expected-fixture.ts';
import { intentMismatches, summarize, type CorpusEntry } from './corpus-summary.ts';

// Invented locality strings (invented place names only) in four languages. Each entry carries a hand-written
// intent (type, features, heading) checked always, and the full reading in corpus-<lang>.expected.json,
// which UPDATE_FIXTURES=1 never overwrites: it writes corpus-<lang>.expected.new.json beside it, and the test
// stays red until a person has read the difference and moved the new file over the old.
const fixtures = new URL('../fixtures/parse/', import.meta.url);

for (const language of ['en', 'es', 'pt', 'fr']) {
  describe(`corpus ${language}`, () => {
    const entries: CorpusEntry[] = JSON.parse(readFileSync(new URL(`corpus-${language}.input.json`, fixtures), 'utf8'));
    const expectedFile = fileURLToPath(new URL(`corpus-${language}.expected.json`, fixtures));
    const readings = entries.map((entry) => ({ text: entry.text, expected: summarize(parseLocality(entry.text)) }));

    it('reads every text as its hand-written intent says', () => {
      const mismatches = entries.flatMap((entry) => intentMismatches(entry, parseLocality(entry.text)).map((m) => `${entry.text}: ${m}`));
      expect(mismatches).toEqual([]);
    });

    it('matches the recorded readings', () => {
      expect(readings).toEqual(expectedFixture(expectedFile, readings, 1));
    });
  });
}

describe('corpus size', () => {
  it('holds at least 400 texts, at least 60 of them refusals, in four languages', () => {
    const all = ['en', 'es', 'pt', 'fr'].flatMap((language) => JSON.parse(readFileSync(new URL(`corpus-${language}.input.json`, fixtures), 'utf8')) as CorpusEntry[]);
    expect(all.length).toBeGreaterThanOrEqual(400);
    expect(all.filter((e) => e.intent.type === 'refused').length).toBeGreaterThanOrEqual(60);
    const types = new Set(all.map((e) => e.intent.type));
    for (const type of ['coordinates', 'named-place', 'offset-heading', 'offset-orthogonal', 'distance-only', 'offset-path', 'heading-only', 'between', 'near', 'junction', 'refused']) {
      expect(types).toContain(type);
    }
  });
});
