/**
 * Gazetteer benchmark: generates a seeded synthetic gazetteer (BENCH_NAMES names, default 1,000,000)
 * in the world-gazetteer dump layout (the layout world-scale gazetteers come in), imports it, and prints import rows/s, bytes per name on disk, peak RSS,
 * lookup median/p99 for names with one and two typing errors, the share of queries whose intended name
 * is among the first five candidates, and fuse.js over the whole list on a few queries (BENCH_FUSE_QUERIES,
 * default 3) with the speed ratio. Run: `npm run bench:gazetteer` (BENCH_NAMES=100000 for a quick run).
 * BENCH_SIDE_FILES=1 also imports the dump as distributed: zipped (Debian's Info-ZIP `zip`), with an
 * alternate-names file of one name for every other feature, and prints that import's rows/s.
 */
import { execFileSync } from 'node:child_process';
import { createReadStream, createWriteStream, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import Fuse from 'fuse.js';
import { foldName } from '../src/match/fold.ts';
import { importGazetteer } from '../src/store/import.ts';
import { openGazetteer } from '../src/store/gazetteer-store.ts';
import { seededRandom } from './seeded-random.ts';

const NAMES = Number(process.env.BENCH_NAMES ?? 1_000_000);
const QUERIES = Number(process.env.BENCH_QUERIES ?? 2000);
const FUSE_QUERIES = Number(process.env.BENCH_FUSE_QUERIES ?? 3);
const SEED = 20240521;


const rand = seededRandom(SEED);
const pick = <T>(items: readonly T[]): T => items[Math.floor(rand() * items.length)];

/*
 * Name stems are built from syllables of an onset, a nucleus and an optional coda (about 6,200
 * distinct shapes, as in Spanish and Portuguese place names: "Tres", "Guai", "Blan", "Quer"...).
 * An earlier version drew on 70 mostly two-letter syllables, and its 1 M-name list was so crowded
 * that, measured by a scan of every distinct name over a tenth of the queries, 5.8 % of one-error
 * and 19.4 % of two-error queries had five or more other names at least as close as the intended one
 * (no ranking by edits can then put it in the first five), against 0.5 % and 4.7 % with these
 * syllables. That real gazetteers' words are far more varied than 70 syllables allow is from memory,
 * not measured here. BENCH_NAME_SPACE=narrow keeps the earlier generator, to compare.
 */
const NARROW_SYLLABLES = ['ba', 'be', 'bo', 'ca', 'co', 'cu', 'da', 'de', 'di', 'do', 'fa', 'fe', 'ga', 'go', 'gua', 'ja', 'la', 'le',
  'li', 'lo', 'ma', 'me', 'mi', 'mo', 'na', 'ne', 'ni', 'no', 'pa', 'pe', 'pi', 'po', 'que', 'qui', 'ra', 're', 'ri', 'ro',
  'sa', 'se', 'si', 'so', 'ta', 'te', 'ti', 'to', 'va', 've', 'vi', 'za', 'zo', 'mar', 'dor', 'lin', 'ven', 'tan', 'bel',
  'cor', 'sal', 'ver', 'mon', 'ral', 'tur', 'gen', 'hua', 'chi', 'lla', 'nha', 'rey', 'bran'];
const ONSETS = ['', 'b', 'c', 'ch', 'd', 'f', 'g', 'gu', 'h', 'j', 'l', 'll', 'm', 'n', 'ñ', 'p', 'qu', 'r', 's', 't', 'v', 'x', 'y', 'z',
  'bl', 'br', 'cl', 'cr', 'dr', 'fl', 'fr', 'gl', 'gr', 'pl', 'pr', 'tr', 'nh', 'lh'];
const NUCLEI = ['a', 'a', 'a', 'e', 'e', 'e', 'i', 'i', 'o', 'o', 'o', 'u', 'u', 'ai', 'au', 'ei', 'ia', 'ie', 'io', 'ua', 'ue', 'ui', 'ao'];
const CODAS = ['', '', '', '', '', '', '', '', '', 'n', 'n', 'r', 'r', 's', 's', 'l', 'm', 'z', 'st', 'nt'];
const NARROW = process.env.BENCH_NAME_SPACE === 'narrow';
const SYLLABLES = NARROW ? NARROW_SYLLABLES : ONSETS.flatMap((onset) => NUCLEI.flatMap((nucleus) => CODAS.map((coda) => onset + nucleus + coda)));
/** Shares of stems with two and with up to three syllables (the rest have four): stems of 9 letters on average. */
const [TWO_SYLLABLES, THREE_SYLLABLES] = NARROW ? [0.2, 0.7] : [0.45, 0.9];
const ACCENTED: Record<string, string> = { a: 'á', e: 'é', i: 'í', o: 'ó', u: 'ú' };
const PREFIXES = ['San', 'Santa', 'Santo', 'São', 'Rio', 'Río', 'Cerro', 'Lago', 'Monte', 'Puerto', 'Porto', 'Saint', 'Sainte',
  'Mount', 'Lake', 'Port', 'Fort', 'Villa', 'Vila', 'Ponta', 'Punta', 'Arroyo', 'La', 'El', 'Los', 'Le', 'Fazenda', 'Estancia'];
const SUFFIXES = ['de Abajo', 'de Arriba', 'Nuevo', 'Viejo', 'do Sul', 'do Norte', 'Creek', 'Hill', 'sur Mer', 'Grande', 'Chico'];
const COUNTRIES = ['AR', 'BO', 'BR', 'CL', 'CO', 'CR', 'EC', 'ES', 'FR', 'GT', 'HN', 'MX', 'NI', 'PA', 'PE', 'PT', 'PY', 'US', 'UY', 'VE'];
const FEATURE_CODES = [['P', 'PPL'], ['P', 'PPL'], ['P', 'PPL'], ['P', 'PPLX'], ['L', 'LCTY'], ['S', 'FRM'], ['H', 'STM'], ['T', 'HLL'], ['H', 'LK'], ['T', 'PK']];

function makeStem(): string {
  const draw = rand();
  const count = draw < TWO_SYLLABLES ? 2 : draw < THREE_SYLLABLES ? 3 : 4;
  let stem = '';
  for (let i = 0; i < count; i++) stem += pick(SYLLABLES);
  if (rand() < 0.15) stem = stem.replace(/[aeiou]/, (vowel) => ACCENTED[vowel]);
  return stem[0].toUpperCase() + stem.slice(1);
}

const VOCABULARY = Array.from({ length: Math.max(1000, Math.round(NAMES / 5)) }, makeStem);
/** Skewed toward the first stems, as real gazetteers repeat some names far more than others. */
const stem = () => VOCABULARY[Math.floor(VOCABULARY.length * rand() ** 1.5)];

function makeName(): string {
  const parts: string[] = [];
  if (rand() < 0.35) parts.push(pick(PREFIXES));
  parts.push(stem());
  if (rand() < 0.25) parts.push(rand() < 0.5 ? stem() : `de ${stem()}`);
  if (rand() < 0.15) parts.push(pick(SUFFIXES));
  return parts.join(' ');
}

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

const directory = mkdtempSync(join(tmpdir(), 'whereabouts-bench-'));
const dumpPath = join(directory, 'synthetic.txt');
const dbPath = join(directory, 'synthetic.sqlite');

/** Writes the dump-layout file and keeps a seeded sample of names to query. */
async function generate(): Promise<{ rows: number; sample: string[] }> {
  const out = createWriteStream(dumpPath);
  const write = (line: string) => (out.write(line) ? Promise.resolve() : new Promise<void>((resolve) => out.once('drain', resolve)));
  const sampleEvery = Math.max(1, Math.floor(NAMES / QUERIES));
  const sample: string[] = [];
  let names = 0;
  let rows = 0;
  while (names < NAMES) {
    const name = makeName();
    const alternate = rand() < 0.05 && names + 1 < NAMES ? makeName() : '';
    rows++;
    names += alternate === '' ? 1 : 2;
    if (rows % sampleEvery === 0 && sample.length < QUERIES) sample.push(name);
    const country = pick(COUNTRIES);
    const [featureClass, featureCode] = pick(FEATURE_CODES);
    const ascii = name.normalize('NFD').replace(/\p{M}/gu, '');
    await write(`${rows}\t${name}\t${ascii}\t${alternate}\t${(rand() * 140 - 60).toFixed(5)}\t${(rand() * 360 - 180).toFixed(5)}\t`
      + `${featureClass}\t${featureCode}\t${country}\t\t${String(Math.floor(rand() * 30)).padStart(2, '0')}\t\t\t\t`
      + `${Math.floor(rand() * 20000)}\t\t\t\t2024-01-01\n`);
  }
  await new Promise<void>((resolve) => out.end(resolve));
  return { rows, sample };
}

const percentile = (values: number[], p: number) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
};
const ms = (value: number) => `${value.toFixed(3)} ms`;

