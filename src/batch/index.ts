/**
 * The batch API for the CLI and the HTTP service: start or resume a job, and read its progress.
 * @example
 *   const { jobId, done } = await startBatchJob({ dbPath, input: uploadBytes, output: '/srv/out/records.csv' });
 *   jobProgress(jobsDatabasePath(dbPath), jobId).rowsDone;
 */
export { startBatchJob, type BatchJobOptions, type BatchProgressEvent, type BatchSummary } from './run.ts';
export { failJob, jobProgress, storedLocalityTypes, type JobProgress, type JobState } from '../store/jobs.ts';
export { jobsDatabasePath } from '../store/side-files.ts';
export { COORDINATE_FLAGS, type CoordinateFlag } from '../record/coordinate-check.ts';
export { COORDINATE_FLAGS_COLUMN } from '../output/csv.ts';
