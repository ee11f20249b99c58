/**
 * Corrected center and geographic radial of a gazetteer feature (docs/method.md §4).
 */
import type { Geometry, Position } from 'geojson';
import { localProjection, normaliseLongitude } from '../geodesy/azimuthal-equidistant.ts';
import { inverse } from '../geodesy/geodesic.ts';
import {
  convexHull,
  distanceToSegment,
  insideRings,
  smallestEnclosingCircle,
  type PlaneCircle,
  type PlanePoint,
} from '../geodesy/plane.ts';
import { largest } from '../geodesy/extremes.ts';

export interface FeatureExtent {
  /** Corrected center, WGS84 degrees, longitude in [-180, 180). */
  latitude: number;
  longitude: number;
  /** Geodesic distance from the center to the furthest vertex, meters. */
  radiusMeters: number;
}

/** What can hold the center: areas, segments (lines and ring edges), lone points; and all vertices. */
interface Parts<P> {
  polygons: P[][][];
  segments: [P, P][];
  points: P[];
  vertices: P[];
}

/** The feature's distinct positions, and its parts as indices into them (so each is projected once). */
interface FeatureParts {
  positions: Position[];
  indices: Parts<number>;
}

type PlaneParts = Parts<PlanePoint>;

const MAX_ITERATIONS = 8;
/** Stop when the solution lies within this many meters of the projection center. */
const CONVERGED_METERS = 0.001;
const GOLDEN_SECTION_STEPS = 64;

/**
 * Corrected center and geographic radial (docs/method.md §4): the smallest enclosing circle (SEC) of the
 * vertices when its center lies inside or on the feature; otherwise the point in or on the feature that
 * minimises the largest distance to the vertices (searched per segment, exactly, since the objective is
 * convex along a segment; for areas the optimum then lies on the boundary, because moving from an
 * interior point toward the SEC center only lowers the objective).
 *
 * Solved in a local azimuthal-equidistant projection on WGS84 that is re-centred on each solution
 * until the solution is within 1 mm of the projection center, where distances and azimuths are exact:
 * the center is the ellipsoidal optimum to about 1 mm for features up to a few hundred kilometres, and
 * the radius is the exact geodesic distance (±15 nm) from the returned center to the furthest vertex, so
 * the circle always holds every vertex. Edges count as straight lines in that projection (close to
 * geodesics near the feature). Antimeridian-safe (only geodesics are used). A Point gives radius 0 (the
 * gazetteer applies its default radius). Cost: two to four geodesic inversions per vertex, about
 * 0.5 ms for a 50-vertex polygon and 3–6 ms for 500 vertices (`npm run bench:method`).
 * @example featureExtent({ type: 'LineString', coordinates: [[0, 0], [0, 1]] })
 * // ≈ { latitude: 0.5, longitude: 0, radiusMeters: 55287.2 }
 */
export function featureExtent(geometry: Geometry): FeatureExtent {
  const parts = splitFeature(geometry);
  if (parts.positions.length === 0) throw new Error(`featureExtent: the ${geometry.type} has no coordinates`);
  return minimaxPoint(parts, geometry.type, solveInPlane);
}

/**
 * The smallest geodesic circle holding a set of points, its center anywhere (not constrained to the
 * points): the same re-centred projection as featureExtent, same accuracy.
 * @example enclosingCircle([[0, 0], [2, 0]]) // ≈ { latitude: 0, longitude: 1, radiusMeters: 111319.5 }
 */
export function enclosingCircle(positions: Position[]): FeatureExtent {
  if (positions.length === 0) throw new Error('enclosingCircle: no points');
  const all = positions.map((_, i) => i);
  const parts: FeatureParts = { positions, indices: { polygons: [], segments: [], points: all, vertices: all } };
  return minimaxPoint(parts, 'set of points', (plane) => {
    const circle = smallestEnclosingCircle(plane.vertices);
    return [circle.x, circle.y];
  });
}

