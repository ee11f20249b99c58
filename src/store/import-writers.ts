/**
 * The import's writers of the store's index tables (names, postings, deletion keys): rows are written
 * in key order, many to a statement, because a B-tree fills fastest, and fullest, in key order.
 */
import { closeSync, openSync, readSync, unlinkSync, writeSync } from 'node:fs';
import type Database from 'better-sqlite3';

/** Rows a multi-row INSERT writes at once: one statement of many rows costs far less than many statements. */
const ROWS_PER_INSERT = 100;
/** Index pairs sorted in memory at once: 8 MB for each index. */
const PAIR_BUFFER = 1_000_000;
/** Pairs read from each sorted run at once while the runs are merged: 512 KB a run. */
const MERGE_READ_PAIRS = 65_536;
/** The sign bit of a 32-bit integer. */
const SIGN_BIT = 0x80000000;

/**
 * INSERT OR IGNORE of rows into `table`, ROWS_PER_INSERT rows to a statement; `end` writes what is left.
 * @example const writer = new RowWriter(db, 'postings', 2); writer.add(1, 10); writer.end();
 */
export class RowWriter {
  private readonly full: Database.Statement;
  private readonly single: Database.Statement;
  private readonly values: unknown[];
  private size = 0;

  constructor(db: Database.Database, table: string, private readonly columns: readonly string[]) {
    const statement = (rows: number) => db.prepare(`INSERT OR IGNORE INTO ${table} (${columns.join(', ')}) VALUES `
      + Array.from({ length: rows }, () => `(${columns.map(() => '?').join(', ')})`).join(', '));
    this.full = statement(ROWS_PER_INSERT);
    this.single = statement(1);
    this.values = new Array<unknown>(columns.length * ROWS_PER_INSERT);
  }

  /** Adds a row: `third` only for a table of three columns. */
  add(first: unknown, second: unknown, third?: unknown): void {
    this.values[this.size++] = first;
    this.values[this.size++] = second;
    if (this.columns.length === 3) this.values[this.size++] = third;
    if (this.size === this.values.length) {
      this.full.run(this.values);
      this.size = 0;
    }
  }

  end(): void {
    for (let at = 0; at < this.size; at += this.columns.length) this.single.run(this.values.slice(at, at + this.columns.length));
    this.size = 0;
  }
}

/**
 * Pairs of 32-bit integers for an index table (deletion keys, postings), written in key order when
 * the import ends. They arrive in random key order: runs of PAIR_BUFFER pairs are sorted and kept in a
 * temporary file, and merged as they are written, so each page of the table is written about once,
 * however large the import (sorted batches written as they fill would each touch most of its pages).
 * The file is removed from its folder as soon as it is opened: it never outlives the import.
 * @example const pairs = new SortedPairs(writer, '/data/g.import-sort'); pairs.add(7, 1); pairs.add(3, 2); pairs.write(); // (3, 2), (7, 1)
 */
export class SortedPairs {
  private readonly pairs = new BigUint64Array(PAIR_BUFFER);
  /**
   * The same memory as 32-bit halves, the low half first (Node runs on little-endian machines). The
   * first integer is kept with its sign bit flipped, so that the pairs sort as the table orders them.
   */
  private readonly halves = new Uint32Array(this.pairs.buffer);
  private size = 0;
  /** The sorted runs in the file: where each starts and how many pairs it holds. */
  private readonly runs: { start: number; length: number }[] = [];
  private file: number | null = null;
  private fileBytes = 0;

  /** The first integer is written as a signed 32-bit value; runs go to a file at `spillPath`. */
  constructor(private readonly writer: RowWriter, private readonly spillPath: string) {}

  add(first: number, second: number): void {
    this.halves[2 * this.size] = second;
    this.halves[2 * this.size + 1] = first ^ SIGN_BIT;
    if (++this.size === PAIR_BUFFER) this.spill();
  }

  /** Writes every pair to the table in key order and forgets them; `each`, when given, is shown every pair written. */
  write(each?: (first: number, second: number) => void): void {
    const emit = (first: number, second: number) => {
      this.writer.add(first, second);
      each?.(first, second);
    };
    if (this.runs.length === 0) {
      this.pairs.subarray(0, this.size).sort();
      for (let i = 0; i < this.size; i++) emit(this.halves[2 * i + 1] ^ SIGN_BIT, this.halves[2 * i]);
    } else {
      if (this.size > 0) this.spill();
      this.merge(emit);
    }
    this.writer.end();
    this.discard();
  }

