/**
 * The names thread of an import (started by `ScratchNames`, scratch-names.ts): sorts the staged names
 * of the scratch file into its names table, while the importing thread writes the other indexes, then
 * says it is done (or why it failed) through the shared state and its port.
 */
import { workerData } from 'node:worker_threads';
import Database from 'better-sqlite3';
import { NAMES_THREAD_DONE, NAMES_THREAD_FAILED, sortStagedNames, type NamesThreadData } from './scratch-names.ts';

const { scratchPath, createSql, state, port } = workerData as NamesThreadData;
try {
  const db = new Database(scratchPath);
  sortStagedNames(db, createSql);
  db.close();
  Atomics.store(state, 0, NAMES_THREAD_DONE);
} catch (error) {
  port.postMessage((error as Error).message);
  Atomics.store(state, 0, NAMES_THREAD_FAILED);
} finally {
  Atomics.notify(state, 0);
  port.close();
}
