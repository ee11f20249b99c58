/**
 * The datum term for coordinates with no stated datum, bounded where they lie (Chapman & Wieczorek 2020,
 * §Uncertainty from Unknown Datum: the largest distance, at the point, between the datums that could have
 * been used there; docs/method.md §5.4), against an independent computation: the datums in use are chosen
 * from the EPSG areas of use in epsg-index 2.0.0, each reading is shifted to WGS 84 by proj4 with the EPSG
 * transformation's parameters (test/support/epsg-transformations.ts names each transformation and where its
 * parameters were read), a UTM reference is projected by proj4 on epsg-index's ellipsoid, and the distances
 * are Vincenty's inverse from the geodesy package 2.4.0 (Veness, MIT; Vincenty 1975, about 0.5 mm).
 */
import proj4 from 'proj4';
import { describe, expect, it } from 'vitest';
import LatLonVincenty from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { DATUMS } from '../../src/geodesy/datums.ts';
import { regionalDatumBound } from '../../src/geodesy/unknown-datum.ts';
import { EPSG_INDEX, EPSG_TRANSFORMATIONS, referenceProj4, WGS84_PROJ4 } from '../support/epsg-transformations.ts';

/** The global worst case (Chapman & Wieczorek 2020, §Uncertainty from Unknown Datum). */
const GLOBAL_METERS = 5359;

/** epsg-index's bbox is [north, west, south, east]; west > east crosses 180°. */
const inBox = (lat: number, lon: number, [north, west, south, east]: number[]) =>
  lat >= south! && lat <= north! && (west! <= east! ? lon >= west! && lon <= east! : lon >= west! || lon <= east!);

type Reading = (datum: string) => [number, number];

/** Independent: the datums whose epsg-index area holds the point, their WGS 84 readings by proj4, the largest pairwise Vincenty distance. */
function independentSpread(lat: number, lon: number, read: Reading = (datum) => proj4(referenceProj4(datum), WGS84_PROJ4, [lon, lat]) as [number, number]) {
  const datums = DATUMS.map((d) => d.epsg).filter((datum) => inBox(lat, lon, EPSG_INDEX[datum.slice(5)]!.bbox));
  const readings = datums.map((datum) => {
    const [x, y] = read(datum);
    return new LatLonVincenty(y, x);
  });
  let spread = 0;
  for (let i = 0; i < readings.length; i++) for (let j = i + 1; j < readings.length; j++) spread = Math.max(spread, readings[i]!.distanceTo(readings[j]!));
  return { datums, spread };
}

describe('regionalDatumBound: the term is the largest pairwise shift at the point', () => {
  // One point in each region of the table: conterminous USA, Brazil, Australia, Spain, Japan, Great Britain, Argentina, Peru.
  const places: [string, number, number][] = [
    ['Kansas', 39.2, -98.5], ['Brasília', -15.8, -47.9], ['Sydney', -33.9, 151.2], ['Madrid', 40.4, -3.7],
    ['Tokyo', 35.7, 139.7], ['London', 51.5, -0.1], ['Buenos Aires', -34.6, -58.4], ['Lima', -12, -77],
  ];
  for (const [name, lat, lon] of places) {
    // Tolerance 1 mm: proj4 on both sides, so what is left is geographiclib against Vincenty (well under 1 mm).
    it(`${name}: equals the largest pairwise distance computed independently (1 mm), below ${GLOBAL_METERS} m`, () => {
      const bound = regionalDatumBound({ latitude: lat, longitude: lon })!;
      const expected = independentSpread(lat, lon);
      expect(bound.datums).toEqual(expected.datums);
      expect(expected.datums.length).toBeGreaterThan(2);
      expect(Math.abs(bound.meters - expected.spread)).toBeLessThan(0.001);
      expect(bound.meters).toBeLessThan(GLOBAL_METERS);
      // The transformations' stated accuracy is reported beside the term, not added to it.
      expect(bound.accuracyMeters).toBe(Math.max(...DATUMS.filter((d) => bound.datums.includes(d.epsg)).map((d) => d.accuracyMeters)));
    });
  }

  it('a UTM reference is read on each datum\'s ellipsoid: 14T 600000 4985000 in Minnesota', () => {
    const utm = { zone: 14, hemisphere: 'N' as const, easting: 600000, northing: 4985000 };
    const onWgs84 = proj4(`+proj=utm +zone=14 +datum=WGS84 +no_defs`, WGS84_PROJ4, [utm.easting, utm.northing]) as [number, number];
    const preview = { latitude: onWgs84[1], longitude: onWgs84[0] };
    const bound = regionalDatumBound(preview, utm)!;
    // Each datum's UTM projection: epsg-index's ellipsoid and the EPSG shift (the same proj4 CRS as above, projected).
    const expected = independentSpread(preview.latitude, preview.longitude, (datum) =>
      proj4(referenceProj4(datum).replace('+proj=longlat', '+proj=utm +zone=14'), WGS84_PROJ4, [utm.easting, utm.northing]) as [number, number]);
    expect(Math.abs(bound.meters - expected.spread)).toBeLessThan(0.001);
    // The grid read on Clarke 1866 instead of WGS84 moves the point by about 200 m: far more than the lat/lon spread.
    expect(bound.meters).toBeGreaterThan(regionalDatumBound(preview)!.meters + 100);
  });

  it(`never above the global ${GLOBAL_METERS} m, at every point of a 5° grid over the globe`, () => {
    let largest = 0;
    for (let lat = -85; lat <= 85; lat += 5) {
      for (let lon = -180; lon < 180; lon += 5) largest = Math.max(largest, regionalDatumBound({ latitude: lat, longitude: lon })?.meters ?? 0);
    }
    expect(largest).toBeGreaterThan(0);
    expect(largest).toBeLessThan(GLOBAL_METERS);
  });

  it('outside every regional area of use only the world-wide datums apply: no regional bound (the caller uses 5359 m)', () => {
    // Open South Pacific and the Indian Ocean: every datum of the table but WGS 84 and WGS 72 has an area elsewhere.
    for (const [lat, lon] of [[-45.2, -131.4], [-30, 80], [0, -160]] as const) {
      expect(DATUMS.filter((d) => inBox(lat, lon, EPSG_INDEX[d.epsg.slice(5)]!.bbox)).map((d) => d.epsg)).toEqual(['EPSG:4326', 'EPSG:4322']);
      expect(regionalDatumBound({ latitude: lat, longitude: lon })).toBeUndefined();
    }
  });

  it('every datum compared has a named EPSG transformation', () => {
    for (const datum of DATUMS) expect(EPSG_TRANSFORMATIONS[datum.epsg]!.transformation).toMatch(/^(EPSG:\d+|none)$/);
  });
});
