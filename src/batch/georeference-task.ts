/**
 * The work a batch worker thread does: georeference a chunk of distinct localities against the
 * gazetteer, which each worker opens read-only once and keeps open.
 */
import { openGazetteer, type GazetteerStore, type OpenOptions } from '../store/gazetteer-store.ts';
import { sameSources } from '../store/jobs.ts';
import type { LocateRequest } from '../locate/locate.ts';
import { renderGroup, type Delimiter, type RenderedGroup } from '../output/csv.ts';
import type { RecordContext } from '../record/darwin-core.ts';
import { georeferenceGroup, type BatchSettings } from './georeference-group.ts';

/**
 * How batch threads open the gazetteer: read-only, no memory map and a 16 MiB page cache, so that two
 * connections (main thread and worker) keep a batch under its memory budget [measured with bench:batch];
 * query words' neighbours kept up to 8 MiB a connection (about 80,000 neighbours: a batch's recurring
 * words, whose count was bounded before but not their bytes).
 */
export const BATCH_STORE_OPTIONS: OpenOptions = { readonly: true, memoryMap: false, cacheKiB: 16_384, wordCacheKiB: 8192 };

export interface GeoreferenceTask {
  dbPath: string;
  groups: { id: number; request: LocateRequest }[];
  settings: BatchSettings;
  context: RecordContext;
  /** The output's delimiter, for the rendered fields. */
  delimiter: Delimiter;
}

let opened: { dbPath: string; store: GazetteerStore } | undefined;

/**
 * The gazetteer this thread keeps open (read-only) for its tasks: opened on the first task, again when
 * a task names another file. Shared by the batch's and the service's worker tasks.
 * @example gazetteerOfThread('g.sqlite', BATCH_STORE_OPTIONS).sources()
 */
export function gazetteerOfThread(dbPath: string, options: OpenOptions): GazetteerStore {
  if (opened?.dbPath !== dbPath) {
    opened?.store.close();
    opened = { dbPath, store: openGazetteer(dbPath, options) };
  }
  return opened.store;
}

/**
 * Georeference every group of the task, in order, each rendered for the writer, against the store as of
 * one moment. A job's rows cite the sources it started with (`task.context`): when the store holds
 * others by now (another process imported, replaced, removed or ranked a source), the chunk throws,
 * and the job fails saying so, rather than write answers of another gazetteer under those sources.
 * @example georeferenceChunk({ dbPath: 'g.sqlite', groups: [{ id: 1, request: { locality: 'Alba' } }], settings, context, delimiter: ',' })
 */
export default function georeferenceChunk(task: GeoreferenceTask): { id: number; result: RenderedGroup }[] {
  const store = gazetteerOfThread(task.dbPath, BATCH_STORE_OPTIONS);
  return store.asOfOneMoment(() => {
    if (!sameSources(store.sources(), task.context.sources)) {
      throw new Error('the gazetteer changed while the job ran (a source imported, replaced, removed or ranked anew), so its rows would mix the answers of two gazetteers; start a new batch');
    }
    return task.groups.map(({ id, request }) => {
      const group = georeferenceGroup(store, request, task.settings, task.context);
      return { id, result: renderGroup(group, task.delimiter, group.localityType) };
    });
  });
}

/** Close the gazetteer this thread opened (the main thread, after doing a small batch itself). */
export function closeGazetteerOfThread(): void {
  opened?.store.close();
  opened = undefined;
}
