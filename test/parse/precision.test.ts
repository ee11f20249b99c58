import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseLocality, readDistanceNumber } from '../../src/parse/index.ts';

// Distance precision (Chapman & Wieczorek 2020, §Uncertainty Related to Offset Precision; method §5.1)
// and heading half-widths (ibid. §Uncertainty Related to Heading; method §5.2). Sources in the fixture files.
const fixtures = new URL('../fixtures/parse/', import.meta.url);
interface DistanceCase {
  written: string;
  value: number;
  unit: string;
  uncertainty: number;
}
const precision: { published: DistanceCase[]; rules: DistanceCase[] } = JSON.parse(readFileSync(new URL('distance-precision.json', fixtures), 'utf8'));

describe('distance precision as written (method §5.1)', () => {
  for (const c of [...precision.published, ...precision.rules]) {
    it(`${c.written} → δ ${c.uncertainty} ${c.unit}`, () => {
      const r = parseLocality(`${c.written} N of Vila Serena`);
      const distance = r.offsets[0]?.distance;
      expect(distance?.unit).toBe(c.unit);
      expect(distance?.value).toBeCloseTo(c.value, 12);
      expect(distance?.uncertainty).toBeCloseTo(c.uncertainty, 12);
    });
  }

  it('reads precision from the written unit, never from a converted value (16 mi stays δ 0.5 mi)', () => {
    const distance = parseLocality('16 mi N of Vila Serena').offsets[0]!.distance!;
    expect(distance.uncertainty).toBe(0.5);
    expect(distance.uncertaintyMeters).toBeCloseTo(0.5 * 1609.344, 9);
  });

  it('readDistanceNumber reads a bare number or range and refuses anything else', () => {
    expect(readDistanceNumber('1 1/2')).toMatchObject({ value: 1.5, precision: 0.5, uncertainty: 0.25 });
    expect(readDistanceNumber('100')).toMatchObject({ value: 100, precision: 10, uncertainty: 5 });
    expect(readDistanceNumber('5-8')).toMatchObject({ value: 6.5, range: { low: 5, high: 8 }, uncertainty: 2 });
    expect(readDistanceNumber('ten')).toBeNull();
    expect(readDistanceNumber('5 km')).toBeNull();
  });
});

const headings: { cases: Array<{ text: string; azimuth: number; halfWidth: number; kind: string; toward?: boolean }> } = JSON.parse(
  readFileSync(new URL('headings.json', fixtures), 'utf8'),
);

describe('headings and their half-width Δ (method §5.2)', () => {
  for (const c of headings.cases) {
    it(`${c.text} → ${c.azimuth}° ± ${c.halfWidth}°`, () => {
      const heading = parseLocality(c.text).offsets[0]?.heading;
      expect(heading?.azimuth).toBeCloseTo(c.azimuth, 9);
      expect(heading?.halfWidth).toBeCloseTo(c.halfWidth, 9);
      expect(heading?.kind).toBe(c.kind);
      if (c.toward) expect(heading?.toward).toBe(true);
    });
  }
});
