/**
 * Batch review for the page: uploads become batch jobs (src/batch), their output is listed record by
 * record, each record can be shown with its candidates and map, accepted, rejected or given another
 * candidate, and the reviewed file downloaded. Job ids come from the job store, files from this
 * module's own folder: nothing a request says is ever used as a path.
 */
import { randomUUID } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { basename, dirname, isAbsolute, join } from 'node:path';
import { failJob, jobProgress, storedLocalityTypes, type BatchSummary, type JobProgress } from '../batch/index.ts';
import { ArchiveTooLarge, NotAnArchive, startBatch, writeGeoreferencedArchive } from '../batch/archive/archive-job.ts';
import { isZipStart } from '../batch/archive/zip.ts';
import { groupOf, indexColumns, normaliseText } from '../batch/locality-group.ts';
import { originalLine } from '../batch/original-line.ts';
import { parseRecords, type Delimiter, type InputRecord } from '../batch/records.ts';
import type { LocateResult } from '../locate/locate.ts';
import { COORDINATE_FLAGS_COLUMN, csvLine, readFlags } from '../output/csv.ts';
import { answerBody, type AnswerBody } from '../output/json.ts';
import { footprintGeometry } from '../output/footprint-geometry.ts';
import { footprintSummary } from '../geodesy/wkt.ts';
import { decimalNumber } from '../record/coordinate-check.ts';
import { GEOREFERENCE_TERMS, type GeoreferenceTerm } from '../record/darwin-core.ts';
import { REVIEWED_STATUS } from '../record/verification-status.ts';
import { HEAD_BYTES, notText } from '../store/file-kind.ts';
import { delimiterDeclarationLine } from '../store/input-format.ts';
import { writeResults } from '../batch/gis-output.ts';
import { sensitiveGeneralisation } from '../batch/sensitive-records.ts';
import type { GeneralisationSettings } from '../georef/generalisation.ts';
import type { Generalisation } from '../georef/generalisation.ts';
import { appendedColumns } from '../output/result-rows.ts';
import { GENERALISATION_TERMS, generaliseRecord } from '../record/generalised-record.ts';
import { RequestError } from './errors.ts';
import type { RecordAnswer } from '../locate/georeference-record.ts';
import { lookUp, type ServedGazetteer } from './lookup.ts';
import type { ResultCache } from './result-cache.ts';
import type { Resolution, ResolvedTerms, Review, ReviewDecision, ReviewStore } from '../store/reviews.ts';
import { batchFolderPath, jobsDatabasePath } from '../store/side-files.ts';
import { SERVER_DEFAULTS } from './defaults.ts';


/** One record of the review list. */
export interface RecordSummary {
  row: number;
  locality: string;
  status: string;
  localityType: string;
  radiusMeters: number | null;
  flags: string[];
  review: ReviewDecision | null;
}

export interface RecordFilter {
  status?: string;
  review?: ReviewDecision | 'pending';
  flag?: string;
  localityType?: string;
  radiusMin?: number;
  radiusMax?: number;
}

/** One record for review: its original fields, what the batch proposed, and the lookup for the map. */
export interface RecordDetail {
  row: number;
  original: Record<string, string>;
  proposed: Record<string, string>;
  flags: string[];
  review: Review | null;
  answer: AnswerBody;
  /** What the reviewer's resolution did, in words (e.g. a sign corrected), when one is applied. */
  resolutionNote?: string;
}

/** A record georeferenced again for review, with what the resolution applied to it did. */
interface ResolvedRow {
  answer: RecordAnswer;
  note?: string;
}

/** Coordinate-check flags (src/batch/coordinate-check.ts) whose correction the reviewer may accept, and how each corrects. */
const CORRECTIONS: Record<string, { fix: (lat: string, lon: string) => [string, string]; words: string }> = {
  'fits-if-latitude-sign-flipped': { fix: (lat, lon) => [flipSign(lat), lon], words: 'the sign of latitude inverted' },
  'fits-if-longitude-sign-flipped': { fix: (lat, lon) => [lat, flipSign(lon)], words: 'the sign of longitude inverted' },
  'fits-if-both-signs-flipped': { fix: (lat, lon) => [flipSign(lat), flipSign(lon)], words: 'both signs inverted' },
  'fits-if-latitude-longitude-exchanged': { fix: (lat, lon) => [lon, lat], words: 'latitude and longitude exchanged' },
};

