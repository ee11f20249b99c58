/**
 * A batch job from input file to output file: read the rows once to find the distinct localities, then
 * georeference each once (over worker threads for large files) while the main thread reads the rows
 * again and writes each, in order, with its originals and the appended terms. Every step commits its
 * progress to the job, so a job stopped at any point (even by kill -9) finishes on resume with the same
 * bytes as an unbroken run.
 */
import { randomUUID } from 'node:crypto';
import { closeSync, copyFileSync, createReadStream, createWriteStream, existsSync, fsyncSync, ftruncateSync, openSync, renameSync, rmSync, writeFileSync, writeSync } from 'node:fs';
import { cpus } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { setTimeout as sleep } from 'node:timers/promises';
import type Database from 'better-sqlite3';
import Tinypool from 'tinypool';
import { openGazetteer } from '../store/gazetteer-store.ts';
import { unreadableRecord } from '../locate/georeference-record.ts';
import type { LocateRequest } from '../locate/locate.ts';
import { appendedLine, csvLine, groupFields, outputHeader, renderGroup, type RenderedGroup } from '../output/csv.ts';
import { GENERALISATION_TERMS, generaliseRecord, type WithheldTerm } from '../record/generalised-record.ts';
import { sensitiveGeneralisation } from './sensitive-records.ts';
import type { Generalisation, GeneralisationSettings } from '../georef/generalisation.ts';
import { checkCoordinates, hasCoordinates, isFlagged } from '../record/coordinate-check.ts';
import type { RecordContext } from '../record/darwin-core.ts';
import { methodChoiceValues } from '../georef/method-choices.ts';
import { VERSION } from '../version.ts';
import type { BatchSettings } from './georeference-group.ts';
import type { RouteKilometrePostRule } from '../georef/types.ts';
import georeferenceChunk, { BATCH_STORE_OPTIONS, closeGazetteerOfThread, type GeoreferenceTask } from './georeference-task.ts';
import { fileHead, notText } from '../store/file-kind.ts';
import { detectDelimiter, inspectInput, type InputEncoding, type InputFormat } from '../store/input-format.ts';
import { originalLine } from './original-line.ts';
import {
  claimJob, finishJob, findUnfinishedJob, insertJob, jobGeneralisation, loadJob, openJobs, removeLeftovers, sameSources, updateJob,
  type BatchJob, type JobState,
} from '../store/jobs.ts';
import { jobsDatabasePath } from '../store/side-files.ts';
import { groupOf, indexColumns, type ColumnIndex } from './locality-group.ts';
import { readRecords, type Delimiter, type InputRecord } from './records.ts';
import { checkRunTimestamp, partFileStart, partOfKey, partRowFrame, type PartMeta, type PartSpec } from './partition.ts';

/**
 * The module a worker thread loads. Compiled (dist/), the task module itself; run from the TypeScript
 * sources, worker.js, which registers tsx first (worker threads do not inherit the main thread's loader).
 */
const WORKER_ENTRY = import.meta.url.endsWith('.ts')
  ? new URL('./worker.js', import.meta.url).href
  : new URL('./georeference-task.js', import.meta.url).href;

export interface BatchJobOptions {
  /** The gazetteer database (opened read-only). */
  dbPath: string;
  /** Path of the input file, '-' for standard input, or the file's bytes (an upload). Not needed with `resume`. */
  input?: string | Buffer;
  /**
   * Target file, or '-' for standard output (the default). With `resume`, a file other than the job's
   * moves its CSV there: the rows written so far go along, so nothing is written twice.
   */
  output?: string;
  /** Id of a job to finish. */
  resume?: string;
  /** What the caller makes of the CSV when the job is done (src/batch/gis-output.ts), kept with the job; on a resume, stored anew. */
  result?: { format: string; path: string };
  /**
   * Makes the file the caller delivers from the whole CSV (a GIS file, a new archive), renamed into place
   * when whole. Run before the job is marked done, so a job stopped meanwhile is finished by a resume, which
   * runs it again from the CSV kept (nothing georeferenced or written again). Gives the files the job no
   * longer needs once done (the CSV the file was made from, say), removed with the job's own leftovers.
   */
  finishOutput?: (summary: Omit<BatchSummary, 'resumed'>) => Promise<string[]>;
  /** The input's delimiter when the caller knows it (an archive's core, written by whereabouts); found from the header otherwise. */
  delimiter?: Delimiter;
  coverAmbiguous?: boolean;
  administrativeFallback?: boolean;
  /** The method choice routeKilometrePost for this job (src/georef/method-defaults.ts); the method's own rule when left out. */
  routeKilometrePost?: RouteKilometrePostRule;
  /**
   * Worker threads for the distinct localities. Default: one a core but one, as the main thread reads and
   * writes the rows meanwhile (on 2 cores, 1 worker keeps both busy within the 500 MB memory target).
   */
  threads?: number;
  /**
   * Run even though the gazetteer holds no source (every row then comes back not found). Without it a
   * batch against an empty store is refused with a message saying how to load one.
   */
  allowEmptyGazetteer?: boolean;
  /** Job database; default `jobsDatabasePath(dbPath)`, or `<output>.jobs.sqlite` for a part. */
  jobsDbPath?: string;
  /**
   * Georeference only part K of N (cut by a hash of each row's locality key) and write a part file, for
   * `mergeParts` to join with the others. Needs an output file and `runTimestamp`.
   */
  part?: PartSpec;
  /**
   * The run timestamp (georeferencedDate), UTC to the second as `2026-05-01T09:30:00Z`; default the
   * job's start. Every part of one input needs the same one.
   */
  runTimestamp?: string;
  /**
   * Generalise the rows of sensitive taxa (or marked rows) to a grid cell, keeping their precise georeference
   * only in the job database (table batch_withheld); the output then has the columns dataGeneralizations
   * and informationWithheld. Absent: the output is as without it, byte for byte.
   */
  generalise?: GeneralisationSettings;
  /** Called after each committed step. */
  onProgress?: (event: BatchProgressEvent) => void;
  /** Where output '-' goes (default process.stdout) and where input '-' comes from (default process.stdin). */
  stdout?: NodeJS.WritableStream;
  stdin?: NodeJS.ReadableStream;
}

