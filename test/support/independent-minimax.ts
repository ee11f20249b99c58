/**
 * The minimax point of a feature (the point that minimises the largest distance to its vertices: the
 * corrected center and geographic radial, BP2020 glossary; docs/method.md §4), computed independently of
 * src/georef/feature-extent.ts with a second geodesic implementation, Vincenty's inverse and direct
 * solutions on WGS84 (Vincenty 1975, Survey Review 23:88; registry package geodesy, C. Veness, MIT; about
 * 0.5 mm), not the geographiclib the code uses:
 * - `centerMinimax`, unconstrained (when the smallest enclosing circle's center lies in the feature): that
 *   circle, from the two or three vertices that fix it;
 * - `edgeMinimax`, constrained to the feature's boundary or line: a golden-section search along each edge,
 *   an edge being the geodesic joining its vertices (as featureExtent takes it at its solution), since the
 *   largest distance is convex along an edge.
 * Slow (tens of thousands of inversions): for tests only.
 */
import { coordAll } from '@turf/turf';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import type { Geometry, Position } from 'geojson';

export interface Minimax { latitude: number; longitude: number; radiusMeters: number }

const at = ([lon, lat]: Position) => new LatLon(lat!, lon!);
const minimax = (point: LatLon, points: LatLon[]): Minimax => ({ latitude: point.lat, longitude: point.lon, radiusMeters: Math.max(...points.map((p) => meters(point, p))) });

/**
 * The unconstrained minimax of the vertices: the smallest circle holding them, which two or three of them
 * fix (a circle through fewer can shrink). First a rough center, the planar smallest circle of the vertices
 * in an equirectangular projection about their mean (every pair and triple tried, Elzinga & Hearn 1972,
 * Management Science 19(1)); then, on the ellipsoid, every pair of the vertices that could fix it (within
 * 1 km of the largest distance from that center) gives its geodesic midpoint and every triple the point
 * equidistant from the three (Newton's method on Vincenty distances, to 1e-10°), and the smallest of
 * those circles that holds every vertex is the answer.
 * @example centerMinimax({ type: 'LineString', coordinates: [[0, 0], [0, 1]] }).radiusMeters // ≈ 55287.2
 */
export function centerMinimax(geometry: Geometry): Minimax {
  const points = unique(coordAll(geometry)).map(at);
  const rough = planarCenter(points);
  const far = Math.max(...points.map((p) => meters(rough, p)));
  const support = points.filter((p) => meters(rough, p) >= far - 1000);
  if (support.length > 40) throw new Error(`${support.length} vertices could fix the circle: too many to try`);
  const centers: LatLon[] = [];
  for (let i = 0; i < support.length; i++) {
    for (let j = i + 1; j < support.length; j++) {
      const [a, b] = [support[i]!, support[j]!];
      centers.push(a.destinationPoint(meters(a, b) / 2, a.initialBearingTo(b)));
      for (let k = j + 1; k < support.length; k++) {
        const equidistant = equidistantPoint(a, b, support[k]!, rough);
        if (equidistant) centers.push(equidistant);
      }
    }
  }
  let best: Minimax = { latitude: NaN, longitude: NaN, radiusMeters: Infinity };
  for (const center of centers) {
    const radius = Math.max(...points.map((p) => meters(center, p)));
    if (radius < best.radiusMeters) best = { latitude: center.lat, longitude: center.lon, radiusMeters: radius };
  }
  return best;
}

/** Vincenty's distance, unrounded (geodesy's distanceTo rounds to 1 mm). */
const meters = (a: LatLon, b: LatLon) => a.inverse(b).distance;

function unique(positions: Position[]): Position[] {
  const seen = new Map(positions.map((p) => [`${p[0]} ${p[1]}`, p]));
  return [...seen.values()];
}

