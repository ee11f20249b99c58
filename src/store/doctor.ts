/**
 * An examination of a gazetteer store, read-only: SQLite's own integrity check, the schema version,
 * the journal mode, that every source has its features and index rows, journal files left behind, and
 * the batch job database beside the store. Each finding says what to do about it.
 */
import { existsSync, statSync } from 'node:fs';
import Database from 'better-sqlite3';
import { jobsDatabasePath } from './side-files.ts';
import { nameVariants } from '../match/fold.ts';
import { OLDEST_READABLE_SCHEMA, SCHEMA_VERSION } from './gazetteer-store.ts';
import { recordsUnitsByRow } from './unit-names.ts';

/** `note`: worth knowing, nothing is wrong; `problem`: the store (or a job) needs the remedy. */
export type CheckStatus = 'ok' | 'note' | 'problem';

export interface DoctorCheck {
  /** What was checked, e.g. "integrity" or "source demo-towns". */
  check: string;
  status: CheckStatus;
  finding: string;
  /** What to do, for a note or a problem. */
  remedy?: string;
}

export interface DoctorReport {
  storePath: string;
  /** True when no check found a problem (notes allowed). */
  healthy: boolean;
  checks: DoctorCheck[];
}

export interface DoctorOptions {
  /** PRAGMA quick_check instead of integrity_check: skips the index-against-table comparison, much faster on a large store. */
  quick?: boolean;
}

/** Tables the store's schema (store.ts) creates. */
const STORE_TABLES = ['sources', 'features', 'names', 'tokens', 'postings', 'deletions', 'unit_names'];
/** Integrity messages listed at most (SQLite stops counting there). */
const MAX_INTEGRITY_MESSAGES = 20;
const REBUILD = 'restore the file from a backup, or move it aside and import the gazetteer files again into a new store (whereabouts --db <new file> import <file>)';

/**
 * Examines the store at `storePath` without writing to it.
 * @example examineStore('whereabouts.sqlite') // { storePath: 'whereabouts.sqlite', healthy: true, checks: [{ check: 'integrity', status: 'ok', … }, …] }
 */
export function examineStore(storePath: string, options: DoctorOptions = {}): DoctorReport {
  const checks: DoctorCheck[] = [];
  if (!existsSync(storePath)) {
    checks.push({
      check: 'file', status: 'problem', finding: `no file at ${storePath}`,
      remedy: 'name the store with --db <file> (or WHEREABOUTS_DB), or create one with whereabouts import <file>',
    });
    return { storePath, healthy: false, checks };
  }
  // Before opening: opening the store creates its -wal and -shm files.
  checks.push(journalFiles(storePath));
  checks.push(...withDatabase(storePath, 'store', (db) => storeChecks(db, options)));
  checks.push(...batchJobChecks(jobsDatabasePath(storePath)));
  return { storePath, healthy: checks.every((c) => c.status !== 'problem'), checks };
}

/** Opens `path` read-only and runs `examine`, turning a file SQLite cannot read into one problem. */
function withDatabase(path: string, what: string, examine: (db: Database.Database) => DoctorCheck[]): DoctorCheck[] {
  let db: Database.Database;
  try {
    db = new Database(path, { readonly: true, fileMustExist: true });
  } catch (error) {
    return [{ check: 'file', status: 'problem', finding: `the ${what} ${path} cannot be opened as SQLite: ${messageOf(error)}`, remedy: REBUILD }];
  }
  try {
    return examine(db);
  } finally {
    db.close();
  }
}

function storeChecks(db: Database.Database, options: DoctorOptions): DoctorCheck[] {
  const integrity = guarded('integrity', () => integrityCheck(db, options.quick === true));
  const schema = guarded('schema version', () => schemaCheck(db));
  const checks = [integrity, schema, guarded('journal mode', () => journalModeCheck(db))];
  // Row counts of a damaged file or of another schema would mislead.
  if (integrity.status === 'ok' && schema.status !== 'problem') {
    try {
      checks.push(...sourceChecks(db), ...orphanChecks(db));
    } catch (error) {
      checks.push(unreadable('sources', error));
    }
  }
  return checks;
}