/** Re-centres the projection on each planar solution until it stays within 1 mm of the center. */
function minimaxPoint(parts: FeatureParts, what: string, solve: (plane: PlaneParts) => PlanePoint): FeatureExtent {
  for (const vertex of parts.positions) {
    const [longitude, latitude] = vertex;
    if (!Number.isFinite(longitude) || !Number.isFinite(latitude) || Math.abs(latitude!) > 90) {
      throw new Error(`invalid position [${vertex.join(', ')}] in the ${what}`);
    }
  }
  const [first] = parts.positions;
  if (parts.positions.every((v) => v[0] === first![0] && v[1] === first![1])) {
    return { latitude: first![1]!, longitude: normaliseLongitude(first![0]!), radiusMeters: 0 };
  }
  let [latitude, longitude] = meanDirection(parts.positions);
  for (let iteration = 0; iteration < MAX_ITERATIONS; iteration++) {
    const projection = localProjection(latitude, longitude);
    const projected = projectParts(parts, (p) => projection.forward(p[1]!, p[0]!));
    const solution = solve(projected);
    if (Math.hypot(solution[0], solution[1]) <= CONVERGED_METERS) {
      const radiusMeters = largest(projected.vertices.map((v) => Math.hypot(v[0], v[1])));
      return { latitude, longitude: normaliseLongitude(longitude), radiusMeters };
    }
    [latitude, longitude] = projection.inverse(solution[0], solution[1]);
  }
  const radiusMeters = largest(parts.positions.map((v) => inverse(latitude, longitude, v[1]!, v[0]!).meters));
  return { latitude, longitude: normaliseLongitude(longitude), radiusMeters };
}

function splitFeature(geometry: Geometry): FeatureParts {
  const positions: Position[] = [];
  const indexOf = new Map<Position, number>();
  const id = (p: Position) => {
    let index = indexOf.get(p);
    if (index === undefined) indexOf.set(p, (index = positions.push(p) - 1));
    return index;
  };
  const indices: Parts<number> = { polygons: [], segments: [], points: [], vertices: [] };
  const addLine = (line: Position[]) => {
    const ids = line.map(id);
    for (let i = 1; i < ids.length; i++) indices.segments.push([ids[i - 1]!, ids[i]!]);
    if (ids.length === 1) indices.points.push(ids[0]!);
    return ids;
  };
  const add = (g: Geometry) => {
    switch (g.type) {
      case 'Point':
        indices.points.push(id(g.coordinates));
        return;
      case 'MultiPoint':
        indices.points.push(...g.coordinates.map(id));
        return;
      case 'LineString':
        addLine(g.coordinates);
        return;
      case 'MultiLineString':
        g.coordinates.forEach(addLine);
        return;
      case 'Polygon':
        indices.polygons.push(g.coordinates.map(addLine));
        return;
      case 'MultiPolygon':
        for (const rings of g.coordinates) indices.polygons.push(rings.map(addLine));
        return;
      case 'GeometryCollection':
        g.geometries.forEach(add);
        return;
    }
  };
  add(geometry);
  indices.vertices = positions.map((_, i) => i);
  return { positions, indices };
}

/** Direction of the mean of the vertices' unit vectors: a start point that is safe across the antimeridian. */
function meanDirection(vertices: Position[]): [number, number] {
  let x = 0;
  let y = 0;
  let z = 0;
  const radians = Math.PI / 180;
  for (const [longitude, latitude] of vertices) {
    const phi = latitude! * radians;
    const lambda = longitude! * radians;
    x += Math.cos(phi) * Math.cos(lambda);
    y += Math.cos(phi) * Math.sin(lambda);
    z += Math.sin(phi);
  }
  if (Math.hypot(x, y, z) < 1e-9 * vertices.length) return [vertices[0]![1]!, vertices[0]![0]!];
  return [Math.atan2(z, Math.hypot(x, y)) / radians, Math.atan2(y, x) / radians];
}

function projectParts({ positions, indices }: FeatureParts, forward: (p: Position) => PlanePoint): PlaneParts {
  const xy = positions.map(forward);
  const at = (i: number) => xy[i]!;
  return {
    polygons: indices.polygons.map((rings) => rings.map((ring) => ring.map(at))),
    segments: indices.segments.map(([a, b]) => [xy[a]!, xy[b]!]),
    points: indices.points.map(at),
    vertices: xy,
  };
}

