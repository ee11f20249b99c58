/**
 * A copy of a gazetteer for many readers on a shared (network) file system: the same pages, in rollback
 * journal mode instead of WAL, and made read-only. WAL readers share an index in a -shm file mapped in
 * memory, which a network file system does not keep in step between machines, and open it for writing;
 * a rollback-journal file opened read-only is only read, with shared locks (SQLite, "Write-Ahead
 * Logging", sections 2.1 and 8, sqlite.org/wal.html).
 */
import { chmodSync, existsSync } from 'node:fs';
import Database from 'better-sqlite3';

/**
 * Write the copy (refusing to replace a file) and return once it is whole and read-only.
 * @example await writeSharedGazetteerCopy('whereabouts.sqlite', '/shared/gazetteer.sqlite')
 */
export async function writeSharedGazetteerCopy(from: string, to: string): Promise<void> {
  if (!existsSync(from)) throw new Error(`no gazetteer database at ${from}`);
  if (existsSync(to)) throw new Error(`${to} exists already; give a new file name for the shared copy`);
  const source = new Database(from, { readonly: true, fileMustExist: true });
  try {
    await source.backup(to);
  } finally {
    source.close();
  }
  const copy = new Database(to);
  try {
    copy.pragma('journal_mode = DELETE');
  } finally {
    copy.close();
  }
  chmodSync(to, 0o444);
}
