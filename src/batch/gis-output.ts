/**
 * The formats `batch` writes its results in: the CSV (the default, which the job itself writes and can
 * resume), or, made from that CSV once it is whole, GeoJSON (RFC 7946) or a GeoPackage (OGC 12-128) for a
 * desktop GIS. What goes into each is src/output's; this module reads the CSV and writes the files.
 */
import { randomUUID } from 'node:crypto';
import { once } from 'node:events';
import { createWriteStream, existsSync, renameSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Writable } from 'node:stream';
import Database from 'better-sqlite3';
import {
  Envelope, featureTableSql, GEOPACKAGE_APPLICATION_ID, GEOPACKAGE_CORE_TABLES, GEOPACKAGE_LAYERS, GEOPACKAGE_SPATIAL_REF_SYS,
  GEOPACKAGE_USER_VERSION, lastChange, multiPolygonBlob, pointBlob, quoted, WGS84_SRS_ID,
} from '../output/geopackage-encoding.ts';
import type { ResultFormat } from '../output/result-formats.ts';
import { resultFeature, resultRowReader, uniqueColumnNames, type ResultRow } from '../output/result-rows.ts';
import { inspectInput } from '../store/input-format.ts';
import { readRecords, type Delimiter } from './records.ts';

/** Rows inserted into a GeoPackage a transaction [CHOICE]. */
const ROWS_PER_TRANSACTION = 5000;

/**
 * Where the job writes its CSV for a format: the output itself for CSV; for the others a file beside the
 * output, named after it so that the same command run again finds and finishes a stopped job (standard
 * output: a temporary file). A GeoPackage cannot go to standard output.
 * @example batchCsvPath('gpkg', 'out.gpkg') // '/abs/out.gpkg.rows.csv'
 */
export function batchCsvPath(format: ResultFormat, output: string): string {
  if (format === 'csv') return output;
  if (output === '-') {
    if (format === 'gpkg') throw new Error('a GeoPackage is a database file, not a stream: give --out <file.gpkg>');
    return join(tmpdir(), `whereabouts-${randomUUID().slice(0, 8)}.rows.csv`);
  }
  return `${resolve(output)}.rows.csv`;
}

/** The file a batch makes: its format and its absolute path, or '-' for standard output. */
export interface BatchResult {
  format: ResultFormat;
  path: string;
}

/**
 * The file a run of `batch` makes: what was asked, and on a resume what was left out taken from the job
 * as it was started (its format; its file, when the format stays the same). The georeferencing a job
 * keeps does not depend on the format, so a job started as one format may finish as another, named as a
 * new run with that format and file would name it. A file named for the old format is never given the
 * new one: changing the format of a job that wrote to a file needs the new file. A part stays CSV.
 * @example resultOf({ format: 'gpkg', path: 'out.gpkg' }, { id: '3f9c2a71', format: 'csv', path: '/data/out.csv', part: false }) // { format: 'gpkg', path: '/abs/out.gpkg' }
 */
export function resultOf(asked: { format?: ResultFormat; path?: string }, started?: { id: string; format: ResultFormat; path: string; part: boolean }): BatchResult {
  const format = asked.format ?? started?.format ?? 'csv';
  if (started?.part && format !== 'csv') throw new Error(`batch job ${started.id} is a part (--part), always a CSV part file: merge the parts, then convert`);
  const path = asked.path ?? (!started || format === started.format || started.path === '-' ? started?.path ?? '-' : undefined);
  if (path === undefined) {
    throw new Error(`batch job ${started!.id} was started to write ${started!.format} to ${started!.path}; to finish it as ${format} instead, say where with --out <file> (or - for standard output)`);
  }
  return { format, path: path === '-' ? '-' : resolve(path) };
}

/**
 * Make the asked format from the finished CSV (nothing to do for CSV). A file is written beside its
 * target and renamed into place when whole, so a run stopped meanwhile never leaves part of one there;
 * the CSV is kept (a batch removes it once its job is done, so that a resume can make the file again).
 * @example await writeResults({ format: 'geojson', csvPath: 'out.geojson.rows.csv', delimiter: ',', output: 'out.geojson', runTimestamp })
 */
export async function writeResults(options: {
  format: ResultFormat; csvPath: string; delimiter: Delimiter; output: string; runTimestamp: string; stdout?: Writable;
}): Promise<void> {
  const { format, csvPath, delimiter, output } = options;
  if (format === 'gpkg') await writeGeoPackage(csvPath, delimiter, output, options.runTimestamp);
  else if (format === 'geojson') await writeGeoJSON(csvPath, delimiter, output === '-' ? (options.stdout ?? process.stdout) : output);
}

