import { describe, expect, it } from 'vitest';
import { direct, inverse, polygonAreaSquareMeters } from '../../src/geodesy/geodesic.ts';
import { localProjection } from '../../src/geodesy/azimuthal-equidistant.ts';

const dms = (d: number, m: number, s: number) => Math.sign(d || 1) * (Math.abs(d) + m / 60 + s / 3600);

// Flinders Peak – Buninyong, the worked example of the Australian geodetic manuals (Geocentric Datum of
// Australia Technical Manual, ICSM; values from memory): on the GRS80/WGS84 ellipsoid,
// distance 54 972.271 m, forward azimuth 306°52′05.37″, reverse azimuth 127°10′25.07″.
const flinders = { latitude: -dms(37, 57, 3.7203), longitude: dms(144, 25, 29.5244) };
const buninyong = { latitude: -dms(37, 39, 10.1561), longitude: dms(143, 55, 35.3839) };

describe('geodesic inverse and direct on WGS84', () => {
  it('reproduces Flinders Peak – Buninyong (ICSM GDA manual worked example, from memory)', () => {
    const result = inverse(flinders.latitude, flinders.longitude, buninyong.latitude, buninyong.longitude);
    expect(result.meters).toBeCloseTo(54972.271, 2);
    expect((result.azimuth1 + 360) % 360).toBeCloseTo(dms(306, 52, 5.37), 4);
    // reverse azimuth = forward azimuth at the far end + 180°
    expect((result.azimuth2 + 180 + 360) % 360).toBeCloseTo(dms(127, 10, 25.07), 4);
  });

  it('direct returns to Buninyong from Flinders Peak (same example)', () => {
    const end = direct(flinders.latitude, flinders.longitude, dms(306, 52, 5.37), 54972.271);
    expect(end.latitude).toBeCloseTo(buninyong.latitude, 7);
    expect(end.longitude).toBeCloseTo(buninyong.longitude, 7);
  });

  // The WGS84 quarter meridian, 10 001 965.729 m (GeographicLib documentation of the WGS84 ellipsoid;
  // value from memory).
  it('quarter meridian is 10 001 965.729 m (Karney 2013, from memory)', () => {
    expect(inverse(0, 0, 90, 0).meters).toBeCloseTo(10001965.729, 2);
  });

  // GeographicLib's own test values, as published in geographiclib-geodesic 2.2.0 test/geodesictest.js
  // (Karney): the first GeodTest line and GeodSolve76 (Wellington–Salamanca) and GeodSolve78.
  it('reproduces GeographicLib GeodTest line 1 (inverse and direct)', () => {
    const result = inverse(35.60777, -139.44815, -11.17491, -69.95921);
    expect(result.meters).toBeCloseTo(8935244.5604818305, 6);
    expect(result.azimuth1).toBeCloseTo(111.098748429560326, 9);
    expect(result.azimuth2).toBeCloseTo(129.289270889708762, 9);
    const end = direct(35.60777, -139.44815, 111.098748429560326, 8935244.5604818305);
    expect(end.latitude).toBeCloseTo(-11.17491, 9);
    expect(end.longitude).toBeCloseTo(-69.95921, 9);
  });
  it('reproduces GeodSolve76 (Wellington–Salamanca) and GeodSolve78', () => {
    const wellington = inverse(-(41 + 19 / 60), 174 + 49 / 60, 40 + 58 / 60, -(5 + 30 / 60));
    expect(wellington.meters).toBeCloseTo(19960543.857179, 5);
    expect(wellington.azimuth1).toBeCloseTo(160.39137649664, 10);
    const nearlyAntipodal = inverse(27.2, 0, -27.1, 179.5);
    expect(nearlyAntipodal.meters).toBeCloseTo(19974354.765767, 5);
    expect(nearlyAntipodal.azimuth2).toBeCloseTo(134.2277653267, 10);
  });

  it('equatorial degree is a·π/180 = 111 319.491 m (WGS84 a = 6 378 137 m, NIMA TR8350.2)', () => {
    expect(inverse(0, 0, 0, 1).meters).toBeCloseTo((6378137 * Math.PI) / 180, 3);
  });

  it('crosses the antimeridian: 179.9°E to 179.9°W is 0.2° of equator', () => {
    expect(inverse(0, 179.9, 0, -179.9).meters).toBeCloseTo((0.2 * 6378137 * Math.PI) / 180, 3);
  });
});

describe('local azimuthal-equidistant projection', () => {
  it('keeps distances and azimuths from its center exact (definition of the projection)', () => {
    const projection = localProjection(flinders.latitude, flinders.longitude);
    const [x, y] = projection.forward(buninyong.latitude, buninyong.longitude);
    expect(Math.hypot(x, y)).toBeCloseTo(54972.271, 2);
    const [latitude, longitude] = projection.inverse(x, y);
    expect(latitude).toBeCloseTo(buninyong.latitude, 9);
    expect(longitude).toBeCloseTo(buninyong.longitude, 9);
  });
});

// The area of a quadrangle bounded by parallels and meridians on an ellipsoid, in closed form:
// A = (a² Δλ / 2) (q(φ2) − q(φ1)), q(φ) = (1 − e²)[sinφ / (1 − e² sin²φ) − ln((1 − e sinφ)/(1 + e sinφ)) / (2e)]
// (Snyder 1987, Map Projections: A Working Manual, USGS PP 1395, eq. 3-12). WGS84: a = 6 378 137 m,
// f = 1/298.257223563 (NIMA TR8350.2, 2000, §3). Its parallels are drawn as 0.001° geodesic steps.
describe('polygon area on WGS84', () => {
  const a = 6378137;
  const e2 = (2 - 1 / 298.257223563) / 298.257223563;
  const e = Math.sqrt(e2);
  const q = (phi: number) => {
    const s = Math.sin((phi * Math.PI) / 180);
    return (1 - e2) * (s / (1 - e2 * s * s) - Math.log((1 - e * s) / (1 + e * s)) / (2 * e));
  };
  const quadrangle = (south: number, north: number, west: number, east: number) => {
    const steps = Math.round((east - west) / 0.001);
    const along = (lat: number, from: number, to: number) => Array.from({ length: steps + 1 }, (_, i) => [from + ((to - from) * i) / steps, lat]);
    return [[...along(south, west, east), ...along(north, east, west), [west, south]]];
  };

  it('matches the closed form for a 1° × 1° quadrangle at 45° S and at the equator (Snyder 1987, eq. 3-12)', () => {
    for (const [south, north] of [[-46, -45], [0, 1]]) {
      const expected = ((a * a * (Math.PI / 180)) / 2) * (q(north) - q(south));
      expect(polygonAreaSquareMeters(quadrangle(south, north, -131, -130)) / expected).toBeCloseTo(1, 6);
    }
  });

  it('takes a hole away, whatever the rings\' orientation', () => {
    const outer = quadrangle(-46, -45, -131, -130)[0];
    const hole = quadrangle(-45.6, -45.4, -130.6, -130.4)[0];
    const whole = polygonAreaSquareMeters([outer]);
    expect(polygonAreaSquareMeters([[...outer].reverse()])).toBeCloseTo(whole, 0);
    expect(polygonAreaSquareMeters([outer, hole])).toBeCloseTo(whole - polygonAreaSquareMeters([hole]), 0);
  });
});