interface ParsedOutput {
  /** The output's first line "sep=;" as written, or ''. */
  declaration: string;
  header: InputRecord;
  originalLength: number;
  /** How the job generalises a row (undefined: not at all, or not this row): the job's own settings. */
  generalisationOf: (originals: readonly string[]) => Generalisation | undefined;
  /** The job's rows as read from its output, original fields quoted as they stood. */
  records: InputRecord[];
  delimiter: Delimiter;
  summaries: RecordSummary[];
}

/**
 * What an upload is, from its bytes (never its name): CSV text, or a zip to be read as a Darwin Core
 * Archive; a workbook or other binary data is refused (src/store/file-kind.ts).
 */
export function uploadKind(bytes: Buffer): 'csv' | 'archive' {
  if (bytes.length === 0) throw new RequestError(400, 'the uploaded file is empty', 'file');
  const kind = notText(bytes.subarray(0, HEAD_BYTES));
  if (kind?.mayBeArchive && isZipStart(bytes)) return 'archive';
  if (kind) throw new RequestError(415, `the uploaded file is ${kind.format} and not CSV text: ${kind.advice}`, 'file');
  return 'csv';
}

/**
 * The files of an upload's job: all named from one id, so a job's output path leads back to its upload.
 * An archive's job writes no `archiveOutput` (`coreOnly`): its core table is named from it.
 */
function uploadFiles(folder: string, id: string) {
  return { csvOutput: join(folder, `${id}.csv`), archive: join(folder, `${id}.dwca.zip`), archiveOutput: join(folder, `${id}.zip`) };
}

/** The downloads of a finished job, by format; the archive only for a job over an archive. */
function downloads(jobId: string, archive: boolean): Record<string, string> {
  const formats = archive ? ['zip', 'csv', 'geojson', 'gpkg'] : ['csv', 'geojson', 'gpkg'];
  return Object.fromEntries(formats.map((f) => [f, `/api/v1/batches/${jobId}/reviewed.${f}`]));
}

export class BatchService {
  private readonly folder: string;
  private readonly jobsPath: string;
  private readonly running = new Map<string, Promise<BatchSummary | undefined>>();
  private readonly parsed = new Map<string, ParsedOutput>();

  constructor(
    private readonly dbPath: string,
    private readonly store: ServedGazetteer,
    private readonly reviews: ReviewStore,
    private readonly results?: ResultCache<LocateResult>,
    /** Largest sum of an uploaded archive's files uncompressed, in bytes. */
    private readonly archiveExpandedLimit = SERVER_DEFAULTS.archiveExpandedLimit,
  ) {
    // Output paths are kept absolute by the job store: so is this folder, for the two to compare equal.
    if (!isAbsolute(dbPath)) throw new Error(`the batch service needs an absolute database path, not ${dbPath}`);
    this.folder = batchFolderPath(dbPath);
    this.jobsPath = jobsDatabasePath(dbPath);
  }

