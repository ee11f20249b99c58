/**
 * A batch killed (SIGKILL, the real CLI in a child process, a real job database) after its CSV is whole
 * but before the file asked for is made from it (a GeoPackage, GeoJSON, a new Darwin Core Archive) is not
 * done: `--resume` makes that file from the CSV kept, and it is the file of an unbroken run with the same
 * --run-timestamp. A half-written file left beside the target is not trusted. The GeoPackages are compared
 * as GDAL's ogrinfo reads them (the GeoPackage Encoding Standard 1.3, OGC 12-128r18), the other files
 * byte for byte. Common practice, no source: an interrupted job finishes as an unbroken one would.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { jobsDatabasePath } from '../../src/store/side-files.ts';
import { writeManyRowArchive } from '../support/demo-archive.ts';
import { gdal, gdalAvailable } from '../support/gdal.ts';
import { fixtureGazetteer, killWhen, progress, writeManyRowCsv } from './helpers.ts';

const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;
const hasGdal = gdalAvailable('test/batch/output-step-resume.test.ts');
/** Each commit is followed by this pause, the one after the CSV is whole among them: time to kill the run there. */
const SLOW = { ...process.env, WHEREABOUTS_TEST_DELAY_MS: '400' };
const RUN_TIMESTAMP = '2026-05-01T09:30:00Z';

let dir: string;
let dbPath: string;
let jobsPath: string;
let input: string;
let archive: string;

beforeAll(async () => {
  ({ dir, dbPath } = await fixtureGazetteer());
  jobsPath = jobsDatabasePath(dbPath);
  input = join(dir, 'input.csv');
  writeManyRowCsv(input);
  archive = join(dir, 'dwca.zip');
  await writeManyRowArchive(archive);
}, 60_000);

function cli(...args: string[]) {
  return spawnSync(process.execPath, [BIN, '--db', dbPath, ...args], { encoding: 'utf8', maxBuffer: 256 << 20 });
}

/** An unbroken run of `batch` with `args` and the shared run timestamp. */
function unbroken(...args: string[]): void {
  const run = cli('batch', ...args, '--run-timestamp', RUN_TIMESTAMP, '--quiet');
  expect(run.status, run.stderr).toBe(0);
}

/**
 * Start `batch` with `args`, kill it once `csvWhole` says its CSV is in place (the job then pauses before
 * making the file asked for), and give the stopped job's id, after checking it is not done.
 */
async function stoppedAfterCsv(csvWhole: () => boolean, ...args: string[]): Promise<string> {
  await killWhen(['--db', dbPath, 'batch', ...args, '--run-timestamp', RUN_TIMESTAMP, '--quiet'], SLOW, jobsPath, (p) => p.state !== 'done' && csvWhole());
  const job = progress(jobsPath)!;
  expect(job.state).toBe('writing');
  expect(job.rows_done).toBe(job.rows_total);
  return job.id;
}

/** What ogrinfo reads from a GeoPackage: every layer's metadata, extent and features, the file's name aside. */
function ogrDump(path: string): string {
  return gdal('ogrinfo', '-ro', '-al', path).replaceAll(path, '<file>');
}

/** Files of the test folder but the gazetteer, its jobs and the inputs. */
function leftOver(): string[] {
  return readdirSync(dir).filter((f) => !/^(gazetteer\.|input\.csv$|dwca\.zip$)/.test(f)).sort();
}

