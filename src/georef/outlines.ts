/**
 * Polygon outlines for point tests: inside or not, and how far to the nearest edge. Used by the
 * plausibility checks (a point outside the record's country, a point at sea).
 */
import type { MultiPolygon, Polygon } from 'geojson';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { localProjection, normaliseLongitude } from '../geodesy/azimuthal-equidistant.ts';
import { distanceToSegment, type PlanePoint } from '../geodesy/plane.ts';

/** One polygon (outer ring and holes) with its bounding box [west, south, east, north], degrees. */
export interface Outline {
  polygon: Polygon;
  bbox: [number, number, number, number];
}

/**
 * The polygons of a Polygon or MultiPolygon, each with its bounding box.
 * @example outlinesOf({ type: 'Polygon', coordinates: [[[0, 0], [1, 0], [1, 1], [0, 0]]] })[0].bbox // [0, 0, 1, 1]
 */
export function outlinesOf(geometry: Polygon | MultiPolygon): Outline[] {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  return polygons.map((rings) => {
    let [west, south, east, north] = [Infinity, Infinity, -Infinity, -Infinity];
    for (const [x, y] of rings[0] ?? []) {
      west = Math.min(west, x!);
      east = Math.max(east, x!);
      south = Math.min(south, y!);
      north = Math.max(north, y!);
    }
    return { polygon: { type: 'Polygon', coordinates: rings }, bbox: [west, south, east, north] };
  });
}

/**
 * Whether a point lies inside any of the outlines (turf's ray casting; holes excluded).
 * @example insideOutlines(0.5, 0.5, outlinesOf(square)) // true
 */
export function insideOutlines(latitude: number, longitude: number, outlines: readonly Outline[]): boolean {
  return outlinesInBand(outlines, latitude, latitude).some(({ bbox: [w, s, e, n], polygon }) =>
    latitude >= s && latitude <= n && longitude >= w && longitude <= e && booleanPointInPolygon([longitude, latitude], polygon));
}

/**
 * Outline indexes by whole degree of latitude: for each band [k − 90, k − 89) the outlines whose box reaches
 * into it, in their order. Built once for each list (the lists come from caches: Natural Earth's land, a
 * gazetteer's country outlines), so a point tested against a world of coastlines looks only at the few
 * near its latitude.
 */
const bandsByOutlines = new WeakMap<readonly Outline[], number[][]>();

function latitudeBand(latitude: number): number {
  return Math.min(179, Math.max(0, Math.floor(latitude + 90)));
}

/**
 * The outlines whose box may reach latitudes south..north, in their order: every outline whose box
 * overlaps that range, and perhaps some near it (callers test the box themselves).
 */
function outlinesInBand(outlines: readonly Outline[], south: number, north: number): readonly Outline[] {
  let bands = bandsByOutlines.get(outlines);
  if (!bands) {
    const built: number[][] = Array.from({ length: 180 }, () => []);
    outlines.forEach(({ bbox: [, s, , n] }, i) => {
      // A box that is no range (an empty ring's [Infinity, −Infinity]) goes in every band: the callers' own tests judge it.
      const [from, to] = s <= n ? [latitudeBand(s), latitudeBand(n)] : [0, 179];
      for (let band = from; band <= to; band++) built[band]!.push(i);
    });
    bandsByOutlines.set(outlines, (bands = built));
  }
  if (!(south <= north)) return outlines;
  const first = latitudeBand(south);
  const last = latitudeBand(north);
  if (first === last) return bands[first]!.map((i) => outlines[i]!);
  const indexes = new Set<number>();
  for (let band = first; band <= last; band++) for (const i of bands[band]!) indexes.add(i);
  return [...indexes].sort((a, b) => a - b).map((i) => outlines[i]!);
}

// Shortest length of a degree of latitude on WGS84 (at the equator, 110 574 m; method §5.3) and of longitude at the equator.
const METERS_PER_DEGREE_LATITUDE = 110_574;
const METERS_PER_DEGREE_LONGITUDE_AT_EQUATOR = 111_320;

/**
 * Shortest distance in meters from a point to the edges of the outlines, looking no farther than
 * `withinMeters` (Infinity when no edge is that close). Edges are shortlisted by a plate carrée estimate
 * around the point (cheap), then the shortlist is measured in a local azimuthal equidistant projection
 * centred on the point: distances to vertices are geodesic, and to points inside an edge good to about
 * (ρ/R)²/6 of ρ (under 0.1 % within 150 km). Beyond a few hundred km the shortlist may miss the nearest
 * edge by the estimate's distortion, so a distance that large may be overstated by a few percent.
 * @example distanceToOutlines(0.5, 2, outlinesOf(unitSquare), 500_000) // ≈ 111 000 (1° of longitude at the equator)
 */