  /**
   * Starts a job on the uploaded bytes, CSV text or a Darwin Core Archive (the same job the CLI's batch
   * runs over an archive's core, src/batch/archive), generalising sensitive rows when asked; resolves with
   * its id once the job is stored.
   */
  async start(bytes: Buffer, generalise?: GeneralisationSettings): Promise<string> {
    const kind = uploadKind(bytes);
    // Said here without the store's path, which an HTTP answer never shows.
    if (this.store.sources().length === 0) throw new RequestError(409, 'the service\'s gazetteer holds no source, so no row could be georeferenced: load one with whereabouts import <file> --source "<citation>" and start the service again', 'file');
    mkdirSync(this.folder, { recursive: true });
    const files = uploadFiles(this.folder, randomUUID());
    if (kind === 'archive') writeFileSync(files.archive, bytes);
    let started: Awaited<ReturnType<typeof startBatch>>;
    try {
      const generalising = generalise ? { generalise } : {};
      started = await startBatch(
        kind === 'archive'
          ? { dbPath: this.dbPath, input: files.archive, output: files.archiveOutput, archiveOnly: true, coreOnly: true, inputName: 'the uploaded zip', maxExpandedBytes: this.archiveExpandedLimit, ...generalising }
          : { dbPath: this.dbPath, input: bytes, output: files.csvOutput, ...generalising },
      );
    } catch (error) {
      rmSync(files.archive, { force: true });
      const message = this.withoutPaths(error instanceof Error ? error.message : String(error));
      if (error instanceof ArchiveTooLarge) throw new RequestError(413, message, 'file');
      if (error instanceof NotAnArchive) throw new RequestError(415, `the uploaded file is a ZIP archive and not CSV text, nor a Darwin Core Archive: ${message}. Send a Darwin Core Archive (a zip with a meta.xml) or one CSV or tab-separated file`, 'file');
      throw new RequestError(400, `the file could not be read as a batch: ${message}`, 'file');
    }
    this.reviews.addJob(started.jobId);
    this.follow(started.jobId, started.done);
    return started.jobId;
  }

  /**
   * Resumes the jobs this service started that a stop (SIGTERM, a crash) left unfinished: each has
   * committed its steps (src/batch), so it goes on where it was, with nothing lost or repeated. A job
   * that cannot go on with the answers it started with (the gazetteer's sources or the job's input
   * changed meanwhile) is stored as failed with the reason, which its progress shows; the service starts.
   */
  async resumeUnfinished(): Promise<string[]> {
    const resumed: string[] = [];
    for (const jobId of this.reviews.jobs()) {
      const state = this.progressOrUndefined(jobId)?.state;
      if (state === undefined || state === 'done' || state === 'failed') continue;
      try {
        const started = await startBatch({ dbPath: this.dbPath, resume: jobId, coreOnly: true });
        this.follow(jobId, started.done);
        resumed.push(jobId);
      } catch (error) {
        failJob(this.jobsPath, jobId, this.withoutPaths(error instanceof Error ? error.message : String(error)));
      }
    }
    return resumed;
  }

  /** A failed job is stored as failed by src/batch and progress reports it, so the rejection ends here. */
  private follow(jobId: string, done: Promise<BatchSummary>): void {
    this.running.set(jobId, done.catch(() => undefined).finally(() => this.running.delete(jobId)));
  }

  private progressOrUndefined(jobId: string): JobProgress | undefined {
    try {
      return jobProgress(this.jobsPath, jobId);
    } catch {
      return undefined;
    }
  }

  /**
   * Progress without server paths; a 404 for a job this service did not start. A finished job says what
   * was uploaded (`input`) and lists its downloads.
   */
  progress(jobId: string): Omit<JobProgress, 'outputPath'> & { fraction: number; input?: 'csv' | 'darwin-core-archive'; downloads?: Record<string, string> } {
    const { outputPath: _outputPath, ...progress } = this.ownProgress(jobId);
    const fraction = progress.state === 'done' ? 1 : progress.state === 'writing' && progress.rowsTotal ? 0.5 + (0.5 * progress.rowsDone) / progress.rowsTotal
      : progress.state === 'georeferencing' && progress.distinctTotal ? (0.5 * progress.distinctDone) / progress.distinctTotal : 0;
    if (progress.state !== 'done') return { ...progress, fraction };
    const archive = this.uploadedArchive(jobId) !== undefined;
    return { ...progress, fraction, input: archive ? 'darwin-core-archive' : 'csv', downloads: downloads(jobId, archive) };
  }

