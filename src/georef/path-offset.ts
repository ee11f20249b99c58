/** Following a line for a distance from where it leaves a feature (docs/method.md §3, "along a path"). */
import type { Geometry, Position } from 'geojson';
import { direct, inverse } from '../geodesy/geodesic.ts';

/** A point reached along the line, with the azimuth from the feature's center to it. */
export interface PathEnd {
  latitude: number;
  longitude: number;
  /** Azimuth from the feature's center to the end, degrees in [0, 360). */
  azimuthFromCenter: number;
}

/** Bisection steps for the crossing of the extent circle: 50 halvings leave < 1 nm of a 1000 km segment. */
const BISECTION_STEPS = 50;

/**
 * Every point reached by following the line `meters` (geodesic lengths of its segments) outward from a
 * place where it crosses the feature's extent circle (center, radius). Each crossing gives one end
 * per direction that leads out of the circle; a walk that runs off the end of the line gives none.
 * Accuracy: crossings found by bisection to under a nanometre on the geodesic segment, walks exact along
 * geodesic segments (geographiclib, ~15 nm per step).
 * @example pathEnds(line, 10.5, -66.9, 2000, 10000) // [{ latitude, longitude, azimuthFromCenter }, …]
 */
export function pathEnds(line: Geometry, latitude: number, longitude: number, radiusMeters: number, meters: number): PathEnd[] {
  const parts = line.type === 'LineString' ? [line.coordinates] : line.type === 'MultiLineString' ? line.coordinates : [];
  const ends: PathEnd[] = [];
  const from = (p: Position) => inverse(latitude, longitude, p[1]!, p[0]!).meters;
  for (const part of parts) {
    for (const direction of [1, -1] as const) {
      const vertices = direction === 1 ? part : [...part].reverse();
      for (let i = 1; i < vertices.length; i++) {
        const [a, b] = [vertices[i - 1]!, vertices[i]!];
        if (!(from(a) <= radiusMeters && from(b) > radiusMeters)) continue;
        const exit = crossing(a, b, (p) => from(p) > radiusMeters);
        const end = walk([exit, ...vertices.slice(i)], meters);
        if (end) {
          const azimuth = inverse(latitude, longitude, end[1]!, end[0]!).azimuth1;
          ends.push({ latitude: end[1]!, longitude: end[0]!, azimuthFromCenter: (azimuth + 360) % 360 });
        }
      }
    }
  }
  return ends;
}

/** The point of the geodesic a→b where `outside` first holds (a inside, b outside), by bisection. */
function crossing(a: Position, b: Position, outside: (p: Position) => boolean): Position {
  const segment = inverse(a[1]!, a[0]!, b[1]!, b[0]!);
  const at = (t: number): Position => {
    const p = direct(a[1]!, a[0]!, segment.azimuth1, t * segment.meters);
    return [p.longitude, p.latitude];
  };
  let [low, high] = [0, 1];
  for (let step = 0; step < BISECTION_STEPS; step++) {
    const middle = (low + high) / 2;
    if (outside(at(middle))) high = middle;
    else low = middle;
  }
  return at(high);
}

/** The point `meters` along a polyline from its first vertex, or undefined when the line is shorter. */
function walk(vertices: Position[], meters: number): Position | undefined {
  let left = meters;
  for (let i = 1; i < vertices.length; i++) {
    const [a, b] = [vertices[i - 1]!, vertices[i]!];
    const segment = inverse(a[1]!, a[0]!, b[1]!, b[0]!);
    if (segment.meters >= left) {
      const p = direct(a[1]!, a[0]!, segment.azimuth1, left);
      return [p.longitude, p.latitude];
    }
    left -= segment.meters;
  }
  return undefined;
}