/** A step of a running job, for a progress bar. */
export interface BatchProgressEvent {
  jobId: string;
  phase: Exclude<JobState, 'done' | 'failed'>;
  /** Rows read, distinct localities georeferenced, or rows written, by phase. */
  done: number;
  total?: number;
}

export interface BatchSummary {
  jobId: string;
  /** True when the job had been started before and this run finished it. */
  resumed: boolean;
  rows: number;
  distinctLocalities: number;
  malformedRows: number;
  /** Rows whose coordinates were flagged (any flag but agrees-with-locality). */
  flaggedRows: number;
  /** Rows by georeferenceVerificationStatus. */
  byStatus: Record<string, number>;
  outputPath: string;
  encoding: InputEncoding;
  delimiter: Delimiter;
  runTimestamp: string;
}

/** Distinct localities georeferenced in one unit of work (and one commit) [CHOICE]. */
const GROUPS_PER_CHUNK = 64;
/** Rows written and committed at a time [CHOICE]. */
const ROWS_PER_CHUNK = 1000;
/**
 * Below this many distinct localities, the main thread does the work [CHOICE]: a worker takes about a
 * second to start (tsx compiles the sources again), the time of some 2,000 localities on a spare core.
 */
const IN_PROCESS_LIMIT = 2000;
/** Heap of a worker thread [CHOICE]: a worker holds one chunk of localities at a time, so a small heap keeps memory flat. */
const WORKER_HEAP_MB = 128;
/** Group results kept parsed in memory while writing [CHOICE]. */
const RESULT_CACHE_SIZE = 2000;
/**
 * Bytes of plain rows (see PlainRows) kept in memory while writing [CHOICE]: a plain row of bench:batch is
 * about 3.4 kB, so this holds some 12,000 localities; measured there (200,000 rows, 39,209 distinct), peak
 * RSS 454 MB with it and 487 MB with 64 MB, against the 500 MB target. Bounded, so memory stays flat
 * however many localities a file has.
 */
const PLAIN_ROW_BUDGET = 40 * 2 ** 20;

/**
 * Start (or resume) a batch job. Resolves once the job is stored, with its id and a promise of the
 * finished job; the output file appears, whole, only when that promise resolves.
 * @example
 *   const { jobId, done } = await startBatchJob({ dbPath: 'whereabouts.sqlite', input: 'in.csv', output: 'out.csv' });
 *   const summary = await done; // { rows: 52, distinctLocalities: 47, … }
 */
export async function startBatchJob(options: BatchJobOptions): Promise<{ jobId: string; methodChoices: BatchJob['methodChoices']; done: Promise<BatchSummary> }> {
  if (!existsSync(options.dbPath)) throw new Error(`no gazetteer database at ${options.dbPath}: import a gazetteer first (whereabouts import <file>)`);
  checkPartOptions(options);
  const jobsPath = jobsPathOf(options);
  const jobs = openJobs(jobsPath);
  try {
    const started = options.resume ? await resumableJob(jobs, options) : await newOrUnfinishedJob(jobs, jobsPath, options);
    const { resumed, format } = started;
    claimJob(jobs, started.job.id);
    const job = options.resume ? resumedAs(jobs, started.job, options) : started.job;
    const done = runJob(jobs, job, format, options).then(
      (summary) => ({ ...summary, resumed }),
      (error: unknown) => {
        updateJob(jobs, job.id, { state: 'failed', error: error instanceof Error ? error.message : String(error) });
        throw error;
      },
    ).finally(() => jobs.close());
    return { jobId: job.id, methodChoices: job.methodChoices, done };
  } catch (error) {
    jobs.close();
    throw error;
  }
}