console.log(`machine: ${cpus().length} cores, load average ${loadavg().map((l) => l.toFixed(1)).join(' ')} (other work on the machine slows every figure)`);
const { rows, sample } = await generate();
console.log(`synthetic gazetteer: ${NAMES} names in ${rows} features (seed ${SEED}), ${(statSync(dumpPath).size / 1e6).toFixed(1)} MB in the dump layout`);

const store = openGazetteer(dbPath);
const summary = await importGazetteer(store, dumpPath, { format: 'geonames', citation: 'synthetic benchmark gazetteer' });
store.close();
const bytes = statSync(dbPath).size;
console.log(`import: ${summary.imported} features in ${summary.seconds.toFixed(1)} s = ${Math.round(summary.rowsRead / summary.seconds)} rows/s (target ≥ 60000), ${summary.rejected.length} rejected`);
console.log(`store: ${(bytes / 1e6).toFixed(1)} MB = ${Math.round(bytes / NAMES)} bytes per name (target ≤ 400)`);
console.log(`peak RSS of generator and import: ${Math.round(process.resourceUsage().maxRSS / 1024)} MB (target ≤ 400 MB)`);

if (process.env.BENCH_SIDE_FILES === '1') {
  // One alternate name for every other feature, a tenth of them former names (10 columns, alternateNamesV2).
  const alternates: string[] = [];
  for (let feature = 1; feature <= rows; feature += 2) {
    alternates.push(`${feature}\t${feature}\tes\t${makeName()}\t\t\t\t${feature % 20 === 1 ? '1' : ''}\t\t`);
  }
  const alternatesPath = join(directory, 'alternateNamesV2.txt');
  writeFileSync(alternatesPath, `${alternates.join('\n')}\n`);
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

const reader = openGazetteer(dbPath, { readonly: true });
const queries = [1, 2].map((errors) => sample.map((name) => {
  let query = name;
  for (let i = 0; i < errors; i++) query = typo(query);
  return { name, query };
}));
const isIntended = (name: string, matched: string[]) => matched.some((candidate) => foldName(candidate) === foldName(name));

for (const [index, set] of queries.entries()) {
  for (const { query } of set.slice(0, 50)) reader.findCandidates({ name: query, context: {} });
  const times: number[] = [];
  let hits = 0;
  for (const { name, query } of set) {
    const started = performance.now();
    const candidates = reader.findCandidates({ name: query, context: {}, limit: 5 });
    times.push(performance.now() - started);
    if (candidates.some((c) => isIntended(name, [c.feature.name, ...c.feature.alternateNames]))) hits++;
  }
  const target = index === 0 ? 98 : 90;
  console.log(`${index + 1} error${index === 0 ? '' : 's'}: ${set.length} queries, median ${ms(percentile(times, 50))}, p99 ${ms(percentile(times, 99))} `
    + `(targets ≤ 1 ms, ≤ 5 ms), intended name in the first five: ${(100 * hits / set.length).toFixed(1)} % (target ≥ ${target} %)`);
}

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
}
reader.close();
console.log(`load average at the end: ${loadavg().map((l) => l.toFixed(1)).join(' ')}`);
rmSync(directory, { recursive: true, force: true });
