/**
 * Generalisation to a grid in meters and to a stated distance (src/georef/generalisation.ts), against an
 * independent computation: the cell's corners from the UTM zone's definition in the EPSG dataset (the proj4
 * string of WGS 84 / UTM zone zz N or S, EPSG:326zz / 327zz, as packaged in epsg-index 2.0.0; zone rule
 * NIMA TM 8358.2 §2), distances by Vincenty's inverse on WGS84 (Vincenty 1975, Survey Review 23:176) as the
 * registry package geodesy 2.4.0 implements it (C. Veness, MIT; about 0.5 mm).
 */
import proj4 from 'proj4';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { describe, expect, it } from 'vitest';
import { generalise, readGeneralisation } from '../../src/georef/generalisation.ts';
import { generaliseToMeterGrid } from '../../src/georef/meter-grid-generalisation.ts';
import { EPSG_INDEX, WGS84_PROJ4 } from '../support/epsg-transformations.ts';

const vincenty = (lat1: number, lon1: number, lat2: number, lon2: number) => new LatLon(lat1, lon1).distanceTo(new LatLon(lat2, lon2));

/** The cell holding a point in its UTM zone's grid, computed here: its corners as [latitude, longitude]. */
function independentCell(lat: number, lon: number, side: number) {
  const zone = Math.floor((lon + 180) / 6) + 1;
  const code = `${lat < 0 ? 327 : 326}${String(zone).padStart(2, '0')}`;
  const utm = EPSG_INDEX[code]!.proj4;
  const [e, n] = proj4(WGS84_PROJ4, utm, [lon, lat]) as [number, number];
  const [e0, n0] = [Math.floor(e / side) * side, Math.floor(n / side) * side];
  const corners = [[e0, n0], [e0 + side, n0], [e0 + side, n0 + side], [e0, n0 + side]].map(([x, y]) => {
    const [cLon, cLat] = proj4(utm, WGS84_PROJ4, [x!, y!]) as [number, number];
    return [cLat, cLon] as [number, number];
  });
  const [centreLon, centreLat] = proj4(utm, WGS84_PROJ4, [e0 + side / 2, n0 + side / 2]) as [number, number];
  return { code, corners, centre: [centreLat, centreLon] as [number, number] };
}

// Input and expected side by side: each point, its side, and the zone EPSG names for it.
const cases = [
  { point: { latitude: -45.4321, longitude: -131.0789, radiusMeters: 2000 }, side: 10000, crs: '32709' },
  { point: { latitude: 12.3456, longitude: 45.6789, radiusMeters: 150 }, side: 1000, crs: '32638' },
  { point: { latitude: 0.0004, longitude: -0.0004, radiusMeters: 0 }, side: 100, crs: '32630' },
  { point: { latitude: 64.98, longitude: 179.97, radiusMeters: 10 }, side: 5000, crs: '32660' },
  { point: { latitude: -33.9, longitude: 18.4, radiusMeters: 500 }, side: 100000, crs: '32734' },
  { point: { latitude: 78.2, longitude: 15.6, radiusMeters: 30 }, side: 2000, crs: '32633' }, // Svalbard: the plain 6° zone, no exception
];