/**
 * The job database of a batch: the one given, a part's beside its part file, else the one beside the gazetteer.
 * @example jobsPathOf({ dbPath: 'whereabouts.sqlite' }) // '/abs/whereabouts.jobs.sqlite'
 */
export function jobsPathOf(options: Pick<BatchJobOptions, 'jobsDbPath' | 'part' | 'output' | 'dbPath'>): string {
  if (options.jobsDbPath) return options.jobsDbPath;
  if (!options.part) return jobsDatabasePath(options.dbPath);
  if (!options.output || options.output === '-') throw new Error('a part (--part) needs an output file (--out), the part file the merge reads');
  return `${resolve(options.output)}.jobs.sqlite`;
}

function checkPartOptions(options: BatchJobOptions): void {
  if (options.runTimestamp !== undefined) checkRunTimestamp(options.runTimestamp);
  if (!options.part || options.resume) return;
  if (!options.output || options.output === '-') throw new Error('a part (--part) needs an output file (--out), the part file the merge reads');
  if (options.runTimestamp === undefined) {
    throw new Error('a part (--part) needs --run-timestamp, the same for every part, so that all parts record one georeferencedDate');
  }
}

interface StartedJob {
  job: BatchJob;
  resumed: boolean;
  format: InputFormat;
}

function settingsOf(options: BatchJobOptions): string {
  const settings: BatchSettings & { generalise?: GeneralisationSettings } = {
    administrativeFallback: Boolean(options.administrativeFallback), coverAmbiguous: Boolean(options.coverAmbiguous),
    // Only when asked, so that the settings (and with them an unfinished job's identity) are as before otherwise.
    ...(options.routeKilometrePost ? { routeKilometrePost: options.routeKilometrePost } : {}),
    ...(options.generalise ? { generalise: options.generalise } : {}),
  };
  return JSON.stringify(settings);
}

/**
 * The sources of a gazetteer file and their content hashes, read read-only: what a job's results depend on.
 * @example gazetteerSources('whereabouts.sqlite') // [{ id: 'demo', contentHash: '3f…', … }]
 */
export function gazetteerSources(dbPath: string) {
  const store = openGazetteer(dbPath, BATCH_STORE_OPTIONS);
  try {
    return store.sources();
  } finally {
    store.close();
  }
}

async function resumableJob(jobs: Database.Database, options: BatchJobOptions): Promise<StartedJob> {
  const job = loadJob(jobs, options.resume!);
  if (job.state === 'done') throw new Error(doneMessage(job));
  if (!existsSync(job.inputPath)) throw new Error(`batch job ${job.id}: its input ${job.inputPath} is gone`);
  const format = await inspectInput(job.inputPath);
  if (format.sha256 !== job.inputSha256) throw new Error(`batch job ${job.id}: its input ${job.inputPath} has changed since the job started; start a new batch`);
  if (!sameSources(gazetteerSources(job.gazetteerPath), job.sources)) {
    throw new Error(`batch job ${job.id}: the gazetteer sources have changed since the job started, so its results could not be reproduced; start a new batch`);
  }
  if (job.version !== VERSION) throw new Error(`batch job ${job.id} was started by whereabouts ${job.version}, this is ${VERSION}; start a new batch`);
  return { job, resumed: true, format };
}

/**
 * What a resume of a finished job says: its output, the file made (a GIS file or an archive) when there is
 * one, and when that file is no longer where it was written, that only a new batch makes it again.
 * @example doneMessage(job) // 'batch job 3f9c2a71 is already done (output /data/out.gpkg)'
 */
function doneMessage(job: BatchJob): string {
  const output = job.resultPath ?? job.outputPath;
  const gone = output !== '-' && !existsSync(output);
  return `batch job ${job.id} is already done (output ${output}${gone ? ', since moved or removed: start a new batch to make it again' : ''})`;
}

/**
 * A resumed job, with the result asked now stored, and its CSV sent to `options.output` when that is
 * another file: the partial file moves beside it (copied when across file systems), so that the rows
 * written so far are kept and the finished file is renamed into place as ever. Called once the job is
 * claimed, so no other process writes the partial file meanwhile.
 */