describe.skipIf(!hasGdal)('a batch killed while making its file from the whole CSV', { timeout: 180_000 }, () => {
  it('a GeoPackage: --resume makes it from the CSV kept, as an unbroken run does; a second --resume says the job is done', async () => {
    const reference = join(dir, 'reference.gpkg');
    unbroken(input, '--format', 'gpkg', '--out', reference);
    const out = join(dir, 'stopped.gpkg');
    const jobId = await stoppedAfterCsv(() => existsSync(`${out}.rows.csv`), input, '--format', 'gpkg', '--out', out);
    expect(existsSync(out)).toBe(false);
    // As a kill while the GeoPackage was being written would leave it: half a file beside the target.
    writeFileSync(`${out}.partial`, readFileSync(reference).subarray(0, 8192));

    const resumed = cli('batch', '--resume', jobId);
    expect(resumed.status, resumed.stderr).toBe(0);
    expect(resumed.stderr).toContain('job resumed');
    expect(resumed.stderr).toContain(`output: ${out}`);
    expect(ogrDump(out)).toBe(ogrDump(reference));
    expect(ogrDump(out)).toContain('Feature Count: 4000');
    expect(leftOver()).toEqual(['reference.gpkg', 'stopped.gpkg']);

    const again = cli('batch', '--resume', jobId);
    expect(again.status).toBe(1);
    expect(again.stderr).toContain(`batch job ${jobId} is already done (output ${out})`);
    rmSync(out);
    const gone = cli('batch', '--resume', jobId);
    expect(gone.status).toBe(1);
    expect(gone.stderr).toContain(`batch job ${jobId} is already done (output ${out}, since moved or removed: start a new batch to make it again)`);
  });

  it('resumed as GeoJSON in another file: the whole CSV goes along, and the file is the bytes of an unbroken GeoJSON run', async () => {
    const reference = join(dir, 'reference.geojson');
    unbroken(input, '--format', 'geojson', '--out', reference);
    const started = join(dir, 'started.gpkg');
    const jobId = await stoppedAfterCsv(() => existsSync(`${started}.rows.csv`), input, '--format', 'gpkg', '--out', started);
    const out = join(dir, 'finished.geojson');
    const resumed = cli('batch', '--resume', jobId, '--format', 'geojson', '--out', out, '--quiet');
    expect(resumed.status, resumed.stderr).toBe(0);
    expect(readFileSync(out).equals(readFileSync(reference))).toBe(true);
    // Nothing of the GeoPackage the job was started for: no CSV, no partial file.
    expect(leftOver().filter((f) => f.startsWith('started') || f.startsWith('finished'))).toEqual(['finished.geojson']);
  });

  it('a Darwin Core Archive: --resume writes the new archive from the core kept, the bytes of an unbroken run, and removes the core', async () => {
    const reference = join(dir, 'reference.zip');
    unbroken(archive, '--out', reference);
    const out = join(dir, 'stopped.zip');
    const coreWhole = () => readdirSync(dir).some((f) => f.startsWith('stopped.zip.') && f.endsWith('.core.txt'));
    const jobId = await stoppedAfterCsv(coreWhole, archive, '--out', out);
    expect(existsSync(out)).toBe(false);
    writeFileSync(`${out}.partial`, readFileSync(reference).subarray(0, 1000));

    const resumed = cli('batch', '--resume', jobId);
    expect(resumed.status, resumed.stderr).toBe(0);
    expect(resumed.stderr).toContain('Darwin Core Archive: every other file copied unchanged');
    expect(readFileSync(out).equals(readFileSync(reference))).toBe(true);
    expect(leftOver().filter((f) => f.startsWith('stopped.zip') || f.includes('core') || f.includes('archive'))).toEqual(['stopped.zip']);
  });

});

describe('a batch killed once its job is marked done', { timeout: 180_000 }, () => {
  it('before its working files were removed: the next open of the job database removes them', async () => {
    const reference = join(dir, 'reference-tidy.zip');
    unbroken(archive, '--out', reference);
    const out = join(dir, 'tidied.zip');
    await killWhen(['--db', dbPath, 'batch', archive, '--out', out, '--run-timestamp', RUN_TIMESTAMP, '--quiet'], SLOW, jobsPath, (p) => p.state === 'done' && p.leftovers !== null);
    const job = progress(jobsPath)!;
    // The archive is whole; the core CSV, the core table and the manifest it was made from are still there, and listed.
    expect(readFileSync(out).equals(readFileSync(reference))).toBe(true);
    const listed = JSON.parse(job.leftovers ?? '[]') as string[];
    expect(listed.map((path) => path.replace(/.*\.(core\.txt(\.archive\.json)?)$/, '$1')).sort()).toEqual(['core.txt', 'core.txt', 'core.txt.archive.json']);
    expect(listed.every((path) => existsSync(path))).toBe(true);

    const again = cli('batch', '--resume', job.id);
    expect(again.status).toBe(1);
    expect(again.stderr).toContain(`batch job ${job.id} is already done (output ${out})`);
    expect(listed.some((path) => existsSync(path))).toBe(false);
    expect(progress(jobsPath)!.leftovers).toBeNull();
  });
});