describe('a grid in meters: the UTM grid of the point\'s zone', () => {
  for (const { point, side, crs } of cases) {
    it(`${point.latitude}, ${point.longitude}: ${side} m cell of EPSG:${crs}`, () => {
      const g = generaliseToMeterGrid(point, side);
      const cell = independentCell(point.latitude, point.longitude, side);
      expect(cell.code).toBe(crs);
      expect(g.cell).toContain(`${side} m cell of the UTM zone ${Number(crs.slice(3))}${crs.startsWith('327') ? 'S' : 'N'}`);
      // The written centre is the cell's centre to a hundredth of the side or better.
      expect(vincenty(g.latitude, g.longitude, ...cell.centre)).toBeLessThan(side / 100);
      expect(g.latitude).toBe(Number(g.decimalLatitude));
      // The radius covers the whole cell: every corner by Vincenty from the written centre, plus the original radius, rounded up.
      const farthest = Math.max(...cell.corners.map(([lat, lon]) => vincenty(g.latitude, g.longitude, lat, lon)));
      expect(Math.abs(g.halfDiagonalMeters - farthest)).toBeLessThan(0.001);
      expect(g.radiusMeters).toBe(Math.ceil(farthest + point.radiusMeters));
      // …and every vertex of the footprint (the cell's sides), and the original circle.
      const vertices = [...g.footprintWKT.matchAll(/(-?[\d.]+) (-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])] as [number, number]);
      for (const [lon, lat] of vertices) expect(vincenty(g.latitude, g.longitude, lat, lon)).toBeLessThanOrEqual(g.radiusMeters);
      expect(vincenty(g.latitude, g.longitude, point.latitude, point.longitude) + point.radiusMeters).toBeLessThanOrEqual(g.radiusMeters);
      if (g.footprintWKT.startsWith('POLYGON')) {
        // One ring, 8 segments a side; its corners are the cell's corners (to the 7 decimals written).
        expect(vertices).toHaveLength(33);
        for (const k of [0, 8, 16, 24]) expect(vincenty(vertices[k]![1], vertices[k]![0], ...cell.corners[k / 8]!)).toBeLessThan(0.02);
      }
    });
  }

  it('a cell across the antimeridian: the footprint cut at ±180° into two parts (RFC 7946 §3.1.9), the radius still covering every corner', () => {
    const point = { latitude: 64.98, longitude: 179.97, radiusMeters: 10 };
    const g = generaliseToMeterGrid(point, 5000);
    const cell = independentCell(point.latitude, point.longitude, 5000);
    expect(cell.corners.some(([, lon]) => lon < 0)).toBe(true); // the cell does cross
    expect(g.footprintWKT).toMatch(/^MULTIPOLYGON\(/);
    const longitudes = [...g.footprintWKT.matchAll(/(-?[\d.]+) -?[\d.]+/g)].map((m) => Number(m[1]));
    expect(longitudes.every((lon) => lon >= -180 && lon <= 180)).toBe(true);
    expect(longitudes).toEqual(expect.arrayContaining([180, -180]));
    expect(g.radiusMeters).toBe(Math.ceil(Math.max(...cell.corners.map(([lat, lon]) => vincenty(g.latitude, g.longitude, lat, lon))) + point.radiusMeters));
  });

  it('is reproducible: two points of one cell give the same answer', () => {
    const a = generaliseToMeterGrid({ latitude: -45.4321, longitude: -131.0789, radiusMeters: 0 }, 10000);
    const b = generaliseToMeterGrid({ latitude: -45.4302, longitude: -131.0801, radiusMeters: 0 }, 10000);
    expect(b).toEqual(a);
  });
});

describe('a stated distance: the precise point within it of the point shown', () => {
  for (const { point } of cases.slice(0, 5)) {
    for (const distance of [500, 5000]) {
      it(`${point.latitude}, ${point.longitude} within ${distance} m`, () => {
        const g = generalise(point, { distanceMeters: distance });
        // Half-diagonal of the cell of side d·√2 is d on the grid; on the ground within UTM's scale factor (0.9996–1.001).
        expect(g.halfDiagonalMeters / distance).toBeGreaterThan(0.998);
        expect(g.halfDiagonalMeters / distance).toBeLessThan(1.015);
        expect(vincenty(g.latitude, g.longitude, point.latitude, point.longitude)).toBeLessThanOrEqual(distance * 1.015);
        expect(g.cell).toMatch(new RegExp(`within ${distance} m of the precise point`));
        const cell = independentCell(point.latitude, point.longitude, distance * Math.SQRT2);
        expect(g.radiusMeters).toBe(Math.ceil(Math.max(...cell.corners.map(([lat, lon]) => vincenty(g.latitude, g.longitude, lat, lon))) + point.radiusMeters));
      });
    }
  }
});

describe('readGeneralisation: one way, written as a number in its limits', () => {
  const cases: [Record<string, string>, unknown][] = [
    [{ gridDegrees: '0.1' }, { gridDegrees: 0.1 }],
    [{ gridMeters: ' 1000 ' }, { gridMeters: 1000 }],
    [{ distanceMeters: '2500', gridDegrees: '' }, { distanceMeters: 2500 }],
  ];
  for (const [fields, expected] of cases) it(JSON.stringify(fields), () => expect(readGeneralisation(fields)).toEqual(expected));
  it('refuses none, two, and values out of their limits, saying which', () => {
    expect(() => readGeneralisation({})).toThrow(/exactly one of gridDegrees.*not none/);
    expect(() => readGeneralisation({ gridDegrees: '0.1', gridMeters: '1000' })).toThrow(/not gridDegrees and gridMeters/);
    expect(() => readGeneralisation({ gridMeters: '5' })).toThrow(/grid in meters must be a number of meters from 10 to 100000, not "5"/);
    expect(() => readGeneralisation({ distanceMeters: '1 km' })).toThrow(/distance must be a number of meters from 10 to 70710/);
  });
});