function resumedAs(jobs: Database.Database, job: BatchJob, options: BatchJobOptions): BatchJob {
  const change: Parameters<typeof updateJob>[2] = options.result ? { resultFormat: options.result.format, resultPath: options.result.path } : {};
  const outputPath = options.output === undefined ? job.outputPath : options.output === '-' ? '-' : resolve(options.output);
  if (outputPath !== job.outputPath) {
    if (outputPath === job.inputPath) throw new Error(`the output ${outputPath} would replace the input`);
    const partialPath = outputPath === '-' ? job.partialPath : `${outputPath}.${job.id}.partial`;
    if (partialPath !== job.partialPath && existsSync(job.partialPath)) moveFile(job.partialPath, partialPath);
    // A job stopped while its file was made from the whole CSV: the CSV goes along instead.
    else if (outputPath !== '-' && job.outputPath !== '-' && job.outputBytes > 0 && existsSync(job.outputPath)) moveFile(job.outputPath, outputPath);
    Object.assign(change, { outputPath, partialPath });
  }
  updateJob(jobs, job.id, change);
  return { ...job, ...change };
}

/**
 * Rename a file, or copy it and remove the original when the two paths are on different file systems. A
 * copy that fails part way (a full disk) leaves nothing at `to` (libuv removes it) and the original as it was.
 */
function moveFile(from: string, to: string): void {
  try {
    renameSync(from, to);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EXDEV') throw error;
    copyFileSync(from, to);
    rmSync(from);
  }
}

async function newOrUnfinishedJob(jobs: Database.Database, jobsPath: string, options: BatchJobOptions): Promise<StartedJob> {
  if (options.input === undefined) throw new Error('a batch needs an input file (or - for standard input), or --resume <job>');
  const spooled = typeof options.input !== 'string' || options.input === '-';
  const inputPath = spooled ? await spool(options, jobsPath) : resolve(options.input as string);
  const outputPath = !options.output || options.output === '-' ? '-' : resolve(options.output);
  try {
    if (outputPath === inputPath) throw new Error(`the output ${outputPath} would replace the input`);
    if (!existsSync(inputPath)) throw new Error(`cannot read the input ${inputPath}: no such file`);
    const kind = notText(fileHead(inputPath));
    if (kind) throw new Error(`the input ${spooled ? '' : `${inputPath} `}is ${kind.format}, not CSV or tab-separated text: ${kind.advice}`);
    const sources = gazetteerSources(options.dbPath);
    if (sources.length === 0 && !options.allowEmptyGazetteer) {
      throw new Error(`the gazetteer ${resolve(options.dbPath)} holds no source, so no row could be georeferenced: load one first with whereabouts import <file> --source "<citation>" (or run the batch with --allow-empty-gazetteer to have every row come back not found)`);
    }
    const format = await inspectInput(inputPath);
    const delimiter = options.delimiter ?? (await detectDelimiter(inputPath, format));
    const { header } = await headerColumns(inputPath, format, delimiter); // a clear error now, before a job exists
    if (options.generalise) sensitiveGeneralisation(header, options.generalise); // a marking column or scientificName missing: said now too
    const like = {
      inputSha256: format.sha256, outputPath, settings: settingsOf(options), version: VERSION, sources,
      partIndex: options.part?.index ?? null, partCount: options.part?.count ?? null,
    };
    const unfinished = findUnfinishedJob(jobs, like, options.runTimestamp);
    if (unfinished) {
      if (spooled) rmSync(inputPath, { force: true });
      return { job: unfinished, resumed: true, format };
    }
    const id = randomUUID().slice(0, 8);
    const job: BatchJob = {
      ...like, resultFormat: options.result?.format ?? null, resultPath: options.result?.path ?? null, methodChoices: { ...methodChoiceValues(), ...(options.routeKilometrePost ? { routeKilometrePost: options.routeKilometrePost } : {}) }, id, state: 'reading', inputPath, inputIsSpool: spooled, inputBytes: format.bytes, encoding: format.encoding, delimiter,
      partialPath: outputPath === '-' ? join(dirname(jobsPath), `whereabouts-job-${id}.partial`) : `${outputPath}.${id}.partial`,
      gazetteerPath: resolve(options.dbPath), runTimestamp: options.runTimestamp ?? new Date().toISOString().replace(/\.\d+Z$/, 'Z'), rowsTotal: null, rowsDone: 0,
      outputBytes: 0, distinctTotal: null, distinctDone: 0, tallies: {}, startedAt: new Date().toISOString(), finishedAt: null, error: null,
    };
    insertJob(jobs, job);
    return { job, resumed: false, format };
  } catch (error) {
    if (spooled) rmSync(inputPath, { force: true });
    throw error;
  }
}

/** Standard input or uploaded bytes, kept in a file beside the job database until the job is done. */
async function spool(options: BatchJobOptions, jobsPath: string): Promise<string> {
  const path = join(dirname(jobsPath), `whereabouts-spool-${randomUUID().slice(0, 8)}.input`);
  if (Buffer.isBuffer(options.input)) writeFileSync(path, options.input);
  else await pipeline(options.stdin ?? process.stdin, createWriteStream(path));
  return path;
}

async function headerColumns(path: string, format: InputFormat, delimiter: Delimiter): Promise<{ header: string[]; columns: ColumnIndex }> {
  for await (const record of readRecords(path, format, delimiter)) {
    if (record.problem) throw new Error(`cannot read the header of ${path}: ${record.problem}`);
    return { header: record.fields, columns: indexColumns(record.fields) };
  }
  throw new Error(`the input ${path} is empty: it has no header line`);
}

