/**
 * Batch jobs in SQLite (WAL), in a file of their own beside the gazetteer (`<gazetteer>.jobs.sqlite`),
 * so the gazetteer stays read-only while a batch runs. A job holds what makes its output reproducible
 * (input sha256, settings, whereabouts version, gazetteer source hashes, one run timestamp) and its
 * progress: the result of each distinct locality and the number of rows written.
 */
import type { GeneralisationSettings } from '../georef/generalisation.ts';
import { rmSync } from 'node:fs';
import Database from 'better-sqlite3';
import type { Source } from '../match/types.ts';

export type JobState = 'reading' | 'georeferencing' | 'writing' | 'done' | 'failed';

/** A job as stored. */
export interface BatchJob {
  id: string;
  state: JobState;
  inputPath: string;
  /** True when the input was standard input or an upload, spooled to a file the job deletes when done. */
  inputIsSpool: boolean;
  inputSha256: string;
  inputBytes: number;
  encoding: string;
  delimiter: string;
  /** Target file, or '-' for standard output. */
  outputPath: string;
  /** The file written as the job goes, renamed to outputPath at the end. */
  partialPath: string;
  /**
   * What the caller makes of the CSV once the job is done (the CLI's `--format` and `--out`: a GeoPackage,
   * GeoJSON, the CSV itself or an archive's new archive), kept so that a resume asking nothing makes the
   * same file; null for a job whose caller keeps the CSV (the HTTP service) or stored before jobs kept it.
   */
  resultFormat: string | null;
  resultPath: string | null;
  gazetteerPath: string;
  settings: string;
  /** The value of every method choice in force when the job started (src/georef/method-choices.ts), by id; null for jobs stored before jobs recorded them. */
  methodChoices: Record<string, number | string> | null;
  version: string;
  sources: Source[];
  runTimestamp: string;
  /** For one part of a split input (`--part K/N`): K, counted from 0, and N; null for a whole input. */
  partIndex: number | null;
  partCount: number | null;
  /** Rows of the input (for a part too: the part's rows are picked as the input is read). */
  rowsTotal: number | null;
  rowsDone: number;
  outputBytes: number;
  distinctTotal: number | null;
  distinctDone: number;
  /** Counts by georeferenceVerificationStatus and of malformed and flagged rows, as JSON. */
  tallies: Record<string, number>;
  startedAt: string;
  finishedAt: string | null;
  error: string | null;
}

/** What the HTTP service and the progress bar show. */
export interface JobProgress {
  state: JobState;
  rowsTotal?: number;
  rowsDone: number;
  distinctDone: number;
  distinctTotal?: number;
  startedAt: string;
  finishedAt?: string;
  outputPath?: string;
  /** The input's delimiter, which the output keeps. */
  delimiter: string;
  error?: string;
  /** The method choices the job uses, by id (absent for jobs stored before jobs recorded them). */
  methodChoices?: Record<string, number | string>;
  /** How the job generalises sensitive rows, when it was asked to (taxa list and/or marking column). */
  generalise?: GeneralisationSettings;
}

const SCHEMA = `
CREATE TABLE IF NOT EXISTS batch_job (
  id TEXT PRIMARY KEY, state TEXT NOT NULL,
  input_path TEXT NOT NULL, input_is_spool INTEGER NOT NULL, input_sha256 TEXT NOT NULL, input_bytes INTEGER NOT NULL,
  encoding TEXT NOT NULL, delimiter TEXT NOT NULL, output_path TEXT NOT NULL, partial_path TEXT NOT NULL,
  gazetteer_path TEXT NOT NULL, settings TEXT NOT NULL, version TEXT NOT NULL, sources TEXT NOT NULL,
  run_timestamp TEXT NOT NULL, rows_total INTEGER, rows_done INTEGER NOT NULL DEFAULT 0,
  output_bytes INTEGER NOT NULL DEFAULT 0, distinct_total INTEGER, distinct_done INTEGER NOT NULL DEFAULT 0,
  tallies TEXT NOT NULL DEFAULT '{}', started_at TEXT NOT NULL, finished_at TEXT, error TEXT, runner_pid INTEGER,
  part_index INTEGER, part_count INTEGER, method_choices TEXT, result_format TEXT, result_path TEXT, leftovers TEXT
);
CREATE TABLE IF NOT EXISTS batch_locality (
  id INTEGER PRIMARY KEY, job_id TEXT NOT NULL, key TEXT NOT NULL, request TEXT NOT NULL, result TEXT
);
CREATE UNIQUE INDEX IF NOT EXISTS batch_locality_key ON batch_locality (job_id, key);
-- The precise georeference of each row a job generalised (for a sensitive taxon): kept here, in the private
-- job store, and never written to the shared output. precise: JSON of the Darwin Core fields withheld.
CREATE TABLE IF NOT EXISTS batch_withheld (
  job_id TEXT NOT NULL, row_number INTEGER NOT NULL, precise TEXT NOT NULL, PRIMARY KEY (job_id, row_number)
) WITHOUT ROWID;
CREATE TABLE IF NOT EXISTS batch_locality_type (
  job_id TEXT NOT NULL, key TEXT NOT NULL, locality_type TEXT NOT NULL, PRIMARY KEY (job_id, key)
) WITHOUT ROWID;
`;


