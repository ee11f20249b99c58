/**
 * Clean labels against an outside truth: 432 labels (48 of each form, 12 of each form in each of the four
 * languages) written for true points drawn first, run through the front door `georeferenceRecord` against
 * the demo gazetteer (gazetteer/demo.geojson, CC0) imported into a real SQLite file. How the labels and
 * their true points are made, and what answered, covered and false mean: test/real/clean-labels.ts.
 * Method: Wieczorek, Guo & Hijmans 2004 and Chapman & Wieczorek 2020 (the point-radius circle must contain
 * where the specimen was taken). Target (issue 11): answered ≥ 92 % of the labels that can be georeferenced,
 * false ≤ 0.3 %. The test asserts the levels reached; where a target is missed it says so.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDemoStore } from '../support/demo-store.ts';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { cleanRatesOf, FORMS, generateCleanLabels, measureCleanLabel, type CleanOutcome } from './clean-labels.ts';

/** The false rate this sample reached (percent of all its labels), rounded up; lower it as causes are fixed. */
const FALSE_PERCENT_REACHED = 1.7; // 7 of 432 labels on this sample

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

  // Issue 11 target: ≤ 0.3 % false. MISSED: see README "On clean labels" for the causes (namesakes chosen by
  // the record's county, a near name in the county preferred to the exact name outside it, "near" wider than
  // the [CHOICE] allows for small towns, distances rounded to 5 km against the integer precision rule).
  it('keeps false georeferences at the level reached (target ≤ 0.3 % missed)', () => {
    expect(cleanRatesOf(outcomes).falsePercent).toBeLessThanOrEqual(FALSE_PERCENT_REACHED);
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
