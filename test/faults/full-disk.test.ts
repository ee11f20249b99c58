/**
 * A full disk gives a clear error, never a corrupt file: a 2 MB tmpfs (mount(8), tmpfs(5)) holds the
 * store for an import and the output for a batch that cannot fit. SQLite reports a full disk as
 * SQLITE_FULL, "database or disk is full" (sqlite.org/rescode.html#full), and rolls the transaction
 * back; a file write reports ENOSPC (write(2)). Needs root to mount; skipped, saying so, otherwise.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { DoctorReport } from '../../src/store/doctor.ts';
import { fixtureStore, FIXTURE_SOURCE, locatedFeature, whereabouts, writeInventedGazetteer } from './helpers.ts';

const DISK_SIZE = '2m';
/** What the batch needs once the disk is made larger: its output is some 2 kB a row (footprint WKT). */
const LARGER_DISK_SIZE = '64m';
const BATCH_ROWS = 5000;
const DISK_FULL = /disk is full|SQLITE_FULL|ENOSPC|no space left/i;

/** Mounts a small tmpfs; returns where, or why it could not. */
function mountSmallDisk(): { dir: string; skipped?: undefined } | { dir?: undefined; skipped: string } {
  if (process.platform !== 'linux') return { skipped: 'tmpfs mounts are a Linux feature' };
  const dir = mkdtempSync(join(tmpdir(), 'whereabouts-full-disk-'));
  const mounted = spawnSync('mount', ['-t', 'tmpfs', '-o', `size=${DISK_SIZE}`, 'tmpfs', dir], { encoding: 'utf8' });
  if (mounted.status !== 0) return { skipped: `mount is not permitted here (${(mounted.stderr || mounted.error?.message || '').trim()})` };
  return { dir };
}

const disk = mountSmallDisk();

afterAll(() => {
  if (disk.dir !== undefined) spawnSync('umount', [disk.dir]);
});

function resize(size: string): void {
  const remounted = spawnSync('mount', ['-o', `remount,size=${size}`, disk.dir!], { encoding: 'utf8' });
  if (remounted.status !== 0) throw new Error(`remount failed: ${remounted.stderr}`);
}

/** An output with the run timestamp (ISO 8601 to the second) taken out, to compare two runs. */
function withoutRunTimestamp(path: string): string {
  return readFileSync(path, 'utf8').replace(/\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ/g, '<run>');
}

describe.skipIf(disk.skipped !== undefined)(`a full disk${disk.skipped ? ` (skipped: ${disk.skipped})` : ''}`, { timeout: 120_000 }, () => {
  it('stops an import with a disk-full error and leaves the store as it was', () => {
    resize(DISK_SIZE);
    const dbPath = fixtureStore(disk.dir, 'store.sqlite');
    const input = join(mkdtempSync(join(tmpdir(), 'whereabouts-full-disk-input-')), 'invented-villages.csv');
    writeInventedGazetteer(input, 50_000); // some 8 MB of store: four times the disk

    const imported = whereabouts(['--db', dbPath, 'import', input, '--source-id', 'invented-villages']);
    expect(imported.status).not.toBe(0);
    expect(imported.stderr).toMatch(DISK_FULL);

    expect(locatedFeature(dbPath, 'Caleta Brava')).toEqual({ status: 'georeferenced', sourceId: FIXTURE_SOURCE });
    const listed = whereabouts(['--db', dbPath, 'gazetteer', 'list', '--json']);
    expect((JSON.parse(listed.stdout) as { id: string }[]).map((s) => s.id)).toEqual([FIXTURE_SOURCE]);
    const doctor = whereabouts(['--db', dbPath, 'doctor', '--json']);
    expect(doctor.status, doctor.stdout).toBe(0);
    expect((JSON.parse(doctor.stdout) as DoctorReport).healthy).toBe(true);
  });

  describe('a batch whose output does not fit', () => {
    const work = mkdtempSync(join(tmpdir(), 'whereabouts-full-disk-batch-'));
    const input = join(work, 'records.csv');
    const target = () => join(disk.dir!, 'records.out.csv');
    let dbPath: string;

    it('stops with a disk-full error, and no output file at the target path', () => {
      resize(DISK_SIZE);
      dbPath = fixtureStore(work);
      const places = ['Caleta Brava', 'San Telmo', 'Rio Hondo'];
      const lines = ['occurrenceID,locality,countryCode'];
      for (let i = 0; i < BATCH_ROWS; i++) lines.push(`o-${i},"${1 + (i % 40)} km N of ${places[i % places.length]}",QV`);
      writeFileSync(input, `${lines.join('\n')}\n`);

      const batch = whereabouts(['--db', dbPath, 'batch', input, '--out', target(), '--quiet']);
      expect(batch.status).not.toBe(0);
      expect(batch.stderr).toMatch(DISK_FULL);
      expect(existsSync(target())).toBe(false);
      // The job is kept, and doctor says how to finish it.
      const doctor = JSON.parse(whereabouts(['--db', dbPath, 'doctor', '--json']).stdout) as DoctorReport;
      expect(doctor.healthy).toBe(true);
      expect(doctor.checks.find((c) => c.check.startsWith('batch job '))?.remedy).toMatch(/^finish it with: whereabouts batch --resume \w+$/);
    });

    // A short write at the full disk must not be committed as whole, or the resumed file would hold
    // NUL bytes where rows should be.
    it('resumes once the disk has room, with every row once, as an unbroken run writes them', () => {
      resize(LARGER_DISK_SIZE);
      const job = readdirSync(disk.dir!).map((name) => /^records\.out\.csv\.(\w+)\.partial$/.exec(name)?.[1]).find(Boolean)!;
      const resumed = whereabouts(['--db', dbPath, 'batch', '--resume', job, '--quiet']);
      expect(resumed.status, resumed.stderr).toBe(0);
      const reference = join(work, 'reference.csv');
      expect(whereabouts(['--db', dbPath, 'batch', input, '--out', reference, '--quiet']).status).toBe(0);
      expect(withoutRunTimestamp(target())).toBe(withoutRunTimestamp(reference));
    });
  });
});