  /** The records of a finished job, filtered, with the facets the filters offer. */
  list(jobId: string, filter: RecordFilter): { records: RecordSummary[]; total: number; facets: { status: string[]; flag: string[]; localityType: string[] } } {
    const output = this.output(jobId);
    const reviews = this.reviews.latest(jobId);
    const all = output.summaries.map((s) => ({ ...s, status: reviewedStatus(s.status, reviews.get(s.row)), review: reviews.get(s.row)?.decision ?? null }));
    const records = all.filter((r) => matches(r, filter));
    const distinct = (values: string[]) => [...new Set(values)].filter(Boolean).sort();
    return {
      records,
      total: all.length,
      facets: { status: distinct(all.map((r) => r.status)), flag: distinct(all.flatMap((r) => r.flags)), localityType: distinct(all.map((r) => r.localityType)) },
    };
  }

  /**
   * One record, georeferenced again for the map: with the resolution asked for (another candidate, a
   * corrected locality, the record's own coordinates), else the one stored with its review.
   */
  record(jobId: string, row: number, resolution: Resolution = {}): RecordDetail {
    const output = this.output(jobId);
    const fields = this.rowOf(output, row);
    const review = this.reviews.latest(jobId).get(row) ?? null;
    const { answer, note } = this.lookUpRow(output, fields, hasResolution(resolution) ? resolution : (review ?? {}));
    const generalisation = output.generalisationOf(fields.slice(0, output.originalLength));
    const original = Object.fromEntries(output.header.fields.slice(0, output.originalLength).map((name, i) => [name, fields[i] ?? '']));
    const proposed = Object.fromEntries(output.header.fields.slice(output.originalLength).map((name, i) => [name, fields[output.originalLength + i] ?? '']));
    const body = generalisation ? generalisedAnswer(answerBody(answer), generalisation) : answerBody(answer);
    return { row, original, proposed, flags: readFlags(proposed[COORDINATE_FLAGS_COLUMN]), review, answer: body, ...(note && !generalisation ? { resolutionNote: note } : {}) };
  }

  /**
   * Stores a decision with who and when. Verifying needs a point: an accept of a record that has none
   * (not found, ambiguous, unreadable) is refused until a resolution gives it one.
   */
  decide(jobId: string, row: number, decision: ReviewDecision, reviewer: string, resolution: Resolution = {}): Review {
    const output = this.output(jobId);
    const fields = this.rowOf(output, row);
    // Georeferencing again refuses a candidate that is not offered and coordinates the record does not have.
    const resolved = hasResolution(resolution) ? this.lookUpRow(output, fields, resolution) : undefined;
    if (decision === 'accepted') {
      const hasPoint = resolved ? resolved.answer.result.georeference !== undefined : fields[termColumns(output.header.fields).decimalLatitude] !== '';
      if (!hasPoint) {
        const status = resolved?.answer.result.status ?? summaryStatus(output, row);
        const reason = resolved?.answer.result.reason;
        throw new RequestError(
          409,
          `row ${row} has no point to verify (${status}${reason ? `: ${reason}` : ''}): ` +
            "choose a candidate, give a corrected locality, or accept the record's own coordinates, then accept",
          'decision',
        );
      }
    }
    const review: Review = { decision, ...resolution, reviewer: reviewer.trim() || 'anonymous reviewer', decidedAt: new Date().toISOString() };
    // The reviewed file writes these terms, as the reviewer decided on them, not a later gazetteer's.
    const kept = resolved && this.lookUpRow(output, fields, resolution, review);
    this.reviews.record(jobId, row, review, kept ? { darwinCore: kept.answer.darwinCore, ...(kept.note ? { note: kept.note } : {}) } : undefined);
    return review;
  }

