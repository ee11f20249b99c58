/**
 * The work a worker thread of the HTTP service does: one record through the front door
 * (`georeferenceRecord`) against the gazetteer, which each worker opens read-only once and keeps open.
 * SQLite shows each connection what other connections commit, so a gazetteer imported while serving is
 * seen here too. It sits beside the batch's worker task because worker threads are this folder's; the
 * service's record pool (src/server/record-pool.ts) loads it.
 */
import { gazetteerOfThread } from './georeference-task.ts';
import { EditRefused, type EditProblem } from '../locate/edits.ts';
import { georeferenceRecord, recordMemoKey, type RecordAnswer, type RecordRequest } from '../locate/georeference-record.ts';

export interface RecordTask {
  dbPath: string;
  request: RecordRequest;
}

/**
 * The answer and the key its result is kept under in the service's cache (`recordMemoKey`), or the
 * edit the record refused (a thrown error loses its class between threads).
 */
export type RecordTaskAnswer = { answer: RecordAnswer; memoKey: string } | { refused: EditProblem };

/**
 * Georeference one record in this thread, against the store as of one moment. The loaded sources are
 * read here, in that moment, not taken from the request: another process may have changed them since
 * the main thread read them, and the answer's terms and cache key must name the sources it was found in.
 * @example answerRecord({ dbPath: 'g.sqlite', request: { locality: 'Alba', attribution } }) // { answer: { result, darwinCore, centers }, memoKey }
 */
export function answerRecord(task: RecordTask): RecordTaskAnswer {
  // The service's own reading settings (memory map, default page cache): the service is not under the batch's memory budget.
  const store = gazetteerOfThread(task.dbPath, { readonly: true });
  return store.asOfOneMoment(() => {
    const request = { ...task.request, attribution: { ...task.request.attribution, sources: store.sources() } };
    try {
      return { answer: georeferenceRecord(store, request), memoKey: recordMemoKey(request) };
    } catch (error) {
      if (error instanceof EditRefused) return { refused: error.problem };
      throw error;
    }
  });
}
