import { describe, expect, it } from 'vitest';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { generaliseToGrid, parseGridDegrees } from '../../src/georef/grid-generalisation.ts';

// The independent reference: Vincenty's inverse on WGS84 (Vincenty 1975, Survey Review 23:176) as
// implemented in the registry package geodesy 2.4.0 (C. Veness, MIT), accurate to about 0.5 mm.
const vincenty = (lat1: number, lon1: number, lat2: number, lon2: number) => new LatLon(lat1, lon1).distanceTo(new LatLon(lat2, lon2));

describe('generaliseToGrid: the centre of the grid cell, the radius grown to cover it', () => {
  // Input and expected cell side by side; each cell's bounds are the grid lines either side of the point
  // (a degree grid from 0°, as generalised data are published: Chapman 2020, doi:10.15468/doc-5jp4-5g10; from memory).
  const cases = [
    { point: { latitude: -45.4321, longitude: -131.0789, radiusMeters: 2000 }, grid: 0.1, centre: ['-45.45', '-131.05'], cell: [-45.5, -45.4, -131.1, -131] },
    { point: { latitude: 12.3456, longitude: 45.6789, radiusMeters: 150 }, grid: 0.01, centre: ['12.345', '45.675'], cell: [12.34, 12.35, 45.67, 45.68] },
    { point: { latitude: 0.05, longitude: -0.05, radiusMeters: 0 }, grid: 0.1, centre: ['0.05', '-0.05'], cell: [0, 0.1, -0.1, 0] },
    { point: { latitude: 64.98, longitude: 179.97, radiusMeters: 10 }, grid: 0.5, centre: ['64.75', '179.75'], cell: [64.5, 65, 179.5, 180] },
    { point: { latitude: -33.9, longitude: 18.4, radiusMeters: 500 }, grid: 1, centre: ['-33.5', '18.5'], cell: [-34, -33, 18, 19] },
  ];
  for (const { point, grid, centre, cell } of cases) {
    it(`${point.latitude}, ${point.longitude} on a ${grid}° grid`, () => {
      const g = generaliseToGrid(point, grid);
      expect([g.decimalLatitude, g.decimalLongitude]).toEqual(centre);
      const [south, north, west, east] = cell;
      expect(g.footprintWKT).toBe(`POLYGON((${west} ${south},${east} ${south},${east} ${north},${west} ${north},${west} ${south}))`);
      // Radius: the farthest corner by Vincenty (geodesy 2.4.0) plus the original radius, rounded up.
      const corners = [south, north].flatMap((lat) => [west, east].map((lon) => vincenty(g.latitude, g.longitude, lat, lon)));
      const farthest = Math.max(...corners);
      expect(Math.abs(g.halfDiagonalMeters - farthest)).toBeLessThan(0.001);
      expect(g.radiusMeters).toBe(Math.ceil(farthest + point.radiusMeters));
      // The grown circle holds the original circle wholly (triangle inequality, Vincenty distance).
      expect(vincenty(g.latitude, g.longitude, point.latitude, point.longitude) + point.radiusMeters).toBeLessThanOrEqual(g.radiusMeters);
    });
  }

  it('a cell past 180° (0.7° does not divide 180) is cut there into two parts (RFC 7946 §3.1.9), every longitude within ±180°', () => {
    const g = generaliseToGrid({ latitude: 10.2, longitude: 179.95, radiusMeters: 0 }, 0.7);
    expect(g.footprintWKT).toBe('MULTIPOLYGON(((179.9 9.8,180 9.8,180 10.5,179.9 10.5,179.9 9.8)),((-180 9.8,-179.4 9.8,-179.4 10.5,-180 10.5,-180 9.8)))');
    expect([g.decimalLatitude, g.decimalLongitude]).toEqual(['10.15', '-179.75']);
    // The radius: the farthest corner by Vincenty (geodesy 2.4.0), as for any cell.
    const corners = [9.8, 10.5].flatMap((lat) => [179.9, -179.4].map((lon) => vincenty(10.15, -179.75, lat, lon)));
    expect(g.radiusMeters).toBe(Math.ceil(Math.max(...corners)));
  });

  it('refuses a grid that is not a positive number of degrees up to 10', () => {
    for (const bad of ['0', '-0.1', 'a tenth', '20']) expect(() => parseGridDegrees(bad)).toThrow(/generalisation grid must be a number of degrees/);
    expect(parseGridDegrees(' 0.01 ')).toBe(0.01);
  });
});