  /** Forgets every pair and closes the file (an import that failed, or one written). */
  discard(): void {
    if (this.file !== null) closeSync(this.file);
    this.file = null;
    this.runs.length = 0;
    this.fileBytes = 0;
    this.size = 0;
  }

  private spill(): void {
    if (this.file === null) {
      this.file = openSync(this.spillPath, 'w+');
      unlinkSync(this.spillPath);
    }
    this.pairs.subarray(0, this.size).sort();
    const bytes = this.size * 8;
    for (let written = 0; written < bytes;) written += writeSync(this.file, this.halves, written, bytes - written, this.fileBytes + written);
    this.runs.push({ start: this.fileBytes, length: this.size });
    this.fileBytes += bytes;
    this.size = 0;
  }

  /** K-way merge of the sorted runs through a binary heap of their next pairs, compared as (high, low) halves. */
  private merge(emit: (first: number, second: number) => void): void {
    const file = this.file!;
    const runs = this.runs.map(({ start, length }) => ({
      halves: new Uint32Array(MERGE_READ_PAIRS * 2), next: start, left: length, at: 0, held: 0,
    }));
    /** Reads the run's next pairs; false when it has none left. */
    const refill = (run: typeof runs[number]): boolean => {
      const pairs = Math.min(MERGE_READ_PAIRS, run.left);
      if (pairs === 0) return false;
      const bytes = pairs * 8;
      for (let read = 0; read < bytes;) read += readSync(file, run.halves, read, bytes - read, run.next + read);
      run.next += bytes;
      run.left -= pairs;
      run.at = 0;
      run.held = pairs;
      return true;
    };
    const high = (run: typeof runs[number]) => run.halves[2 * run.at + 1];
    const low = (run: typeof runs[number]) => run.halves[2 * run.at];
    const before = (a: typeof runs[number], b: typeof runs[number]) => high(a) < high(b) || (high(a) === high(b) && low(a) < low(b));
    const heap = runs.filter(refill);
    const sink = (from: number) => {
      for (let i = from; ;) {
        const left = 2 * i + 1;
        if (left >= heap.length) return;
        const child = left + 1 < heap.length && before(heap[left + 1], heap[left]) ? left + 1 : left;
        if (!before(heap[child], heap[i])) return;
        [heap[i], heap[child]] = [heap[child], heap[i]];
        i = child;
      }
    };
    for (let i = (heap.length >> 1) - 1; i >= 0; i--) sink(i);
    while (heap.length > 0) {
      const run = heap[0];
      emit(high(run) ^ SIGN_BIT, low(run));
      if (++run.at === run.held && !refill(run)) {
        heap[0] = heap[heap.length - 1];
        heap.pop();
      }
      sink(0);
    }
  }
}

/**
 * Folded names with their features, for the names table: kept in a temporary table (in SQLite's
 * temporary file, not the store's) until the import ends, then written in key order by one INSERT …
 * SELECT … ORDER BY, so that each page of the table is written about once, however large the import,
 * as SortedPairs does for integers. SQLite's sorter orders text keys in a fraction of the time a sort
 * of JavaScript strings takes (950,000 names: 1.8 s of CPU for the sort and the writing, against 4.5 s
 * for the sort alone); sorted batches written as they filled each touched most of the table's pages,
 * which at the world's size no longer fit the page cache. The connection must keep temporary tables
 * in a file (temp_store FILE): at the world's size they hold hundreds of MB.
 * @example const names = new StagedNames(db); names.add('rosario', 7); names.add('alto', 9); names.write(); // ('alto', 9), ('rosario', 7)
 */
export class StagedNames {
  private readonly staged: RowWriter;

  /** Creates the temporary table: inside the import's transaction, so that a rollback takes it away. */
  constructor(private readonly db: Database.Database) {
    db.exec('CREATE TEMP TABLE import_names (key TEXT NOT NULL, feature INTEGER NOT NULL)');
    this.staged = new RowWriter(db, 'temp.import_names', ['key', 'feature']);
  }

  add(key: string, feature: number): void {
    this.staged.add(key, feature);
  }

  /** Writes every name to the names table in key order and drops the temporary table. */
  write(): void {
    this.staged.end();
    this.db.exec(`INSERT OR IGNORE INTO names (key, feature) SELECT key, feature FROM temp.import_names ORDER BY key, feature;
      DROP TABLE temp.import_names;`);
  }
}