async function runJob(jobs: Database.Database, started: BatchJob, format: InputFormat, options: BatchJobOptions): Promise<Omit<BatchSummary, 'resumed'>> {
  const delimiter = started.delimiter as Delimiter;
  if (started.rowsTotal === null) await readGroups(jobs, started, format, delimiter, options);
  // Rows are written while the distinct localities are georeferenced: the writer waits only for a row
  // whose locality is not done yet, and localities go out in the order their first rows stand in the file.
  const read = loadJob(jobs, started.id);
  const pending = read.distinctDone < (read.distinctTotal ?? 0);
  updateJob(jobs, read.id, { state: pending ? 'georeferencing' : 'writing', error: null });
  const results = new ResultSignal();
  const plainRows = new PlainRows(delimiter);
  const georeferencing = pending
    ? georeferenceGroups(jobs, read, options, results, plainRows).then(() => results.finish(), (error: unknown) => results.finish(error))
    : results.finish();
  const writing = writeRows(jobs, read, format, delimiter, options, results, plainRows);
  await Promise.all([georeferencing, writing]);
  const job = loadJob(jobs, started.id);
  await deliver(job, options);
  const { malformed = 0, flagged = 0, ...byStatus } = job.tallies;
  const summary = {
    jobId: job.id, rows: job.rowsTotal ?? 0, distinctLocalities: job.distinctTotal ?? 0, malformedRows: malformed, flaggedRows: flagged,
    byStatus, outputPath: job.outputPath, encoding: format.encoding, delimiter, runTimestamp: job.runTimestamp,
  };
  await testDelay();
  const made = (await options.finishOutput?.(summary)) ?? [];
  finishJob(jobs, job.id, job.inputIsSpool ? [...made, job.inputPath] : made);
  await testDelay();
  removeLeftovers(jobs, job.id);
  return summary;
}

/** A pause after each commit, for tests that stop a job part way (WHEREABOUTS_TEST_DELAY_MS; never set in use). */
async function testDelay(): Promise<void> {
  const ms = Number(process.env.WHEREABOUTS_TEST_DELAY_MS ?? 0);
  if (ms > 0) await sleep(ms);
}

/** Phase 1: every row read once; each distinct locality stored once (reading again after a crash changes nothing). */
async function readGroups(jobs: Database.Database, job: BatchJob, format: InputFormat, delimiter: Delimiter, options: BatchJobOptions): Promise<void> {
  updateJob(jobs, job.id, { state: 'reading' });
  const insert = jobs.prepare('INSERT OR IGNORE INTO batch_locality (job_id, key, request) VALUES (?, ?, ?)');
  const insertAll = jobs.transaction((groups: { key: string; request: LocateRequest }[]) => {
    for (const g of groups) insert.run(job.id, g.key, JSON.stringify(g.request));
  });
  let columns: ColumnIndex | undefined;
  let rows = 0;
  let pending: { key: string; request: LocateRequest }[] = [];
  for await (const record of readRecords(job.inputPath, format, delimiter)) {
    if (!columns) {
      columns = indexColumns(record.fields);
      continue;
    }
    rows++;
    if (record.problem) continue;
    const group = groupOf(record.fields, columns);
    if (job.partCount === null || partOfKey(group.key, job.partCount) === job.partIndex) pending.push(group);
    if (pending.length >= 5000) {
      insertAll(pending);
      pending = [];
      options.onProgress?.({ jobId: job.id, phase: 'reading', done: rows });
    }
  }
  insertAll(pending);
  const { n } = jobs.prepare('SELECT COUNT(*) AS n FROM batch_locality WHERE job_id = ?').get(job.id) as { n: number };
  updateJob(jobs, job.id, { rowsTotal: rows, distinctTotal: n, state: 'georeferencing' });
}

function recordContextOf(job: BatchJob): RecordContext {
  return { georeferencedBy: `whereabouts ${job.version}`, georeferencedDate: job.runTimestamp, sources: job.sources };
}

