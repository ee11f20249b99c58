import { describe, expect, it } from 'vitest';
import { circleRing, circleWKT, clipCircleToUnit, sectorRing } from '../../src/georef/footprint.ts';
import { featureExtent } from '../../src/georef/feature-extent.ts';
import { inverse } from '../../src/geodesy/geodesic.ts';
import { wktPolygonAreaSquareMeters } from './wkt-area.ts';

const positions = (wkt: string) => [...wkt.matchAll(/(-?[\d.]+) (-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])] as const);

describe('circleWKT', () => {
  it('is a closed ring of vertices exactly at the radius (geographiclib inverse), counter-clockwise', () => {
    const wkt = circleWKT(-23.5, -46.6, 2500);
    expect(wkt.startsWith('POLYGON((')).toBe(true);
    const ring = positions(wkt);
    expect(ring[0]).toEqual(ring[ring.length - 1]);
    expect(ring.length).toBe(65);
    // 7 decimals are about 1 cm.
    for (const [lon, lat] of ring) expect(inverse(-23.5, -46.6, lat, lon).meters).toBeCloseTo(2500, 1);
    // geographiclib's PolygonArea is positive for counter-clockwise rings; a 64-gon holds
    // (64/2π)·sin(2π/64) = 99.84 % of the circle's area πr² (plane geometry, r ≪ Earth radius).
    const area = wktPolygonAreaSquareMeters(wkt);
    expect(area / (Math.PI * 2500 ** 2)).toBeCloseTo((64 / (2 * Math.PI)) * Math.sin((2 * Math.PI) / 64), 4);
  });

  it('is cut at the antimeridian into a MULTIPOLYGON with every longitude in [−180, 180] and the full area', () => {
    const wkt = circleWKT(-17, 179.98, 5000, 360);
    expect(wkt.startsWith('MULTIPOLYGON(')).toBe(true);
    for (const [lon] of positions(wkt)) expect(Math.abs(lon)).toBeLessThanOrEqual(180);
    expect(wktPolygonAreaSquareMeters(wkt) / (Math.PI * 5000 ** 2)).toBeCloseTo(1, 3);
  });

  it('becomes a polar cap holding the pole when the circle reaches it', () => {
    const wkt = circleWKT(89.5, 10, 100000, 720);
    expect(wkt.startsWith('POLYGON((')).toBe(true);
    expect(positions(wkt).some(([, lat]) => lat === 90)).toBe(true);
    // A cap of geodesic radius r near the pole has area ≈ πr² (to (r/R)², 0.03 % here).
    expect(wktPolygonAreaSquareMeters(wkt) / (Math.PI * 100000 ** 2)).toBeCloseTo(1, 2);
  });

  it('radius 0 is a POINT; a non-positive or odd segment count is a clear error', () => {
    expect(circleWKT(1.5, 2.25, 0)).toBe('POINT(2.25 1.5)');
    expect(() => circleRing(0, 0, 10, 3)).toThrow(/segments/);
    expect(() => circleRing(0, 0, -1)).toThrow(/positive/);
  });
});