  /**
   * The job's output with every decision applied: accepted → "verified by data custodian", rejected →
   * "requires georeference" with the proposal moved into the remarks; a chosen candidate recomputes
   * the appended terms. Originals are never changed. `as` is the delimiter to write (default the job's).
   */
  reviewedCsv(jobId: string, as?: Delimiter): { text: string; delimiter: Delimiter } {
    const output = this.output(jobId);
    const reviews = this.reviews.latest(jobId);
    const resolvedTerms = this.reviews.resolved(jobId);
    const column = termColumns(output.header.fields);
    const rows = output.records.map(({ fields }, index) => {
      const review = reviews.get(index + 1);
      if (!review) return fields;
      const copy = [...fields];
      const set = (term: GeoreferenceTerm, value: string) => (copy[column[term]] = value);
      const get = (term: GeoreferenceTerm) => copy[column[term]] ?? '';
      if (hasResolution(review)) {
        // As kept when the reviewer decided; a review file written before terms were kept is georeferenced again.
        const { darwinCore, note } = resolvedTerms.get(index + 1) ?? this.resolvedNow(output, fields, review);
        // A generalised row stays generalised, however the reviewer resolved it: the precise answer is not written.
        const generalisation = output.generalisationOf(fields.slice(0, output.originalLength));
        const generalised = generalisation ? generaliseRecord(darwinCore as Record<GeoreferenceTerm, string>, generalisation) : undefined;
        const recomputed = generalised?.fields ?? (darwinCore as Record<GeoreferenceTerm, string>);
        for (const term of GEOREFERENCE_TERMS) set(term, recomputed[term]);
        if (generalised) GENERALISATION_TERMS.forEach((term, i) => (copy[output.originalLength + GEOREFERENCE_TERMS.length + i] = generalised.terms[term]));
        if (note && !generalised) set('georeferenceRemarks', [get('georeferenceRemarks'), note].filter(Boolean).join('; '));
      }
      if (review.decision === 'accepted' && get('decimalLatitude') === '') {
        // Kept from a review file written before an accept needed a point: nothing to verify.
        set('georeferenceRemarks', [get('georeferenceRemarks'), `accepted by ${review.reviewer} on ${review.decidedAt} without a point, so not verified`].filter(Boolean).join('; '));
        return copy;
      }
      const stamp = `${review.decision === 'accepted' ? 'verified' : 'rejected'} by ${review.reviewer} on ${review.decidedAt}`;
      if (review.decision === 'rejected' && get('decimalLatitude') !== '') {
        const was = `proposed georeference rejected (was ${get('decimalLatitude')}, ${get('decimalLongitude')} ± ${get('coordinateUncertaintyInMeters')} m)`;
        for (const term of ['decimalLatitude', 'decimalLongitude', 'geodeticDatum', 'coordinateUncertaintyInMeters', 'coordinatePrecision', 'footprintWKT', 'footprintSRS'] as const) set(term, '');
        set('georeferenceRemarks', [get('georeferenceRemarks'), was].filter(Boolean).join('; '));
      }
      set('georeferenceVerificationStatus', REVIEWED_STATUS[review.decision]);
      set('georeferenceRemarks', [get('georeferenceRemarks'), stamp].filter(Boolean).join('; '));
      return copy;
    });
    // Original fields go back as the batch wrote them (README, Batches); the appended ones as CSV.
    const { originalLength } = output;
    const delimiter = as ?? output.delimiter;
    const line = (record: InputRecord, fields: string[]) => `${originalLine(record, originalLength, delimiter)}${delimiter}${csvLine(fields.slice(originalLength), delimiter)}\r\n`;
    // a "sep=" line goes back as the batch wrote it, naming the delimiter asked for when it is another
    const declaration = output.declaration && (delimiter === output.delimiter ? output.declaration : `sep=${delimiter}\r\n`);
    const text = [declaration, line(output.header, output.header.fields), ...output.records.map((record, i) => line(record, rows[i]))].join('');
    return { text, delimiter };
  }

