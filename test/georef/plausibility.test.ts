/**
 * The plausibility rules on real outlines: Natural Earth 1:50m land and countries (public domain), as
 * the registry package world-atlas 2.0.2 ships them. Distances are checked against turf's
 * pointToPolygonDistance (@turf/point-to-polygon-distance 7.4.0, geodesic method on a sphere), an
 * implementation independent of ours; a sphere and the ellipsoid differ by up to about 0.5 %.
 */
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { pointToPolygonDistance } from '@turf/point-to-polygon-distance';
import geographiclib from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { NATURAL_EARTH, naturalEarthCountry, naturalEarthLand } from '../../src/georef/natural-earth.ts';
import { distanceToOutlines, insideOutlines } from '../../src/georef/outlines.ts';
import { atSea, clausesConflict, outsideRecordCountry, TERRITORIAL_SEA_METERS, type NamedOutlines } from '../../src/georef/plausibility.ts';

const france: NamedOutlines = { name: 'Natural Earth France', outlines: naturalEarthCountry('FR')!, toleranceMeters: NATURAL_EARTH.toleranceMeters };
const land: NamedOutlines = { name: 'Natural Earth land', outlines: naturalEarthLand(), toleranceMeters: NATURAL_EARTH.toleranceMeters };
const onLand = (latitude: number, longitude: number) => insideOutlines(latitude, longitude, land.outlines);
const circle = (latitude: number, longitude: number, radiusMeters: number) => ({ latitude, longitude, radiusMeters });

// Places (WGS84, rounded; from memory, each well away from any border or shore the check depends on).
const PARIS = [48.8566, 2.3522] as const;
const MADRID = [40.4168, -3.7038] as const;
const OFF_MARSEILLE = [43.1, 5.37] as const; // Mediterranean, about 10–15 km south of the islands off the city
const MID_ATLANTIC = [0, -30] as const;

describe('outsideRecordCountry (Natural Earth 1:50m countries)', () => {
  it('passes a point inside the country', () => {
    expect(outsideRecordCountry(circle(...PARIS, 1000), 'FR', france, onLand)).toBeUndefined();
  });

  it('flags a point in another country, with its distance from the outline as turf measures it', () => {
    const finding = outsideRecordCountry(circle(...MADRID, 1000), 'FR', france, onLand);
    expect(finding?.flag).toBe('outside-record-country');
    const ours = distanceToOutlines(...MADRID, france.outlines, 2_000_000);
    const reference = Math.min(...france.outlines.map((o) => pointToPolygonDistance([MADRID[1], MADRID[0]], o.polygon, { units: 'meters', method: 'geodesic' })));
    expect(Math.abs(ours - reference) / reference).toBeLessThan(0.01);
    expect(finding?.remark).toContain(`${Math.round(ours / 1000)} km from its outline`);
  });

  it("does not flag a point at sea within the country's territorial sea (12 nautical miles, UNCLOS 1982 art. 3)", () => {
    const distance = distanceToOutlines(...OFF_MARSEILLE, france.outlines, 100_000);
    expect(distance).toBeGreaterThan(NATURAL_EARTH.toleranceMeters);
    expect(distance).toBeLessThan(TERRITORIAL_SEA_METERS);
    expect(outsideRecordCountry(circle(...OFF_MARSEILLE, 500), 'FR', france, onLand)).toBeUndefined();
  });
});

describe('atSea (Natural Earth 1:50m land)', () => {
  it('flags a circle in the open ocean', () => {
    expect(atSea(circle(...MID_ATLANTIC, 10_000), [], [() => land])?.flag).toBe('at-sea');
  });

  it('does not flag a circle whose point is within the land outline\'s accuracy of the shore', () => {
    const distance = distanceToOutlines(...OFF_MARSEILLE, land.outlines, 100_000);
    // Radius + 5 km tolerance reaches the shore: not flagged; a radius 6 km short of it: flagged.
    expect(atSea(circle(...OFF_MARSEILLE, distance - NATURAL_EARTH.toleranceMeters + 100), [], [() => land])).toBeUndefined();
    expect(atSea(circle(...OFF_MARSEILLE, distance - NATURAL_EARTH.toleranceMeters - 1000), [], [() => land])?.flag).toBe('at-sea');
  });

  it('does not flag a circle that holds the gazetteer place it was made from (an islet no world map draws)', () => {
    expect(atSea(circle(...MID_ATLANTIC, 2000), [{ latitude: 0.01, longitude: -30 }], [() => land])).toBeUndefined();
  });
});

describe('clausesConflict', () => {
  // Distances by geographiclib's inverse solution (Karney 2013), independent of the check's own call.
  const apart = (a: readonly [number, number], b: readonly [number, number]) => geographiclib.Geodesic.WGS84.Inverse(a[0], a[1], b[0], b[1]).s12!;
  const A = [-45.2, -131.4] as const;
  const B = [-45.5, -131.4] as const;

  it('flags circles that do not touch and passes circles that do', () => {
    const d = apart(A, B);
    expect(clausesConflict({ text: 'a', ...circle(...A, d / 2 - 100) }, { text: 'b', ...circle(...B, d / 2 - 100) })?.flag).toBe('clauses-conflict');
    expect(clausesConflict({ text: 'a', ...circle(...A, d / 2 + 100) }, { text: 'b', ...circle(...B, d / 2 + 100) })).toBeUndefined();
  });
});

describe('insideOutlines over the whole land (outlines looked up by latitude band)', () => {
  it('answers as turf\'s point-in-polygon over every outline, for points near every 97th shore vertex', () => {
    // The reference: @turf/boolean-point-in-polygon 7.4.0 on each polygon, no index.
    const points = land.outlines.flatMap(({ polygon }, i) => (i % 97 === 0 ? polygon.coordinates[0]!.filter((_, j) => j % 7 === 0) : []))
      .flatMap(([lon, lat]) => [[lon! + 0.03, lat! + 0.02], [lon! - 0.02, lat! - 0.03]]);
    expect(points.length).toBeGreaterThan(100);
    for (const [lon, lat] of points) {
      const reference = land.outlines.some(({ polygon }) => booleanPointInPolygon([lon!, lat!], polygon));
      expect(insideOutlines(lat!, lon!, land.outlines)).toBe(reference);
    }
  });
});
