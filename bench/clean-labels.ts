/**
 * Clean-label benchmark: specimen labels of every locality form in English, Spanish, Portuguese and
 * French, each written for a true point drawn first (test/real/clean-labels.ts says how, and defines
 * answered, covered and false), run through `georeferenceRecord` against the demo gazetteer imported into
 * a real SQLite file. Prints answered %, false % and covered % overall, by form, by language and by form
 * and language, with the machine's load; then, as a sensitivity run (not asserted anywhere), the same
 * labels with distances of 20 km and more written in 5 km steps as people often write them, which the
 * published method reads as precise to 1 km. Run: `npm run bench:clean`.
 * BENCH_CLEAN_COUNT sets the number of labels (default 4,500); BENCH_CLEAN_LIST=1 lists every false
 * georeference and every label that can be georeferenced but was not answered.
 */
import { machineLoad } from './machine-load.ts';
import { performance } from 'node:perf_hooks';
import { openDemoStore } from '../test/support/demo-store.ts';
import { groupRates } from '../test/real/harness.ts';
import { cleanRatesOf, generateCleanLabels, measureCleanLabel, type CleanOutcome, type CleanRates, type Rounding } from '../test/real/clean-labels.ts';

const COUNT = Number(process.env.BENCH_CLEAN_COUNT ?? 4500);
const SEED = 20261202;

const header = `${'group'.padEnd(34)} ${'labels'.padStart(6)} ${'can'.padStart(5)} ${'answered%'.padStart(9)} ${'false%'.padStart(7)} ${'covered%'.padStart(9)}`;
const row = (label: string, r: CleanRates) =>
  `${label.padEnd(34)} ${String(r.labels).padStart(6)} ${String(r.georeferenceable).padStart(5)} ${r.answeredPercent.toFixed(1).padStart(9)} ${r.falsePercent.toFixed(2).padStart(7)} ${r.coveredPercentOfAnswered.toFixed(1).padStart(9)}`;

const store = await openDemoStore('whereabouts-bench-clean-');
console.log(`load at start: ${machineLoad()}`);

function run(rounding: Rounding): CleanOutcome[] {
  const labels = generateCleanLabels(COUNT, SEED, rounding);
  const started = performance.now();
  const outcomes = labels.map((label) => measureCleanLabel(store, label));
  const seconds = (performance.now() - started) / 1000;
  console.log(`== distances rounded ${rounding}: ${labels.length} labels, ${(labels.length / seconds).toFixed(0)} labels/s`);
  console.log(header);
  console.log(row('all', cleanRatesOf(outcomes)));
  return outcomes;
}

const outcomes = run('as stated');
console.log('-- by form');
for (const [k, r] of groupRates(outcomes, (o) => o.label.form, cleanRatesOf)) console.log(row(k, r));
console.log('-- by language');
for (const [k, r] of groupRates(outcomes, (o) => o.label.language, cleanRatesOf)) console.log(row(k, r));
console.log('-- by form and language');
for (const [k, r] of groupRates(outcomes, (o) => `${o.label.form} ${o.label.language}`, cleanRatesOf).sort((a, b) => a[0].localeCompare(b[0]))) console.log(row(k, r));
console.log('-- written coordinates by how they are written');
for (const [k, r] of groupRates(outcomes.filter((o) => o.label.form === 'coordinates'), (o) => o.label.variant, cleanRatesOf).sort((a, b) => a[0].localeCompare(b[0]))) console.log(row(k, r));
console.log('-- by status');
for (const [k, r] of groupRates(outcomes, (o) => o.result.status, cleanRatesOf)) console.log(`${k.padEnd(34)} ${String(r.labels).padStart(6)}`);

if (process.env.BENCH_CLEAN_LIST) {
  for (const o of outcomes) {
    if (o.falseGeoreference) {
      const g = o.result.georeference!;
      console.log(`FALSE ${o.label.form} ${o.label.language} "${o.label.locality}" [${o.label.county}] -> r ${(g.uncertaintyMeters / 1000).toFixed(2)} km, off ${((o.errorMeters ?? 0) / 1000).toFixed(2)} km (${g.features.map((f) => f.name).join(', ')})`);
    } else if (o.label.georeferenceable && !o.answered) {
      console.log(`UNANSWERED ${o.label.form} ${o.label.language} "${o.label.locality}" [${o.label.county}] ${o.result.status}: ${o.result.reason ?? ''}`);
    }
  }
}

const fiveKmSteps = run('5 km steps');
console.log('-- by form');
for (const [k, r] of groupRates(fiveKmSteps, (o) => o.label.form, cleanRatesOf)) console.log(row(k, r));
store.close();
console.log(`uptime: load ${machineLoad()}`);
