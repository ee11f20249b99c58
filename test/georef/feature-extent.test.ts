import { coordAll } from '@turf/turf';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Geometry, Position } from 'geojson';
import { enclosingCircle, featureExtent } from '../../src/georef/feature-extent.ts';
import { inverse } from '../../src/geodesy/geodesic.ts';
import { centerMinimax, edgeMinimax, type Minimax } from '../support/independent-minimax.ts';

// Independent check: the minimax point computed with Vincenty's solutions (test/support/independent-minimax.ts).
// featureExtent states its center to about 1 mm and its radius exact for that center (its doc comment), so
// the radii must agree to 1 cm.
const vertices = (geometry: Geometry): Position[] => coordAll(geometry);
const worst = (lat: number, lon: number, points: Position[]) =>
  Math.max(...points.map(([x, y]) => inverse(lat, lon, y!, x!).meters));

/** featureExtent's radius within 1 cm of the independent minimax. */
function expectSameMinimax(result: Minimax, reference: Minimax) {
  expect(Math.abs(result.radiusMeters - reference.radiusMeters), `radius ${result.radiusMeters} against ${reference.radiusMeters}`).toBeLessThan(0.01);
}

describe('featureExtent (method §4) against an independent minimax over Vincenty distances', () => {
  it('a point gives the point and radius 0', () => {
    expect(featureExtent({ type: 'Point', coordinates: [-60.5, -12.25] })).toEqual({ latitude: -12.25, longitude: -60.5, radiusMeters: 0 });
  });

  it('convex polygon: SEC center inside; radius equals the independent smallest enclosing circle', () => {
    const polygon: Geometry = { type: 'Polygon', coordinates: [[[-47, -15], [-46, -15.2], [-45.8, -14.1], [-46.9, -14], [-47, -15]]] };
    const result = featureExtent(polygon);
    expectSameMinimax(result, centerMinimax(polygon));
    expect(worst(result.latitude, result.longitude, vertices(polygon))).toBeCloseTo(result.radiusMeters, 3);
  });

  it('concave crescent: SEC center falls outside, so the center is on the boundary', () => {
    const ring: Position[] = [];
    for (let i = 0; i <= 24; i++) ring.push([10 + Math.cos((Math.PI * i) / 24), 40 + 0.75 * Math.sin((Math.PI * i) / 24)]);
    for (let i = 24; i >= 0; i--) ring.push([10 + 0.8 * Math.cos((Math.PI * i) / 24), 40 + 0.6 * Math.sin((Math.PI * i) / 24)]);
    ring.push(ring[0]!);
    const crescent: Geometry = { type: 'Polygon', coordinates: [ring] };
    const result = featureExtent(crescent);
    // The SEC of the two horns is centred near (10°E, 40°N), outside the crescent.
    expect(result.latitude).toBeGreaterThan(40.5);
    expectSameMinimax(result, edgeMinimax(crescent, [ring]));
  });

  it('multipart: two islands, the center lies on one of them', () => {
    const islands: Geometry = {
      type: 'MultiPolygon',
      coordinates: [
        [[[0, 0], [0.2, 0], [0.2, 0.2], [0, 0.2], [0, 0]]],
        [[[1, 0.05], [1.1, 0.05], [1.1, 0.15], [1, 0.15], [1, 0.05]]],
      ],
    };
    const result = featureExtent(islands);
    const edges = [islands.coordinates[0]![0]!, islands.coordinates[1]![0]!];
    const best = edgeMinimax(islands, edges);
    expectSameMinimax(result, best);
    expect(result.longitude).toBeCloseTo(best.longitude, 2);
  });

  it('a bent line: the center is on the line', () => {
    const line: Geometry = { type: 'LineString', coordinates: [[-70, -30], [-69.5, -29.6], [-69, -30]] };
    const result = featureExtent(line);
    expectSameMinimax(result, edgeMinimax(line, [line.coordinates]));
  });

  it('a polygon crossing the antimeridian', () => {
    const polygon: Geometry = { type: 'Polygon', coordinates: [[[179.6, -17], [-179.7, -17.1], [-179.8, -16.4], [179.5, -16.5], [179.6, -17]]] };
    const result = featureExtent(polygon);
    expect(Math.abs(result.longitude)).toBeGreaterThan(179.4);
    expectSameMinimax(result, centerMinimax(polygon));
  });

  it('rejects a geometry without coordinates with a clear error', () => {
    expect(() => featureExtent({ type: 'LineString', coordinates: [] })).toThrow(/no coordinates/);
  });

  it('enclosingCircle of two points is their geodesic midpoint with radius D/2 (geographiclib inverse)', () => {
    const circle = enclosingCircle([[-60, -12], [-60.4, -12.3]]);
    const D = inverse(-12, -60, -12.3, -60.4).meters;
    expect(circle.radiusMeters).toBeCloseTo(D / 2, 2);
    expect(inverse(circle.latitude, circle.longitude, -12, -60).meters).toBeCloseTo(D / 2, 2);
    expect(inverse(circle.latitude, circle.longitude, -12.3, -60.4).meters).toBeCloseTo(D / 2, 2);
  });

  it('enclosingCircle of scattered points matches the independent smallest enclosing circle', () => {
    const points: Position[] = [[30, 10], [30.8, 10.1], [30.3, 10.9], [30.5, 10.4], [30.1, 10.6]];
    const result = enclosingCircle(points);
    const multi: Geometry = { type: 'LineString', coordinates: points };
    expectSameMinimax(result, centerMinimax(multi));
  });

  it('annulus: the SEC center falls in the hole, so the center lies on the hole\'s edge', () => {
    const circle = (r: number, n: number, reverse: boolean): Position[] => {
      const ring = Array.from({ length: n + 1 }, (_, i) => {
        const a = (2 * Math.PI * (reverse ? n - i : i)) / n;
        return [5 + r * Math.cos(a), 5 + r * Math.sin(a)];
      });
      return ring;
    };
    const outer = circle(0.5, 36, false);
    const hole = circle(0.3, 36, true);
    const annulus: Geometry = { type: 'Polygon', coordinates: [outer, hole] };
    const result = featureExtent(annulus);
    expect(inverse(5, 5, result.latitude, result.longitude).meters).toBeGreaterThan(0.29 * 111000);
    expectSameMinimax(result, edgeMinimax(annulus, [outer, hole]));
  });
});

