/**
 * A batch stopped part way (SIGKILL, the real CLI in a child process, a real job database) and resumed
 * with another --format than it started with makes the file asked for now, named as a new run with that
 * format and --out names it, holding every row of an unbroken run; a plain --resume makes the file the
 * job was started for. GIS files are read back by GDAL's ogrinfo (the GeoPackage Encoding Standard 1.3,
 * RFC 7946), one point feature a row, as test/e2e/real-files.test.ts checks a fresh run's. Common
 * practice, no source: compare the values, the run timestamp aside.
 */
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { beforeAll, describe, expect, it } from 'vitest';
import { jobsDatabasePath } from '../../src/store/side-files.ts';
import { writeManyRowArchive } from '../support/demo-archive.ts';
import { gdalAvailable, ogrFeatures } from '../support/gdal.ts';
import { fixtureGazetteer, killWhen, readOutput, unzip, writeRepeatedLocalities } from './helpers.ts';

const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;
const hasGdal = gdalAvailable('test/batch/resume-format.test.ts');
const SLOW = { ...process.env, WHEREABOUTS_TEST_DELAY_MS: '60' };

let dir: string;
let dbPath: string;
let jobsPath: string;
let input: string;
let archive: string;
/** The CSV of an unbroken run over `input`, header first. */
let reference: string[][];

beforeAll(async () => {
  ({ dir, dbPath } = await fixtureGazetteer());
  jobsPath = jobsDatabasePath(dbPath);
  input = join(dir, 'input.csv');
  writeRepeatedLocalities(input);
  archive = join(dir, 'dwca.zip');
  await writeManyRowArchive(archive);
  const out = join(dir, 'reference.csv');
  const full = cli('batch', input, '--out', out, '--quiet');
  expect(full.status, full.stderr).toBe(0);
  reference = readOutput(out);
}, 120_000);

function cli(...args: string[]) {
  return spawnSync(process.execPath, [BIN, '--db', dbPath, ...args], { encoding: 'utf8', maxBuffer: 256 << 20 });
}

/** Start `batch` with `args`, kill it once rows are being written, and give the stopped job's id. */
async function stopped(...args: string[]): Promise<string> {
  const before = new Set(jobIds());
  // Only the job this command starts: a job an earlier test left unfinished must not stop the wait.
  const isNew = (p: object) => !before.has((p as { id: string }).id);
  await killWhen(['--db', dbPath, 'batch', ...args, '--quiet'], SLOW, jobsPath, (p) => isNew(p) && p.rows_done > 0 && p.rows_done < (p.rows_total ?? 0));
  return jobIds().find((id) => !before.has(id))!;
}

function jobIds(): string[] {
  const db = new Database(jobsPath, { readonly: true });
  try {
    return (db.prepare('SELECT id FROM batch_job').all() as { id: string }[]).map((r) => r.id);
  } finally {
    db.close();
  }
}

/** Files of the test folder but the gazetteer, its jobs, the inputs and the reference. */
function leftOver(): string[] {
  return readdirSync(dir).filter((f) => !/^(gazetteer\.|input\.csv$|dwca\.zip$|reference\.csv$)/.test(f)).sort();
}

/** Every feature holds its row of the unbroken run, in order (georeferencedDate aside: each job has its own run timestamp). */
function expectRowsOfUnbrokenRun(features: ReturnType<typeof ogrFeatures>): void {
  const [header, ...rows] = reference;
  expect(features).toHaveLength(rows.length);
  for (const [i, feature] of features.entries()) {
    for (const [c, column] of header!.entries()) {
      // ogrinfo prints an empty string attribute as nothing after "= "
      if (column !== 'georeferencedDate') expect(feature.fields[column] ?? '', `row ${i + 1} ${column}`).toBe(rows[i]![c]);
    }
  }
}

