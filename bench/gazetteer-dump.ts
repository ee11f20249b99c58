/**
 * Writes the gazetteer benchmark's seeded synthetic gazetteer in the world-gazetteer dump layout,
 * streamed (memory flat in the file's size), with names drawn with a real gazetteer's word frequencies
 * (gazetteer-words.ts). bench/gazetteer.ts runs it in a process of its own, so that the import's peak
 * RSS is the import's alone.
 * Writes into DIR: synthetic.txt (the dump), sample.json (every k-th feature's name, QUERIES of them,
 * and the counts), and with BENCH_SIDE_FILES=1 alternateNamesV2.txt (one name for every other feature,
 * a tenth of them former names; 10 columns).
 * @example tsx bench/gazetteer-dump.ts /tmp/dir 1000000 2000 20240521
 */
import { createWriteStream, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { gazetteerWords } from './gazetteer-words.ts';
import { seededRandom } from './seeded-random.ts';

const [directory, namesText, queriesText, seedText] = process.argv.slice(2);
const NAMES = Number(namesText);
const QUERIES = Number(queriesText);
const rand = seededRandom(Number(seedText));
const pick = <T>(items: readonly T[]): T => items[Math.floor(rand() * items.length)];
/** Feature classes and codes in the shares we give them [CHOICE]: mostly populated places. */
const FEATURE_CODES = [['P', 'PPL'], ['P', 'PPL'], ['P', 'PPL'], ['P', 'PPLX'], ['L', 'LCTY'], ['S', 'FRM'], ['H', 'STM'], ['T', 'HLL'], ['H', 'LK'], ['T', 'PK']];
/** Lines written at once: one write call for many lines. */
const LINES_PER_WRITE = 2000;

const started = performance.now();
const words = gazetteerWords(rand, NAMES);

/** Writes `lines` to a file, waiting when the stream asks to. */
function lineWriter(path: string): { add(line: string): Promise<void>; end(): Promise<void> } {
  const out = createWriteStream(path);
  let pending: string[] = [];
  const flush = () => {
    const ok = out.write(pending.join(''));
    pending = [];
    return ok ? Promise.resolve() : new Promise<void>((resolve) => out.once('drain', resolve));
  };
  return {
    add: (line) => {
      pending.push(line);
      return pending.length === LINES_PER_WRITE ? flush() : Promise.resolve();
    },
    end: async () => {
      await flush();
      await new Promise<void>((resolve) => out.end(resolve));
    },
  };
}

const dump = lineWriter(join(directory, 'synthetic.txt'));
const alternates = process.env.BENCH_SIDE_FILES === '1' ? lineWriter(join(directory, 'alternateNamesV2.txt')) : undefined;
const sampleEvery = Math.max(1, Math.floor(NAMES / QUERIES));
const sample: string[] = [];
let names = 0;
let rows = 0;
while (names < NAMES) {
  const country = words.country();
  const name = words.name(country);
  const alternate = rand() < 0.05 && names + 1 < NAMES ? words.name(country) : '';
  rows++;
  names += alternate === '' ? 1 : 2;
  if (rows % sampleEvery === 0 && sample.length < QUERIES) sample.push(name);
  const [featureClass, featureCode] = pick(FEATURE_CODES);
  const ascii = name.normalize('NFD').replace(/\p{M}/gu, '');
  await dump.add(`${rows}\t${name}\t${ascii}\t${alternate}\t${(rand() * 140 - 60).toFixed(5)}\t${(rand() * 360 - 180).toFixed(5)}\t`
    + `${featureClass}\t${featureCode}\t${country}\t\t${String(Math.floor(rand() * 30)).padStart(2, '0')}\t\t\t\t`
    + `${Math.floor(rand() * 20000)}\t\t\t\t2024-01-01\n`);
  if (alternates !== undefined && rows % 2 === 1) {
    await alternates.add(`${rows}\t${rows}\tes\t${words.name(country)}\t\t\t\t${rows % 20 === 1 ? '1' : ''}\t\t\n`);
  }
}
await dump.end();
await alternates?.end();
writeFileSync(join(directory, 'sample.json'), JSON.stringify({ rows, names, sample, words: words.summary, seconds: (performance.now() - started) / 1000 }));