  /**
   * The reviewed output as a GeoJSON FeatureCollection or a GeoPackage (src/output), made from
   * `reviewedCsv` in files beside the jobs that are removed once read.
   */
  async reviewedFile(jobId: string, format: 'geojson' | 'gpkg'): Promise<Buffer> {
    const { text, delimiter } = this.reviewedCsv(jobId);
    const stem = join(this.folder, `reviewed-${randomUUID()}`);
    const csvPath = `${stem}.csv`;
    const output = `${stem}.${format}`;
    writeFileSync(csvPath, text);
    try {
      await writeResults({ format, csvPath, delimiter, output, runTimestamp: new Date().toISOString().replace(/\.\d+Z$/, 'Z') });
      return readFileSync(output);
    } finally {
      rmSync(csvPath, { force: true });
      rmSync(output, { force: true });
    }
  }

  /**
   * A job over an uploaded Darwin Core Archive, reviewed: the same new archive the CLI's batch writes
   * (src/batch/archive), its core the reviewed rows. A 404 for a job over a CSV upload.
   */
  async reviewedArchive(jobId: string): Promise<Buffer> {
    const archivePath = this.uploadedArchive(jobId);
    if (!archivePath) throw new RequestError(404, `batch job ${jobId} was a CSV upload: its results come as CSV, GeoJSON or GeoPackage, not as a Darwin Core Archive`, 'jobId');
    const { text } = this.reviewedCsv(jobId);
    const stem = join(this.folder, `reviewed-${randomUUID()}`);
    writeFileSync(`${stem}.core.txt`, text);
    try {
      await writeGeoreferencedArchive({ archivePath, corePath: `${stem}.core.txt`, target: `${stem}.zip`, jobsPath: this.jobsPath, jobId });
      return readFileSync(`${stem}.zip`);
    } finally {
      rmSync(`${stem}.core.txt`, { force: true });
      rmSync(`${stem}.zip`, { force: true });
    }
  }

  /** The upload a job over an archive was started on (its output path begins with the upload's id), or undefined for a CSV upload. */
  private uploadedArchive(jobId: string): string | undefined {
    const { outputPath } = this.ownProgress(jobId);
    if (!outputPath || dirname(outputPath) !== this.folder) return undefined;
    const archive = uploadFiles(this.folder, basename(outputPath).split('.')[0]).archive;
    return existsSync(archive) ? archive : undefined;
  }

  /** An error message with the service's own folders taken out, as an HTTP answer never shows a server path. */
  private withoutPaths(message: string): string {
    return message.replaceAll(this.folder + '/', '').replaceAll(dirname(this.dbPath) + '/', '');
  }

  /**
   * Nothing to wait for on a stop: a job commits each step as it goes (src/batch), so whatever a stop
   * interrupts is resumed by `resumeUnfinished` on the next start.
   */
  runningJobs(): string[] {
    return [...this.running.keys()];
  }

  private ownProgress(jobId: string): JobProgress {
    const progress = this.progressOrUndefined(jobId);
    if (!progress) throw new RequestError(404, `no batch job ${jobId}`, 'jobId');
    return progress;
  }

  private output(jobId: string): ParsedOutput {
    const cached = this.parsed.get(jobId);
    if (cached) return cached;
    const progress = this.ownProgress(jobId);
    if (progress.state !== 'done' || !progress.outputPath) throw new RequestError(409, `batch job ${jobId} is ${progress.state}, not done`, 'jobId');
    if (dirname(progress.outputPath) !== this.folder) throw new RequestError(404, `no batch job ${jobId} was started by this service`, 'jobId');
    // The output keeps the input's delimiter (a semicolon file stays one), and is read by the batch's own reader.
    const delimiter = progress.delimiter as Delimiter;
    // a delimiter declaration ("sep=;") the batch wrote back before the header is kept for the reviewed file
    const text = readFileSync(progress.outputPath, 'utf8');
    const declaration = delimiterDeclarationLine(text)?.line ?? '';
    const [headerRecord, ...records] = parseRecords(text.slice(declaration.length), delimiter);
    const header = headerRecord.fields;
    const rows = records.map((r) => r.fields);
    const originalLength = appendedColumns(header).termsStart;
    const column = termColumns(header);
    const columns = indexColumns(header.slice(0, originalLength));
    const settings = progress.generalise;
    const generalisationOf = settings ? sensitiveGeneralisation(header.slice(0, originalLength), settings) : () => undefined;
    // The locality type as the batch read it, from its stored results: the text is not parsed again.
    const localityTypes = storedLocalityTypes(this.jobsPath, jobId);
    const summaries = rows.map((fields, i): RecordSummary => {
      const group = groupOf(fields.slice(0, originalLength), columns);
      const radius = fields[column.coordinateUncertaintyInMeters];
      return {
        row: i + 1,
        locality: group.request.locality,
        status: fields[column.georeferenceVerificationStatus] ?? '',
        localityType: localityTypes.get(group.key) ?? '',
        radiusMeters: radius ? Number(radius) : null,
        flags: readFlags(fields[header.length - 1]),
        review: null,
      };
    });
    const parsed = { declaration, header: headerRecord, originalLength, generalisationOf, records, delimiter, summaries };
    this.parsed.set(jobId, parsed);
    return parsed;
  }

