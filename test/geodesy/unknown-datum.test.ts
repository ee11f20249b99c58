/**
 * The datum term for coordinates with no stated datum, bounded where they lie (Chapman & Wieczorek 2020,
 * §Uncertainty from Unknown Datum; docs/method.md §5.4), against an independent computation: the datums in
 * use are chosen from the EPSG areas of use in epsg-index 2.0.0, ellipsoids are read from its WKT, each
 * shift is the geodesy package's Helmert (Veness, MIT; position-vector convention, EPSG method 9606) and the
 * distances its Vincenty inverse. The shift parameters are the table's, checked against the EPSG dataset in
 * test/geodesy/datums.test.ts.
 */
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import LatLon from 'geodesy/latlon-ellipsoidal-datum.js';
import LatLonVincenty from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { DATUMS } from '../../src/geodesy/datums.ts';
import { regionalDatumBound } from '../../src/geodesy/unknown-datum.ts';
import { utmToGeographic } from '../../src/geodesy/utm.ts';

const require = createRequire(import.meta.url);
const epsg = require('epsg-index/all.json') as Record<string, { wkt: string; bbox: [number, number, number, number] }>;

/** geodesy's datum for an EPSG geographic CRS: ellipsoid from epsg-index's WKT, transform WGS84 → datum. */
function geodesyDatum(code: string) {
  const [, a, rf] = /SPHEROID\["[^"]+",([\d.]+),([\d.]+)/.exec(epsg[code]!.wkt)!.map(Number) as [number, number, number];
  const f = 1 / rf;
  const [tx, ty, tz, rx, ry, rz, s] = DATUMS.find((d) => d.epsg === `EPSG:${code}`)!.towgs84.split(',').map(Number) as number[];
  // geodesy stores the WGS84 → datum transform [tx, ty, tz, s, rx, ry, rz] and negates it for datum → WGS84.
  return { ellipsoid: { a, b: a * (1 - f), f }, transform: [-tx!, -ty!, -tz!, -s!, -rx!, -ry!, -rz!] };
}

/** epsg-index's bbox is [north, west, south, east]; west > east crosses 180°. */
const inBox = (lat: number, lon: number, [north, west, south, east]: number[]) =>
  lat >= south! && lat <= north! && (west! <= east! ? lon >= west! && lon <= east! : lon >= west! || lon <= east!);

/** Independent: the datums whose epsg-index area holds the point, their WGS84 readings, the largest pairwise distance. */
function independentSpread(lat: number, lon: number, inDatum: (code: string) => { latitude: number; longitude: number } = () => ({ latitude: lat, longitude: lon })) {
  const codes = DATUMS.map((d) => d.epsg.slice(5)).filter((code) => inBox(lat, lon, epsg[code]!.bbox));
  const readings = codes.map((code) => {
    const p = inDatum(code);
    const wgs84 = new LatLon(p.latitude, p.longitude, 0, geodesyDatum(code)).convertDatum(LatLon.datums.WGS84!);
    return new LatLonVincenty(wgs84.lat, wgs84.lon);
  });
  let spread = 0;
  for (let i = 0; i < readings.length; i++) for (let j = i + 1; j < readings.length; j++) spread = Math.max(spread, readings[i]!.distanceTo(readings[j]!));
  return { codes: codes.map((c) => `EPSG:${c}`), spread };
}

describe('regionalDatumBound', () => {
  // Kansas, Brasília, Sydney, Madrid, Tokyo, London, Buenos Aires, Lima.
  const places: [string, number, number][] = [
    ['Kansas', 39.2, -98.5], ['Brasília', -15.8, -47.9], ['Sydney', -33.9, 151.2], ['Madrid', 40.4, -3.7],
    ['Tokyo', 35.7, 139.7], ['London', 51.5, -0.1], ['Buenos Aires', -34.6, -58.4], ['Lima', -12, -77],
  ];
  for (const [name, lat, lon] of places) {
    // Tolerance 0.25 m: proj4js 2.22.0 and the geodesy package agree to micrometres on every shift of the table
    // but WGS 72 → WGS 84, where they differ by up to 0.2 m (found here; inside that transformation's 2 m).
    it(`${name}: the spread equals the largest pairwise distance computed independently (0.25 m); the term adds the largest accuracy; below 5359 m`, () => {
      const bound = regionalDatumBound({ latitude: lat, longitude: lon })!;
      const expected = independentSpread(lat, lon);
      expect(bound.datums).toEqual(expected.codes);
      expect(Math.abs(bound.spreadMeters - expected.spread)).toBeLessThan(0.25);
      const accuracies = DATUMS.filter((d) => bound.datums.includes(d.epsg)).map((d) => d.accuracyMeters);
      expect(bound.meters).toBe(bound.spreadMeters + Math.max(...accuracies));
      expect(bound.meters).toBeLessThan(5359);
    });
  }
  it('a UTM reference is read on each datum\'s ellipsoid: 14T 600000 4985000 in Minnesota', () => {
    const utm = { zone: 14, hemisphere: 'N' as const, easting: 600000, northing: 4985000 };
    const preview = utmToGeographic(utm, 'EPSG:4326');
    const bound = regionalDatumBound(preview, utm)!;
    const expected = independentSpread(preview.latitude, preview.longitude, (code) => utmToGeographic(utm, `EPSG:${code}`));
    expect(Math.abs(bound.spreadMeters - expected.spread)).toBeLessThan(0.25);
    // The grid read on Clarke 1866 instead of WGS84 moves the point by about 200 m: far more than the lat/lon spread.
    expect(bound.spreadMeters).toBeGreaterThan(regionalDatumBound(preview)!.spreadMeters + 100);
  });
  it('in the open ocean only the world-wide datums apply: no regional bound (the caller uses 5359 m)', () => {
    expect(regionalDatumBound({ latitude: -45.2, longitude: -131.4 })).toBeUndefined();
  });
});