/** A check that SQLite could not even run is a problem with the file itself. */
function guarded(check: string, run: () => DoctorCheck): DoctorCheck {
  try {
    return run();
  } catch (error) {
    return unreadable(check, error);
  }
}

function unreadable(check: string, error: unknown): DoctorCheck {
  return { check, status: 'problem', finding: `SQLite could not read the file: ${messageOf(error)}`, remedy: REBUILD };
}

function integrityCheck(db: Database.Database, quick: boolean): DoctorCheck {
  const pragma = quick ? 'quick_check' : 'integrity_check';
  const messages = (db.pragma(`${pragma}(${MAX_INTEGRITY_MESSAGES})`) as Record<string, string>[]).map((row) => row[pragma]);
  if (messages.length === 1 && messages[0] === 'ok') return { check: 'integrity', status: 'ok', finding: `PRAGMA ${pragma}: ok` };
  return { check: 'integrity', status: 'problem', finding: `PRAGMA ${pragma} found damage: ${messages.join('; ')}`, remedy: REBUILD };
}

function schemaCheck(db: Database.Database): DoctorCheck {
  const version = db.pragma('user_version', { simple: true }) as number;
  const check = 'schema version';
  if (version === 0) {
    return { check, status: 'problem', finding: 'schema version 0: this is not a whereabouts gazetteer store', remedy: 'name the store with --db <file>, or create one with whereabouts import <file>' };
  }
  if (version > SCHEMA_VERSION) {
    return {
      check, status: 'problem', finding: `schema version ${version}, written by a newer whereabouts; this one reads version ${SCHEMA_VERSION}`,
      remedy: 'use the whereabouts that wrote the store, or import the gazetteer files again into a new store with this one',
    };
  }
  if (version < OLDEST_READABLE_SCHEMA) {
    return { check, status: 'problem', finding: `schema version ${version}, older than any version this whereabouts reads (${OLDEST_READABLE_SCHEMA} to ${SCHEMA_VERSION})`, remedy: 'import the gazetteer files again into a new store' };
  }
  if (version < SCHEMA_VERSION) {
    return {
      check, status: 'note', finding: `schema version ${version}, older than version ${SCHEMA_VERSION}: its data reads as it is, and the next whereabouts command that opens it migrates it in place (adds what later versions hold: source priorities, the details of alternate names and the names of administrative units (2), features by position (3), the country outlines' index (4), each unit name tied to its unit's own feature (5), which the names already held gain when their file is imported again)`,
      remedy: 'nothing to do; keep a copy first if an older whereabouts must still read the file',
    };
  }
  const present = new Set((db.prepare("SELECT name FROM sqlite_schema WHERE type = 'table'").all() as { name: string }[]).map((r) => r.name));
  const missing = STORE_TABLES.filter((table) => !present.has(table));
  if (missing.length > 0) return { check, status: 'problem', finding: `schema version ${version}, but the tables ${missing.join(', ')} are missing`, remedy: REBUILD };
  return { check, status: 'ok', finding: `schema version ${version}, as this whereabouts expects` };
}

function journalModeCheck(db: Database.Database): DoctorCheck {
  const mode = db.pragma('journal_mode', { simple: true }) as string;
  if (mode === 'wal') return { check: 'journal mode', status: 'ok', finding: 'WAL (readers never wait for an import)' };
  return {
    check: 'journal mode', status: 'problem', finding: `journal mode ${mode}, not WAL: batch workers and the service would wait for every write`,
    remedy: "with no whereabouts process using the store, run: sqlite3 <store> 'PRAGMA journal_mode=WAL'",
  };
}

