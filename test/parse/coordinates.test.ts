import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import { parseCoordinates, parseLocality, type WrittenCoordinates } from '../../src/parse/index.ts';

const fixtures = new URL('../fixtures/parse/', import.meta.url);
const cases: {
  readable: Array<{ text: string; latitude: number; longitude: number; format: string; precisionDegrees: number; datumWritten?: string }>;
  flagged: Array<{ text: string; problem: string }>;
  refused: string[];
} = JSON.parse(readFileSync(new URL('coordinates.json', fixtures), 'utf8'));

const read = (text: string): WrittenCoordinates => {
  const r = parseCoordinates(text);
  if ('problem' in r) throw new Error(r.problem);
  return r;
};

describe('written coordinates (fixture coordinates.json)', () => {
  for (const c of cases.readable) {
    it(c.text, () => {
      const r = read(c.text);
      expect(r.latitude).toBeCloseTo(c.latitude, 6);
      expect(r.longitude).toBeCloseTo(c.longitude, 6);
      expect(r.format).toBe(c.format);
      expect(r.precisionDegrees).toBeCloseTo(c.precisionDegrees, 8);
      expect(r.datumWritten).toBe(c.datumWritten);
      expect(r.datum).toBeUndefined();
      expect(r.problems).toEqual([]);
    });
  }
  for (const c of cases.flagged) {
    it(`flags, never fixes: ${c.text}`, () => {
      expect(read(c.text).problems.join(' ')).toContain(c.problem);
    });
  }
  for (const text of cases.refused) {
    it(`refuses ${JSON.stringify(text)} with a problem`, () => {
      expect(parseCoordinates(text)).toHaveProperty('problem');
    });
  }
  it('finds coordinates inside a locality text', () => {
    const r = parseLocality('Puerto Lindo, 10°30\'N 66°10\'O, WGS84, 800 m');
    expect(r.type).toBe('coordinates');
    expect(r.coordinates).toMatchObject({ latitude: 10.5, format: 'degrees-minutes', datumWritten: 'WGS84' });
    expect(r.coordinates!.longitude).toBeCloseTo(-66.1666667, 6);
    expect(r.elevation).toMatchObject({ minimumMeters: 800, maximumMeters: 800 });
  });
});

describe('ordinal numbers are not degrees', () => {
  // "1º" is the Portuguese and Spanish masculine ordinal indicator (first), "ª" the feminine; "1er", "2e", "1st",
  // "3o" write ordinals too. Beside a word they number (districts, sections, branch lines, leagues, kilometres)
  // they are no coordinates, and two whole degrees that name no hemisphere or axis are no latitude-longitude pair.
  it('reads "Alisos, 1º e 2º distritos" as the place Alisos, not as 2° N 1° E', () => {
    const r = parseLocality('Alisos, 1º e 2º distritos');
    expect(r.type).toBe('named-place');
    expect(r.features).toEqual(['Alisos']);
    expect(r.coordinates).toBeUndefined();
  });
  it('reads no pair from "Alisos, 1º e 2º", whose small "e" is "and", nor a distance east from "Alisos, 2e district"', () => {
    expect(parseLocality('Alisos, 1º e 2º').coordinates).toBeUndefined();
    const district = parseLocality('Alisos, 2e district');
    expect(district.type).toBe('named-place');
    expect(district.offsets).toEqual([]);
  });
  it('still reads degrees with a hemisphere, and a capital E as east', () => {
    expect(parseLocality('Alisos, 12º S e 45º O').coordinates).toMatchObject({ latitude: -12, longitude: -45 });
    expect(parseLocality('Alisos, 1º N 2º E').coordinates).toMatchObject({ latitude: 1, longitude: 2 });
  });
});

describe('UTM to latitude/longitude on the WGS84 ellipsoid', () => {
  // On the central meridian (easting 500000 m) UTM northing = k0 · meridian arc from the equator, k0 = 0.9996
  // (Snyder 1987, Map Projections — A Working Manual, USGS PP 1395, §8). The meridian arc is measured here with
  // geographiclib-geodesic (Karney 2013), a reference library independent of proj4.
  const { Geodesic } = geodesic;
  it('18T 500000 4649776 lies on 75°W at the latitude whose meridian arc × 0.9996 is the northing', () => {
    const r = read('UTM 18T 500000E 4649776N');
    expect(r.format).toBe('utm');
    expect(r.longitude).toBeCloseTo(-75, 9);
    const arc = Geodesic.WGS84.Inverse(0, -75, r.latitude, -75).s12!;
    expect(arc * 0.9996).toBeCloseTo(4649776, 3);
    expect(r.latitude).toBeCloseTo(42, 4);
  });
  it('southern bands use the 10 000 000 m false northing', () => {
    const r = read('22K 500000 7400000');
    expect(r.longitude).toBeCloseTo(-51, 9);
    const arc = Geodesic.WGS84.Inverse(0, -51, r.latitude, -51).s12!;
    expect(10000000 - arc * 0.9996).toBeCloseTo(7400000, 3);
  });
});
