/**
 * Batch benchmark: a synthetic gazetteer (BENCH_NAMES names, default 1,000,000; built once for each
 * version of the store's code and kept in the system's temporary directory) and a generated input of
 * BENCH_ROWS rows (default 200,000) holding BENCH_DISTINCT distinct localities (default 40,000) of mixed
 * types, each repeated. Each size in
 * BENCH_ROWS (a comma list, e.g. "200000,2000000" to show memory stays flat) runs in a child process of
 * its own, so that its peak RSS is its own. Prints rows/s, distinct localities/s and peak RSS against the
 * targets (≥ 5,000 rows/s, ≤ 500 MB). BENCH_TYPOS sets the share of names with a typing error (default 0.01).
 * BENCH_PART="K/N" runs only part K of N (`batch --part`), the work of one cluster task.
 * Run: `npm run bench:batch` (BENCH_NAMES=100000 for a quick run).
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createWriteStream, existsSync, mkdtempSync, readdirSync, readFileSync, renameSync, rmSync, statSync } from 'node:fs';
import { once } from 'node:events';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { startBatchJob, type BatchProgressEvent } from '../src/batch/run.ts';
import { parsePartSpec } from '../src/batch/partition.ts';
import { importGazetteer } from '../src/store/import.ts';
import { openGazetteer } from '../src/store/gazetteer-store.ts';

const NAMES = Number(process.env.BENCH_NAMES ?? 1_000_000);
const DISTINCT = Number(process.env.BENCH_DISTINCT ?? 40_000);
const THREADS = process.env.BENCH_THREADS ? Number(process.env.BENCH_THREADS) : undefined;
const SIZES = (process.env.BENCH_ROWS ?? '200000').split(',').map(Number);
const PART = process.env.BENCH_PART ? parsePartSpec(process.env.BENCH_PART) : undefined;

/** Place i's name: i written in base 60 with a syllable a digit, so every name is unique and pronounceable. */
const SYLLABLES = 'ba be bi bo bu ca ce ci co cu da de di do du fa fe fi fo fu ga ge gi go gu la le li lo lu ma me mi mo mu na ne ni no nu pa pe pi po pu ra re ri ro ru sa se si so su ta te ti to tu'.split(' ');
function placeName(i: number): string {
  let word = '';
  for (let n = i + SYLLABLES.length ** 2; n > 0; n = Math.floor(n / SYLLABLES.length)) word += SYLLABLES[n % SYLLABLES.length];
  return word[0].toUpperCase() + word.slice(1) + (i % 3 === 0 ? ' Alto' : '');
}

/** A point spread over an invented region around 45.5°S 131°W, from the place's index (a low-discrepancy walk). */
function placePoint(i: number): [number, number] {
  const golden = 0.6180339887498949;
  return [-44 - ((i * golden) % 1) * 3, -133 + ((i * golden * golden) % 1) * 4];
}

/** The store's and the matching's code, hashed: a gazetteer built by other code (another index) is built again. */
function storeCodeHash(): string {
  const hash = createHash('sha256');
  for (const folder of ['store', 'match']) {
    const dir = new URL(`../src/${folder}/`, import.meta.url).pathname;
    for (const file of readdirSync(dir).sort()) hash.update(readFileSync(join(dir, file)));
  }
  return hash.digest('hex').slice(0, 12);
}

