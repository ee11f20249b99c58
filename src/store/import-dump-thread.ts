/**
 * The reading thread of a dump import (started by `checkedDumpRows`, import-dump.ts): reads the file,
 * checks each row and works out its index terms, and posts them in packed batches, never more than
 * BATCHES_AHEAD ahead of the writing thread.
 */
import { parentPort, workerData } from 'node:worker_threads';
import {
  BATCHES_AHEAD, checkRow, openDumpText, packRows, readDump, THREAD_READ_BYTES, type DumpThreadData, type DumpThreadMessage,
} from './import-dump.ts';

const port = parentPort!;
const { filePath, zipped, format, adminNames, radii, taken } = workerData as DumpThreadData;
const post = (message: DumpThreadMessage, transfer: ArrayBuffer[] = []) => port.postMessage(message, transfer);
const sentWords = new Set<string>();
let posted = 0;
try {
  for await (const batch of readDump(await openDumpText(filePath, zipped, format, THREAD_READ_BYTES), adminNames)) {
    const rows = packRows(batch.map((read) => checkRow(read, radii)), sentWords);
    // This thread has nothing else to do meanwhile: it blocks until the writing thread takes a batch.
    for (let seen = Atomics.load(taken, 0); posted - seen >= BATCHES_AHEAD; seen = Atomics.load(taken, 0)) Atomics.wait(taken, 0, seen);
    post({ rows }, [rows.counts.buffer, rows.numbers.buffer, rows.deletionKeys.buffer] as ArrayBuffer[]);
    posted++;
  }
  post({ done: true });
} catch (error) {
  post({ error: (error as Error).message });
}
