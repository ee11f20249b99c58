/**
 * The names an import stages in its scratch file (src/store/scratch-names.ts), sorted on the importing
 * thread and on a thread of their own, and copied into a names table: each (key, feature) once, in the
 * order SQLite's BINARY collation gives text (byte order of the UTF-8 text: SQLite documentation,
 * "Datatypes In SQLite", §7.1 Collating Sequences), checked against Node's Buffer.compare, and the
 * scratch file gone afterwards, as is one left by a killed import.
 */
import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { ScratchNames } from '../../src/store/scratch-names.ts';
import { importScratchPath } from '../../src/store/side-files.ts';

const directory = mkdtempSync(join(tmpdir(), 'whereabouts-scratch-names-'));
afterAll(() => rmSync(directory, { recursive: true, force: true }));

const NAMES: [string, number][] = [['rosario', 7], ['alto', 9], ['ñandú', 3], ['alto', 2], ['rosario', 7], ['zárate', 1], ['alto', 9], ['a', 5]];
/** The rows in byte order of their UTF-8 keys, then by feature, each once. */
const EXPECTED = [...new Map(NAMES.map(([key, feature]) => [`${key}\u0000${feature}`, [key, feature] as [string, number]])).values()]
  .sort(([a, x], [b, y]) => Buffer.compare(Buffer.from(a), Buffer.from(b)) || x - y);

const scratchFiles = () => readdirSync(directory).filter((name) => name.includes('.import-scratch'));

function storeWithNames(name: string): Database.Database {
  const db = new Database(join(directory, `${name}.sqlite`));
  db.exec('CREATE TABLE names (key TEXT NOT NULL, feature INTEGER NOT NULL, PRIMARY KEY (key, feature)) WITHOUT ROWID');
  return db;
}

describe('ScratchNames', () => {
  for (const [where, threadFrom] of [['on the importing thread', Infinity], ['on a thread of their own', 0]] as const) {
    it(`sorts the staged names ${where} into the store's names table, each once, and removes its file`, () => {
      const db = storeWithNames(`store-${threadFrom}`);
      // Left by an import killed part way: a process that no longer runs (the largest pid Linux gives is 2^22).
      const stale = importScratchPath(db.name, 2 ** 22 + 1, 1);
      writeFileSync(stale, 'left by a killed import');
      const names = new ScratchNames(db, threadFrom);
      expect(existsSync(stale)).toBe(false);
      db.exec('BEGIN');
      for (const [key, feature] of NAMES) names.add(key, feature);
      names.sort();
      names.copyIn();
      db.exec('COMMIT');
      names.close();
      expect(db.prepare('SELECT key, feature FROM names').raw().all()).toEqual(EXPECTED);
      expect(scratchFiles()).toEqual([]);
      db.close();
    });
  }

  it('leaves the names table as it was, and no file, when the import is rolled back', () => {
    const db = storeWithNames('rolled-back');
    const names = new ScratchNames(db, 0);
    db.exec('BEGIN');
    names.add('alto', 1);
    names.sort();
    db.exec('ROLLBACK');
    names.close();
    expect(db.prepare('SELECT count(*) FROM names').pluck().get()).toBe(0);
    expect(scratchFiles()).toEqual([]);
    db.close();
  });
});
