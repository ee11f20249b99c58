/**
 * Plane geometry on projected points (meters), used inside a local azimuthal-equidistant projection.
 * Plain floating point: exact up to rounding (relative 1e-15 of the coordinates' size).
 */

export type PlanePoint = readonly [number, number];

export interface PlaneCircle {
  x: number;
  y: number;
  radius: number;
}

/**
 * Convex hull by Andrew's monotone chain, counter-clockwise, without repeated or collinear points.
 * @example convexHull([[0,0],[1,0],[0,1],[0.2,0.2]]) // [[0,0],[1,0],[0,1]]
 */
export function convexHull(points: readonly PlanePoint[]): PlanePoint[] {
  const sorted = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (sorted.length < 3) return sorted;
  const cross = (o: PlanePoint, a: PlanePoint, b: PlanePoint) =>
    (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const chain = (ordered: PlanePoint[]) => {
    const hull: PlanePoint[] = [];
    for (const point of ordered) {
      while (hull.length >= 2 && cross(hull[hull.length - 2]!, hull[hull.length - 1]!, point) <= 0) hull.pop();
      hull.push(point);
    }
    hull.pop();
    return hull;
  };
  return [...chain(sorted), ...chain([...sorted].reverse())];
}

/**
 * Smallest enclosing circle (Welzl 1991, iterative form) of points; the order is shuffled with a fixed
 * seed so that results are reproducible. Expected O(n).
 * @example smallestEnclosingCircle([[0,0],[2,0]]) // { x: 1, y: 0, radius: 1 }
 */
export function smallestEnclosingCircle(points: readonly PlanePoint[]): PlaneCircle {
  if (points.length === 0) throw new Error('smallestEnclosingCircle: no points');
  const shuffled = [...points];
  let seed = 12345;
  for (let i = shuffled.length - 1; i > 0; i--) {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    const j = seed % (i + 1);
    [shuffled[i], shuffled[j]] = [shuffled[j]!, shuffled[i]!];
  }
  let circle: PlaneCircle = { x: shuffled[0]![0], y: shuffled[0]![1], radius: 0 };
  for (let i = 1; i < shuffled.length; i++) {
    const p = shuffled[i]!;
    if (inCircle(circle, p)) continue;
    circle = { x: p[0], y: p[1], radius: 0 };
    for (let j = 0; j < i; j++) {
      const q = shuffled[j]!;
      if (inCircle(circle, q)) continue;
      circle = circleOnDiameter(p, q);
      for (let k = 0; k < j; k++) {
        const r = shuffled[k]!;
        if (!inCircle(circle, r)) circle = circumcircle(p, q, r) ?? circle;
      }
    }
  }
  return circle;
}

function inCircle(circle: PlaneCircle, p: PlanePoint): boolean {
  // Relative slack so that rounding does not restart the search for points on the circle.
  return Math.hypot(p[0] - circle.x, p[1] - circle.y) <= circle.radius * (1 + 1e-12) + 1e-9;
}

function circleOnDiameter(a: PlanePoint, b: PlanePoint): PlaneCircle {
  const x = (a[0] + b[0]) / 2;
  const y = (a[1] + b[1]) / 2;
  return { x, y, radius: Math.max(Math.hypot(a[0] - x, a[1] - y), Math.hypot(b[0] - x, b[1] - y)) };
}

function circumcircle(a: PlanePoint, b: PlanePoint, c: PlanePoint): PlaneCircle | undefined {
  const bx = b[0] - a[0];
  const by = b[1] - a[1];
  const cx = c[0] - a[0];
  const cy = c[1] - a[1];
  const d = 2 * (bx * cy - by * cx);
  if (d === 0) {
    // Collinear: the circle on the two furthest apart points.
    const pairs: [PlanePoint, PlanePoint][] = [[a, b], [a, c], [b, c]];
    return pairs.map(([p, q]) => circleOnDiameter(p, q)).sort((u, v) => v.radius - u.radius)[0];
  }
  const ux = (cy * (bx * bx + by * by) - by * (cx * cx + cy * cy)) / d;
  const uy = (bx * (cx * cx + cy * cy) - cx * (bx * bx + by * by)) / d;
  const x = a[0] + ux;
  const y = a[1] + uy;
  return { x, y, radius: Math.max(...[a, b, c].map((p) => Math.hypot(p[0] - x, p[1] - y))) };
}

/** Distance from a point to the segment [a, b]. */
export function distanceToSegment(p: PlanePoint, a: PlanePoint, b: PlanePoint): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const lengthSquared = dx * dx + dy * dy;
  const t = lengthSquared === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / lengthSquared));
  return Math.hypot(p[0] - (a[0] + t * dx), p[1] - (a[1] + t * dy));
}

/**
 * Even-odd point-in-polygon over all rings of one polygon (outer ring and holes), rings as closed or
 * open vertex lists. Points exactly on an edge may fall either way: test the boundary separately.
 */
export function insideRings(p: PlanePoint, rings: readonly (readonly PlanePoint[])[]): boolean {
  let inside = false;
  for (const ring of rings) {
    for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
      const a = ring[i]!;
      const b = ring[j]!;
      if (a[1] > p[1] !== b[1] > p[1] && p[0] < ((b[0] - a[0]) * (p[1] - a[1])) / (b[1] - a[1]) + a[0]) inside = !inside;
    }
  }
  return inside;
}
