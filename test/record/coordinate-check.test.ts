/**
 * The check of coordinates records already have. Invented records around an invented circle at
 * 45.5°S 131°W, radius 2 km; each expected flag follows from the flag's definition (README, "The
 * coordinate flags column"), with distances geodesic on WGS84 (geographiclib; Karney 2013, J. Geodesy 87:43).
 */
import { describe, expect, it } from 'vitest';
import { checkCoordinates, type AdministrativeCenter, type Circle } from '../../src/record/coordinate-check.ts';

const circle: Circle = { latitude: -45.5, longitude: -131.0, radiusMeters: 2000 };
const norte: AdministrativeCenter = { level: 'stateProvince', name: 'Norte', latitude: -45.55, longitude: -131.05 };
const country: AdministrativeCenter = { level: 'country', name: 'Isla Quiroga', latitude: -45.75, longitude: -130.95 };

describe('checking the coordinates a record already has', () => {
  const cases: { record: string; lat: string; lon: string; flags: string[] }[] = [
    { record: 'correct values', lat: '-45.5', lon: '-131.0', flags: ['agrees-with-locality'] },
    { record: 'correct, 0.01° off (≈1.1 km: 1′ of latitude ≈ 1852 m, international nautical mile)', lat: '-45.51', lon: '-131.0', flags: ['agrees-with-locality'] },
    { record: 'latitude sign dropped', lat: '45.5', lon: '-131.0', flags: ['outside-locality-circle', 'fits-if-latitude-sign-flipped'] },
    { record: 'longitude sign dropped', lat: '-45.5', lon: '131.0', flags: ['outside-locality-circle', 'fits-if-longitude-sign-flipped'] },
    { record: 'both signs dropped', lat: '45.5', lon: '131', flags: ['outside-locality-circle', 'fits-if-both-signs-flipped'] },
    { record: 'latitude and longitude swapped', lat: '-131.0', lon: '-45.5', flags: ['beyond-valid-range', 'outside-locality-circle', 'fits-if-latitude-longitude-exchanged'] },
    { record: 'zeros for missing values', lat: '0', lon: '0', flags: ['both-zero', 'outside-locality-circle'] },
    { record: 'zero latitude only', lat: '0', lon: '-131.0', flags: ['outside-locality-circle', 'latitude-zero'] },
    { record: 'one value empty', lat: '0', lon: '', flags: ['one-side-empty'] },
    { record: 'not a number', lat: '45°30′S', lon: '131°W', flags: ['not-a-decimal-number'] },
    { record: 'on the state center', lat: '-45.55', lon: '-131.05', flags: ['outside-locality-circle', 'at-state-center'] },
    { record: 'on the country center, rounded to 0.1°', lat: '-45.8', lon: '-130.9', flags: ['outside-locality-circle', 'at-country-center'] },
    { record: 'no coordinates', lat: '', lon: ' ', flags: [] },
  ];
  for (const c of cases) {
    it(c.record, () => {
      const check = checkCoordinates(c.lat, c.lon, circle, [norte, country]);
      expect(check.flags).toEqual(c.flags);
      expect(check.remarks).toHaveLength(c.flags.length);
    });
  }

  it('still flags zeros and centers when the locality could not be georeferenced', () => {
    expect(checkCoordinates('0', '0', undefined, []).flags).toEqual(['both-zero']);
    expect(checkCoordinates('-45.55', '-131.05', undefined, [norte]).flags).toEqual(['at-state-center']);
  });

  it('reads a decimal comma as written in semicolon files', () => {
    expect(checkCoordinates('-45,5', '-131,0', circle, []).flags).toEqual(['agrees-with-locality']);
  });
});