  /** A resolved row's terms as the gazetteer gives them now, with the reviewer as georeferencedBy. */
  private resolvedNow(output: ParsedOutput, fields: string[], review: Review): ResolvedTerms {
    const { answer, note } = this.lookUpRow(output, fields, review, review);
    return { darwinCore: answer.darwinCore, ...(note ? { note } : {}) };
  }

  private rowOf(output: ParsedOutput, row: number): string[] {
    const record = output.records[row - 1];
    if (!record) throw new RequestError(404, `the batch has no row ${row} (it has ${output.records.length})`, 'row');
    return record.fields;
  }

  /**
   * The row through the front door again, as the API answers it, with a reviewer's resolution applied,
   * and, for the reviewed file, the reviewer as georeferencedBy.
   */
  private lookUpRow(output: ParsedOutput, fields: string[], resolution: Resolution, review?: Review): ResolvedRow {
    const originals = fields.slice(0, output.originalLength);
    const columns = indexColumns(output.header.fields.slice(0, output.originalLength));
    const { request } = groupOf(originals, columns);
    const written = (i?: number) => (i === undefined ? '' : (originals[i] ?? '').trim().replace(',', '.'));
    const coordinate = (i?: number) => (i === undefined ? undefined : decimalNumber(originals[i] ?? ''));
    const latitude = coordinate(columns.decimalLatitude);
    const longitude = coordinate(columns.decimalLongitude);
    const inRange = latitude !== undefined && longitude !== undefined && Math.abs(latitude) <= 90 && Math.abs(longitude) <= 180;
    const notes: string[] = [];
    if (resolution.locality !== undefined) {
      request.locality = normaliseText(resolution.locality);
      notes.push(`locality text corrected by the reviewer to "${request.locality}" (the original column is unchanged)`);
    }
    if (resolution.recordCoordinates) {
      if (!inRange) {
        const what = latitude === undefined || longitude === undefined || Number.isNaN(latitude) || Number.isNaN(longitude) ? 'has no coordinates of its own to accept' : 'has coordinates beyond ±90° latitude or ±180° longitude';
        throw new RequestError(409, `the record ${what} (decimalLatitude "${written(columns.decimalLatitude)}", decimalLongitude "${written(columns.decimalLongitude)}"): choose a candidate or give a corrected locality`, 'recordCoordinates');
      }
      const flags = readFlags(fields[output.header.fields.length - 1]);
      const correction = flags.map((f) => CORRECTIONS[f]).find(Boolean);
      const [lat, lon] = correction ? correction.fix(written(columns.decimalLatitude), written(columns.decimalLongitude)) : [written(columns.decimalLatitude), written(columns.decimalLongitude)];
      // As verbatim coordinates the written decimals keep their precision and the record's datum applies (method §5.3, §5.4).
      request.verbatimCoordinates = `${lat}, ${lon}`;
      notes.push(
        correction
          ? `point from the record's own coordinates (${written(columns.decimalLatitude)}, ${written(columns.decimalLongitude)}) with ${correction.words}, as the coordinate check found (${lat}, ${lon}), accepted by the reviewer`
          : `point from the record's own coordinates (${lat}, ${lon}), accepted by the reviewer`,
      );
    }
    const answer = lookUp(
      this.store,
      {
        ...request,
        ...(inRange ? { decimalLatitude: latitude, decimalLongitude: longitude } : {}),
        ...(review ? { georeferencedBy: review.reviewer } : {}),
        options: resolution.candidate && !resolution.recordCoordinates ? { candidate: resolution.candidate } : {},
      },
      this.results,
      review ? new Date(review.decidedAt) : undefined,
    );
    return { answer, ...(notes.length ? { note: notes.join('; ') } : {}) };
  }
}

