/**
 * A batch output as a GeoPackage (OGC GeoPackage Encoding Standard 1.3, OGC 12-128; the clauses cited
 * are that standard's): an SQLite file with two feature tables in EPSG:4326, `points` (every row, in
 * input order, its point or a NULL geometry when it has none) and `footprints` (the rows that have a
 * footprintWKT, as MULTIPOLYGON), each carrying every column of the CSV as a TEXT attribute, exactly as
 * written there. The file is written beside the target and renamed into place when whole.
 */
import { existsSync, renameSync, rmSync } from 'node:fs';
import Database from 'better-sqlite3';
import type { Position } from 'geojson';
import type { Delimiter } from '../batch/records.ts';
import { readResultTable } from './result-table.ts';

/** The layers written, by table name. */
export const GEOPACKAGE_LAYERS = { points: 'points', footprints: 'footprints' } as const;

const WGS84 = 4326;
/** §1.1.1.1.1 Req 2: application_id "GPKG"; user_version 10300 for version 1.3 (GDAL 3.x reads 1.4 with a warning). */
const APPLICATION_ID = 0x47504b47;
const USER_VERSION = 10300;
/** EPSG:4326 as OGC WKT 1 (the definition GDAL and the EPSG registry give; from memory). */
const WGS84_WKT =
  'GEOGCS["WGS 84",DATUM["WGS_1984",SPHEROID["WGS 84",6378137,298.257223563,AUTHORITY["EPSG","7030"]],AUTHORITY["EPSG","6326"]],' +
  'PRIMEM["Greenwich",0,AUTHORITY["EPSG","8901"]],UNIT["degree",0.0174532925199433,AUTHORITY["EPSG","9122"]],AXIS["Latitude",NORTH],AXIS["Longitude",EAST],AUTHORITY["EPSG","4326"]]';
/** Rows inserted a transaction [CHOICE]. */
const ROWS_PER_TRANSACTION = 5000;

/**
 * Write the GeoPackage of a batch output; resolves with the feature count of each layer.
 * @example await writeGeoPackage('out.csv', ',', 'out.gpkg', '2026-05-01T09:30:00Z') // { points: 52, footprints: 12 }
 */
export async function writeGeoPackage(csvPath: string, delimiter: Delimiter, target: string, lastChange: string): Promise<{ points: number; footprints: number }> {
  const { columns, rows } = await readResultTable(csvPath, delimiter);
  const partial = `${target}.partial`;
  rmSync(partial, { force: true });
  const db = new Database(partial);
  let counts = { points: 0, footprints: 0 };
  try {
    createCoreTables(db);
    const attributes = columns.map((c) => `${quoted(c)} TEXT`).join(', ');
    const names = columns.map(quoted).join(', ');
    const marks = columns.map(() => '?').join(', ');
    // §1.1.3.1.1: data_type "features"; last_change as ISO 8601 "%Y-%m-%dT%H:%M:%fZ" (Req 15), here the run timestamp.
    const when = lastChange.replace(/Z$/, '').replace(/(\d\d:\d\d:\d\d)$/, '$1.000') + 'Z';
    const contents = db.prepare("INSERT INTO gpkg_contents (table_name, data_type, identifier, description, last_change, srs_id) VALUES (?, 'features', ?, ?, ?, ?)");
    contents.run('points', 'points', 'proposed points of the georeferenced records, one feature a row (NULL geometry when none)', when, WGS84);
    contents.run('footprints', 'footprints', 'proposed footprints (footprintWKT) of the georeferenced records that have one', when, WGS84);
    for (const [table, type] of [['points', 'POINT'], ['footprints', 'MULTIPOLYGON']] as const) {
      // §2.1.6.1.1 Req 29: an INTEGER PRIMARY KEY AUTOINCREMENT column; §2.1.5: the geometry column.
      db.exec(`CREATE TABLE ${table} (fid INTEGER PRIMARY KEY AUTOINCREMENT NOT NULL, geom ${type}, ${attributes})`);
      db.prepare('INSERT INTO gpkg_geometry_columns (table_name, column_name, geometry_type_name, srs_id, z, m) VALUES (?, ?, ?, ?, 0, 0)').run(table, 'geom', type, WGS84);
    }
    const insert = {
      points: db.prepare(`INSERT INTO points (fid, geom, ${names}) VALUES (?, ?, ${marks})`),
      footprints: db.prepare(`INSERT INTO footprints (fid, geom, ${names}) VALUES (?, ?, ${marks})`),
    };
    const extent = { points: new Envelope(), footprints: new Envelope() };
    counts = { points: 0, footprints: 0 };
    let batch: (() => void)[] = [];
    const flush = db.transaction(() => {
      for (const insertRow of batch) insertRow();
    });
    for await (const row of rows) {
      const fid = ++counts.points;
      const point = row.point;
      if (point) extent.points.add([point]);
      batch.push(() => insert.points.run(fid, point ? geometryBlob(pointWKB(point), [point]) : null, ...row.fields));
      if (row.footprint) {
        const polygons = row.footprint.type === 'Polygon' ? [row.footprint.coordinates] : row.footprint.coordinates;
        const positions = polygons.flat(2);
        extent.footprints.add(positions);
        const footprintFid = ++counts.footprints;
        batch.push(() => insert.footprints.run(footprintFid, geometryBlob(multiPolygonWKB(polygons), positions), ...row.fields));
      }
      if (batch.length >= ROWS_PER_TRANSACTION) {
        flush();
        batch = [];
      }
    }
    flush();
    const bounds = db.prepare('UPDATE gpkg_contents SET min_x = ?, min_y = ?, max_x = ?, max_y = ? WHERE table_name = ?');
    bounds.run(...extent.points.bounds(), 'points');
    bounds.run(...extent.footprints.bounds(), 'footprints');
    db.close();
  } catch (error) {
    if (db.open) db.close();
    rmSync(partial, { force: true });
    throw error;
  }
  if (existsSync(target)) rmSync(target);
  renameSync(partial, target);
  return counts;
}