/** A -wal file with content is either in use or left by a process that stopped without closing the store. */
function journalFiles(path: string): DoctorCheck {
  const wal = `${path}-wal`;
  const walBytes = existsSync(wal) ? statSync(wal).size : 0;
  if (walBytes === 0) return { check: 'journal files', status: 'ok', finding: existsSync(wal) ? 'the -wal file is empty' : 'no -wal file' };
  return {
    check: 'journal files', status: 'note',
    finding: `${wal} holds ${walBytes} bytes not yet copied into the store: a whereabouts process has the store open, or one stopped without closing it`,
    remedy: 'nothing to do, and do not delete the -wal file (it may hold committed changes): SQLite keeps the committed part and drops the rest, and the next import folds it into the store',
  };
}

interface SourceCounts {
  id: number;
  name: string;
  content_hash: string;
  format: string;
  feature_count: number;
  features: number;
  named: number | null;
  posted: number | null;
}

/** Each source: the feature count it was recorded with, its feature rows, and the features with name and token index rows. */
function sourceChecks(db: Database.Database): DoctorCheck[] {
  const rows = db.prepare(`
    SELECT s.id, s.name, s.content_hash, s.format, s.feature_count,
      (SELECT count(*) FROM features f WHERE f.source = s.id) AS features, named.n AS named, posted.n AS posted
    FROM sources s
    LEFT JOIN (SELECT source, count(*) AS n FROM features WHERE id IN (SELECT feature FROM names) GROUP BY source) named ON named.source = s.id
    LEFT JOIN (SELECT source, count(*) AS n FROM features WHERE id IN (SELECT feature FROM postings) GROUP BY source) posted ON posted.source = s.id
    ORDER BY s.name`).all() as SourceCounts[];
  if (rows.length === 0) {
    return [{ check: 'sources', status: 'note', finding: 'the store holds no gazetteer source', remedy: 'import one with whereabouts import <file>' }];
  }
  return rows.map((row) => sourceCheck(db, row));
}

function sourceCheck(db: Database.Database, row: SourceCounts): DoctorCheck {
  const check = `source ${row.name}`;
  const reimport = `import its file again (whereabouts import <file> --source-id ${row.name}): an import replaces the whole source in one transaction`;
  if (row.content_hash === '') {
    return { check, status: 'problem', finding: 'recorded without a content hash: its import never finished', remedy: `remove it (whereabouts gazetteer remove ${row.name}), then ${reimport}` };
  }
  if (row.features !== row.feature_count) {
    return { check, status: 'problem', finding: `recorded with ${row.feature_count} features, but ${row.features} feature rows are stored`, remedy: reimport };
  }
  const unindexed = row.features - (row.named ?? 0);
  // A feature whose every name folds to nothing (punctuation only) has no name to index: not a fault.
  const missing = unindexed === 0 ? 0 : countIndexable(db, row.id);
  if (missing > 0) return { check, status: 'problem', finding: `${missing} of its ${row.features} features have no name index rows, so lookups cannot find them`, remedy: reimport };
  if ((row.posted ?? 0) !== (row.named ?? 0)) {
    return { check, status: 'problem', finding: `${row.named ?? 0} features have name index rows but ${row.posted ?? 0} have token index rows, so fuzzy lookups miss some`, remedy: reimport };
  }
  const unnamed = unindexed > 0 ? `; ${unindexed} have names that fold to nothing and are reached by id only` : '';
  const found = `${row.features} features, each with its name and token index rows${unnamed}`;
  const untied = untiedUnitNames(db, row);
  if (untied > 0) {
    return {
      check, status: 'note',
      finding: `${found}; ${untied} names and codes of its states, counties or municipalities, recorded before schema version 5, are tied to no unit's own feature, so a code names its unit only by the unit's name, which two units may share`,
      remedy: reimport,
    };
  }
  return { check, status: 'ok', finding: found };
}

/**
 * The unit names of a source that a file of its format ties to their unit's feature (recordsUnitsByRow) but which
 * are tied to none: names a store held before schema version 5.
 * None on a store not yet migrated, whose schema check says so.
 */
function untiedUnitNames(db: Database.Database, row: SourceCounts): number {
  if (!recordsUnitsByRow(row.format) || db.prepare("SELECT 1 FROM pragma_table_info('unit_names') WHERE name = 'feature'").get() === undefined) return 0;
  return db.prepare("SELECT count(*) FROM unit_names WHERE source = ? AND feature = ''").pluck().get(row.id) as number;
}

