import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseCoordinates, parseLocality } from '../../src/parse/index.ts';

// Property tests (fast-check): the parser never throws and always returns a typed reading, on arbitrary
// strings and on adversarial repetitions up to 10,000 characters. The per-test timeout is only a guard
// against runaway backtracking; the speed figure itself is measured by bench/parse.ts.
const TYPES = new Set(['coordinates', 'named-place', 'offset-heading', 'offset-orthogonal', 'distance-only', 'offset-path', 'heading-only', 'between', 'near', 'junction', 'no-locality', 'unparseable']);

function checkReading(text: string): void {
  const r = parseLocality(text);
  expect(TYPES.has(r.type)).toBe(true);
  expect(r.verbatim).toBe(text);
  if (r.type === 'no-locality' || r.type === 'unparseable') expect(typeof r.reason).toBe('string');
  for (const clause of r.clauses) expect(text.slice(clause.start, clause.end)).toBe(clause.text);
  const coordinates = parseCoordinates(text);
  expect(typeof coordinates).toBe('object');
}

const PIECES = ['1 ', '1', 'N ', 'N', 'de ', '°', "'", '"', '9', ' ', ',', ';', ':', '-', '/', '.', 'km ', 'of ', 'and ', 'between ', 'junction ', 'near ', 'along ', 'by road ', 'upstream ', 'a ', 'e ', 'Puerto ', 'Lindo', 'ca. ', '~', '½', 'nornor', 'sud-', 'UTM ', '18T ', '500000 ', 'N.', 'S', 'W', 'O', 'L'];

describe('robustness', () => {
  it('never throws on arbitrary strings', () => {
    fc.assert(fc.property(fc.string({ maxLength: 300 }), (text) => checkReading(text)), { numRuns: 500 });
  });

  it('never throws on strings of locality-like pieces', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...PIECES), { maxLength: 200 }), (pieces) => checkReading(pieces.join(''))),
      { numRuns: 500 },
    );
  });

  it('stays bounded on adversarial repetitions of 10,000 characters', { timeout: 60000 }, () => {
    fc.assert(
      fc.property(fc.constantFrom(...PIECES, '1 1 ', 'N N ', 'de de ', '°°', '12°30\'', '10 km N of X ', 'X, '), (piece) => {
        const text = piece.repeat(Math.ceil(10000 / piece.length)).slice(0, 10000);
        checkReading(text);
      }),
      { numRuns: 60 },
    );
    checkReading('7'.repeat(10000));
    checkReading(`${'1'.repeat(5000)}.${'2'.repeat(4999)}`);
  });

  it('refuses texts longer than 10,000 characters with a reason', () => {
    const r = parseLocality('a'.repeat(10001));
    expect(r.type).toBe('unparseable');
    expect(r.reason).toContain('10000');
  });

  it('returns a reading for a non-string input instead of throwing', () => {
    expect(parseLocality(undefined as unknown as string).type).toBe('no-locality');
  });
});
