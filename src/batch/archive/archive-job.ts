/**
 * A batch over a Darwin Core Archive: the occurrence core is read as the metafile describes it and
 * georeferenced as any batch file is (a resumable job); the result is a new archive holding every
 * original file byte for byte, the core with the appended columns, a metafile describing them, and the
 * EML metadata with a method step naming whereabouts, its version and the gazetteer sources.
 */
import { createHash } from 'node:crypto';
import { closeSync, createReadStream, existsSync, openSync, readFileSync, readSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import type { Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { describeCore, formatMetaXml, OCCURRENCE_ROW_TYPE, type MetaArchive } from '../../output/darwin-core-archive.ts';
import { methodStepParagraphs, minimalEml, withMethodStep } from '../../output/eml-method-step.ts';
import { resultFormat, type ResultFormat } from '../../output/result-formats.ts';
import { jobGeneralisation, loadJob, openJobs } from '../../store/jobs.ts';
import { jobsDatabasePath } from '../../store/side-files.ts';
import { batchCsvPath, resultOf, writeResults, type BatchResult } from '../gis-output.ts';
import { jobsPathOf, startBatchJob, type BatchJobOptions, type BatchSummary } from '../run.ts';
import { writeCoreTable } from './core-table.ts';
import { parseMetaXml } from './meta-xml.ts';
import { isZipFile, openZip, writeZip, type ZipReader, type ZipSource } from './zip.ts';

/** What the job keeps beside its core table, so that a job resumed by id still ends in an archive. */
interface ArchiveManifest {
  archivePath: string;
  outputPath: string;
  /** The core table the job reads, removed once the archive is written. */
  tablePath: string;
}

type StartedJob = Awaited<ReturnType<typeof startBatchJob>>;

/** Options of a batch that may be over an archive: a batch's, and how a caller other than the CLI wants the archive handled. */
export interface ArchiveJobOptions extends BatchJobOptions {
  /**
   * The input is a zip given as a Darwin Core Archive (an upload whose first bytes are a zip's): one that
   * is not an archive (unreadable, no meta.xml) is refused with `NotAnArchive`, never read as text.
   */
  archiveOnly?: boolean;
  /**
   * Write no archive when the job is done: the finished core table stays at the job's output path, for a
   * caller that writes the archive later with `writeGeoreferencedArchive` (the HTTP service, after review),
   * or that writes the core's rows in another format (the CLI's `batch --format geojson|gpkg`, through
   * src/batch/gis-output.ts as for any batch output).
   */
  coreOnly?: boolean;
  /**
   * The file to make, as the CLI's `batch --format` and `--out` ask it (either left out on a resume: as the
   * job was started, see `resultOf`): the CSV, a GIS file made from it, or for an archive a new archive.
   * Given, it decides `output` and `coreOnly`, is kept with the job, and is written when the job is done.
   */
  resultAsked?: { format?: ResultFormat; path?: string };
  /** How messages name the input (default its path; the HTTP service never shows its paths). */
  inputName?: string;
  /** Largest sum of the archive's files uncompressed, in bytes; a larger archive is refused before it is read. */
  maxExpandedBytes?: number;
}

/** A zip that is not a Darwin Core Archive: it cannot be read as a zip, or it holds no meta.xml. */
export class NotAnArchive extends Error {}

/** An archive whose files hold more bytes uncompressed than `maxExpandedBytes`. */
export class ArchiveTooLarge extends Error {}

export interface ArchiveSummary extends BatchSummary {
  /** Set when the input was a Darwin Core Archive: its core's path inside the archive and its encoding as meta.xml gives it. */
  archiveCore?: { path: string; encoding: string };
  /** The format of the file made, when `resultAsked` asked for one. */
  format?: ResultFormat;
}

/**
 * Start (or resume) a batch over a CSV or tab-separated file or a Darwin Core Archive (a zip with a
 * meta.xml). A zip without meta.xml is refused with a clear error.
 * @example const { jobId, done } = await startBatch({ dbPath, input: 'dwca.zip', output: 'dwca-georeferenced.zip' });
 */
export async function startBatch(asked: ArchiveJobOptions): Promise<{ jobId: string; methodChoices: StartedJob['methodChoices']; done: Promise<ArchiveSummary> }> {
  const resulting = asked.resultAsked ? withResult(asked, asked.resultAsked) : asked;
  // Read when the output is made, before the job's leftovers (the manifest among them) are removed.
  let made: ArchiveManifest | undefined;
  const options: ArchiveJobOptions = {
    ...resulting,
    finishOutput: (summary) => {
      made = manifestOf(summary.outputPath);
      return makeOutput(summary, resulting, made);
    },
  };
  const input = options.input;
  const zipPath = !options.resume && typeof input === 'string' && input !== '-' && existsSync(input) && isZipFile(input) ? input : undefined;
  if (zipPath && options.archiveOnly) await checkArchive(zipPath, options);
  if (!zipPath || !(await hasMetafile(zipPath))) {
    // Not an archive (a zip without meta.xml among them): the batch reads it, or says what it is.
    const { jobId, methodChoices, done } = await startBatchJob(options);
    return { jobId, methodChoices, done: done.then((summary) => finishResult(summary, options, made)) };
  }
  if (options.part) throw new Error('a Darwin Core Archive is georeferenced whole: --part cuts CSV and tab-separated files only');
  const archivePath = resolve(zipPath);
  const outputPath = !options.output || options.output === '-' ? '-' : resolve(options.output);
  if (outputPath === archivePath) throw new Error(`the output ${outputPath} would replace the input`);
  const zip = await openZip(archivePath);
  try {
    const { meta, metaDir } = await readMeta(zip, options.inputName ?? archivePath);
    if (meta.core.rowType !== OCCURRENCE_ROW_TYPE) {
      throw new Error(`the archive's core holds ${meta.core.rowType} rows; whereabouts georeferences an occurrence core (rowType ${OCCURRENCE_ROW_TYPE})`);
    }
    // Paths named by the archive's hash, so the same command run again finds the same job and resumes it.
    const key = (await sha256(archivePath)).slice(0, 16);
    const work = dirname(options.jobsDbPath ?? jobsDatabasePath(options.dbPath));
    // The output's name in it too: the same archive georeferenced into two outputs at once (two uploads) has two tables.
    const table = join(work, `whereabouts-archive-${key}.${createHash('sha256').update(outputPath).digest('hex').slice(0, 8)}.core.txt`);
    const coreOut = outputPath === '-' ? join(work, `whereabouts-archive-${key}.out.txt`) : `${outputPath}.${key}.core.txt`;
    await writeCoreTable(zip, metaDir, meta.core, table);
    const manifest: ArchiveManifest = { archivePath, outputPath, tablePath: table };
    writeFileSync(manifestPathOf(coreOut), JSON.stringify(manifest));
    try {
      const { jobId, methodChoices, done } = await startBatchJob({ ...options, input: table, output: coreOut, delimiter: '\t' });
      return { jobId, methodChoices, done: done.then((summary) => finishResult(summary, options, made)) };
    } catch (error) {
      // No job was stored (a core without a locality term, say): nothing is left behind.
      rmSync(table, { force: true });
      rmSync(manifestPathOf(coreOut), { force: true });
      throw error;
    }
  } finally {
    zip.close();
  }
}

/**
 * The options of a run that makes a file (the CLI's): the result, from what was asked and, on a resume,
 * the job as it was started; where the job writes its CSV for it; whether an archive's job writes its
 * archive. A resumed job over an archive keeps its core table where it is (its manifest is named after
 * it); a resumed job over a plain file whose result changed has its CSV moved (src/batch/run.ts).
 */
function withResult(options: ArchiveJobOptions, asked: NonNullable<ArchiveJobOptions['resultAsked']>): ArchiveJobOptions {
  if (!options.resume) {
    const result = resultOf(asked);
    return { ...options, output: batchCsvPath(result.format, result.path), coreOnly: result.format !== 'csv', result };
  }
  const jobs = openJobs(jobsPathOf({ ...options, output: asked.path }));
  let job;
  try {
    job = loadJob(jobs, options.resume);
  } finally {
    jobs.close();
  }
  const manifest = manifestOf(job.outputPath);
  const started = {
    id: job.id, format: resultFormat(job.resultFormat ?? 'csv'), path: job.resultPath ?? manifest?.outputPath ?? job.outputPath, part: job.partCount !== null,
  };
  const result = resultOf(asked, started);
  if (manifest && result.format === 'csv' && result.path === manifest.archivePath) throw new Error(`the output ${result.path} would replace the input`);
  const unchanged = result.format === started.format && result.path === started.path;
  return { ...options, output: manifest || unchanged ? undefined : batchCsvPath(result.format, result.path), coreOnly: result.format !== 'csv', result };
}

/**
 * The file asked for, made from the job's whole CSV before the job is marked done (a resume of a job
 * stopped meanwhile makes it again): for a job over an archive's core (`manifest`) the new archive (none
 * with `coreOnly`), then the GIS file asked for; each written beside its target and renamed into place.
 * Gives the files kept only to make it, which go once the job is done: the CSV a GIS file or an archive was
 * made from (with `coreOnly` the georeferenced core stays for the caller), an archive's core table and manifest.
 */
async function makeOutput(summary: Omit<BatchSummary, 'resumed'>, options: ArchiveJobOptions, manifest: ArchiveManifest | undefined): Promise<string[]> {
  if (manifest && !options.coreOnly) {
    // The archive goes where the run asked (a resume may name another file), else where the job was started for.
    const archiveTarget = options.result?.path ?? manifest.outputPath;
    const target = archiveTarget === '-' ? `${summary.outputPath}.zip` : `${archiveTarget}.partial`;
    const jobsPath = options.jobsDbPath ?? jobsDatabasePath(options.dbPath);
    await writeGeoreferencedArchive({ archivePath: manifest.archivePath, corePath: summary.outputPath, target, jobsPath, jobId: summary.jobId });
    if (archiveTarget === '-') {
      await pipeline(createReadStream(target), options.stdout ?? process.stdout, { end: false });
      rmSync(target, { force: true });
    } else renameSync(target, archiveTarget);
  }
  const result = options.result as BatchResult | undefined;
  if (result) await writeResults({ format: result.format, csvPath: summary.outputPath, delimiter: summary.delimiter, output: result.path, runTimestamp: summary.runTimestamp, stdout: options.stdout as Writable | undefined });
  const csvMadeInto = (manifest && !options.coreOnly) || (result && result.format !== 'csv');
  return [...(csvMadeInto ? [summary.outputPath] : []), ...(manifest ? [manifest.tablePath, manifestPathOf(summary.outputPath)] : [])];
}

/** Once the job is done (its leftovers gone): a summary naming the file made, from the manifest of a job over an archive's core. */
async function finishResult(summary: BatchSummary, options: ArchiveJobOptions, manifest: ArchiveManifest | undefined): Promise<ArchiveSummary> {
  const result = options.result as BatchResult | undefined;
  let finished: ArchiveSummary = summary;
  if (manifest) {
    finished = { ...summary, outputPath: options.coreOnly ? summary.outputPath : (result?.path ?? manifest.outputPath), archiveCore: await coreOf(manifest.archivePath) };
  }
  return result ? { ...finished, outputPath: result.path, format: result.format } : finished;
}

/**
 * Where a job over an archive's core keeps its manifest: beside the job's CSV.
 * @example manifestPathOf('/data/out.zip.3f9c2a71e0b4d6c8.core.txt') // '/data/out.zip.3f9c2a71e0b4d6c8.core.txt.archive.json'
 */
function manifestPathOf(csvPath: string): string {
  return `${csvPath}.archive.json`;
}

/** The manifest of a job over an archive's core; undefined for a job over a plain file. */
function manifestOf(csvPath: string): ArchiveManifest | undefined {
  const path = manifestPathOf(csvPath);
  return csvPath !== '-' && existsSync(path) ? (JSON.parse(readFileSync(path, 'utf8')) as ArchiveManifest) : undefined;
}

async function sha256(path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/** The metafile's entry: `meta.xml` at the top of the archive or in a folder (the shortest path). */
function metafileEntry(zip: ZipReader): string | undefined {
  return zip.entries.map((e) => e.name).filter((n) => n === 'meta.xml' || n.endsWith('/meta.xml')).sort((a, b) => a.length - b.length)[0];
}

/**
 * Refuses a zip given as an archive that is not one: unreadable, without meta.xml, or larger uncompressed
 * than `maxExpandedBytes` (yauzl checks each entry's bytes against the size its header declares).
 */
async function checkArchive(path: string, options: ArchiveJobOptions): Promise<void> {
  const name = options.inputName ?? path;
  const zip = await openZip(path).catch((error: unknown) => {
    throw new NotAnArchive(`${name} cannot be read as a zip (${error instanceof Error ? error.message.replace(`the zip archive ${path}`, 'it') : String(error)})`);
  });
  try {
    if (!metafileEntry(zip)) throw new NotAnArchive(`${name} has no meta.xml (Darwin Core text guide §2.1: the metafile describes the core and its extensions); its files: ${zip.entries.slice(0, 10).map((e) => e.name).join(', ')}${zip.entries.length > 10 ? ', …' : ''}`);
    const expanded = zip.entries.reduce((sum, e) => sum + e.size, 0);
    if (options.maxExpandedBytes !== undefined && expanded > options.maxExpandedBytes) {
      throw new ArchiveTooLarge(`${name} holds ${expanded} bytes uncompressed, more than the limit of ${options.maxExpandedBytes} bytes`);
    }
  } finally {
    zip.close();
  }
}

/** Whether a zip holds a meta.xml; false for one yauzl cannot read either (the batch then says what the file is). */
async function hasMetafile(path: string): Promise<boolean> {
  const zip = await openZip(path).catch(() => undefined);
  if (!zip) return false;
  try {
    return metafileEntry(zip) !== undefined;
  } finally {
    zip.close();
  }
}

async function readMeta(zip: ZipReader, name: string): Promise<{ meta: MetaArchive; metaDir: string }> {
  const metaEntry = metafileEntry(zip);
  if (!metaEntry) throw new NotAnArchive(`${name} has no meta.xml, so it is not a Darwin Core Archive`);
  return { meta: parseMetaXml((await zip.read(metaEntry)).toString('utf8').replace(/^\uFEFF/, '')), metaDir: metaEntry.slice(0, -'meta.xml'.length) };
}

/** The core's path inside the archive and its encoding as meta.xml gives it. */
async function coreOf(archivePath: string): Promise<{ path: string; encoding: string }> {
  const zip = await openZip(archivePath);
  try {
    const { meta, metaDir } = await readMeta(zip, archivePath);
    return { path: metaDir + meta.core.locations[0].replace(/^\.\//, ''), encoding: meta.core.encoding };
  } finally {
    zip.close();
  }
}

/**
 * Write the georeferenced archive: every file of the original archive byte for byte, but the core,
 * which is `corePath` (a batch output over that core: UTF-8, tab-separated, RFC 4180 quoting), meta.xml
 * describing it, and the EML metadata with the method step of job `jobId`. The CLI's batch writes it
 * when the job is done; the HTTP service writes it from the reviewed core.
 * @example await writeGeoreferencedArchive({ archivePath: 'dwca.zip', corePath: 'core.txt', target: 'out.zip', jobsPath, jobId }) // { path: 'occurrence.txt', encoding: 'UTF-8' }
 */
export async function writeGeoreferencedArchive(options: { archivePath: string; corePath: string; target: string; jobsPath: string; jobId: string }): Promise<{ path: string; encoding: string }> {
  const { archivePath, corePath, target } = options;
  const zip = await openZip(archivePath);
  try {
    const { meta, metaDir } = await readMeta(zip, archivePath);
    const core = metaDir + meta.core.locations[0].replace(/^\.\//, '');
    const header = coreHeader(corePath);
    const { paragraphs, runTimestamp } = methodStep(options.jobsPath, options.jobId);
    const modified = new Date(runTimestamp);
    const metadataName = meta.metadata ?? ['eml.xml', 'metadata.xml'].find((n) => zip.entries.some((e) => e.name === metaDir + n)) ?? 'eml.xml';
    const emlPath = metaDir + metadataName;
    const newMeta = Buffer.from(formatMetaXml(describeCore(meta, header, metadataName)), 'utf8');
    const eml = zip.entries.some((e) => e.name === emlPath) ? withMethodStep(await zip.read(emlPath), paragraphs) : minimalEml(`Occurrences of ${basename(core)}, georeferenced by whereabouts`, paragraphs);
    const entries = zip.entries.map((e): { name: string; modified: Date; source: ZipSource } => {
      if (e.name === core) return { name: e.name, modified, source: { file: corePath } };
      if (e.name === metaDir + 'meta.xml') return { name: e.name, modified, source: { buffer: newMeta } };
      if (e.name === emlPath) return { name: e.name, modified, source: { buffer: eml } };
      return { name: e.name, modified: e.modified, source: { stream: () => zip.open(e.name) } };
    });
    if (!zip.entries.some((e) => e.name === emlPath)) {
      entries.push({ name: emlPath, modified, source: { buffer: eml } });
    }
    await writeZip(target, entries);
    return { path: core, encoding: meta.core.encoding };
  } finally {
    zip.close();
  }
}

/** The finished core's header line (the batch writes UTF-8, tab-separated, RFC 4180 quoting). */
function coreHeader(path: string): string[] {
  const fd = openSync(path, 'r');
  const head = Buffer.alloc(1 << 20);
  const n = readSync(fd, head, 0, head.length, 0);
  closeSync(fd);
  const text = head.subarray(0, n).toString('utf8');
  const line = text.slice(0, text.indexOf('\r\n'));
  return line.split('\t').map((f) => (f.startsWith('"') ? f.slice(1, -1).replace(/""/g, '"') : f));
}

/** The EML method step of the job that georeferenced the core, and the job's run timestamp. */
function methodStep(jobsPath: string, jobId: string): { paragraphs: string[]; runTimestamp: string } {
  const jobs = openJobs(jobsPath);
  try {
    const job = loadJob(jobs, jobId);
    return { paragraphs: methodStepParagraphs({ version: job.version, runTimestamp: job.runTimestamp, rows: job.rowsTotal ?? 0, sources: job.sources, generalise: jobGeneralisation(job) }), runTimestamp: job.runTimestamp };
  } finally {
    jobs.close();
  }
}
