/**
 * Review decisions on batch records, in a SQLite file of their own beside the gazetteer
 * (`<gazetteer>.reviews.sqlite`, WAL): every decision is kept with who made it and when; the
 * latest one for a row is the one that counts. The ids of the jobs the service started are kept
 * too, to resume them after a stop. Prepared statements only.
 */
import Database from 'better-sqlite3';
import type { FeatureKey } from '../match/types.ts';
export type ReviewDecision = 'accepted' | 'rejected';

/**
 * How a reviewer gave a record its point: another candidate, a corrected locality text (georeferenced
 * through the same lookup, its candidate chosen too if it is ambiguous), or the record's own coordinates.
 */
export interface Resolution {
  /** The candidate the reviewer chose instead of the matcher's, if any. */
  candidate?: FeatureKey;
  /** The locality text as the reviewer corrected it; the original column is never changed. */
  locality?: string;
  /** The record's own decimalLatitude/decimalLongitude, with a sign or order error corrected when the coordinate check found one. */
  recordCoordinates?: boolean;
}

export interface Review extends Resolution {
  decision: ReviewDecision;
  reviewer: string;
  /** ISO 8601 date-time of the decision. */
  decidedAt: string;
}

/**
 * What a resolution gave the record when the reviewer decided: its Darwin Core terms and what the
 * resolution did, in words. Kept so that the reviewed file writes what was verified, whatever the
 * gazetteer holds by the time it is downloaded.
 */
export interface ResolvedTerms {
  darwinCore: Record<string, string>;
  note?: string;
}

export interface ReviewStore {
  /** Remembers a batch job this service started, so that it can be resumed after a stop. */
  addJob(jobId: string): void;
  /** The jobs this service started, oldest first. */
  jobs(): string[];
  record(jobId: string, row: number, review: Review, resolved?: ResolvedTerms): void;
  /** The latest decision for each reviewed row of a job. */
  latest(jobId: string): Map<number, Review>;
  /** The terms the latest decision's resolution gave, for each row whose latest decision kept them. */
  resolved(jobId: string): Map<number, ResolvedTerms>;
  close(): void;
}

/** Opens (creating) the review store. */
export function openReviews(path: string): ReviewStore {
  const db = new Database(path);
  db.pragma('journal_mode = WAL');
  db.exec(`CREATE TABLE IF NOT EXISTS review_decision (
    id INTEGER PRIMARY KEY, job_id TEXT NOT NULL, row INTEGER NOT NULL, decision TEXT NOT NULL,
    candidate_source TEXT, candidate_feature TEXT, reviewer TEXT NOT NULL, decided_at TEXT NOT NULL);
    CREATE INDEX IF NOT EXISTS review_by_job ON review_decision (job_id, row, id);
    CREATE TABLE IF NOT EXISTS served_job (job_id TEXT PRIMARY KEY, started_at TEXT NOT NULL);`);
  // Review files written before a decision could carry a corrected locality or the record's own coordinates.
  const columns = new Set((db.pragma('table_info(review_decision)') as { name: string }[]).map((c) => c.name));
  if (!columns.has('corrected_locality')) db.exec('ALTER TABLE review_decision ADD COLUMN corrected_locality TEXT');
  if (!columns.has('record_coordinates')) db.exec('ALTER TABLE review_decision ADD COLUMN record_coordinates INTEGER NOT NULL DEFAULT 0');
  if (!columns.has('resolved_terms')) db.exec('ALTER TABLE review_decision ADD COLUMN resolved_terms TEXT');
  const insertJob = db.prepare('INSERT OR IGNORE INTO served_job (job_id, started_at) VALUES (?, ?)');
  const selectJobs = db.prepare('SELECT job_id FROM served_job ORDER BY started_at, job_id');
  const insert = db.prepare(
    'INSERT INTO review_decision (job_id, row, decision, candidate_source, candidate_feature, corrected_locality, record_coordinates, reviewer, decided_at, resolved_terms) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)',
  );
  const selectResolved = db.prepare('SELECT row, resolved_terms FROM review_decision WHERE job_id = ? ORDER BY id');
  const select = db.prepare('SELECT row, decision, candidate_source, candidate_feature, corrected_locality, record_coordinates, reviewer, decided_at FROM review_decision WHERE job_id = ? ORDER BY id');
  return {
    addJob: (jobId) => void insertJob.run(jobId, new Date().toISOString()),
    jobs: () => (selectJobs.all() as { job_id: string }[]).map((r) => r.job_id),
    record(jobId, row, r, resolved) {
      insert.run(jobId, row, r.decision, r.candidate?.sourceId ?? null, r.candidate?.featureId ?? null, r.locality ?? null, r.recordCoordinates ? 1 : 0, r.reviewer, r.decidedAt, resolved ? JSON.stringify(resolved) : null);
    },
    resolved(jobId) {
      const terms = new Map<number, ResolvedTerms>();
      for (const r of selectResolved.all(jobId) as { row: number; resolved_terms: string | null }[]) {
        if (r.resolved_terms === null) terms.delete(r.row);
        else terms.set(r.row, JSON.parse(r.resolved_terms) as ResolvedTerms);
      }
      return terms;
    },
    latest(jobId) {
      const reviews = new Map<number, Review>();
      for (const r of select.all(jobId) as ReviewRow[]) {
        const candidate = r.candidate_source !== null && r.candidate_feature !== null ? { sourceId: r.candidate_source, featureId: r.candidate_feature } : undefined;
        const review: Review = { decision: r.decision, candidate, reviewer: r.reviewer, decidedAt: r.decided_at };
        if (r.corrected_locality !== null) review.locality = r.corrected_locality;
        if (r.record_coordinates) review.recordCoordinates = true;
        reviews.set(r.row, review);
      }
      return reviews;
    },
    close: () => db.close(),
  };
}

interface ReviewRow {
  row: number;
  decision: ReviewDecision;
  candidate_source: string | null;
  candidate_feature: string | null;
  corrected_locality: string | null;
  record_coordinates: number;
  reviewer: string;
  decided_at: string;
}