function hasResolution(r: Resolution): boolean {
  return r.candidate !== undefined || r.locality !== undefined || r.recordCoordinates === true;
}

/** "-45.3" ⇄ "45.3", keeping every written digit. */
function flipSign(value: string): string {
  return value.startsWith('-') ? value.slice(1) : `-${value.replace(/^\+/, '')}`;
}

function summaryStatus(output: ParsedOutput, row: number): string {
  return output.summaries[row - 1]?.status || 'no georeference';
}

function termColumns(header: string[]): Record<GeoreferenceTerm, number> {
  const originalLength = appendedColumns(header).termsStart;
  return Object.fromEntries(GEOREFERENCE_TERMS.map((term, i) => [term, originalLength + i])) as Record<GeoreferenceTerm, number>;
}

function reviewedStatus(status: string, review: Review | undefined): string {
  return review ? REVIEWED_STATUS[review.decision] : status;
}

function matches(r: RecordSummary, f: RecordFilter): boolean {
  if (f.status && r.status !== f.status) return false;
  if (f.review && (f.review === 'pending' ? r.review !== null : r.review !== f.review)) return false;
  if (f.flag && !r.flags.includes(f.flag)) return false;
  if (f.localityType && r.localityType !== f.localityType) return false;
  if (f.radiusMin !== undefined && (r.radiusMeters === null || r.radiusMeters < f.radiusMin)) return false;
  if (f.radiusMax !== undefined && (r.radiusMeters === null || r.radiusMeters > f.radiusMax)) return false;
  return true;
}

/**
 * A generalised row's answer for the review page: the point, radius and footprint of its cell and the
 * generalised Darwin Core fields, never the precise ones; the candidates, the features used, the
 * plausibility flags and the distance to the record's own coordinates are left out, as each would place the
 * record precisely (its georeferenceSources and remarks are withheld the same way).
 */
function generalisedAnswer(body: AnswerBody, generalisation: Generalisation): AnswerBody {
  const { georeference, footprint: _footprint, footprintSummary: _summary, recordPoint: _recordPoint, flags: _flags, ...rest } = body;
  const generalised = generaliseRecord(body.darwinCore, generalisation);
  const answer: AnswerBody = { ...rest, candidates: [], darwinCore: generalised.fields };
  if (!georeference || generalised.terms.dataGeneralizations === '') return { ...answer, georeference: undefined };
  const radius = Number(generalised.fields.coordinateUncertaintyInMeters);
  // The whole radius is the cell's (with the original radius inside it): one term, as the remarks say.
  const components = { extent: radius, offset: 0, coordinatePrecision: 0, datum: 0, mapScale: 0, measurement: 0 };
  answer.georeference = {
    latitude: Number(generalised.fields.decimalLatitude),
    longitude: Number(generalised.fields.decimalLongitude),
    uncertaintyMeters: radius,
    components,
    footprintWKT: generalised.fields.footprintWKT,
    features: [],
    remarks: [generalised.fields.georeferenceRemarks, generalised.terms.dataGeneralizations, generalised.terms.informationWithheld],
  };
  answer.components = components;
  answer.footprint = footprintGeometry(generalised.fields.footprintWKT);
  if (answer.footprint) answer.footprintSummary = footprintSummary(answer.footprint);
  return answer;
}