/** The minimax point in or on the feature, in the plane. */
function solveInPlane(parts: PlaneParts): PlanePoint {
  const hull = convexHull(parts.vertices);
  const circle = smallestEnclosingCircle(hull.length > 0 ? hull : parts.vertices);
  const center: PlanePoint = [circle.x, circle.y];
  const tolerance = Math.max(CONVERGED_METERS / 10, circle.radius * 1e-12);
  if (liesOnFeature(center, parts, tolerance)) return center;

  const farthest = (p: PlanePoint) => {
    let max = 0;
    for (const v of hull) max = Math.max(max, Math.hypot(p[0] - v[0], p[1] - v[1]));
    return max;
  };
  let best: PlanePoint = parts.vertices[0]!;
  let bestValue = farthest(best);
  for (const point of parts.points) {
    const value = farthest(point);
    if (value < bestValue) [best, bestValue] = [point, value];
  }
  // Two lower bounds on the objective along a segment let most segments be skipped: for any p,
  // max distance ≥ sqrt(R² + |p − c|²) (the SEC's touching points surround c), and, the objective being
  // convex and 1-Lipschitz, its minimum on [a, b] ≥ (f(a) + f(b) − |ab|) / 2.
  const atVertex = new Map<PlanePoint, number>();
  const valueAt = (p: PlanePoint) => {
    let value = atVertex.get(p);
    if (value === undefined) atVertex.set(p, (value = farthest(p)));
    return value;
  };
  const ordered = parts.segments
    .map((segment) => {
      const [a, b] = segment;
      const fa = valueAt(a);
      const fb = valueAt(b);
      if (fa < bestValue) [best, bestValue] = [a, fa];
      if (fb < bestValue) [best, bestValue] = [b, fb];
      const lipschitz = (fa + fb - Math.hypot(b[0] - a[0], b[1] - a[1])) / 2;
      return { segment, bound: Math.max(lowerBound(circle, distanceToSegment(center, a, b)), lipschitz) * (1 - 1e-12) };
    })
    .sort((x, y) => x.bound - y.bound);
  for (const { segment, bound } of ordered) {
    if (bound >= bestValue) break;
    const [point, value] = minimiseAlongSegment(segment, farthest);
    if (value < bestValue) [best, bestValue] = [point, value];
  }
  return best;
}

function lowerBound(circle: PlaneCircle, distance: number): number {
  return Math.sqrt(circle.radius ** 2 + distance ** 2);
}

function liesOnFeature(p: PlanePoint, parts: PlaneParts, tolerance: number): boolean {
  return (
    parts.polygons.some((rings) => insideRings(p, rings)) ||
    parts.segments.some(([a, b]) => distanceToSegment(p, a, b) <= tolerance) ||
    parts.points.some((q) => Math.hypot(p[0] - q[0], p[1] - q[1]) <= tolerance)
  );
}

/** Golden-section search of a convex function along a segment; 64 steps shrink it by 1e-13. */
function minimiseAlongSegment(
  [a, b]: [PlanePoint, PlanePoint],
  objective: (p: PlanePoint) => number,
): [PlanePoint, number] {
  const at = (t: number): PlanePoint => [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
  const ratio = (Math.sqrt(5) - 1) / 2;
  let low = 0;
  let high = 1;
  let t1 = high - ratio * (high - low);
  let t2 = low + ratio * (high - low);
  let f1 = objective(at(t1));
  let f2 = objective(at(t2));
  for (let step = 0; step < GOLDEN_SECTION_STEPS; step++) {
    if (f1 <= f2) {
      high = t2;
      [t2, f2] = [t1, f1];
      t1 = high - ratio * (high - low);
      f1 = objective(at(t1));
    } else {
      low = t1;
      [t1, f1] = [t2, f2];
      t2 = low + ratio * (high - low);
      f2 = objective(at(t2));
    }
  }
  const candidates: [PlanePoint, number][] = [[a, objective(a)], [b, objective(b)], [at((low + high) / 2), objective(at((low + high) / 2))]];
  return candidates.reduce((x, y) => (y[1] < x[1] ? y : x));
}
