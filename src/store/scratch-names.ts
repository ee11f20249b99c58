/**
 * Folded names with their features, for the names table: staged in a scratch SQLite file beside the
 * gazetteer, through a connection of their own, until the import ends; then sorted into a names table
 * of that file by SQLite's sorter (INSERT … SELECT … ORDER BY), on a thread of its own while the
 * importing thread writes the deletion keys and postings, and copied into the store's names table by
 * one INSERT … SELECT, which SQLite runs as a copy of whole records when the table is empty. Written
 * in key order, each page of the table is written about once, however large the import (sorted
 * batches written as they filled each touched most of its pages); SQLite's sorter orders text keys in
 * a fraction of the time a sort of JavaScript strings takes (950,000 names: 1.8 s of CPU for the sort
 * and the writing, against 4.5 s for the sort alone). The commit's index writing ran on one core; the
 * sort on the second takes a third of it off the importing thread (13 M names: 35 s of 138).
 * The scratch file is removed when the import ends; one left by a killed import is removed by the next.
 */
import { readdirSync, rmSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { MessageChannel, receiveMessageOnPort, type MessagePort, type Worker } from 'node:worker_threads';
import Database from 'better-sqlite3';
import { RowWriter } from './import-writers.ts';
import { importScratchPath } from './side-files.ts';
import { startThread } from './start-thread.ts';

/** The names thread's state, shared: still working, done, or failed (its reason on its port). */
export const NAMES_THREAD_WORKING = 0;
export const NAMES_THREAD_DONE = 1;
export const NAMES_THREAD_FAILED = 2;
/** Fewer names than this are sorted on the importing thread: a thread costs more than it saves. */
const THREAD_FROM_NAMES = 500_000;
/** The name the scratch file is attached by to the store's connection. */
const SCRATCH_SCHEMA = 'import_scratch';
/** SQLite's page cache of the scratch file's connections: the staged names are appended, the sorter spills to its own files. */
const SCRATCH_CACHE_KIB = 16_384;
/** Imports this process has begun: each one's scratch file is named by its number. */
let importsBegun = 0;

/** What the names thread is given. */
export interface NamesThreadData {
  scratchPath: string;
  /** The names table's CREATE statement as the store holds it: the copy runs as a copy of records only between tables alike. */
  createSql: string;
  state: Int32Array;
  port: MessagePort;
}

/**
 * @example const names = new ScratchNames(db); // before the import's BEGIN
 *   names.add('rosario', 7); names.add('alto', 9); names.sort(); …; names.copyIn(); …COMMIT…; names.close(); // ('alto', 9), ('rosario', 7)
 */
export class ScratchNames {
  private staging: Database.Database | null;
  private readonly staged: RowWriter;
  private count = 0;
  private thread: { worker: Worker; state: Int32Array; port: MessagePort } | null = null;
  private readonly scratchPath: string;

  /**
   * Opens a scratch file of its own, empty, and attaches it to the store's connection (ATTACH cannot run inside
   * a transaction): call before the import's BEGIN. From `threadFrom` names on, they are sorted on a thread.
   */
  constructor(private readonly db: Database.Database, private readonly threadFrom = THREAD_FROM_NAMES) {
    removeStaleScratch(db.name);
    this.scratchPath = importScratchPath(db.name, process.pid, ++importsBegun);
    this.staging = new Database(this.scratchPath);
    scratchPragmas(this.staging);
    this.staging.exec('CREATE TABLE import_names (key TEXT NOT NULL, feature INTEGER NOT NULL); BEGIN');
    this.staged = new RowWriter(this.staging, 'import_names', ['key', 'feature']);
    db.prepare(`ATTACH ? AS ${SCRATCH_SCHEMA}`).run(this.scratchPath);
  }

  add(key: string, feature: number): void {
    this.staged.add(key, feature);
    this.count++;
  }

  /** Sorts the staged names into the scratch file's names table: on the names thread when there are many (copyIn waits for it). */
  sort(): void {
    const staging = this.staging!;
    this.staged.end();
    staging.exec('COMMIT');
    const createSql = this.db.prepare("SELECT sql FROM main.sqlite_schema WHERE type = 'table' AND name = 'names'").pluck().get() as string;
    if (this.count < this.threadFrom) {
      sortStagedNames(staging, createSql);
    } else {
      const state = new Int32Array(new SharedArrayBuffer(4));
      const { port1, port2 } = new MessageChannel();
      const workerData: NamesThreadData = { scratchPath: this.scratchPath, createSql, state, port: port2 };
      this.thread = { worker: startThread('import-names-thread', { workerData, transferList: [port2] }), state, port: port1 };
    }
    staging.close();
    this.staging = null;
  }

  /** Waits for the names thread, if it runs (this thread has nothing else to do by then), and copies the sorted names into the store's. */
  copyIn(): void {
    if (this.thread !== null) {
      const { state, port } = this.thread;
      Atomics.wait(state, 0, NAMES_THREAD_WORKING);
      if (Atomics.load(state, 0) === NAMES_THREAD_FAILED) {
        throw new Error(`the import's names thread failed: ${String(receiveMessageOnPort(port)?.message ?? 'no reason given')}`);
      }
    }
    this.db.exec(`INSERT OR IGNORE INTO main.names SELECT * FROM ${SCRATCH_SCHEMA}.names`);
  }

  /** After the import's COMMIT or ROLLBACK: lets the names thread finish, detaches and removes the scratch file. */
  close(): void {
    if (this.thread !== null) {
      Atomics.wait(this.thread.state, 0, NAMES_THREAD_WORKING);
      void this.thread.worker.terminate();
      this.thread.port.close();
      this.thread = null;
    }
    this.staging?.close();
    this.staging = null;
    this.db.exec(`DETACH ${SCRATCH_SCHEMA}`);
    removeScratch(this.scratchPath);
  }
}

/**
 * Sorts the staged names of a scratch file's connection into its names table (`createSql`, the
 * store's), each (key, feature) once.
 * @example sortStagedNames(new Database('/data/g.import-scratch'), 'CREATE TABLE names (…) WITHOUT ROWID')
 */
export function sortStagedNames(scratch: Database.Database, createSql: string): void {
  scratchPragmas(scratch);
  scratch.exec(`BEGIN; ${createSql};
    INSERT OR IGNORE INTO names (key, feature) SELECT key, feature FROM import_names ORDER BY key, feature;
    COMMIT;`);
}

/** A scratch file, thrown away when the import ends: nothing to journal or sync; the sorter spills to a file, not to memory. */
function scratchPragmas(scratch: Database.Database): void {
  scratch.pragma('journal_mode = OFF');
  scratch.pragma('synchronous = OFF');
  scratch.pragma('temp_store = FILE');
  scratch.pragma(`cache_size = -${SCRATCH_CACHE_KIB}`);
}

/** Removes the scratch files of imports into the gazetteer at `gazetteerPath` by processes no longer running (killed part way). */
function removeStaleScratch(gazetteerPath: string): void {
  const [prefix] = basename(importScratchPath(gazetteerPath, 0, 0)).split('0-0');
  for (const name of readdirSync(dirname(gazetteerPath))) {
    const pid = name.startsWith(prefix) ? Number(/^(\d+)-\d+$/.exec(name.slice(prefix.length))?.[1]) : NaN;
    if (Number.isInteger(pid) && !isRunning(pid)) removeScratch(join(dirname(gazetteerPath), name));
  }
}

/** Whether a process `pid` runs (signal 0 tests without sending; EPERM: it runs as another user). */
function isRunning(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

function removeScratch(scratchPath: string): void {
  for (const suffix of ['', '-journal', '-wal', '-shm']) rmSync(`${scratchPath}${suffix}`, { force: true });
}