describe.skipIf(!hasGdal)('a stopped batch resumed with another --format', { timeout: 180_000 }, () => {
  it('started as CSV to a file, finished as the GeoPackage asked for now, and nothing of the CSV is left', async () => {
    const jobId = await stopped(input, '--out', join(dir, 'started.csv'));
    const out = join(dir, 'resumed.gpkg');
    const resumed = cli('batch', '--resume', jobId, '--format', 'gpkg', '--out', out);
    expect(resumed.status, resumed.stderr).toBe(0);
    expect(resumed.stderr).toContain(`output: ${out}`);
    expectRowsOfUnbrokenRun(ogrFeatures(out, 'points'));
    expect(leftOver()).toEqual(['resumed.gpkg']);
  });

  it('started as CSV to standard output, finished as GeoJSON in a file: the rows written so far move with it', async () => {
    const jobId = await stopped(input);
    expect(leftOver()).toEqual(['resumed.gpkg', `whereabouts-job-${jobId}.partial`]); // beside the job database
    const out = join(dir, 'resumed.geojson');
    const resumed = cli('batch', '--resume', jobId, '--format', 'geojson', '--out', out, '--quiet');
    expect(resumed.status, resumed.stderr).toBe(0);
    expect(resumed.stdout).toBe('');
    expectRowsOfUnbrokenRun(ogrFeatures(out));
    expect(leftOver()).toEqual(['resumed.geojson', 'resumed.gpkg']);
  });

  it('started as a GeoPackage, finished by a plain --resume as that GeoPackage, not as its CSV', async () => {
    const out = join(dir, 'started.gpkg');
    const jobId = await stopped(input, '--format', 'gpkg', '--out', out);
    const resumed = cli('batch', '--resume', jobId);
    expect(resumed.status, resumed.stderr).toBe(0);
    expect(resumed.stderr).toContain(`output: ${out}`);
    expectRowsOfUnbrokenRun(ogrFeatures(out, 'points'));
    expect(leftOver()).toEqual(['resumed.geojson', 'resumed.gpkg', 'started.gpkg']);
  });

  it('another format without --out for a job that wrote to a file is refused, naming the file and what to add; the job then finishes as CSV in another file', async () => {
    const started = join(dir, 'other-started.csv');
    const jobId = await stopped(input, '--out', started);
    const refused = cli('batch', '--resume', jobId, '--format', 'geojson');
    expect(refused.status).toBe(1);
    expect(refused.stderr).toContain(`batch job ${jobId} was started to write csv to ${started}; to finish it as geojson instead, say where with --out <file>`);
    const out = join(dir, 'other-finished.csv');
    const resumed = cli('batch', '--resume', jobId, '--out', out, '--quiet');
    expect(resumed.status, resumed.stderr).toBe(0);
    const [header, ...rows] = readOutput(out);
    const date = header!.indexOf('georeferencedDate');
    const withoutDate = (table: string[][]) => table.map((row) => row.filter((_, c) => c !== date));
    expect(withoutDate([header!, ...rows])).toEqual(withoutDate(reference));
    expect(leftOver()).toEqual(['other-finished.csv', 'resumed.geojson', 'resumed.gpkg', 'started.gpkg']);
  });

  it('a Darwin Core Archive started as an archive, finished as the GeoPackage of its core rows; as a new archive when resumed with --format csv after starting as GeoJSON', async () => {
    const out = join(dir, 'archive.gpkg');
    const jobId = await stopped(archive, '--out', join(dir, 'archive-started.zip'));
    const resumed = cli('batch', '--resume', jobId, '--format', 'gpkg', '--out', out);
    expect(resumed.status, resumed.stderr).toBe(0);
    expect(resumed.stderr).toContain('GeoPackage of the archive\'s core rows only');
    const points = ogrFeatures(out, 'points');
    expect(points.map((p) => p.fields.occurrenceID)).toEqual(Array.from({ length: 4000 }, (_, i) => `o-${i}`));
    expect(points.every((p) => p.fields.georeferenceVerificationStatus)).toBe(true);

    const geojson = join(dir, 'archive.geojson');
    const second = await stopped(archive, '--format', 'geojson', '--out', geojson);
    const asArchive = join(dir, 'archive-finished.zip');
    const finished = cli('batch', '--resume', second, '--format', 'csv', '--out', asArchive, '--quiet');
    expect(finished.status, finished.stderr).toBe(0);
    expect((await unzip(asArchive)).map((e) => e.name)).toEqual(['meta.xml', 'occurrence.csv', 'eml.xml']);
    // Nothing of either job is left: no core table, manifest, partial or CSV named after the first outputs.
    expect(leftOver().filter((f) => f.startsWith('archive') || f.includes('core'))).toEqual(['archive-finished.zip', 'archive.gpkg']);
  });
});
