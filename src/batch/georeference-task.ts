/**
 * The work a batch worker thread does: georeference a chunk of distinct localities against the
 * gazetteer, which each worker opens read-only once and keeps open.
 */
import { openGazetteer, type OpenOptions } from '../store/gazetteer-store.ts';
import type { LocateRequest } from '../locate/locate.ts';
import { renderGroup, type Delimiter, type RenderedGroup } from '../output/csv.ts';
import type { RecordContext } from '../record/darwin-core.ts';
import { georeferenceGroup, type BatchSettings } from './georeference-group.ts';

/**
 * How batch threads open the gazetteer: read-only, no memory map and a 16 MiB page cache, so that two
 * connections (main thread and worker) keep a batch under its memory budget [measured with bench:batch].
 */
export const BATCH_STORE_OPTIONS: OpenOptions = { readonly: true, memoryMap: false, cacheKiB: 16_384 };

export interface GeoreferenceTask {
  dbPath: string;
  groups: { id: number; request: LocateRequest }[];
  settings: BatchSettings;
  context: RecordContext;
  /** The output's delimiter, for the rendered fields. */
  delimiter: Delimiter;
}

let opened: { dbPath: string; store: ReturnType<typeof openGazetteer> } | undefined;

/**
 * Georeference every group of the task, in order, each rendered for the writer.
 * @example georeferenceChunk({ dbPath: 'g.sqlite', groups: [{ id: 1, request: { locality: 'Alba' } }], settings, context, delimiter: ',' })
 */
export default function georeferenceChunk(task: GeoreferenceTask): { id: number; result: RenderedGroup }[] {
  if (opened?.dbPath !== task.dbPath) {
    opened?.store.close();
    opened = { dbPath: task.dbPath, store: openGazetteer(task.dbPath, BATCH_STORE_OPTIONS) };
  }
  const store = opened.store;
  return task.groups.map(({ id, request }) => {
    const group = georeferenceGroup(store, request, task.settings, task.context);
    return { id, result: renderGroup(group, task.delimiter, group.localityType) };
  });
}

/** Close the gazetteer this thread opened (the main thread, after doing a small batch itself). */
export function closeGazetteerOfThread(): void {
  opened?.store.close();
  opened = undefined;
}
