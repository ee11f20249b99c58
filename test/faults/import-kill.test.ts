/**
 * An import killed with SIGKILL part way (no chance to roll back or clean up) leaves the store as it
 * was before: an import is one SQLite transaction, and SQLite's WAL keeps an uncommitted transaction
 * out of the database after a crash (sqlite.org/wal.html, "Recovery"; sqlite.org/atomiccommit.html).
 * The kill lands when the import has read between a quarter and two thirds of its file, seen through
 * Linux's /proc/<pid>/fdinfo read position (proc(5)).
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, readlinkSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { describe, expect, it } from 'vitest';
import type { DoctorReport } from '../../src/store/doctor.ts';
import { BIN, fixtureStore, FIXTURE_SOURCE, locatedFeature, whereabouts, writeInventedGazetteer } from './helpers.ts';

/** 300,000 rows: some 6 s of import on a 2-core machine, long enough to be killed part way. */
const ROWS = 300_000;

/** How far the process `pid` has read the file at `path` (bytes), or undefined while it has not opened it. */
function readPosition(pid: number, path: string): number | undefined {
  try {
    for (const fd of readdirSync(`/proc/${pid}/fd`)) {
      let target: string;
      try {
        target = readlinkSync(`/proc/${pid}/fd/${fd}`);
      } catch {
        continue;
      }
      if (target === path) return Number(/^pos:\s+(\d+)/m.exec(readFileSync(`/proc/${pid}/fdinfo/${fd}`, 'utf8'))![1]);
    }
  } catch {
    // the process is gone
  }
  return undefined;
}

describe.skipIf(process.platform !== 'linux')('an import killed with SIGKILL part way', { timeout: 120_000 }, () => {
  it('leaves the previous store usable and the half-done source absent', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'whereabouts-import-kill-'));
    const dbPath = fixtureStore(dir);
    const input = join(dir, 'invented-villages.csv');
    writeInventedGazetteer(input, ROWS);
    const size = statSync(input).size;

    const child = spawn(process.execPath, [BIN, '--db', dbPath, 'import', input, '--source-id', 'invented-villages'], { stdio: 'ignore' });
    const exited = new Promise<NodeJS.Signals | null>((resolve) => child.on('exit', (_code, signal) => resolve(signal)));
    let position: number | undefined;
    for (;;) {
      position = readPosition(child.pid!, input);
      if (position !== undefined && position >= size / 4) break;
      if (child.exitCode !== null) throw new Error('the import ended before it could be killed');
      await sleep(20);
    }
    child.kill('SIGKILL');
    expect(await exited).toBe('SIGKILL');
    expect(position).toBeLessThan((size * 2) / 3);

    // The earlier source still answers, and only it is listed.
    expect(locatedFeature(dbPath, 'Caleta Brava')).toEqual({ status: 'georeferenced', sourceId: FIXTURE_SOURCE });
    const listed = whereabouts(['--db', dbPath, 'gazetteer', 'list', '--json']);
    expect(listed.status, listed.stderr).toBe(0);
    expect((JSON.parse(listed.stdout) as { id: string }[]).map((s) => s.id)).toEqual([FIXTURE_SOURCE]);
    const firstInvented = readFileSync(input, 'utf8').split('\n')[1].split(',')[1];
    expect(locatedFeature(dbPath, firstInvented).sourceId).toBeUndefined();

    // The store passes every check (a -wal file left by the kill is a note, not a problem).
    const doctor = whereabouts(['--db', dbPath, 'doctor', '--json']);
    expect(doctor.status, doctor.stdout).toBe(0);
    const report = JSON.parse(doctor.stdout) as DoctorReport;
    expect(report.checks.filter((c) => c.status === 'problem')).toEqual([]);
    expect(report.checks.find((c) => c.check === 'integrity')!.status).toBe('ok');

    // And the same import, run again to the end, goes in whole.
    const again = whereabouts(['--db', dbPath, 'import', input, '--source-id', 'invented-villages']);
    expect(again.status, again.stderr).toBe(0);
    expect(again.stdout).toContain(`${ROWS} rows read, ${ROWS} imported, 0 rejected`);
    expect(locatedFeature(dbPath, firstInvented).sourceId).toBe('invented-villages');
  });
});