/** Open (and create when new) a job database in WAL mode. */
export function openJobs(path: string): Database.Database {
  const db = new Database(path);
  db.pragma('journal_mode = WAL');
  db.pragma('busy_timeout = 5000');
  db.exec(SCHEMA);
  // Job files made before jobs recorded their runner, their part or their method choices lack those columns; add them rather than refuse the files.
  const columns = db.prepare("SELECT name FROM pragma_table_info('batch_job')").all() as { name: string }[];
  for (const [column, type] of [['runner_pid', 'INTEGER'], ['part_index', 'INTEGER'], ['part_count', 'INTEGER'], ['method_choices', 'TEXT'], ['result_format', 'TEXT'], ['result_path', 'TEXT'], ['leftovers', 'TEXT']]) {
    if (!columns.some((c) => c.name === column)) db.exec(`ALTER TABLE batch_job ADD COLUMN ${column} ${type}`);
  }
  removeLeftovers(db);
  return db;
}

interface JobRow {
  id: string; state: JobState; input_path: string; input_is_spool: number; input_sha256: string; input_bytes: number;
  encoding: string; delimiter: string; output_path: string; partial_path: string; gazetteer_path: string; settings: string;
  version: string; sources: string; run_timestamp: string; rows_total: number | null; rows_done: number; output_bytes: number;
  distinct_total: number | null; distinct_done: number; tallies: string; started_at: string; finished_at: string | null; error: string | null;
  part_index: number | null; part_count: number | null; method_choices: string | null; result_format: string | null; result_path: string | null;
}

function fromRow(row: JobRow): BatchJob {
  return {
    id: row.id, state: row.state, inputPath: row.input_path, inputIsSpool: row.input_is_spool === 1, inputSha256: row.input_sha256,
    inputBytes: row.input_bytes, encoding: row.encoding, delimiter: row.delimiter, outputPath: row.output_path,
    partialPath: row.partial_path, resultFormat: row.result_format, resultPath: row.result_path, gazetteerPath: row.gazetteer_path, settings: row.settings, version: row.version,
    methodChoices: row.method_choices === null ? null : (JSON.parse(row.method_choices) as Record<string, number | string>),
    sources: JSON.parse(row.sources) as Source[], runTimestamp: row.run_timestamp, partIndex: row.part_index, partCount: row.part_count, rowsTotal: row.rows_total,
    rowsDone: row.rows_done, outputBytes: row.output_bytes, distinctTotal: row.distinct_total, distinctDone: row.distinct_done,
    tallies: JSON.parse(row.tallies) as Record<string, number>, startedAt: row.started_at, finishedAt: row.finished_at, error: row.error,
  };
}

/**
 * Mark the job as run by this process, or refuse when another live process runs it: two writers of one
 * partial file would spoil it. A process killed with -9 leaves its pid behind, which is then not alive.
 */
export function claimJob(db: Database.Database, id: string): void {
  const { runner_pid: pid } = db.prepare('SELECT runner_pid FROM batch_job WHERE id = ?').get(id) as { runner_pid: number | null };
  if (pid && pid !== process.pid && processIsAlive(pid)) throw new Error(`batch job ${id} is being run by process ${pid}; wait for it, or stop that process first`);
  db.prepare('UPDATE batch_job SET runner_pid = ? WHERE id = ?').run(process.pid, id);
}

function processIsAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** A job by id, or an error saying there is none. */
export function loadJob(db: Database.Database, id: string): BatchJob {
  const row = db.prepare('SELECT * FROM batch_job WHERE id = ?').get(id) as JobRow | undefined;
  if (!row) throw new Error(`no batch job "${id}" in ${db.name}`);
  return fromRow(row);
}

/**
 * The newest unfinished job for the same input, output, part, settings, version and sources (and run
 * timestamp, when one is asked for): rerunning a command resumes it.
 */
export function findUnfinishedJob(
  db: Database.Database,
  like: Pick<BatchJob, 'inputSha256' | 'outputPath' | 'settings' | 'version' | 'sources' | 'partIndex' | 'partCount'>,
  runTimestamp?: string,
): BatchJob | undefined {
  const rows = db
    .prepare(`SELECT * FROM batch_job WHERE input_sha256 = ? AND output_path = ? AND settings = ? AND version = ? AND state != 'done'
      AND part_index IS ? AND part_count IS ? ORDER BY started_at DESC`)
    .all(like.inputSha256, like.outputPath, like.settings, like.version, like.partIndex, like.partCount) as JobRow[];
  return rows.map(fromRow).find((job) => sameSources(job.sources, like.sources) && (runTimestamp === undefined || job.runTimestamp === runTimestamp));
}

/**
 * Sources are the same when every id has the same content hash and rank: the rank decides which source
 * a place found in several is cited from, so a job resumed across a rank change would mix two answers.
 * A job stored before ranks existed holds none, which reads as unranked.
 */
export function sameSources(a: Source[], b: Source[]): boolean {
  const key = (s: Source[]) => JSON.stringify(s.map((x) => [x.id, x.contentHash, x.priority ?? null]).sort());
  return key(a) === key(b);
}

/** Store a new job. */
export function insertJob(db: Database.Database, job: BatchJob): void {
  db.prepare(
    `INSERT INTO batch_job (id, state, input_path, input_is_spool, input_sha256, input_bytes, encoding, delimiter, output_path,
       partial_path, gazetteer_path, settings, version, sources, run_timestamp, started_at, part_index, part_count, method_choices, result_format, result_path)
     VALUES (@id, @state, @inputPath, @inputIsSpool, @inputSha256, @inputBytes, @encoding, @delimiter, @outputPath,
       @partialPath, @gazetteerPath, @settings, @version, @sources, @runTimestamp, @startedAt, @partIndex, @partCount, @methodChoices, @resultFormat, @resultPath)`,
  ).run({ ...job, inputIsSpool: job.inputIsSpool ? 1 : 0, sources: JSON.stringify(job.sources), methodChoices: job.methodChoices && JSON.stringify(job.methodChoices) });
}

/** Update the given columns of a job (names as in BatchJob). */
export function updateJob(
  db: Database.Database, id: string,
  change: Partial<Pick<BatchJob, 'state' | 'rowsTotal' | 'rowsDone' | 'outputBytes' | 'distinctTotal' | 'distinctDone' | 'tallies' | 'finishedAt' | 'error' | 'outputPath' | 'partialPath' | 'resultFormat' | 'resultPath'>>,
): void {
  const columns: Record<string, string> = {
    state: 'state', rowsTotal: 'rows_total', rowsDone: 'rows_done', outputBytes: 'output_bytes', distinctTotal: 'distinct_total',
    distinctDone: 'distinct_done', tallies: 'tallies', finishedAt: 'finished_at', error: 'error', outputPath: 'output_path',
    partialPath: 'partial_path', resultFormat: 'result_format', resultPath: 'result_path',
  };
  const entries = Object.entries(change);
  if (entries.length === 0) return;
  const values = Object.fromEntries(entries.map(([k, v]) => [k, k === 'tallies' ? JSON.stringify(v) : v]));
  db.prepare(`UPDATE batch_job SET ${entries.map(([k]) => `${columns[k]} = @${k}`).join(', ')} WHERE id = @id`).run({ ...values, id });
}

/** How a job generalises sensitive rows, from its stored settings (undefined: it does not). */
export function jobGeneralisation(job: BatchJob): GeneralisationSettings | undefined {
  return (JSON.parse(job.settings) as { generalise?: GeneralisationSettings }).generalise;
}