/** The planar smallest enclosing circle's center, in an equirectangular projection about the points' mean. */
function planarCenter(points: LatLon[]): LatLon {
  // Longitudes unwrapped about the first point, so that a feature across the antimeridian stays in one piece.
  const unwrap = (lon: number) => points[0]!.lon + ((((lon - points[0]!.lon + 180) % 360) + 360) % 360) - 180;
  const [lat0, lon0] = [points.reduce((s, p) => s + p.lat, 0) / points.length, points.reduce((s, p) => s + unwrap(p.lon), 0) / points.length];
  const scale = Math.cos((lat0 * Math.PI) / 180);
  const xy = points.map((p) => [(unwrap(p.lon) - lon0) * scale, p.lat - lat0] as const);
  const holds = (cx: number, cy: number, r: number) => xy.every(([x, y]) => Math.hypot(x - cx, y - cy) <= r * (1 + 1e-12) + 1e-12);
  let best = { x: 0, y: 0, r: Infinity };
  const offer = (x: number, y: number, r: number) => {
    if (r < best.r && holds(x, y, r)) best = { x, y, r };
  };
  for (let i = 0; i < xy.length; i++) {
    for (let j = i + 1; j < xy.length; j++) {
      const [[ax, ay], [bx, by]] = [xy[i]!, xy[j]!];
      offer((ax + bx) / 2, (ay + by) / 2, Math.hypot(ax - bx, ay - by) / 2);
      for (let k = j + 1; k < xy.length; k++) {
        const [cx, cy] = xy[k]!;
        const d = 2 * (ax * (by - cy) + bx * (cy - ay) + cx * (ay - by));
        if (d === 0) continue;
        const ux = ((ax * ax + ay * ay) * (by - cy) + (bx * bx + by * by) * (cy - ay) + (cx * cx + cy * cy) * (ay - by)) / d;
        const uy = ((ax * ax + ay * ay) * (cx - bx) + (bx * bx + by * by) * (ax - cx) + (cx * cx + cy * cy) * (bx - ax)) / d;
        offer(ux, uy, Math.hypot(ax - ux, ay - uy));
      }
    }
  }
  return new LatLon(lat0 + best.y, lon0 + best.x / scale);
}

/** The point equidistant from a, b and c near `start`, by Newton's method (numerical Jacobian); undefined when it does not converge nearby. */
function equidistantPoint(a: LatLon, b: LatLon, c: LatLon, start: LatLon): LatLon | undefined {
  const residual = (lat: number, lon: number) => {
    const p = new LatLon(lat, lon);
    const da = meters(p, a);
    return [da - meters(p, b), da - meters(p, c)] as const;
  };
  let [lat, lon] = [start.lat, start.lon];
  const h = 1e-6;
  for (let iteration = 0; iteration < 30; iteration++) {
    const [f1, f2] = residual(lat, lon);
    const [la1, la2] = residual(lat + h, lon);
    const [lo1, lo2] = residual(lat, lon + h);
    const [j11, j12, j21, j22] = [(la1 - f1) / h, (lo1 - f1) / h, (la2 - f2) / h, (lo2 - f2) / h];
    const determinant = j11 * j22 - j12 * j21;
    if (!(Math.abs(determinant) > 1e-9)) return undefined;
    const [dLat, dLon] = [(f1 * j22 - f2 * j12) / determinant, (f2 * j11 - f1 * j21) / determinant];
    [lat, lon] = [lat - dLat, lon - dLon];
    if (!(Math.abs(lat - start.lat) < 1 && Math.abs(lon - start.lon) < 1)) return undefined;
    if (Math.abs(dLat) + Math.abs(dLon) < 1e-10) return new LatLon(lat, lon);
  }
  return undefined;
}

/**
 * The minimax of the geometry's vertices over points on the given edges (each the geodesic between its
 * ends), by golden-section search along each (80 steps: 1e-17 of the edge).
 * @example edgeMinimax(line, [line.coordinates]).radiusMeters
 */
export function edgeMinimax(geometry: Geometry, lines: Position[][]): Minimax {
  const points = coordAll(geometry).map(at);
  const golden = (Math.sqrt(5) - 1) / 2;
  let best: Minimax = { latitude: NaN, longitude: NaN, radiusMeters: Infinity };
  for (const line of lines) {
    for (let i = 1; i < line.length; i++) {
      const [a, b] = [at(line[i - 1]!), at(line[i]!)];
      const [length, bearing] = [a.distanceTo(b), a.initialBearingTo(b)];
      const along = (t: number) => minimax(a.destinationPoint(t * length, bearing), points);
      let [low, high] = [0, 1];
      for (let step = 0; step < 80; step++) {
        const [left, right] = [high - golden * (high - low), low + golden * (high - low)];
        if (along(left).radiusMeters <= along(right).radiusMeters) high = right;
        else low = left;
      }
      for (const candidate of [along(0), along((low + high) / 2), along(1)]) if (candidate.radiusMeters < best.radiusMeters) best = candidate;
    }
  }
  return best;
}