describe('featureExtent properties (fast-check)', () => {
  // Random star-shaped polygons: every vertex is a point of the feature, so no vertex can do better than
  // the minimax center; and the radius is exactly the furthest vertex (geographiclib inverse).
  const star = fc.record({
    latitude: fc.double({ min: -80, max: 80, noNaN: true }),
    longitude: fc.double({ min: -180, max: 180, noNaN: true }),
    radii: fc.array(fc.double({ min: 0.01, max: 0.5, noNaN: true }), { minLength: 3, maxLength: 24 }),
  });
  it('radius = furthest vertex, and no vertex is a better center', () => {
    fc.assert(
      fc.property(star, ({ latitude, longitude, radii }) => {
        const ring: Position[] = radii.map((r, i) => {
          const a = (2 * Math.PI * i) / radii.length;
          return [longitude + r * Math.cos(a), latitude + r * Math.sin(a)];
        });
        ring.push(ring[0]!);
        const polygon: Geometry = { type: 'Polygon', coordinates: [ring] };
        const result = featureExtent(polygon);
        expect(worst(result.latitude, result.longitude, ring)).toBeCloseTo(result.radiusMeters, 3);
        for (const [lon, lat] of ring) expect(result.radiusMeters).toBeLessThanOrEqual(worst(lat!, lon!, ring) + 0.01);
      }),
      { numRuns: 100 },
    );
  });
});

describe('large features', () => {
  // Detailed boundaries have hundreds of thousands of vertices; none may overflow the call stack.
  // A circle of 0.1° in lon/lat around (0°, 10°E): its farthest vertices are the two on the equator,
  // 0.1° from the center, so the enclosing circle is centred there with radius a·0.1·π/180 = 11,131.949 m
  // (WGS84 a = 6378137 m; along the equator the geodesic is the equator, Karney 2013 §5), to 1 mm.
  it('takes a ring of 200,000 vertices', () => {
    const ring: Position[] = [];
    for (let i = 0; i < 200_000; i++) {
      const a = (2 * Math.PI * i) / 200_000;
      ring.push([10 + 0.1 * Math.cos(a), 0.1 * Math.sin(a)]);
    }
    ring.push(ring[0]!);
    const extent = featureExtent({ type: 'Polygon', coordinates: [ring] });
    expect(extent.latitude).toBeCloseTo(0, 8);
    expect(extent.longitude).toBeCloseTo(10, 8);
    expect(Math.abs(extent.radiusMeters - (6378137 * 0.1 * Math.PI) / 180)).toBeLessThan(0.001);
  });
});
