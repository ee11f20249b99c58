/** Test helper: geodesic area of a WKT POLYGON/MULTIPOLYGON, measured with geographiclib's PolygonArea (Karney 2013). */
import geographiclib from 'geographiclib-geodesic';

export function wktPolygonAreaSquareMeters(wkt: string): number {
  const rings = [...wkt.matchAll(/\(([^()]+)\)/g)].map((m) => m[1]!.split(',').map((pair) => pair.trim().split(/\s+/).map(Number)));
  let total = 0;
  for (const ring of rings) {
    const polygon = geographiclib.Geodesic.WGS84.Polygon(false);
    for (const [lon, lat] of ring.slice(0, -1)) polygon.AddPoint(lat!, lon!);
    // Counter-clockwise rings give a positive area (PolygonArea's sign convention).
    total += polygon.Compute(false, true).area!;
  }
  return total;
}