/** The columns and rows of a batch output, read in constant memory. */
async function readResultTable(path: string, delimiter: Delimiter): Promise<{ columns: string[]; rows: AsyncGenerator<ResultRow> }> {
  const records = readRecords(path, await inspectInput(path), delimiter)[Symbol.asyncIterator]();
  const first = await records.next();
  if (first.done) throw new Error(`the batch output ${path} is empty`);
  const columns = uniqueColumnNames(first.value.fields);
  const rowOf = resultRowReader(first.value.fields);
  async function* rows(): AsyncGenerator<ResultRow> {
    for (let next = await records.next(); !next.done; next = await records.next()) yield rowOf(next.value.fields);
  }
  return { columns, rows: rows() };
}

/**
 * The GeoJSON of a batch output, one FeatureCollection with a Feature a row in input order, to a stream
 * or to a file (written beside it and renamed into place when whole); resolves with the number of features.
 * @example await writeGeoJSON('out.csv', ',', 'out.geojson') // 52
 */
export async function writeGeoJSON(csvPath: string, delimiter: Delimiter, target: string | Writable): Promise<number> {
  const { columns, rows } = await readResultTable(csvPath, delimiter);
  const partial = typeof target === 'string' ? `${target}.partial` : undefined;
  const out = partial ? createWriteStream(partial) : (target as Writable);
  const write = async (text: string) => {
    if (!out.write(text)) await once(out, 'drain');
  };
  let count = 0;
  try {
    await write('{"type":"FeatureCollection","features":[');
    for await (const row of rows) {
      await write(`${count === 0 ? '\n' : ',\n'}${JSON.stringify(resultFeature(columns, row))}`);
      count++;
    }
    await write('\n]}\n');
    if (!partial) return count;
    out.end();
    await once(out, 'finish');
  } catch (error) {
    if (partial) {
      out.destroy();
      rmSync(partial, { force: true });
    }
    throw error;
  }
  renameSync(partial, target as string);
  return count;
}

/**
 * The GeoPackage of a batch output: layer `points` (every row, its point or a NULL geometry) and layer
 * `footprints` (the rows with a footprintWKT), every column a TEXT attribute. Written beside the target
 * and renamed into place when whole; resolves with the feature count of each layer.
 * @example await writeGeoPackage('out.csv', ',', 'out.gpkg', '2026-05-01T09:30:00Z') // { points: 52, footprints: 12 }
 */
export async function writeGeoPackage(csvPath: string, delimiter: Delimiter, target: string, runTimestamp: string): Promise<{ points: number; footprints: number }> {
  const { columns, rows } = await readResultTable(csvPath, delimiter);
  const partial = `${target}.partial`;
  rmSync(partial, { force: true });
  const db = new Database(partial);
  const counts = { points: 0, footprints: 0 };
  try {
    db.pragma(`application_id = ${GEOPACKAGE_APPLICATION_ID}`);
    db.pragma(`user_version = ${GEOPACKAGE_USER_VERSION}`);
    db.exec(GEOPACKAGE_CORE_TABLES);
    const srs = db.prepare('INSERT INTO gpkg_spatial_ref_sys VALUES (?, ?, ?, ?, ?, ?)');
    for (const row of GEOPACKAGE_SPATIAL_REF_SYS) srs.run(...row);
    const contents = db.prepare("INSERT INTO gpkg_contents (table_name, data_type, identifier, description, last_change, srs_id) VALUES (?, 'features', ?, ?, ?, ?)");
    const geometryColumn = db.prepare('INSERT INTO gpkg_geometry_columns (table_name, column_name, geometry_type_name, srs_id, z, m) VALUES (?, ?, ?, ?, 0, 0)');
    for (const { table, geometryType, description } of GEOPACKAGE_LAYERS) {
      contents.run(table, table, description, lastChange(runTimestamp), WGS84_SRS_ID);
      db.exec(featureTableSql(table, geometryType, columns));
      geometryColumn.run(table, 'geom', geometryType, WGS84_SRS_ID);
    }
    const attributes = columns.map(quoted).join(', ');
    const marks = columns.map(() => '?').join(', ');
    const insert = {
      points: db.prepare(`INSERT INTO points (fid, geom, ${attributes}) VALUES (?, ?, ${marks})`),
      footprints: db.prepare(`INSERT INTO footprints (fid, geom, ${attributes}) VALUES (?, ?, ${marks})`),
    };
    const extent = { points: new Envelope(), footprints: new Envelope() };
    let pending: ResultRow[] = [];
    const flush = db.transaction((batch: ResultRow[]) => {
      for (const row of batch) {
        insert.points.run(++counts.points, row.point ? pointBlob(row.point) : null, ...row.fields);
        if (row.point) extent.points.add([row.point]);
        if (!row.footprint) continue;
        const polygons = row.footprint.type === 'Polygon' ? [row.footprint.coordinates] : row.footprint.coordinates;
        insert.footprints.run(++counts.footprints, multiPolygonBlob(polygons), ...row.fields);
        extent.footprints.add(polygons.flat(2));
      }
    });
    for await (const row of rows) {
      pending.push(row);
      if (pending.length >= ROWS_PER_TRANSACTION) {
        flush(pending);
        pending = [];
      }
    }
    flush(pending);
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
