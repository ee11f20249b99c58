/**
 * A batch over a Darwin Core Archive: the occurrence core is read as the metafile describes it and
 * georeferenced as any batch file is (a resumable job); the result is a new archive holding every
 * original file byte for byte, the core with the appended columns, a metafile describing them, and the
 * EML metadata with a method step naming whereabouts, its version and the gazetteer sources.
 */
import { createHash } from 'node:crypto';
import { closeSync, createReadStream, existsSync, openSync, readFileSync, readSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { describeCore, formatMetaXml, OCCURRENCE_ROW_TYPE, type MetaArchive } from '../../output/darwin-core-archive.ts';
import { methodStepParagraphs, minimalEml, withMethodStep } from '../../output/eml-method-step.ts';
import { loadJob, openJobs } from '../../store/jobs.ts';
import { jobsDatabasePath } from '../../store/side-files.ts';
import { startBatchJob, type BatchJobOptions, type BatchSummary } from '../run.ts';
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

export interface ArchiveSummary extends BatchSummary {
  /** Set when the input was a Darwin Core Archive: its core's path inside the archive and its encoding as meta.xml gives it. */
  archiveCore?: { path: string; encoding: string };
}

/**
 * Start (or resume) a batch over a CSV or tab-separated file or a Darwin Core Archive (a zip with a
 * meta.xml). A zip without meta.xml is refused with a clear error.
 * @example const { jobId, done } = await startBatch({ dbPath, input: 'dwca.zip', output: 'dwca-georeferenced.zip' });
 */
export async function startBatch(options: BatchJobOptions): Promise<{ jobId: string; methodChoices: StartedJob['methodChoices']; done: Promise<ArchiveSummary> }> {
  const input = options.input;
  if (options.resume || typeof input !== 'string' || input === '-' || !existsSync(input) || !isZipFile(input) || !(await hasMetafile(input))) {
    // Not an archive (a zip without meta.xml among them): the batch reads it, or says what it is.
    const { jobId, methodChoices, done } = await startBatchJob(options);
    return { jobId, methodChoices, done: done.then((summary) => finishArchive(summary, options)) };
  }
  if (options.part) throw new Error('a Darwin Core Archive is georeferenced whole: --part cuts CSV and tab-separated files only');
  const archivePath = resolve(input);
  const outputPath = !options.output || options.output === '-' ? '-' : resolve(options.output);
  if (outputPath === archivePath) throw new Error(`the output ${outputPath} would replace the input`);
  const zip = await openZip(archivePath);
  try {
    const { meta, metaDir } = await readMeta(zip, archivePath);
    if (meta.core.rowType !== OCCURRENCE_ROW_TYPE) {
      throw new Error(`the archive's core holds ${meta.core.rowType} rows; whereabouts georeferences an occurrence core (rowType ${OCCURRENCE_ROW_TYPE})`);
    }
    // Paths named by the archive's hash, so the same command run again finds the same job and resumes it.
    const key = (await sha256(archivePath)).slice(0, 16);
    const work = dirname(options.jobsDbPath ?? jobsDatabasePath(options.dbPath));
    const table = join(work, `whereabouts-archive-${key}.core.txt`);
    const coreOut = outputPath === '-' ? join(work, `whereabouts-archive-${key}.out.txt`) : `${outputPath}.${key}.core.txt`;
    await writeCoreTable(zip, metaDir, meta.core, table);
    const manifest: ArchiveManifest = { archivePath, outputPath, tablePath: table };
    writeFileSync(`${coreOut}.archive.json`, JSON.stringify(manifest));
    try {
      const { jobId, methodChoices, done } = await startBatchJob({ ...options, input: table, output: coreOut, delimiter: '\t' });
      return { jobId, methodChoices, done: done.then((summary) => finishArchive(summary, options)) };
    } catch (error) {
      // No job was stored (a core without a locality term, say): nothing is left behind.
      rmSync(table, { force: true });
      rmSync(`${coreOut}.archive.json`, { force: true });
      throw error;
    }
  } finally {
    zip.close();
  }
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

async function readMeta(zip: ZipReader, archivePath: string): Promise<{ meta: MetaArchive; metaDir: string }> {
  const metaEntry = metafileEntry(zip);
  if (!metaEntry) throw new Error(`${archivePath} has no meta.xml, so it is not a Darwin Core Archive`);
  return { meta: parseMetaXml((await zip.read(metaEntry)).toString('utf8').replace(/^\uFEFF/, '')), metaDir: metaEntry.slice(0, -'meta.xml'.length) };
}

/**
 * After a job over an archive's core: the new archive, from the finished core table and the original
 * archive; a summary naming it. A job over a plain file is passed through unchanged.
 */
async function finishArchive(summary: BatchSummary, options: BatchJobOptions): Promise<ArchiveSummary> {
  const manifestPath = `${summary.outputPath}.archive.json`;
  if (summary.outputPath === '-' || !existsSync(manifestPath)) return summary;
  const manifest = JSON.parse(readFileSync(manifestPath, 'utf8')) as ArchiveManifest;
  const zip = await openZip(manifest.archivePath);
  const target = manifest.outputPath === '-' ? `${summary.outputPath}.zip` : `${manifest.outputPath}.partial`;
  let core: string;
  let encoding: string;
  try {
    const { meta, metaDir } = await readMeta(zip, manifest.archivePath);
    core = metaDir + meta.core.locations[0].replace(/^\.\//, '');
    encoding = meta.core.encoding;
    const header = coreHeader(summary.outputPath);
    const modified = new Date(summary.runTimestamp);
    const metadataName = meta.metadata ?? ['eml.xml', 'metadata.xml'].find((n) => zip.entries.some((e) => e.name === metaDir + n)) ?? 'eml.xml';
    const emlPath = metaDir + metadataName;
    const jobsPath = options.jobsDbPath ?? jobsDatabasePath(options.dbPath);
    const method = methodStep(summary, jobsPath);
    const newMeta = Buffer.from(formatMetaXml(describeCore(meta, header, metadataName)), 'utf8');
    const eml = zip.entries.some((e) => e.name === emlPath) ? withMethodStep(await zip.read(emlPath), method) : minimalEml(`Occurrences of ${basename(core)}, georeferenced by whereabouts`, method);
    const entries = zip.entries.map((e): { name: string; modified: Date; source: ZipSource } => {
      if (e.name === core) return { name: e.name, modified, source: { file: summary.outputPath } };
      if (e.name === metaDir + 'meta.xml') return { name: e.name, modified, source: { buffer: newMeta } };
      if (e.name === emlPath) return { name: e.name, modified, source: { buffer: eml } };
      return { name: e.name, modified: e.modified, source: { stream: () => zip.open(e.name) } };
    });
    if (!zip.entries.some((e) => e.name === emlPath)) {
      entries.push({ name: emlPath, modified, source: { buffer: eml } });
    }
    await writeZip(target, entries);
  } finally {
    zip.close();
  }
  if (manifest.outputPath === '-') {
    await pipeline(createReadStream(target), options.stdout ?? process.stdout, { end: false });
    rmSync(target, { force: true });
  } else renameSync(target, manifest.outputPath);
  rmSync(summary.outputPath, { force: true });
  rmSync(manifest.tablePath, { force: true });
  rmSync(manifestPath, { force: true });
  return { ...summary, outputPath: manifest.outputPath, archiveCore: { path: core, encoding } };
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

/** The EML method step of the job that georeferenced the core. */
function methodStep(summary: BatchSummary, jobsPath: string): string[] {
  const jobs = openJobs(jobsPath);
  try {
    const job = loadJob(jobs, summary.jobId);
    return methodStepParagraphs({ version: job.version, runTimestamp: job.runTimestamp, rows: summary.rows, sources: job.sources });
  } finally {
    jobs.close();
  }
}
