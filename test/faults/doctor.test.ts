/**
 * `whereabouts doctor` on a healthy store and on damaged copies of it. The damage follows the SQLite
 * file format (sqlite.org/fileformat2.html, D. R. Hipp et al.): the user version is the 4-byte
 * big-endian integer at offset 60 of the header (§1.3), pages are page_size bytes from offset 0, and a
 * b-tree page starts with its page-type byte (§1.6), so a page of garbage cannot be a valid page.
 * SQLite's PRAGMA integrity_check / quick_check (sqlite.org/pragma.html) are what must notice it.
 */
import { copyFileSync, mkdtempSync, openSync, statSync, closeSync, truncateSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { beforeAll, describe, expect, it } from 'vitest';
import type { DoctorReport } from '../../src/store/doctor.ts';
import { SCHEMA_VERSION } from '../../src/store/gazetteer-store.ts';
import { fixtureStore, FIXTURE_SOURCE, whereabouts } from './helpers.ts';

let dir: string;
let healthy: string;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'whereabouts-doctor-'));
  healthy = fixtureStore(dir, 'healthy.sqlite');
}, 60_000);

/** A copy of the healthy store (its -wal folded in when the import closed it), damaged by `damage`. */
function damagedCopy(name: string, damage: (path: string) => void): string {
  const path = join(dir, name);
  copyFileSync(healthy, path);
  damage(path);
  return path;
}

function doctor(dbPath: string): { status: number | null; report: DoctorReport; text: string } {
  const json = whereabouts(['--db', dbPath, 'doctor', '--json']);
  const text = whereabouts(['--db', dbPath, 'doctor']);
  return { status: json.status, report: JSON.parse(json.stdout) as DoctorReport, text: text.stdout };
}

function problems(report: DoctorReport) {
  return report.checks.filter((c) => c.status === 'problem');
}

describe('whereabouts doctor', { timeout: 60_000 }, () => {
  it('finds nothing wrong with a freshly imported store, and exits 0', () => {
    const { status, report, text } = doctor(healthy);
    expect(status).toBe(0);
    expect(report.healthy).toBe(true);
    expect(problems(report)).toEqual([]);
    const byCheck = Object.fromEntries(report.checks.map((c) => [c.check, c]));
    expect(byCheck.integrity.finding).toBe('PRAGMA integrity_check: ok');
    expect(byCheck['schema version'].finding).toContain(`schema version ${SCHEMA_VERSION}`);
    expect(byCheck['journal mode'].status).toBe('ok');
    expect(byCheck[`source ${FIXTURE_SOURCE}`].finding).toMatch(/^\d+ features, each with its name and token index rows/);
    expect(byCheck['index links'].status).toBe('ok');
    expect(text).toContain('no problem found');
  });

  it('reports a schema version this whereabouts does not read', () => {
    const path = damagedCopy('version.sqlite', (p) => {
      const fd = openSync(p, 'r+');
      const version = Buffer.alloc(4);
      version.writeUInt32BE(SCHEMA_VERSION + 6);
      writeSync(fd, version, 0, 4, 60); // fileformat2 §1.3: user version at offset 60
      closeSync(fd);
    });
    const { status, report, text } = doctor(path);
    expect(status).toBe(1);
    expect(problems(report).map((c) => c.check)).toEqual(['schema version']);
    expect(problems(report)[0].finding).toContain(`schema version ${SCHEMA_VERSION + 6}, written by a newer whereabouts`);
    expect(text).toMatch(/PROBLEM schema version: .*\n\s+what to do: use the whereabouts that wrote the store/);
  });

  it('reports a truncated file as damage, with what to do', () => {
    const path = damagedCopy('truncated.sqlite', (p) => truncateSync(p, Math.floor(statSync(p).size / 2)));
    const { status, report } = doctor(path);
    expect(status).toBe(1);
    const integrity = report.checks.find((c) => c.check === 'integrity')!;
    expect(integrity.status).toBe('problem');
    expect(integrity.finding).toMatch(/malformed|damage/);
    expect(integrity.remedy).toContain('restore the file from a backup');
  });

  it('reports a page overwritten with garbage bytes', () => {
    const path = damagedCopy('garbage.sqlite', (p) => {
      const pageSize = new Database(p, { readonly: true }).pragma('page_size', { simple: true }) as number;
      const fd = openSync(p, 'r+');
      writeSync(fd, Buffer.alloc(pageSize, 0xa5), 0, pageSize, pageSize * 2); // the third page, a b-tree page of the schema
      closeSync(fd);
    });
    const { status, report } = doctor(path);
    expect(status).toBe(1);
    expect(report.checks.find((c) => c.check === 'integrity')!.status).toBe('problem');
    const quick = whereabouts(['--db', path, 'doctor', '--quick']);
    expect(quick.status).toBe(1);
    expect(quick.stdout).toMatch(/^PROBLEM integrity: /m);
  });

  it('reports a source whose features lost their name index rows, and says to import it again', () => {
    const path = damagedCopy('unindexed.sqlite', (p) => {
      const db = new Database(p);
      db.prepare("DELETE FROM names WHERE feature IN (SELECT id FROM features WHERE feature_id IN ('qb-01', 'qb-02'))").run();
      db.close();
    });
    const { status, report } = doctor(path);
    expect(status).toBe(1);
    const source = report.checks.find((c) => c.check === `source ${FIXTURE_SOURCE}`)!;
    expect(source.status).toBe('problem');
    expect(source.finding).toMatch(/^2 of its \d+ features have no name index rows/);
    expect(source.remedy).toContain(`--source-id ${FIXTURE_SOURCE}`);
  });

  it('notes a -wal file holding changes not yet copied into the store, without calling it a problem', () => {
    const path = damagedCopy('open-writer.sqlite', () => undefined);
    const writer = new Database(path);
    try {
      writer.pragma('wal_autocheckpoint = 0'); // keep the change in the -wal file (sqlite.org/wal.html, "Checkpointing")
      writer.prepare("UPDATE sources SET licence = 'CC0 1.0'").run();
      const { status, report } = doctor(path);
      expect(status).toBe(0);
      const journal = report.checks.find((c) => c.check === 'journal files')!;
      expect(journal.status).toBe('note');
      expect(journal.remedy).toContain('do not delete the -wal file');
    } finally {
      writer.close();
    }
  });

  it('says when the file is not there', () => {
    const { status, report } = doctor(join(dir, 'absent.sqlite'));
    expect(status).toBe(1);
    expect(report.checks).toEqual([expect.objectContaining({ check: 'file', status: 'problem' })]);
  });
});