/** Phase 2: each distinct locality not yet done, in chunks, over worker threads; each chunk committed as it comes back. */
async function georeferenceGroups(jobs: Database.Database, job: BatchJob, options: BatchJobOptions, results: ResultSignal, plainRows: PlainRows): Promise<void> {
  const settings = JSON.parse(job.settings) as BatchSettings;
  const context = recordContextOf(job);
  // A walk along the rowid from the last chunk: the (job_id, key) index would sort the whole job each time.
  const next = jobs.prepare('SELECT id, key, request FROM batch_locality NOT INDEXED WHERE id > ? AND job_id = ? AND result IS NULL ORDER BY id LIMIT ?');
  const setResult = jobs.prepare('UPDATE batch_locality SET result = ? WHERE id = ?');
  /** The keys of the localities out with the workers, by id. */
  const keys = new Map<number, string>();
  const total = job.distinctTotal ?? 0;
  let distinctDone = (jobs.prepare('SELECT COUNT(*) AS n FROM batch_locality WHERE job_id = ? AND result IS NOT NULL').get(job.id) as { n: number }).n;
  const save = jobs.transaction((results: { id: number; result: RenderedGroup }[]) => {
    for (const r of results) {
      setResult.run(JSON.stringify(r.result), r.id);
      plainRows.keep(keys.get(r.id)!, r.result);
      keys.delete(r.id);
    }
    distinctDone += results.length;
    updateJob(jobs, job.id, { distinctDone });
  });
  let cursor = 0;
  const nextTask = (): GeoreferenceTask | undefined => {
    const rows = next.all(cursor, job.id, GROUPS_PER_CHUNK) as { id: number; key: string; request: string }[];
    if (rows.length === 0) return undefined;
    for (const r of rows) keys.set(r.id, r.key);
    cursor = rows[rows.length - 1].id;
    return { dbPath: job.gazetteerPath, groups: rows.map((r) => ({ id: r.id, request: JSON.parse(r.request) as LocateRequest })), settings, context, delimiter: job.delimiter as Delimiter };
  };
  const threads = Math.max(1, options.threads ?? cpus().length - 1);
  const pool = total - distinctDone > IN_PROCESS_LIMIT
    ? new Tinypool({ filename: WORKER_ENTRY, minThreads: threads, maxThreads: threads, resourceLimits: { maxOldGenerationSizeMb: WORKER_HEAP_MB } })
    : undefined;
  const run = pool ? (task: GeoreferenceTask) => pool.run(task) as Promise<ReturnType<typeof georeferenceChunk>> : async (task: GeoreferenceTask) => georeferenceChunk(task);
  const lane = async () => {
    for (let task = nextTask(); task; task = nextTask()) {
      save(await run(task));
      results.notify();
      options.onProgress?.({ jobId: job.id, phase: 'georeferencing', done: distinctDone, total });
      await testDelay();
    }
  };
  try {
    await Promise.all(Array.from({ length: pool ? threads * 2 : 1 }, lane));
    updateJob(jobs, job.id, { state: 'writing' });
  } finally {
    await pool?.destroy();
    if (!pool) closeGazetteerOfThread();
  }
}

/**
 * Phase 3: every row written in input order after the rows already committed; the file grows only by whole
 * chunks. A part writes only its own rows, each framed with its row number (see partition.ts); its
 * `rowsDone` counts the input rows passed, so that a resumed part starts after the same input row.
 */
