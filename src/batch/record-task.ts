/**
 * The work a worker thread of the HTTP service does: one record through the front door
 * (`georeferenceRecord`) against the gazetteer, which each worker opens read-only once and keeps open.
 * SQLite shows each connection what other connections commit, so a gazetteer imported while serving is
 * seen here too. It sits beside the batch's worker task because worker threads are this folder's; the
 * service's record pool (src/server/record-pool.ts) loads it.
 */
import { gazetteerOfThread } from './georeference-task.ts';
import { EditRefused, type EditProblem } from '../locate/edits.ts';
import { georeferenceRecord, type RecordAnswer, type RecordRequest } from '../locate/georeference-record.ts';

export interface RecordTask {
  dbPath: string;
  request: RecordRequest;
}

/** The answer, or the edit the record refused (a thrown error loses its class between threads). */
export type RecordTaskAnswer = { answer: RecordAnswer } | { refused: EditProblem };

/**
 * Georeference one record in this thread.
 * @example answerRecord({ dbPath: 'g.sqlite', request: { locality: 'Alba', attribution } }) // { answer: { result, darwinCore, centers } }
 */
export function answerRecord(task: RecordTask): RecordTaskAnswer {
  // The service's own reading settings (memory map, default page cache): the service is not under the batch's memory budget.
  const store = gazetteerOfThread(task.dbPath, { readonly: true });
  try {
    return { answer: georeferenceRecord(store, task.request) };
  } catch (error) {
    if (error instanceof EditRefused) return { refused: error.problem };
    throw error;
  }
}
