/**
 * What a GeoPackage of batch results holds, as SQL and bytes (OGC GeoPackage Encoding Standard 1.3,
 * OGC 12-128; the clauses cited are that standard's): the required tables, the two feature tables in
 * EPSG:4326 and their geometry blobs. Pure: src/batch/gis-output.ts writes the file.
 */
import type { Position } from 'geojson';

/** The layers, by table name, and their geometry types (§2.1.5). */
export const GEOPACKAGE_LAYERS = [
  { table: 'points', geometryType: 'POINT', description: 'proposed points of the georeferenced records, one feature a row (NULL geometry when none)' },
  { table: 'footprints', geometryType: 'MULTIPOLYGON', description: 'proposed footprints (footprintWKT) of the georeferenced records that have one' },
] as const;

export const WGS84_SRS_ID = 4326;
/** §1.1.1.1.1 Req 2: application_id "GPKG"; user_version 10300 for version 1.3 (GDAL 3.6 reads 1.4 with a warning). */
export const GEOPACKAGE_APPLICATION_ID = 0x47504b47;
export const GEOPACKAGE_USER_VERSION = 10300;
/** EPSG:4326 as OGC WKT 1 (the definition GDAL and the EPSG registry give; from memory). */
const WGS84_WKT =
  'GEOGCS["WGS 84",DATUM["WGS_1984",SPHEROID["WGS 84",6378137,298.257223563,AUTHORITY["EPSG","7030"]],AUTHORITY["EPSG","6326"]],' +
  'PRIMEM["Greenwich",0,AUTHORITY["EPSG","8901"]],UNIT["degree",0.0174532925199433,AUTHORITY["EPSG","9122"]],AXIS["Latitude",NORTH],AXIS["Longitude",EAST],AUTHORITY["EPSG","4326"]]';

/** §1.1.2 gpkg_spatial_ref_sys, §1.1.3 gpkg_contents, §2.1.5 gpkg_geometry_columns, as the standard defines them. */
export const GEOPACKAGE_CORE_TABLES = `
  CREATE TABLE gpkg_spatial_ref_sys (
    srs_name TEXT NOT NULL, srs_id INTEGER PRIMARY KEY, organization TEXT NOT NULL,
    organization_coordsys_id INTEGER NOT NULL, definition TEXT NOT NULL, description TEXT);
  CREATE TABLE gpkg_contents (
    table_name TEXT NOT NULL PRIMARY KEY, data_type TEXT NOT NULL, identifier TEXT UNIQUE, description TEXT DEFAULT '',
    last_change DATETIME NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')),
    min_x DOUBLE, min_y DOUBLE, max_x DOUBLE, max_y DOUBLE, srs_id INTEGER,
    CONSTRAINT fk_gc_r_srs_id FOREIGN KEY (srs_id) REFERENCES gpkg_spatial_ref_sys(srs_id));
  CREATE TABLE gpkg_geometry_columns (
    table_name TEXT NOT NULL, column_name TEXT NOT NULL, geometry_type_name TEXT NOT NULL,
    srs_id INTEGER NOT NULL, z TINYINT NOT NULL, m TINYINT NOT NULL,
    CONSTRAINT pk_geom_cols PRIMARY KEY (table_name, column_name),
    CONSTRAINT uk_gc_table_name UNIQUE (table_name),
    CONSTRAINT fk_gc_tn FOREIGN KEY (table_name) REFERENCES gpkg_contents(table_name),
    CONSTRAINT fk_gc_srs FOREIGN KEY (srs_id) REFERENCES gpkg_spatial_ref_sys (srs_id));
`;

/** §1.1.2.1.2 Req 11: the rows every gpkg_spatial_ref_sys holds (EPSG:4326, −1 and 0), in column order. */
export const GEOPACKAGE_SPATIAL_REF_SYS = [
  ['WGS 84 geodetic', WGS84_SRS_ID, 'EPSG', WGS84_SRS_ID, WGS84_WKT, 'longitude/latitude coordinates in decimal degrees on the WGS 84 spheroid'],
  ['Undefined cartesian SRS', -1, 'NONE', -1, 'undefined', 'undefined cartesian coordinate reference system'],
  ['Undefined geographic SRS', 0, 'NONE', 0, 'undefined', 'undefined geographic coordinate reference system'],
] as const;