export function distanceToOutlines(latitude: number, longitude: number, outlines: readonly Outline[], withinMeters: number): number {
  const halfHeight = withinMeters / METERS_PER_DEGREE_LATITUDE;
  const widestLatitude = Math.min(90, Math.abs(latitude) + halfHeight);
  const cosine = Math.cos((widestLatitude * Math.PI) / 180);
  const halfWidth = cosine < 0.01 ? 180 : Math.min(180, withinMeters / (METERS_PER_DEGREE_LONGITUDE_AT_EQUATOR * cosine));
  // Positions relative to the point, longitude brought into [-180, 180) so windows work across 180°.
  const relative = (x: number, y: number): PlanePoint => [normaliseLongitude(x - longitude), y - latitude];
  const touchesWindow = (a: PlanePoint, b: PlanePoint) =>
    Math.max(a[0], b[0]) >= -halfWidth && Math.min(a[0], b[0]) <= halfWidth && Math.max(a[1], b[1]) >= -halfHeight && Math.min(a[1], b[1]) <= halfHeight
    && Math.abs(a[0] - b[0]) < 180; // an edge is never half the world wide; a wrapped pair is two sides of 180°
  const projection = localProjection(latitude, longitude);
  const metersPerDegreeLongitude = METERS_PER_DEGREE_LONGITUDE_AT_EQUATOR * Math.cos((latitude * Math.PI) / 180);
  const estimate = ([x, y]: PlanePoint): PlanePoint => [x * metersPerDegreeLongitude, y * METERS_PER_DEGREE_LATITUDE];
  const shortlist: { a: number[]; b: number[]; estimate: number }[] = [];
  let nearestEstimate = Infinity;
  for (const { bbox: [w, s, e, n], polygon } of outlinesInBand(outlines, latitude - halfHeight, latitude + halfHeight)) {
    if (s > latitude + halfHeight || n < latitude - halfHeight) continue;
    if (halfWidth < 180 && !spansPoint(w, e, longitude, halfWidth)) continue;
    // A world outline (the Americas: 9,378 vertices) is read only where its edges reach the window's latitudes.
    const near = edgesInBand(polygon, latitude - halfHeight - BAND_MARGIN_DEGREES, latitude + halfHeight + BAND_MARGIN_DEGREES);
    polygon.coordinates.forEach((ring, r) => {
      const visit = (i: number) => {
        const a = ring[i - 1]!;
        const b = ring[i]!;
        const ra = relative(a[0]!, a[1]!);
        const rb = relative(b[0]!, b[1]!);
        if (!touchesWindow(ra, rb)) return;
        const estimated = distanceToSegment([0, 0], estimate(ra), estimate(rb));
        nearestEstimate = Math.min(nearestEstimate, estimated);
        shortlist.push({ a, b, estimate: estimated });
      };
      if (near) for (const i of near[r]!) visit(i);
      else for (let i = 1; i < ring.length; i++) visit(i);
    });
  }
  // [CHOICE] edges within a quarter and 1 km of the best estimate are measured exactly.
  let nearest = Infinity;
  for (const edge of shortlist) {
    if (edge.estimate > nearestEstimate * 1.25 + 1000) continue;
    const pa = projection.forward(edge.a[1]!, edge.a[0]!);
    const pb = projection.forward(edge.b[1]!, edge.b[0]!);
    nearest = Math.min(nearest, distanceToSegment([0, 0], pa, pb));
  }
  return nearest <= withinMeters ? nearest : Infinity;
}

/** The window's latitudes are widened by this before the bands are picked, against rounding in relative latitudes. */
const BAND_MARGIN_DEGREES = 1e-6;

/** Polygons with fewer vertices than this are read whole: an index of their edges would save little. */
const INDEXED_POLYGON_VERTICES = 256;

/** For a large polygon, by band (as bandsByOutlines), each ring's edges reaching into the band, by the index of their end vertex. */
const edgeBandsByPolygon = new WeakMap<Polygon, number[][][]>();

/**
 * For each ring of a large polygon, the indexes i of the edges ring[i − 1]–ring[i] that may reach latitudes
 * south..north, increasing: every edge that does, perhaps some near them (callers test each edge
 * themselves). Undefined for a small polygon, or a range that is no range: read every edge.
 */
function edgesInBand(polygon: Polygon, south: number, north: number): number[][] | undefined {
  const rings = polygon.coordinates;
  if (!(south <= north) || rings.reduce((n, ring) => n + ring.length, 0) < INDEXED_POLYGON_VERTICES) return undefined;
  let bands = edgeBandsByPolygon.get(polygon);
  if (!bands) {
    const built: number[][][] = Array.from({ length: 180 }, () => rings.map(() => []));
    rings.forEach((ring, r) => {
      for (let i = 1; i < ring.length; i++) {
        const [y1, y2] = [ring[i - 1]![1]!, ring[i]![1]!];
        // An edge with a latitude that is not a number is never near: touchesWindow refuses it too.
        for (let band = latitudeBand(Math.min(y1, y2)); band <= latitudeBand(Math.max(y1, y2)); band++) built[band]![r]!.push(i);
      }
    });
    edgeBandsByPolygon.set(polygon, (bands = built));
  }
  const first = latitudeBand(south);
  const last = latitudeBand(north);
  if (first === last) return bands[first];
  return rings.map((_, r) => {
    const indexes = new Set<number>();
    for (let band = first; band <= last; band++) for (const i of bands![band]![r]!) indexes.add(i);
    return [...indexes].sort((a, b) => a - b);
  });
}

/** Whether the longitudes west..east, widened by `margin` degrees, hold `longitude` (allowing for 180°). */
function spansPoint(west: number, east: number, longitude: number, margin: number): boolean {
  return [longitude - 360, longitude, longitude + 360].some((x) => x >= west - margin && x <= east + margin);
}