describe('clipCircleToUnit', () => {
  const east = { type: 'Polygon' as const, coordinates: [[[0, -1], [1, -1], [1, 1], [0, 1], [0, -1]]] };

  it('a unit cutting the circle in half leaves a half disc: center on the cut, radius r (plane geometry)', () => {
    const clipped = clipCircleToUnit({ latitude: 0, longitude: 0, radiusMeters: 5000 }, east)!;
    const extent = featureExtent(clipped.geometry);
    expect(extent.radiusMeters).toBeCloseTo(5000, 3);
    expect(extent.longitude).toBeCloseTo(0, 7);
    expect(wktPolygonAreaSquareMeters(clipped.footprintWKT) / (Math.PI * 5000 ** 2)).toBeCloseTo(0.5, 2);
  });

  it('a circle wholly inside the unit is left whole (no boundary meets it)', () => {
    const clipped = clipCircleToUnit({ latitude: 0, longitude: 0.5, radiusMeters: 5000 }, east)!;
    expect(clipped.footprintWKT).toBe(circleWKT(0, 0.5, 5000));
  });

  it('a unit with a hole inside the circle is clipped around the hole', () => {
    const holed = { type: 'Polygon' as const, coordinates: [...east.coordinates, [[0.49, -0.01], [0.49, 0.01], [0.51, 0.01], [0.51, -0.01], [0.49, -0.01]]] };
    const clipped = clipCircleToUnit({ latitude: 0, longitude: 0.5, radiusMeters: 5000 }, holed)!;
    expect(clipped.geometry.coordinates.flat().length).toBeGreaterThan(1);
    expect(wktPolygonAreaSquareMeters(clipped.footprintWKT)).toBeLessThan(Math.PI * 5000 ** 2 * 0.99);
  });

  it('a unit beside the circle gives undefined', () => {
    expect(clipCircleToUnit({ latitude: 0, longitude: -0.5, radiusMeters: 5000 }, east)).toBeUndefined();
  });

  it('works for a circle and a unit on both sides of the antimeridian: the part east of 179.99°W is cut off', () => {
    const unit = {
      type: 'MultiPolygon' as const,
      coordinates: [[[[179, -1], [180, -1], [180, 1], [179, 1], [179, -1]]], [[[-180, -1], [-179.99, -1], [-179.99, 1], [-180, 1], [-180, -1]]]],
    };
    const r = 3000;
    const clipped = clipCircleToUnit({ latitude: 0, longitude: 179.995, radiusMeters: r }, unit, 720)!;
    expect(clipped.footprintWKT.startsWith('MULTIPOLYGON')).toBe(true);
    // The cut is the meridian 0.015° east of the center: on the equator that is d = a·Δλ = 1669.79 m
    // (WGS84 a = 6378137 m, NIMA TR8350.2 §3; the equator is a geodesic). What remains is the disc less the
    // circular segment beyond the cut, πr² − (r²·acos(d/r) − d·√(r² − d²)) (plane geometry; at 3 km the
    // Earth's curvature changes it by under 1e-6). Tolerance 0.05 %: the 720-gon holds 99.999 % of the
    // disc; an unclipped circle would be 16.5 % larger.
    const d = 6378137 * ((0.015 * Math.PI) / 180);
    const expected = Math.PI * r ** 2 - (r ** 2 * Math.acos(d / r) - d * Math.sqrt(r ** 2 - d ** 2));
    expect(wktPolygonAreaSquareMeters(clipped.footprintWKT) / expected).toBeCloseTo(1, 3);
  });

  it('never throws: when the clipping library fails (a unit with a vertex that is not a number), the circle is kept unclipped and says why', () => {
    const broken = { type: 'Polygon' as const, coordinates: [[[0, -1], [1, -1], [Number.NaN, 1], [0, 1], [0, -1]]] };
    const clipped = clipCircleToUnit({ latitude: 0, longitude: 0, radiusMeters: 5000 }, broken)!;
    expect(clipped.unclippedBecause).toMatch(/the polygon clipping failed/);
    expect(clipped.footprintWKT).toBe(circleWKT(0, 0, 5000));
  });
});

describe('sectorRing', () => {
  it('spans θ ± Δ from the apex out to the radius (geographiclib inverse)', () => {
    const ring = sectorRing(10, 20, 45, 22.5, 10000);
    const azimuths = ring.slice(1, -1).map(([lon, lat]) => (inverse(10, 20, lat!, lon!).azimuth1 + 360) % 360);
    expect(Math.min(...azimuths)).toBeCloseTo(22.5, 6);
    expect(Math.max(...azimuths)).toBeCloseTo(67.5, 6);
    expect(Math.max(...ring.map(([lon, lat]) => inverse(10, 20, lat!, lon!).meters))).toBeCloseTo(10000, 6);
  });
});