async function writeRows(
  jobs: Database.Database, job: BatchJob, format: InputFormat, delimiter: Delimiter, options: BatchJobOptions, ready: ResultSignal, plainRows: PlainRows,
): Promise<void> {
  if (job.outputBytes > 0 && !existsSync(job.partialPath) && job.outputPath !== '-' && existsSync(job.outputPath)) return; // renamed before the crash
  const restart = job.outputBytes > 0 && !existsSync(job.partialPath);
  let position = restart ? 0 : job.outputBytes;
  let rowsDone = restart ? 0 : job.rowsDone;
  const tallies: Record<string, number> = restart ? {} : { ...job.tallies };
  const fd = openSync(job.partialPath, existsSync(job.partialPath) ? 'r+' : 'w');
  const context = recordContextOf(job);
  const results = resultLookup(jobs, job.id);
  const generalise = jobGeneralisation(job);
  const withhold = jobs.prepare('INSERT OR REPLACE INTO batch_withheld (job_id, row_number, precise) VALUES (?, ?, ?)');
  let generalisationOf: ((fields: readonly string[]) => Generalisation | undefined) | undefined;
  const writeBytes = (bytes: Buffer) => {
    // writeSync may write less than asked (a disk filling up); only bytes really written count.
    for (let written = 0; written < bytes.length; ) written += writeSync(fd, bytes, written, bytes.length - written, position + written);
    position += bytes.length;
    fsyncSync(fd);
  };
  try {
    ftruncateSync(fd, position);
    let columns: ColumnIndex | undefined;
    let headerLength = 0;
    let rowIndex = 0;
    // UTF-8 bytes, not strings: a plain row's appended fields go from the job database to the file undecoded.
    let buffer: Buffer[] = [];
    const flush = () => {
      if (rowIndex === rowsDone) return;
      writeBytes(Buffer.concat(buffer));
      rowsDone = rowIndex;
      buffer = [];
      updateJob(jobs, job.id, { rowsDone, outputBytes: position, tallies });
    };
    for await (const record of readRecords(job.inputPath, format, delimiter)) {
      if (!columns) {
        columns = indexColumns(record.fields);
        headerLength = record.fields.length;
        generalisationOf = generalise ? sensitiveGeneralisation(record.fields, generalise) : undefined;
        if (position === 0) {
          const appended = csvLine(outputHeader(record.fields, generalise ? GENERALISATION_TERMS : []).slice(headerLength), delimiter);
          // a delimiter declaration ("sep=;") is written back as it stood, so the output opens as the input did
          const headerLine = `${format.delimiterDeclaration?.line ?? ''}${originalLine(record, headerLength, delimiter)}${delimiter}${appended}${LINE_END}`;
          writeBytes(Buffer.from(job.partCount === null ? headerLine : partFileStart(partMeta(job), headerLine)));
          updateJob(jobs, job.id, { outputBytes: position, rowsDone: 0 });
        }
        continue;
      }
      if (++rowIndex <= rowsDone) continue;
      const key = record.problem ? undefined : groupOf(record.fields, columns).key;
      const inPart = job.partCount === null || partOfKey(key, job.partCount) === job.partIndex;
      // A row giving no coordinates (and not generalised) appends its group's plain row as stored; only the others need the whole result.
      const plain = !generalisationOf && !record.problem && !hasCoordinates(fieldAt(record, columns.decimalLatitude), fieldAt(record, columns.decimalLongitude));
      const lookup = (k: string) => (plain ? plainRows.get(k) : undefined) ?? results(k);
      let found = key === undefined || !inPart ? undefined : lookup(key);
      while (inPart && key !== undefined && !found) {
        if (ready.finished) throw new Error(`batch job ${job.id}: no result for the locality ${key}${ready.failed ? ` (${errorMessage(ready.failed)})` : ''}`);
        await ready.next();
        found = lookup(key);
      }
      if (plain && found !== undefined && !('appended' in found)) found = plainRows.keep(key!, found);
      if (found !== undefined && 'appended' in found) {
        count(tallies, found.status);
        if (found.flagged) count(tallies, 'flagged');
        const originals = `${originalLine(record, headerLength, delimiter)}${delimiter}`;
        if (job.partCount === null) buffer.push(Buffer.from(originals), found.appended, LINE_END_BYTES);
        else buffer.push(Buffer.from(partRowFrame(rowIndex, `${originals}${found.appended.toString('utf8')}${LINE_END}`)));
      } else if (inPart) {
        let group = found;
        let extra: string[] | undefined;
        if (generalisationOf) {
          const asked = record.problem ? undefined : generalisationOf(record.fields);
          const generalised = group && asked !== undefined ? generaliseGroup(group, asked, delimiter) : undefined;
          if (generalised?.withheld) withhold.run(job.id, rowIndex, JSON.stringify(generalised.withheld));
          group = generalised?.group ?? group;
          extra = generalised?.terms ?? ['', ''];
        }
        const line = outputRow(record, headerLength, columns, context, group, tallies, delimiter, extra);
        buffer.push(Buffer.from(job.partCount === null ? line : partRowFrame(rowIndex, line)));
      }
      if (rowIndex - rowsDone >= ROWS_PER_CHUNK) {
        flush();
        options.onProgress?.({ jobId: job.id, phase: 'writing', done: rowsDone, total: job.rowsTotal ?? undefined });
        await testDelay();
      }
    }
    flush();
  } finally {
    closeSync(fd);
  }
}

/** What a part file says it was made from (its rows are known once the input has been read). */
function partMeta(job: BatchJob): PartMeta {
  return {
    part: job.partIndex!, parts: job.partCount!, inputSha256: job.inputSha256, inputBytes: job.inputBytes, inputRows: job.rowsTotal ?? 0,
    settings: job.settings, version: job.version, sources: job.sources, runTimestamp: job.runTimestamp, delimiter: job.delimiter, encoding: job.encoding,
  };
}

/** Group results by key, from the job, the most recent kept in memory; undefined while not georeferenced yet. */
function resultLookup(jobs: Database.Database, jobId: string): (key: string) => RenderedGroup | undefined {
  const select = jobs.prepare('SELECT result FROM batch_locality WHERE job_id = ? AND key = ?');
  const cache = new Map<string, RenderedGroup>();
  return (key) => {
    const cached = cache.get(key);
    if (cached) return cached;
    const row = select.get(jobId, key) as { result: string | null } | undefined;
    if (!row?.result) return undefined;
    const result = JSON.parse(row.result) as RenderedGroup;
    if (cache.size >= RESULT_CACHE_SIZE) cache.delete(cache.keys().next().value!);
    cache.set(key, result);
    return result;
  };
}

/** What a row giving no coordinates of its own appends (UTF-8), with its status and whether it counts as flagged. */
interface PlainRow {
  appended: Buffer;
  status: string;
  flagged: boolean;
}

/**
 * Plain rows by locality key: formatted once, from the group's result, and kept until PLAIN_ROW_BUDGET
 * bytes are held; the localities after that are read from the job again each time (their parsed results
 * partly kept, see resultLookup), so that memory stays bounded however many localities a file has.
 */
