/**
 * Import-only gazetteer benchmark: imports a dump already written by bench/gazetteer-dump.ts into a new
 * store and prints rows/s by the clock and by CPU time, the store's bytes per name and the import's peak
 * RSS. Keeping one dump lets two versions of the importer be compared on the same input, run after run.
 * @example tsx bench/gazetteer-dump.ts /tmp/g 1000000 2000 20240521 && tsx bench/gazetteer-import.ts /tmp/g/synthetic.txt
 */
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { importGazetteer } from '../src/store/import.ts';
import { openGazetteer } from '../src/store/gazetteer-store.ts';

const [dumpPath] = process.argv.slice(2);
if (dumpPath === undefined) throw new Error('usage: tsx bench/gazetteer-import.ts DUMP (written by bench/gazetteer-dump.ts, sample.json beside it)');
const { names } = JSON.parse(readFileSync(join(dirname(dumpPath), 'sample.json'), 'utf8')) as { names: number };
const directory = mkdtempSync(join(tmpdir(), 'whereabouts-import-'));
const dbPath = join(directory, 'import.sqlite');
try {
  const store = openGazetteer(dbPath);
  const cpu = process.cpuUsage();
  const summary = await importGazetteer(store, dumpPath, { format: 'geonames', citation: 'synthetic benchmark gazetteer' });
  const { user, system } = process.cpuUsage(cpu);
  store.close();
  const cpuSeconds = (user + system) / 1e6;
  console.log(`import: ${summary.imported} features in ${summary.seconds.toFixed(1)} s = ${Math.round(summary.rowsRead / summary.seconds)} rows/s; `
    + `CPU ${cpuSeconds.toFixed(1)} s = ${Math.round(summary.rowsRead / cpuSeconds)} rows a CPU-second; `
    + `${Math.round(statSync(dbPath).size / names)} bytes per name; peak RSS ${Math.round(process.resourceUsage().maxRSS / 1024)} MB`);
} finally {
  rmSync(directory, { recursive: true, force: true });
}
