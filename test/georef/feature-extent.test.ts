import { coordAll } from '@turf/turf';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Geometry, Position } from 'geojson';
import { enclosingCircle, featureExtent } from '../../src/georef/feature-extent.ts';
import { inverse } from '../../src/geodesy/geodesic.ts';

// Independent check: the minimax point found by brute force — a grid search over candidate points in or
// on the feature, measured with geodesic distances (geographiclib) to every vertex, refined twice.
const vertices = (geometry: Geometry): Position[] => coordAll(geometry);
const worst = (lat: number, lon: number, points: Position[]) =>
  Math.max(...points.map(([x, y]) => inverse(lat, lon, y!, x!).meters));

/** Candidate points: a dense sampling of the edges plus, for polygons, grid points inside. */
function bruteForce(geometry: Geometry, candidates: Position[]) {
  const points = vertices(geometry);
  let best = { latitude: NaN, longitude: NaN, radiusMeters: Infinity };
  for (const [lon, lat] of candidates) {
    const r = worst(lat!, lon!, points);
    if (r < best.radiusMeters) best = { latitude: lat!, longitude: lon!, radiusMeters: r };
  }
  return best;
}
function sampleEdges(lines: Position[][], steps: number): Position[] {
  const out: Position[] = [];
  for (const line of lines)
    for (let i = 1; i < line.length; i++)
      for (let k = 0; k <= steps; k++) {
        const [a, b] = [line[i - 1]!, line[i]!];
        const t = k / steps;
        let dlon = b[0]! - a[0]!;
        if (dlon > 180) dlon -= 360;
        if (dlon < -180) dlon += 360;
        out.push([a[0]! + t * dlon, a[1]! + t * (b[1]! - a[1]!)]);
      }
  return out;
}
function grid(lat0: number, lon0: number, halfDegrees: number, n: number): Position[] {
  const out: Position[] = [];
  for (let i = -n; i <= n; i++) for (let j = -n; j <= n; j++) out.push([lon0 + (j * halfDegrees) / n, lat0 + (i * halfDegrees) / n]);
  return out;
}

describe('featureExtent (method §4) against brute force over geodesic distances', () => {
  it('a point gives the point and radius 0', () => {
    expect(featureExtent({ type: 'Point', coordinates: [-60.5, -12.25] })).toEqual({ latitude: -12.25, longitude: -60.5, radiusMeters: 0 });
  });

  it('convex polygon: SEC center inside; radius equals the minimax over a fine grid', () => {
    const polygon: Geometry = { type: 'Polygon', coordinates: [[[-47, -15], [-46, -15.2], [-45.8, -14.1], [-46.9, -14], [-47, -15]]] };
    const result = featureExtent(polygon);
    const coarse = bruteForce(polygon, grid(-14.6, -46.4, 0.6, 30));
    const fine = bruteForce(polygon, grid(coarse.latitude, coarse.longitude, 0.04, 20));
    const finest = bruteForce(polygon, grid(fine.latitude, fine.longitude, 0.004, 20));
    // The grid's last step is 0.0002° (about 22 m): the brute-force minimax is that close to the optimum.
    expect(result.radiusMeters).toBeLessThanOrEqual(finest.radiusMeters + 0.01);
    expect(result.radiusMeters).toBeGreaterThan(finest.radiusMeters - 22);
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
    const best = bruteForce(crescent, sampleEdges([ring], 200));
    expect(result.radiusMeters).toBeLessThanOrEqual(best.radiusMeters + 0.01);
    expect(result.radiusMeters).toBeGreaterThan(best.radiusMeters - 5);
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
    const best = bruteForce(islands, sampleEdges(edges, 400));
    expect(result.radiusMeters).toBeLessThanOrEqual(best.radiusMeters + 0.01);
    expect(result.radiusMeters).toBeGreaterThan(best.radiusMeters - 5);
    expect(result.longitude).toBeCloseTo(best.longitude, 2);
  });

  it('a bent line: the center is on the line', () => {
    const line: Geometry = { type: 'LineString', coordinates: [[-70, -30], [-69.5, -29.6], [-69, -30]] };
    const result = featureExtent(line);
    const best = bruteForce(line, sampleEdges([line.coordinates], 2000));
    expect(result.radiusMeters).toBeLessThanOrEqual(best.radiusMeters + 0.01);
    expect(result.radiusMeters).toBeGreaterThan(best.radiusMeters - 2);
  });

  it('a polygon crossing the antimeridian', () => {
    const polygon: Geometry = { type: 'Polygon', coordinates: [[[179.6, -17], [-179.7, -17.1], [-179.8, -16.4], [179.5, -16.5], [179.6, -17]]] };
    const result = featureExtent(polygon);
    expect(Math.abs(result.longitude)).toBeGreaterThan(179.4);
    const shifted = grid(-16.75, 179.9, 0.5, 40);
    const coarse = bruteForce(polygon, shifted);
    const fine = bruteForce(polygon, grid(coarse.latitude, coarse.longitude, 0.02, 20));
    const finest = bruteForce(polygon, grid(fine.latitude, fine.longitude, 0.002, 20));
    // Last grid step 0.0001° (about 11 m).
    expect(result.radiusMeters).toBeLessThanOrEqual(finest.radiusMeters + 0.01);
    expect(result.radiusMeters).toBeGreaterThan(finest.radiusMeters - 11);
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

  it('enclosingCircle of scattered points matches a brute-force grid search', () => {
    const points: Position[] = [[30, 10], [30.8, 10.1], [30.3, 10.9], [30.5, 10.4], [30.1, 10.6]];
    const result = enclosingCircle(points);
    const multi: Geometry = { type: 'LineString', coordinates: points };
    const coarse = bruteForce(multi, grid(10.5, 30.4, 0.6, 30));
    const fine = bruteForce(multi, grid(coarse.latitude, coarse.longitude, 0.04, 20));
    const finest = bruteForce(multi, grid(fine.latitude, fine.longitude, 0.004, 20));
    // Last grid step 0.0002° (about 22 m).
    expect(result.radiusMeters).toBeLessThanOrEqual(finest.radiusMeters + 0.01);
    expect(result.radiusMeters).toBeGreaterThan(finest.radiusMeters - 22);
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
    const best = bruteForce(annulus, sampleEdges([hole], 40));
    expect(result.radiusMeters).toBeLessThanOrEqual(best.radiusMeters + 0.01);
    expect(result.radiusMeters).toBeGreaterThan(best.radiusMeters - 50);
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