class PlainRows {
  private readonly held = new Map<string, PlainRow>();
  private bytes = 0;

  constructor(private readonly delimiter: Delimiter) {}

  get(key: string): PlainRow | undefined {
    return this.held.get(key);
  }

  /**
   * The plain row of a locality's group, kept when the budget allows.
   * @example plainRows.keep(key, group).appended.toString() // '-45.5000,-131.0000,…,requires verification,'
   */
  keep(key: string, group: RenderedGroup): PlainRow {
    const kept = this.held.get(key);
    if (kept) return kept;
    const text = appendedLine(group, [], group.flags ?? [], this.delimiter);
    // A buffer of its own: Buffer.from would cut a small one from a shared 8 kB slab, which it would keep alive whole.
    const appended = Buffer.allocUnsafeSlow(Buffer.byteLength(text));
    appended.write(text);
    const row = { appended, status: group.status, flagged: isFlagged(group.flags ?? []) };
    if (this.bytes + row.appended.length <= PLAIN_ROW_BUDGET) {
      this.held.set(key, row);
      this.bytes += row.appended.length;
    }
    return row;
  }
}

/** RFC 4180 line ends (CRLF) for the output. */
const LINE_END = '\r\n';
const LINE_END_BYTES = Buffer.from(LINE_END);

function errorMessage(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/** Lets the row writer wait for localities still being georeferenced. */
class ResultSignal {
  finished = false;
  failed: unknown;
  private waiters: (() => void)[] = [];

  /** New results were stored. */
  notify(): void {
    const waiters = this.waiters;
    this.waiters = [];
    for (const wake of waiters) wake();
  }

  /** Every result is stored, or georeferencing failed. */
  finish(error?: unknown): void {
    this.finished = true;
    this.failed = error;
    this.notify();
    if (error) throw error;
  }

  next(): Promise<void> {
    return new Promise((resolve) => this.waiters.push(resolve));
  }
}

/** One output row: the original fields (padded to the header), the appended terms and the coordinate flags. */
function outputRow(
  record: InputRecord,
  headerLength: number,
  columns: ColumnIndex,
  context: RecordContext,
  group: RenderedGroup | undefined,
  tallies: Record<string, number>,
  delimiter: Delimiter,
  extra?: string[],
): string {
  const originals = originalLine(record, headerLength, delimiter);
  if (!group) {
    const unreadable = renderGroup({ fields: unreadableRecord(record.problem ?? 'the row could not be read', context), centers: [] }, delimiter);
    count(tallies, 'malformed');
    count(tallies, unreadable.status);
    return `${originals}${delimiter}${appendedLine(unreadable, [], [], delimiter, extra)}${LINE_END}`;
  }
  const check = checkCoordinates(fieldAt(record, columns.decimalLatitude), fieldAt(record, columns.decimalLongitude), group.circle, group.centers);
  count(tallies, group.status);
  const flags = [...(group.flags ?? []), ...check.flags];
  if (isFlagged(flags)) count(tallies, 'flagged');
  return `${originals}${delimiter}${appendedLine(group, check.remarks, flags, delimiter, extra)}${LINE_END}`;
}

/** A record's field by column index; '' for a column the input lacks or the row leaves out. */
function fieldAt(record: InputRecord, index: number | undefined): string {
  return index === undefined ? '' : (record.fields[index] ?? '');
}

function count(tallies: Record<string, number>, key: string): void {
  tallies[key] = (tallies[key] ?? 0) + 1;
}

/** The finished file: renamed onto the target (a crash never leaves half a file there), or copied to standard output. */
async function deliver(job: BatchJob, options: BatchJobOptions): Promise<void> {
  if (job.outputPath !== '-') {
    if (existsSync(job.partialPath)) renameSync(job.partialPath, job.outputPath);
    return;
  }
  await pipeline(createReadStream(job.partialPath), options.stdout ?? process.stdout, { end: false });
  rmSync(job.partialPath, { force: true });
}

/**
 * A group's result generalised for one row, with the two terms' values and the precise fields the private
 * store keeps (none when the row has no point to generalise).
 */
function generaliseGroup(group: RenderedGroup, generalisation: Generalisation, delimiter: Delimiter): { group: RenderedGroup; terms: string[]; withheld?: Record<WithheldTerm, string> } {
  const fields = groupFields(group, delimiter);
  const generalised = generaliseRecord(fields, generalisation);
  if (generalised.terms.dataGeneralizations === '') return { group, terms: ['', ''] };
  return {
    group: renderGroup({ fields: generalised.fields, centers: group.centers, flags: group.flags }, delimiter, group.localityType),
    terms: GENERALISATION_TERMS.map((t) => generalised.terms[t]),
    withheld: generalised.withheld,
  };
}