/**
 * A feature table (§2.1.6.1.1 Req 29: an INTEGER PRIMARY KEY AUTOINCREMENT column; the geometry column
 * typed by its geometry type name) with every attribute as TEXT.
 * @example featureTableSql('points', 'POINT', ['locality']) // 'CREATE TABLE "points" (fid INTEGER PRIMARY KEY AUTOINCREMENT NOT NULL, geom POINT, "locality" TEXT)'
 */
export function featureTableSql(table: string, geometryType: string, columns: readonly string[]): string {
  return `CREATE TABLE ${quoted(table)} (fid INTEGER PRIMARY KEY AUTOINCREMENT NOT NULL, geom ${geometryType}, ${columns.map((c) => `${quoted(c)} TEXT`).join(', ')})`;
}

/** An SQL identifier in double quotes. */
export function quoted(identifier: string): string {
  return `"${identifier.replace(/"/g, '""')}"`;
}

/**
 * §1.1.3.1.1 Req 15: last_change as ISO 8601 "%Y-%m-%dT%H:%M:%fZ".
 * @example lastChange('2026-05-01T09:30:00Z') // '2026-05-01T09:30:00.000Z'
 */
export function lastChange(timestamp: string): string {
  return timestamp.replace(/Z$/, '').replace(/(\d\d:\d\d:\d\d)$/, '$1.000') + 'Z';
}

/** A point as a GeoPackageBinary blob. */
export function pointBlob(point: [number, number]): Buffer {
  const wkb = Buffer.alloc(21);
  wkb.writeUInt8(1, 0);
  wkb.writeUInt32LE(1, 1);
  wkb.writeDoubleLE(point[0], 5);
  wkb.writeDoubleLE(point[1], 13);
  return geometryBlob(wkb, [point]);
}

/** Polygons (GeoJSON coordinates) as one MULTIPOLYGON GeoPackageBinary blob. */
export function multiPolygonBlob(polygons: Position[][][]): Buffer {
  const parts: Buffer[] = [wkbHead(6, polygons.length)];
  for (const rings of polygons) {
    parts.push(wkbHead(3, rings.length));
    for (const ring of rings) {
      const b = Buffer.alloc(4 + 16 * ring.length);
      b.writeUInt32LE(ring.length, 0);
      ring.forEach(([x, y], i) => {
        b.writeDoubleLE(x!, 4 + 16 * i);
        b.writeDoubleLE(y!, 12 + 16 * i);
      });
      parts.push(b);
    }
  }
  return geometryBlob(Buffer.concat(parts), polygons.flat(2));
}

/** A little-endian WKB header (OGC Simple Features 1.2.1 §8.2): byte order 1, type, count of parts. */
function wkbHead(type: number, count: number): Buffer {
  const head = Buffer.alloc(9);
  head.writeUInt8(1, 0);
  head.writeUInt32LE(type, 1);
  head.writeUInt32LE(count, 5);
  return head;
}

/**
 * §2.1.3 GeoPackageBinary: magic "GP", version 0, flags (bit 0: little-endian; bits 1–3 = 1: envelope
 * [minx, maxx, miny, maxy]; bit 5 = 0: standard binary), srs_id, the envelope, then the WKB geometry.
 */
function geometryBlob(wkb: Buffer, positions: Position[]): Buffer {
  const header = Buffer.alloc(8 + 32);
  header.write('GP', 0, 'ascii');
  header.writeUInt8(0, 2);
  header.writeUInt8(0b0000_0011, 3);
  header.writeInt32LE(WGS84_SRS_ID, 4);
  const [minX, minY, maxX, maxY] = new Envelope().add(positions).bounds() as number[];
  [minX, maxX, minY, maxY].forEach((v, i) => header.writeDoubleLE(v, 8 + 8 * i));
  return Buffer.concat([header, wkb]);
}

/** The bounds of positions seen so far. */
export class Envelope {
  private minX = Infinity;
  private minY = Infinity;
  private maxX = -Infinity;
  private maxY = -Infinity;

  add(positions: Position[]): this {
    for (const [x, y] of positions) {
      if (x! < this.minX) this.minX = x!;
      if (x! > this.maxX) this.maxX = x!;
      if (y! < this.minY) this.minY = y!;
      if (y! > this.maxY) this.maxY = y!;
    }
    return this;
  }

  /** [minX, minY, maxX, maxY], or nulls when nothing was added. */
  bounds(): (number | null)[] {
    return this.minX === Infinity ? [null, null, null, null] : [this.minX, this.minY, this.maxX, this.maxY];
  }
}