/** Features of the source with no name index rows although one of their names has a key. */
function countIndexable(db: Database.Database, sourceRowId: number): number {
  const rows = db.prepare('SELECT name, alternate_names FROM features WHERE source = ? AND id NOT IN (SELECT feature FROM names)').all(sourceRowId) as { name: string; alternate_names: string | null }[];
  return rows.filter((r) => [r.name, ...(r.alternate_names?.split('\u001f') ?? [])].some((name) => nameVariants(name).some((v) => v.key !== ''))).length;
}

/** Index rows pointing at features or tokens that are gone, and token counts that disagree with the postings. */
function orphanChecks(db: Database.Database): DoctorCheck[] {
  const counts: [string, string][] = [
    ['features of no source', 'SELECT count(*) FROM features WHERE source NOT IN (SELECT id FROM sources)'],
    ['name index rows of no feature', 'SELECT count(*) FROM names WHERE feature NOT IN (SELECT id FROM features)'],
    ['token index rows of no feature or token', 'SELECT count(*) FROM postings WHERE feature NOT IN (SELECT id FROM features) OR token NOT IN (SELECT id FROM tokens)'],
    ['deletion keys of no token', 'SELECT count(*) FROM deletions WHERE token NOT IN (SELECT id FROM tokens)'],
    ['tokens whose feature count is wrong', 'SELECT count(*) FROM tokens t WHERE df != (SELECT count(*) FROM postings p WHERE p.token = t.id)'],
  ];
  const found = counts.map(([what, sql]) => [what, db.prepare(sql).pluck().get() as number] as const).filter(([, n]) => n > 0);
  if (found.length === 0) return [{ check: 'index links', status: 'ok', finding: 'every index row points at a stored feature and token' }];
  return [{
    check: 'index links', status: 'problem', finding: found.map(([what, n]) => `${n} ${what}`).join(', '),
    remedy: 'import the gazetteer files again into a new store (whereabouts --db <new file> import <file>, for each source)',
  }];
}

interface JobRow {
  id: string;
  state: string;
  rows_done: number;
  rows_total: number | null;
  error: string | null;
}

/** The batch job database beside the store: readable, and any job not finished with how to finish it. */
function batchJobChecks(jobsPath: string): DoctorCheck[] {
  if (!existsSync(jobsPath)) return [{ check: 'batch jobs', status: 'ok', finding: 'no batch job database beside the store' }];
  return withDatabase(jobsPath, 'batch job database', (db) => {
    const integrity = guarded('batch jobs', () => {
      const result = db.pragma('quick_check', { simple: true }) as string;
      if (result === 'ok') return { check: 'batch jobs', status: 'ok', finding: `${jobsPath}: PRAGMA quick_check: ok` };
      return {
        check: 'batch jobs', status: 'problem', finding: `${jobsPath} is damaged: ${result}`,
        remedy: `move ${jobsPath} aside and run the batches again (jobs in it cannot be resumed)`,
      };
    });
    if (integrity.status !== 'ok') return [integrity];
    let unfinished: JobRow[];
    try {
      unfinished = db.prepare("SELECT id, state, rows_done, rows_total, error FROM batch_job WHERE state != 'done' ORDER BY started_at").all() as JobRow[];
    } catch (error) {
      return [{ check: 'batch jobs', status: 'problem', finding: `${jobsPath} holds no readable job table: ${messageOf(error)}`, remedy: `move ${jobsPath} aside; the next batch creates a new one` }];
    }
    return [integrity, ...unfinished.map((job): DoctorCheck => ({
      check: `batch job ${job.id}`, status: 'note',
      finding: `${job.state}${job.error ? ` (${job.error})` : ''}, ${job.rows_done} of ${job.rows_total ?? 'not yet counted'} rows written`,
      remedy: `finish it with: whereabouts batch --resume ${job.id}`,
    }))];
  });
}

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}
