/**
 * GeoPackageBinary blobs byte for byte (OGC GeoPackage Encoding Standard 1.3, OGC 12-128, §2.1.3: header
 * "GP", version 0, flags, srs_id, envelope [minx, maxx, miny, maxy]; then WKB, OGC Simple Features 1.2.1
 * §8.2.4), with the bytes worked out by hand from those clauses beside each case.
 */
import { describe, expect, it } from 'vitest';
import { lastChange, multiPolygonBlob, pointBlob } from '../../src/output/geopackage-encoding.ts';
import { uniqueColumnNames } from '../../src/output/result-rows.ts';

const double = (v: number) => {
  const b = Buffer.alloc(8);
  b.writeDoubleLE(v);
  return b.toString('hex');
};

describe('GeoPackageBinary', () => {
  it('encodes a point: header, envelope of the point, little-endian WKB Point', () => {
    const expected =
      '4750' + '00' + '03' + 'e6100000' + // "GP", version 0, flags: little-endian + envelope code 1; srs_id 4326
      double(-131) + double(-131) + double(-45.5) + double(-45.5) + // minx, maxx, miny, maxy
      '01' + '01000000' + double(-131) + double(-45.5); // WKB: little-endian, type 1 Point, x, y
    expect(pointBlob([-131, -45.5]).toString('hex')).toBe(expected);
  });

  it('encodes a polygon as a MULTIPOLYGON of one part, rings with their point counts', () => {
    const ring = [[0, 0], [2, 0], [2, 1], [0, 0]];
    const expected =
      '4750' + '00' + '03' + 'e6100000' + double(0) + double(2) + double(0) + double(1) +
      '01' + '06000000' + '01000000' + // MultiPolygon, 1 polygon
      '01' + '03000000' + '01000000' + // Polygon, 1 ring
      '04000000' + ring.map(([x, y]) => double(x!) + double(y!)).join('');
    expect(multiPolygonBlob([[ring]]).toString('hex')).toBe(expected);
  });
});

describe('attribute names and dates', () => {
  it('makes column names unique without regard to case, names empty ones, avoids fid and geom', () => {
    expect(uniqueColumnNames(['id', 'ID', '', 'fid', 'Geom'])).toEqual(['id', 'ID_2', 'column_3', 'fid_2', 'Geom_2']);
  });

  it('writes last_change as %Y-%m-%dT%H:%M:%fZ (§1.1.3.1.1)', () => {
    expect(lastChange('2026-05-01T09:30:00Z')).toBe('2026-05-01T09:30:00.000Z');
  });
});
