import proj4 from 'proj4';
import { describe, expect, it } from 'vitest';
import { DATUMS, datumFromName, toWgs84 } from '../../src/geodesy/datums.ts';
import { inverse } from '../../src/geodesy/geodesic.ts';
import { EPSG_INDEX, EPSG_TRANSFORMATIONS, transformationParameters, WGS84_PROJ4 } from '../support/epsg-transformations.ts';

const epsg = EPSG_INDEX;
const WGS84 = WGS84_PROJ4;
const numbers = (list: string) => list.split(',').map(Number);

/** A point inside each datum's area of use (EPSG area descriptions in epsg-index), [latitude, longitude]. */
const AREA_SAMPLE: Record<string, [number, number]> = {
  'EPSG:4326': [10, 20],
  'EPSG:4267': [39.22, -98.54], // Kansas, USA
  'EPSG:4269': [40, -100], // USA
  'EPSG:4618': [-15.8, -47.9], // Brasília, Brazil
  'EPSG:4674': [-15.8, -47.9],
  'EPSG:4230': [40.4, -3.7], // Madrid, Spain
  'EPSG:4225': [-22.9, -43.2], // Rio de Janeiro, Brazil
  'EPSG:4248': [-12, -77], // Lima, Peru
  'EPSG:4202': [-33.9, 151.2], // Sydney, Australia
  'EPSG:4283': [-33.9, 151.2],
  'EPSG:4301': [35.7, 139.7], // Tokyo, Japan
  'EPSG:4277': [51.5, -0.1], // London, UK
  'EPSG:4258': [52.5, 13.4], // Berlin, Germany
  'EPSG:4322': [45, 10],
  'EPSG:4221': [-34.6, -58.4], // Buenos Aires, Argentina
  'EPSG:4619': [59.33, 18.07], // Stockholm, Sweden
  'EPSG:4171': [48.86, 2.35], // Paris, France
};

const REFERENCE = EPSG_TRANSFORMATIONS;

function referenceParameters(datum: string): number[] {
  const { parameters, valuesInDataset } = transformationParameters(datum);
  // The dataset must be unambiguous about the datum's shift for this check to mean anything.
  expect(valuesInDataset).toBe(1);
  return parameters;
}