/** §1.1.2 gpkg_spatial_ref_sys (with the rows Req 11 asks for), §1.1.3 gpkg_contents, §2.1.5 gpkg_geometry_columns. */
function createCoreTables(db: Database.Database): void {
  db.pragma(`application_id = ${APPLICATION_ID}`);
  db.pragma(`user_version = ${USER_VERSION}`);
  db.exec(`
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
  `);
  const srs = db.prepare('INSERT INTO gpkg_spatial_ref_sys VALUES (?, ?, ?, ?, ?, ?)');
  srs.run('WGS 84 geodetic', WGS84, 'EPSG', WGS84, WGS84_WKT, 'longitude/latitude coordinates in decimal degrees on the WGS 84 spheroid');
  srs.run('Undefined cartesian SRS', -1, 'NONE', -1, 'undefined', 'undefined cartesian coordinate reference system');
  srs.run('Undefined geographic SRS', 0, 'NONE', 0, 'undefined', 'undefined geographic coordinate reference system');
}

function quoted(identifier: string): string {
  return `"${identifier.replace(/"/g, '""')}"`;
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
  header.writeInt32LE(WGS84, 4);
  const [minX, minY, maxX, maxY] = new Envelope().add(positions).bounds() as number[];
  [minX, maxX, minY, maxY].forEach((v, i) => header.writeDoubleLE(v, 8 + 8 * i));
  return Buffer.concat([header, wkb]);
}

/** WKB (OGC Simple Features 1.2.1 §8.2), little-endian: type 1 Point. */
function pointWKB([x, y]: [number, number]): Buffer {
  const b = Buffer.alloc(21);
  b.writeUInt8(1, 0);
  b.writeUInt32LE(1, 1);
  b.writeDoubleLE(x, 5);
  b.writeDoubleLE(y, 13);
  return b;
}

/** WKB type 6 MultiPolygon: a count, then each part as a whole WKB Polygon (type 3). */
function multiPolygonWKB(polygons: Position[][][]): Buffer {
  const parts: Buffer[] = [];
  const head = Buffer.alloc(9);
  head.writeUInt8(1, 0);
  head.writeUInt32LE(6, 1);
  head.writeUInt32LE(polygons.length, 5);
  parts.push(head);
  for (const rings of polygons) {
    const polygonHead = Buffer.alloc(9);
    polygonHead.writeUInt8(1, 0);
    polygonHead.writeUInt32LE(3, 1);
    polygonHead.writeUInt32LE(rings.length, 5);
    parts.push(polygonHead);
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
  return Buffer.concat(parts);
}

/** The bounds of positions seen so far. */
class Envelope {
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