async function syntheticGazetteer(): Promise<string> {
  const dbPath = join(tmpdir(), `whereabouts-bench-batch-${NAMES}-${storeCodeHash()}.sqlite`);
  if (existsSync(dbPath)) return dbPath;
  const dir = mkdtempSync(join(tmpdir(), 'whereabouts-bench-'));
  const csv = join(dir, 'places.csv');
  const out = createWriteStream(csv);
  out.write('id,name,alternateNames,latitude,longitude,featureType,countryCode,stateProvince,county,radiusMeters\n');
  const types = ['town', 'village', 'hamlet', 'locality', 'hill'];
  for (let i = 0; i < NAMES; i++) {
    const [lat, lon] = placePoint(i);
    if (!out.write(`p${i},${placeName(i)},,${lat.toFixed(5)},${lon.toFixed(5)},${types[i % types.length]},QV,Province ${i % 7},County ${i % 97},${500 + (i % 20) * 250}\n`)) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
  const started = performance.now();
  const store = openGazetteer(`${dbPath}.partial`);
  try {
    await importGazetteer(store, csv, { format: 'csv', citation: `Synthetic benchmark gazetteer, ${NAMES} invented names` });
  } finally {
    store.close();
  }
  renameSync(`${dbPath}.partial`, dbPath);
  rmSync(dir, { recursive: true });
  console.log(`synthetic gazetteer: ${NAMES.toLocaleString('en')} names imported in ${((performance.now() - started) / 1000).toFixed(0)} s (${dbPath})`);
  return dbPath;
}

const HEADINGS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW', 'NNE', 'WSW'];
/** Distinct localities name far fewer places [CHOICE]: one place to five distinct localities. */
const PLACES_USED = Math.max(1, Math.round(DISTINCT / 5));
/** Share of distinct localities with a typing error, which the store matches fuzzily (slow when nothing is close). */
const TYPO_SHARE = Number(process.env.BENCH_TYPOS ?? 0.01);

/** Distinct locality k: five forms of text a place, the mix of label localities a collection export holds [CHOICE]. */
function locality(k: number): string {
  const place = placeName(((k % PLACES_USED) * 24_989) % NAMES);
  const form = Math.floor(k / PLACES_USED);
  const heading = HEADINGS[k % HEADINGS.length];
  if ((k * 0.6180339887498949) % 1 < TYPO_SHARE) return `${place.slice(0, 2)}${place.slice(3)}`;
  if (form === 0) return place;
  if (form === 1) return `${1 + (k % 40)} km ${heading} of ${place}`;
  if (form === 2) return [`near ${place}`, `${1 + (k % 9)} km N and ${1 + (k % 7)} km E of ${place}`, `${1 + (k % 25)} mi from ${place}`, `${place}, ${1 + (k % 30)} mi. ${heading}`][k % 4];
  if (form === 3) return `${44 + (Math.floor(k / 3600) % 3)}°${k % 60}'${Math.floor(k / 60) % 60}"S ${130 + (k % 3)}°${(k * 7) % 60}'W`;
  return k % 10 === 0 ? ['locality unknown', 'no locality given', 'sin localidad'][k % 3] : `${1 + (k % 12)}.5 km ${heading} of ${place}`;
}

async function writeInput(path: string, rows: number): Promise<void> {
  const out = createWriteStream(path);
  out.write('occurrenceID,locality,countryCode,decimalLatitude,decimalLongitude\n');
  for (let i = 0; i < rows; i++) {
    const k = (i * 7919) % DISTINCT; // every distinct locality repeated, spread through the file
    const coordinates = i % 5 === 0 ? `${placePoint((k * 24_989) % NAMES).map((v) => v.toFixed(3)).join(',')}` : ',';
    if (!out.write(`b${i},"${locality(k)}",QV,${coordinates}\n`)) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
}

async function runSize(rows: number): Promise<void> {
  const dbPath = await syntheticGazetteer();
  const dir = mkdtempSync(join(tmpdir(), 'whereabouts-bench-run-'));
  const input = join(dir, 'input.csv');
  await writeInput(input, rows);
  const started = performance.now();
  const cpuBefore = process.cpuUsage();
  let peakHeapMB = 0;
  const sampler = setInterval(() => (peakHeapMB = Math.max(peakHeapMB, process.memoryUsage().heapUsed / 2 ** 20)), 250);
  const phaseEnds = new Map<string, number>();
  const rssByPhase = new Map<string, number>();
  const onProgress = (event: BatchProgressEvent) => {
    phaseEnds.set(event.phase, performance.now());
    rssByPhase.set(event.phase, Math.max(rssByPhase.get(event.phase) ?? 0, process.memoryUsage().rss / 2 ** 20));
  };
  const { done } = await startBatchJob({
    dbPath, input, output: join(dir, 'output.csv'), threads: THREADS, jobsDbPath: join(dir, 'jobs.sqlite'), onProgress,
    part: PART, runTimestamp: PART ? '2026-05-01T09:30:00Z' : undefined,
  });
  const summary = await done;
  clearInterval(sampler);
  const seconds = (performance.now() - started) / 1000;
  const phases = [...phaseEnds].map(([phase, end]) => `${phase} ${((end - started) / 1000).toFixed(1)} s (RSS up to ${rssByPhase.get(phase)!.toFixed(0)} MB)`);
  const cpu = process.cpuUsage(cpuBefore);
  const cpuSeconds = (cpu.user + cpu.system) / 1e6;
  const peakMB = process.resourceUsage().maxRSS / 1024;
  const outputMB = statSync(join(dir, 'output.csv')).size / 1e6;
  console.log(
    `${PART ? `part ${PART.index}/${PART.count} of ` : ''}${rows.toLocaleString('en')} rows, ${summary.distinctLocalities.toLocaleString('en')} distinct localities, ${NAMES.toLocaleString('en')} names: ` +
      `${seconds.toFixed(1)} s, ${Math.round(rows / seconds).toLocaleString('en')} rows/s (target ≥ 5,000), ` +
      `${Math.round(summary.distinctLocalities / seconds).toLocaleString('en')} distinct localities/s, ` +
      `CPU ${cpuSeconds.toFixed(1)} s over all threads (${Math.round(rows / cpuSeconds).toLocaleString('en')} rows a CPU-second; machine load ${loadavg()[0].toFixed(1)}), ` +
      `peak RSS ${peakMB.toFixed(0)} MB (target ≤ 500; main thread's heap at most ${peakHeapMB.toFixed(0)} MB), output ${outputMB.toFixed(0)} MB; ${JSON.stringify(summary.byStatus)}; phases ended at ${phases.join(', ')}`,
  );
  rmSync(dir, { recursive: true });
}

const child = process.argv.indexOf('--rows');
if (child >= 0) {
  await runSize(Number(process.argv[child + 1]));
} else {
  await syntheticGazetteer();
  for (const rows of SIZES) {
    const run = spawnSync(process.execPath, ['--import', 'tsx', new URL(import.meta.url).pathname, '--rows', String(rows)], { stdio: 'inherit' });
    if (run.status !== 0) process.exit(run.status ?? 1);
  }
}
