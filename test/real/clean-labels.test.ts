/**
 * Clean labels against an outside truth: 432 labels (48 of each form, 12 of each form in each of the four
 * languages) written for true points drawn first, run through the front door `georeferenceRecord` against
 * the demo gazetteer (gazetteer/demo.geojson, CC0) imported into a real SQLite file. How the labels and
 * their true points are made, and what answered, covered and false mean: test/real/clean-labels.ts.
 * Method: Wieczorek, Guo & Hijmans 2004 and Chapman & Wieczorek 2020 (the point-radius circle must contain
 * where the specimen was taken). Target (issue 11): answered ≥ 92 % of the labels that can be georeferenced,
 * false ≤ 0.3 %. Both are reached and asserted (distances written with the precision they state; the 5 km
 * steps people also write are a sensitivity run of bench/clean-labels.ts, not asserted).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDemoStore } from '../support/demo-store.ts';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { cleanRatesOf, FORMS, generateCleanLabels, measureCleanLabel, type CleanOutcome } from './clean-labels.ts';

/** Issue 11 target for false georeferences, percent of all labels; this sample reaches 0 of 432. */
const FALSE_PERCENT_TARGET = 0.3;

let store: GazetteerStore;
let outcomes: CleanOutcome[];
const ofForm = (form: string) => cleanRatesOf(outcomes.filter((o) => o.label.form === form));

beforeAll(async () => {
  store = await openDemoStore('whereabouts-clean-labels-');
  outcomes = generateCleanLabels(FORMS.length * 48, 7).map((label) => measureCleanLabel(store, label));
  console.log(`clean labels: ${JSON.stringify(cleanRatesOf(outcomes))}`);
  for (const form of FORMS) console.log(`  ${form}: ${JSON.stringify(ofForm(form))}`);
}, 120_000);
afterAll(() => store.close());

describe('clean labels of every form in four languages, judged against their true points', () => {
  it('makes 12 labels of each form in each language, the same on every run', () => {
    for (const form of FORMS) for (const language of ['en', 'es', 'pt', 'fr']) {
      expect(outcomes.filter((o) => o.label.form === form && o.label.language === language)).toHaveLength(12);
    }
    expect(generateCleanLabels(FORMS.length, 7).map((l) => l.locality)).toEqual(outcomes.slice(0, FORMS.length).map((o) => o.label.locality));
  });

  it('answers at least 92 % of the labels that can be georeferenced (issue 11 target: reached)', () => {
    expect(cleanRatesOf(outcomes).answeredPercent).toBeGreaterThanOrEqual(92);
  });

  // Issue 11 target: ≤ 0.3 % false. The benchmark's 4,500 labels give 0.16 % (7 "between" labels whose
  // second place has a namesake or a near spelling; docs/real-records.md, "On clean labels").
  it('keeps false georeferences at or below 0.3 % (issue 11 target: reached)', () => {
    expect(cleanRatesOf(outcomes).falsePercent).toBeLessThanOrEqual(FALSE_PERCENT_TARGET);
  });

  it('never answers a label whose place the gazetteer lacks', () => {
    expect(ofForm('unknown-place').answered).toBe(0);
  });

  it('answers and covers every bare town name and every written coordinate', () => {
    for (const form of ['named-place', 'coordinates']) {
      const rates = ofForm(form);
      expect(rates.answered, form).toBe(rates.georeferenceable);
      expect(rates.covered, form).toBe(rates.georeferenceable);
    }
  });
});
