/**
 * The formats `batch` writes its results in: the CSV (the default, which the job itself writes and can
 * resume), or, made from that CSV once it is whole, GeoJSON or a GeoPackage for a desktop GIS.
 */
import { rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { randomUUID } from 'node:crypto';
import type { Writable } from 'node:stream';
import type { Delimiter } from '../batch/records.ts';
import { writeGeoJSON } from './batch-geojson.ts';
import { writeGeoPackage } from './geopackage.ts';

export const RESULT_FORMATS = ['csv', 'geojson', 'gpkg'] as const;
export type ResultFormat = (typeof RESULT_FORMATS)[number];

/**
 * The format named by an option value, or a clear error.
 * @example resultFormat('gpkg') // 'gpkg'
 */
export function resultFormat(value: string): ResultFormat {
  const format = value.toLowerCase();
  if (!(RESULT_FORMATS as readonly string[]).includes(format)) throw new Error(`--format must be one of ${RESULT_FORMATS.join(', ')}, not '${value}'`);
  return format as ResultFormat;
}

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

/**
 * Turn the finished CSV into the asked format and remove it (nothing to do for CSV); when that fails, a
 * CSV beside a file output is kept.
 * @example await writeResults({ format: 'geojson', csvPath: 'out.geojson.rows.csv', delimiter: ',', output: 'out.geojson', runTimestamp })
 */
export async function writeResults(options: {
  format: ResultFormat; csvPath: string; delimiter: Delimiter; output: string; runTimestamp: string; stdout?: Writable;
}): Promise<void> {
  const { format, csvPath, delimiter, output } = options;
  if (format === 'csv') return;
  try {
    if (format === 'gpkg') await writeGeoPackage(csvPath, delimiter, output, options.runTimestamp);
    else await writeGeoJSON(csvPath, delimiter, output === '-' ? (options.stdout ?? process.stdout) : output);
  } catch (error) {
    // Beside a file output the CSV stays, so that nothing is lost; a temporary one for standard output goes.
    if (output === '-') rmSync(csvPath, { force: true });
    throw error;
  }
  rmSync(csvPath, { force: true });
}
