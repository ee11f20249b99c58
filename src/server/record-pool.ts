/**
 * Worker threads that georeference the service's records, so that lookups run on the other cores while
 * the main thread keeps fastify, validation, the result cache and reviews. Each worker runs the same
 * front door (`georeferenceRecord`) on its own read-only connection to the gazetteer.
 */
import Tinypool from 'tinypool';
import { EditRefused } from '../locate/edits.ts';
import { georeferenceRecord, recordMemoKey, type RecordAnswer, type RecordRequest } from '../locate/georeference-record.ts';
import type { LocateResult } from '../locate/locate.ts';
import type { RecordTask, RecordTaskAnswer } from '../batch/record-task.ts';
import type { ResultCache } from './result-cache.ts';
import type { ServedGazetteer } from './lookup.ts';

/**
 * The module a worker loads: compiled (dist/), the task module itself; from the TypeScript sources, the
 * batch's worker.js, which registers tsx first (worker threads do not inherit the main thread's loader).
 */
const WORKER_ENTRY = import.meta.url.endsWith('.ts')
  ? new URL('../batch/worker.js', import.meta.url).href
  : new URL('../batch/record-task.js', import.meta.url).href;

/** Georeferences records in worker threads; `close` when the service stops. */
export class RecordPool {
  private readonly pool: Tinypool;

  /** `threads` workers, each opening `dbPath` read-only on its first record. */
  constructor(private readonly dbPath: string, readonly threads: number) {
    this.pool = new Tinypool({ filename: WORKER_ENTRY, name: 'answerRecord', minThreads: threads, maxThreads: threads });
  }

  /**
   * The record's answer, as `georeferenceRecord(store, request, cache)` gives it: a result the cache
   * holds is reused here (only its Darwin Core terms are written anew); any other is computed in a worker,
   * on the sources loaded then, and kept in the cache under them. An edit that does not fit the record throws `EditRefused`, as in the main thread.
   * @example await pool.answer(store, { locality: 'Alba', attribution }, cache)
   */
  async answer(store: ServedGazetteer, request: RecordRequest, cache?: ResultCache<LocateResult>): Promise<RecordAnswer> {
    if (cache?.has(recordMemoKey(request))) return georeferenceRecord(store, request, (k, compute) => cache.get(k, compute));
    const task: RecordTask = { dbPath: this.dbPath, request };
    const reply = (await this.pool.run(task)) as RecordTaskAnswer;
    if ('refused' in reply) throw new EditRefused(reply.refused);
    // Kept under the sources the worker found it in, which another process may have changed since `request` was made.
    cache?.get(reply.memoKey, () => reply.answer.result);
    return reply.answer;
  }

  /** Stops the workers once the records they hold are answered. */
  async close(): Promise<void> {
    await this.pool.destroy();
  }
}
