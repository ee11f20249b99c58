/**
 * What a generalising batch withheld, and whether a shared file still holds it: the tests of sensitive
 * generalisation (test/e2e/sensitive-batch.test.ts, test/server/batch-generalisation.test.ts) read the
 * private job store here and look for its values in every output.
 */
import Database from 'better-sqlite3';

/** The precise georeference a job withheld, by row number (table batch_withheld of the job database). */
export function withheldRows(jobsPath: string, jobId: string): Map<number, Record<string, string>> {
  const jobs = new Database(jobsPath, { readonly: true });
  try {
    const rows = jobs.prepare('SELECT row_number, precise FROM batch_withheld WHERE job_id = ?').all(jobId) as { row_number: number; precise: string }[];
    return new Map(rows.map((r) => [r.row_number, JSON.parse(r.precise) as Record<string, string>]));
  } finally {
    jobs.close();
  }
}

/** The value as a whole number in text: not the first digits of a longer one (-45.3010 is not in -45.3010302). */
export const asNumber = (value: string) => new RegExp(`(?<![0-9])${value.replace(/[.+()-]/g, '\\$&')}(?![0-9])`);

/**
 * Whether bytes hold a precise coordinate: as text (CSV, GeoJSON, XML, JSON, GeoPackage attributes) or as the
 * little-endian IEEE 754 double a GeoPackage geometry stores it as (OGC 12-128 §2.1.3, WKB of OGC 06-103r4
 * §8.2). A value on a line of the degree grid `gridStep` used is also a corner of a cell's footprint: only
 * its text counts.
 */
export function holdsCoordinate(bytes: Buffer, value: string, gridStep: number): boolean {
  if (asNumber(value).test(bytes.toString('latin1'))) return true;
  const steps = Number(value) / gridStep;
  const onGridLine = Math.abs(steps - Math.round(steps)) < 1e-9;
  const double = Buffer.alloc(8);
  double.writeDoubleLE(Number(value));
  return !onGridLine && bytes.includes(double);
}