describe('datum shifts against the EPSG dataset', () => {
  it('every datum of the table has a reference', () => {
    expect(new Set(Object.keys(REFERENCE))).toEqual(new Set(DATUMS.map((d) => d.epsg)));
  });
  for (const datum of DATUMS) {
    const code = datum.epsg.slice('EPSG:'.length);
    const reference = epsg[code]!;
    it(`${datum.epsg} ${datum.name}: same name, ellipsoid and area of use as EPSG (epsg-index); its sample point lies inside`, () => {
      expect([...datum.areaOfUse]).toEqual(reference.bbox);
      const [lat, lon] = AREA_SAMPLE[datum.epsg]!;
      expect(toWgs84(lat, lon, datum.epsg).withinAreaOfUse).toBe(true);
      expect(reference.name.replace(/ /g, '')).toContain(datum.name.replace(/ /g, '').slice(0, 5));
      const ellipsoid = /\+ellps=(\S+)/.exec(reference.proj4)?.[1] ?? (reference.proj4.includes('+datum=WGS84') ? 'WGS84' : undefined);
      expect(datum.ellipsoid).toBe(`+ellps=${ellipsoid}`);
    });
    const { transformation, source } = REFERENCE[datum.epsg]!;
    it(`${datum.epsg} ${datum.name}: parameters of ${transformation} exactly (${source}); the shift equals theirs within 1 mm`, () => {
      const expected = referenceParameters(datum.epsg);
      expect(numbers(datum.towgs84)).toEqual(expected);
      if (transformation !== 'none') expect(datum.transformation).toContain(transformation);
      const [lat, lon] = AREA_SAMPLE[datum.epsg]!;
      const ours = toWgs84(lat, lon, datum.epsg);
      const [refLon, refLat] = proj4(`+proj=longlat ${datum.ellipsoid} +towgs84=${expected.join(',')} +no_defs`, WGS84, [lon, lat]);
      expect(inverse(ours.latitude, ours.longitude, refLat!, refLon!).meters).toBeLessThan(0.001);
    });
  }

  /**
   * Rotation conventions: EPSG method 9606 (position vector) rotates the point, method 9607 (coordinate
   * frame) rotates the axes; the same physical rotation has opposite signs in the two, so a coordinate-frame
   * set becomes a position-vector set by negating rx, ry and rz (EPSG Guidance Note 7-2, §4.4.3). proj4's
   * +towgs84 is position vector. epsg-index 2.0.0 writes EPSG record 15980 "AGD66 to WGS 84 (18)" (method
   * 9607: rx −0.303", ry −0.446", rz −0.234") with those signs unchanged into +towgs84. Converted as 9607
   * requires, it agrees with the independent EPSG:1278 (3 translations, 5 m) within the two accuracies
   * across Australia; read as it is written, it is about 35 m off everywhere.
   */
  it('AGD66: epsg-index\'s EPSG:15980 string holds coordinate-frame rotations; converted to position vector it agrees with EPSG:1278', () => {
    const written = numbers(/\+towgs84=(\S+)/.exec(epsg['4202']!.proj4)![1]!);
    expect(written).toEqual([-117.808, -51.536, 137.784, -0.303, -0.446, -0.234, -0.29]);
    const [tx, ty, tz, rx, ry, rz, ds] = written as [number, number, number, number, number, number, number];
    const positionVector = [tx, ty, tz, -rx, -ry, -rz, ds];
    const shifted = (parameters: number[], lat: number, lon: number) => {
      const [x, y] = proj4(`+proj=longlat +ellps=aust_SA +towgs84=${parameters.join(',')} +no_defs`, WGS84, [lon, lat]);
      return [y!, x!] as const;
    };
    // Darwin, Perth, Hobart, Brisbane, Sydney.
    for (const [lat, lon] of [[-12.4, 130.8], [-31.95, 115.86], [-42.88, 147.33], [-27.47, 153.03], [-33.9, 151.2]] as const) {
      const ours = toWgs84(lat, lon, 'EPSG:4202');
      const converted = shifted(positionVector, lat, lon);
      const asWritten = shifted(written, lat, lon);
      expect(inverse(ours.latitude, ours.longitude, converted[0], converted[1]).meters).toBeLessThanOrEqual(ours.accuracyMeters + epsg['4202']!.accuracy!);
      expect(inverse(ours.latitude, ours.longitude, asWritten[0], asWritten[1]).meters).toBeGreaterThan(30);
    }
  });

  it('WGS84 is returned untouched with accuracy 0', () => {
    expect(toWgs84(-12.5, 130.25, 'EPSG:4326')).toMatchObject({ latitude: -12.5, longitude: 130.25, accuracyMeters: 0 });
  });

  it('flags a point outside the datum\'s area of use (NAD27 in Brazil; NAD27 crosses 180°: Aleutians inside)', () => {
    expect(toWgs84(-15.8, -47.9, 'EPSG:4267').withinAreaOfUse).toBe(false);
    expect(toWgs84(52, 175, 'EPSG:4267').withinAreaOfUse).toBe(true);
  });

  it('an unsupported datum is a clear error', () => {
    expect(() => toWgs84(0, 0, 'EPSG:9999')).toThrow(/unsupported datum "EPSG:9999"/);
  });
});

describe('datumFromName: datums as written on labels', () => {
  const cases: [string, string | undefined][] = [
    ['NAD27', 'EPSG:4267'],
    ['NAD 1927', 'EPSG:4267'],
    ['North American Datum 1927', 'EPSG:4267'],
    ['North American Datum of 1927', 'EPSG:4267'],
    ['nad-27', 'EPSG:4267'],
    ['EPSG:4267', 'EPSG:4267'],
    ['epsg 4267', 'EPSG:4267'],
    ['4267', 'EPSG:4267'],
    ['WGS 84', 'EPSG:4326'],
    ['wgs-84', 'EPSG:4326'],
    ['WGS1984', 'EPSG:4326'],
    ['NAD83', 'EPSG:4269'],
    ['SIRGAS2000', 'EPSG:4674'],
    ['SIRGAS 2000', 'EPSG:4674'],
    ['SAD 69', 'EPSG:4618'],
    ['SAD-69', 'EPSG:4618'],
    ['Córrego Alegre', 'EPSG:4225'],
    ['PSAD 56', 'EPSG:4248'],
    ['Provisional South American 1956', 'EPSG:4248'],
    ['ED50', 'EPSG:4230'],
    ['AGD66', 'EPSG:4202'],
    ['GDA94', 'EPSG:4283'],
    ['Tokyo', 'EPSG:4301'],
    ['OSGB36', 'EPSG:4277'],
    ['ETRS89', 'EPSG:4258'],
    ['local datum', undefined],
    ['EPSG:3857', undefined],
    ['', undefined],
  ];
  for (const [text, expected] of cases) it(`${JSON.stringify(text)} → ${expected}`, () => expect(datumFromName(text)).toBe(expected));
});
