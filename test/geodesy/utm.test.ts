import { describe, expect, it } from 'vitest';
import LatLon from 'geodesy/latlon-ellipsoidal-datum.js';
import Utm from 'geodesy/utm.js';
import geodesic from 'geographiclib-geodesic';
import { transverseMercatorToGeographic, utmToGeographic } from '../../src/geodesy/utm.ts';
import { parseCoordinates, type WrittenCoordinates } from '../../src/parse/index.ts';
import { georeference } from '../../src/georef/georeference.ts';
import type { Interpretation } from '../../src/parse/types.ts';

const { Geodesic } = geodesic;
const apart = (a: { latitude: number; longitude: number }, b: { latitude: number; longitude: number }) =>
  Geodesic.WGS84.Inverse(a.latitude, a.longitude, b.latitude, b.longitude).s12!;

describe('transverse Mercator against EPSG Guidance Note 7-2', () => {
  // IOGP Publication 373-7-2 (Geomatics Guidance Note 7-2), §3.5.3.1 Transverse Mercator (EPSG method 9807),
  // worked example: OSGB 1936 / British National Grid (Airy 1830, latitude of origin 49°N, central meridian
  // 2°W, k0 = 0.9996012717, FE 400 000 m, FN −100 000 m); 50°30'00"N 0°30'00"E ↔ E 577 274.99 m, N 69 740.50 m.
  // The guidance note prints eastings and northings to 0.01 m: the reverse must land within 1 cm of the point.
  const britishNationalGrid = { latitudeOfOrigin: 49, centralMeridian: -2, scaleFactor: 0.9996012717, falseEasting: 400000, falseNorthing: -100000, ellipsoid: '+a=6377563.396 +rf=299.3249646' };
  it('reverse of E 577274.99, N 69740.50 is 50°30\'N 0°30\'E within 1 cm', () => {
    const point = transverseMercatorToGeographic(britishNationalGrid, 577274.99, 69740.5);
    expect(Geodesic.WGS84.Inverse(point.latitude, point.longitude, 50.5, 0.5).s12!).toBeLessThan(0.01);
  });
});

describe('utmToGeographic: the UTM grid (NIMA TM 8358.2 §2: k0 0.9996, FE 500 000 m, FN 0 or 10 000 000 m)', () => {
  it('puts easting 500 000 m on the central meridian 6z − 183°', () => {
    expect(utmToGeographic({ zone: 14, hemisphere: 'N', easting: 500000, northing: 4206000 }, 'EPSG:4267').longitude).toBeCloseTo(-99, 9);
  });
  // On the central meridian the northing is k0 = 0.9996 times the meridian arc, measured here with
  // geographiclib-geodesic (Karney 2013), a library independent of proj4.
  it('northing on the central meridian is 0.9996 × meridian arc (WGS84), south with the 10 000 000 m false northing', () => {
    const arc = Geodesic.WGS84.Inverse(0, 15, 45, 15).s12!;
    expect(utmToGeographic({ zone: 33, hemisphere: 'N', easting: 500000, northing: 0.9996 * arc }, 'EPSG:4326').latitude).toBeCloseTo(45, 7);
    expect(utmToGeographic({ zone: 33, hemisphere: 'S', easting: 500000, northing: 10000000 - 0.9996 * arc }, 'EPSG:4326').latitude).toBeCloseTo(-45, 7);
  });
  // A second implementation: the geodesy package (Veness, MIT) computes UTM with Krüger's series (Karney 2011).
  it('agrees with the geodesy package within 1 mm across a zone, on the stated ellipsoid', () => {
    for (const [easting, northing] of [[166000, 100000], [500000, 4985000], [833000, 9300000]] as const) {
      const ours = utmToGeographic({ zone: 14, hemisphere: 'N', easting, northing }, 'EPSG:4267');
      const theirs = new Utm(14, 'N', easting, northing, LatLon.datums.NAD27).toLatLon();
      expect(apart(ours, { latitude: theirs.lat, longitude: theirs.lon })).toBeLessThan(0.001);
    }
  });
  it('rejects a reference no UTM grid holds, with a clear error', () => {
    expect(() => utmToGeographic({ zone: 61, hemisphere: 'N', easting: 500000, northing: 0 }, 'EPSG:4326')).toThrow(/zone/);
    expect(() => utmToGeographic({ zone: 10, hemisphere: 'X' as 'N', easting: 500000, northing: 0 }, 'EPSG:4326')).toThrow(/hemisphere/);
    expect(() => utmToGeographic({ zone: 10, hemisphere: 'N', easting: 1500000, northing: 0 }, 'EPSG:4326')).toThrow(/easting/);
  });
});