/**
 * The progress of a job, for the HTTP service and the progress bar.
 * @example jobProgress(jobsDatabasePath('whereabouts.sqlite'), 'k3v9q2xa') // { state: 'writing', rowsDone: 12000, … }
 */
export function jobProgress(jobs: string | Database.Database, jobId: string): JobProgress {
  const db = typeof jobs === 'string' ? openJobs(jobs) : jobs;
  try {
    const job = loadJob(db, jobId);
    return {
      state: job.state,
      rowsTotal: job.rowsTotal ?? undefined,
      rowsDone: job.rowsDone,
      distinctDone: job.distinctDone,
      distinctTotal: job.distinctTotal ?? undefined,
      startedAt: job.startedAt,
      finishedAt: job.finishedAt ?? undefined,
      outputPath: job.state === 'done' && job.outputPath !== '-' ? job.outputPath : undefined,
      delimiter: job.delimiter,
      error: job.error ?? undefined,
      methodChoices: job.methodChoices ?? undefined,
      generalise: jobGeneralisation(job),
    };
  } finally {
    if (typeof jobs === 'string') db.close();
  }
}

/**
 * Stores a job as failed, with why, when it cannot be run on (a resume refused): its progress says so.
 * @example failJob(jobsDatabasePath('whereabouts.sqlite'), '3f2a9c1e', 'the gazetteer sources have changed since the job started')
 */
export function failJob(jobsPath: string, jobId: string, error: string): void {
  const db = openJobs(jobsPath);
  try {
    updateJob(db, jobId, { state: 'failed', error });
  } finally {
    db.close();
  }
}

/**
 * Mark a job done, in one transaction with what goes with it: its per-locality results dropped (only the
 * locality type each was read as is kept, for the review list's facets, so nothing is parsed again) and the files it no longer needs listed as leftovers. Those files
 * are removed by `removeLeftovers` straight after, or when the job database is next opened if the process
 * was stopped in between, so a job never stays done with its working files beside it.
 * @example finishJob(db, 'k3v9q2xa', ['/data/whereabouts-spool-1a2b3c4d.input']); removeLeftovers(db, 'k3v9q2xa');
 */
export function finishJob(db: Database.Database, jobId: string, leftovers: string[]): void {
  db.transaction(() => {
    db.prepare(
      "INSERT OR REPLACE INTO batch_locality_type (job_id, key, locality_type) SELECT job_id, key, json_extract(result, '$.localityType') FROM batch_locality WHERE job_id = ? AND json_extract(result, '$.localityType') IS NOT NULL",
    ).run(jobId);
    db.prepare('DELETE FROM batch_locality WHERE job_id = ?').run(jobId);
    db.prepare("UPDATE batch_job SET state = 'done', finished_at = ?, leftovers = ? WHERE id = ?").run(new Date().toISOString(), leftovers.length > 0 ? JSON.stringify(leftovers) : null, jobId);
  })();
}

/**
 * Remove the leftover files of one finished job, or of every finished job that still lists some (a job
 * database opened after a run stopped between marking its job done and tidying up).
 * @example removeLeftovers(db) // removes files listed by done jobs, then forgets them
 */
export function removeLeftovers(db: Database.Database, jobId?: string): void {
  const rows = db.prepare(`SELECT id, leftovers FROM batch_job WHERE leftovers IS NOT NULL${jobId === undefined ? '' : ' AND id = ?'}`).all(...(jobId === undefined ? [] : [jobId])) as { id: string; leftovers: string }[];
  for (const row of rows) {
    for (const path of JSON.parse(row.leftovers) as string[]) rmSync(path, { force: true });
    db.prepare('UPDATE batch_job SET leftovers = NULL WHERE id = ?').run(row.id);
  }
}

/**
 * The locality type each distinct locality of a finished job was read as, by its group key (a job
 * finished before the types were kept has none).
 * @example storedLocalityTypes(jobsDatabasePath(dbPath), jobId).get(key) // 'offset-heading'
 */
export function storedLocalityTypes(jobsPath: string, jobId: string): Map<string, string> {
  const db = openJobs(jobsPath);
  try {
    const rows = db.prepare('SELECT key, locality_type FROM batch_locality_type WHERE job_id = ?').all(jobId) as { key: string; locality_type: string }[];
    return new Map(rows.map((r) => [r.key, r.locality_type]));
  } finally {
    db.close();
  }
}
