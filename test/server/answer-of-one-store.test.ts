/**
 * The service's result cache keeps a result under the loaded sources it read (ids, content hashes,
 * ranks). Another process may change the store between that read and the lookup's reads: the result
 * must then be the one of the sources in its key, or a later request with those sources (the rank set
 * back, say) gets another store's answer. Real SQLite file, the demo gazetteer loaded twice (the same
 * places in two sources, cited from the one ranked first, docs/method.md §4a); the change is made on a
 * second connection during the first lookup, as another process would make it; for a worker thread's
 * record, between the main thread's read of the sources and the worker's answer.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { answerRecord } from '../../src/batch/record-task.ts';
import { closeGazetteerOfThread } from '../../src/batch/georeference-task.ts';
import { georeferenceRecord, recordMemoKey } from '../../src/locate/georeference-record.ts';
import type { LocateResult } from '../../src/locate/locate.ts';
import { lookUp } from '../../src/server/lookup.ts';
import { ResultCache } from '../../src/server/result-cache.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { demoDatabase, withDemoCopy, type TempDatabase } from './helpers.ts';

let db: TempDatabase;
let served: GazetteerStore;
let other: GazetteerStore;
beforeAll(async () => {
  db = await demoDatabase();
  other = await withDemoCopy(db);
  served = openGazetteer(db.dbPath, { readonly: true });
});
afterAll(() => {
  served?.close();
  other?.close();
  db?.remove();
});

/** The served store, whose first candidate lookup lets `change` run first on the other connection. */
function changingDuringLookup(store: GazetteerStore, change: () => void): GazetteerStore {
  let changed = false;
  const once = () => {
    if (!changed) change();
    changed = true;
  };
  return new Proxy(store, {
    get(target, property) {
      const value = Reflect.get(target, property, target);
      if (typeof value !== 'function') return value;
      if (property === 'findCandidates' || property === 'lookupCandidates') return (...args: unknown[]) => (once(), value.apply(target, args));
      return value.bind(target);
    },
  });
}

describe('a lookup while another process ranks a source anew', () => {
  it('answers from the sources it names, and the cache keeps that answer under them', () => {
    const request = { locality: 'Puerto Lindo', countryCode: 'QV' };
    const unranked = lookUp(served, request).result;
    const citedFrom = (result: LocateResult) => result.georeference?.features.map((f) => f.sourceId);
    expect(citedFrom(unranked)).toEqual(['demo']);

    const cache = new ResultCache<LocateResult>(10);
    const during = lookUp(changingDuringLookup(served, () => other.setPriority('copy', 1)), request, cache);
    // The answer's sources were read at its start (none ranked): its result is that store's, cited from demo.
    expect(citedFrom(during.result)).toEqual(['demo']);
    expect(during.result).toEqual(unranked);

    other.setPriority('copy', null);
    expect(lookUp(served, request, cache).result).toEqual(unranked);
  });
});

describe('a record answered by a worker thread after another process ranked a source anew', () => {
  it('names the sources it was found in, in its terms and in the key the service keeps it under', () => {
    const attribution = { georeferencedBy: 'test', georeferencedDate: '2026-01-01T00:00:00Z', sources: served.sources() };
    const request = { locality: 'Puerto Lindo', countryCode: 'QV', attribution };
    // What the main thread read (none ranked); the worker runs once the rank has changed.
    other.setPriority('copy', 1);
    try {
      const reply = answerRecord({ dbPath: db.dbPath, request });
      if (!('answer' in reply)) throw new Error('the record was refused');
      const now = { ...attribution, sources: served.sources() };
      expect(reply.answer.result.georeference?.features.map((f) => f.sourceId)).toEqual(['copy']);
      expect(reply.memoKey).toBe(recordMemoKey({ ...request, attribution: now }));
      expect(reply.memoKey).not.toBe(recordMemoKey(request));
      expect(reply.answer.darwinCore).toEqual(georeferenceRecord(served, { ...request, attribution: now }).darwinCore);
    } finally {
      other.setPriority('copy', null);
      closeGazetteerOfThread();
    }
  });
});