describe('a written UTM reference is converted in its stated datum (issue 10 part 3)', () => {
  // Expected point from a second implementation: the geodesy package's UTM on Clarke 1866, then its Helmert
  // shift NAD27 → WGS 84 with EPSG:1173 "NAD27 to WGS 84 (4)" (geocentric translations −8, +160, +176 m,
  // EPSG Geodetic Parameter Dataset; geodesy's NAD27 entry holds the same translations, reversed in sign).
  const nad27Utm = new Utm(14, 'N', 600000, 4985000, LatLon.datums.NAD27).toLatLon();
  const EPSG_1173 = { ...LatLon.datums.NAD27, transform: [8, -160, -176, 0, 0, 0, 0] };
  const expected = new LatLon(nad27Utm.lat, nad27Utm.lon, 0, EPSG_1173).convertDatum(LatLon.datums.WGS84);
  const expectedPoint = { latitude: expected.lat, longitude: expected.lon };

  const interpretationOf = (coordinates: WrittenCoordinates): Interpretation => ({
    verbatim: coordinates.written, language: 'en', clauses: [], type: 'coordinates', approximate: false, features: [], offsets: [], coordinates, administrative: {}, notes: [],
  } as unknown as Interpretation);
  const read = (text: string) => {
    const r = parseCoordinates(text);
    if ('problem' in r) throw new Error(r.problem);
    return r;
  };
  const place = (coordinates: WrittenCoordinates, datum?: string) => {
    const outcome = georeference({ interpretation: interpretationOf(coordinates), features: [], options: { datum } });
    if (!outcome.ok) throw new Error(outcome.reason);
    return outcome.georeference;
  };

  it('the parse keeps what was written: zone, hemisphere, band, easting, northing', () => {
    expect(read('UTM 14T 600000E 4985000N').utm).toEqual({ zone: 14, hemisphere: 'N', band: 'T', easting: 600000, northing: 4985000 });
    expect(read('22K 500000 7400000').utm).toEqual({ zone: 22, hemisphere: 'S', band: 'K', easting: 500000, northing: 7400000 });
  });
  it('datum in the text ("NAD27"): the point lies within 1 mm of the independent computation', () => {
    const g = place(read('UTM 14T 600000E 4985000N NAD27'));
    expect(apart(g, expectedPoint)).toBeLessThan(0.001);
    expect(g.components.datum).toBe(10);
    expect(g.remarks.join('\n')).toMatch(/UTM zone 14N 600000 m E 4985000 m N converted .* NAD27/);
  });
  it('datum from the record\'s geodeticDatum field (written beside the coordinates) gives the same point', () => {
    const g = place({ ...read('UTM 14T 600000E 4985000N'), datumWritten: 'NAD 1927' });
    expect(apart(g, expectedPoint)).toBeLessThan(0.001);
  });
  it('datum from an edit (the method option) gives the same point', () => {
    const g = place(read('UTM 14T 600000E 4985000N'), 'EPSG:4267');
    expect(apart(g, expectedPoint)).toBeLessThan(0.001);
  });
  it('reading the grid on WGS84 instead would land about 200 m away: far outside the 10 m datum term', () => {
    const wgs84 = place(read('UTM 14T 600000E 4985000N WGS84'));
    expect(apart(wgs84, expectedPoint)).toBeGreaterThan(200);
  });
});
