/** Shared set-up for the batch tests: a real SQLite gazetteer imported from the invented fixture. */
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import yauzl from 'yauzl';
import { parse } from 'csv-parse/sync';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer } from '../../src/store/gazetteer-store.ts';

export const FIXTURES = new URL('../fixtures/batch/', import.meta.url).pathname;

/** A temporary directory holding a gazetteer built from test/fixtures/batch/gazetteer.csv (invented places). */
export async function fixtureGazetteer(): Promise<{ dir: string; dbPath: string }> {
  const dir = mkdtempSync(join(tmpdir(), 'whereabouts-batch-'));
  const dbPath = join(dir, 'gazetteer.sqlite');
  const store = openGazetteer(dbPath);
  try {
    await importGazetteer(store, join(FIXTURES, 'gazetteer.csv'), { format: 'csv', citation: 'Invented test gazetteer of Isla Quiroga (whereabouts test fixture)' });
  } finally {
    store.close();
  }
  return { dir, dbPath };
}

/** An output file read back as RFC 4180 CSV (UTF-8), header first. */
export function readOutput(path: string, delimiter = ','): string[][] {
  return parse(readFileSync(path, 'utf8'), { delimiter, relax_column_count: false }) as string[][];
}

/** The job's committed progress, read as another process would. */
export function progress(jobsPath: string): { id: string; state: string; leftovers: string | null; distinct_done: number; distinct_total: number | null; rows_done: number; rows_total: number | null; run_timestamp: string } | undefined {
  if (!existsSync(jobsPath)) return undefined;
  const db = new Database(jobsPath, { readonly: true, fileMustExist: true });
  try {
    return db.prepare('SELECT * FROM batch_job ORDER BY started_at DESC LIMIT 1').get() as ReturnType<typeof progress>;
  } catch {
    return undefined;
  } finally {
    db.close();
  }
}

/** Run the CLI with `args` and kill it with SIGKILL once the job's progress satisfies `when`. */
export async function killWhen(args: string[], env: NodeJS.ProcessEnv, jobsPath: string, when: (p: NonNullable<ReturnType<typeof progress>>) => boolean): Promise<void> {
  const child = spawn(process.execPath, [new URL('../../bin/whereabouts.js', import.meta.url).pathname, ...args], { env, stdio: 'ignore' });
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  for (;;) {
    const p = progress(jobsPath);
    if (p && when(p)) break;
    if (child.exitCode !== null) throw new Error('the batch ended before it could be killed');
    await new Promise((r) => setTimeout(r, 25));
  }
  child.kill('SIGKILL');
  await exited;
}

/** Every entry of a zip archive, in stored order, with its bytes (read with yauzl, not with the code under test). */
export async function unzip(path: string): Promise<{ name: string; bytes: Buffer }[]> {
  const zip = await yauzl.openPromise(path, { lazyEntries: true, autoClose: false });
  const out: { name: string; bytes: Buffer }[] = [];
  for await (const entry of zip.eachEntry()) {
    const chunks: Buffer[] = [];
    for await (const c of await zip.openReadStreamPromise(entry)) chunks.push(c as Buffer);
    out.push({ name: entry.fileName, bytes: Buffer.concat(chunks) });
  }
  zip.close();
  return out;
}

const PLACES = ['Caleta Brava', 'San Telmo', 'Pont-Étoile', 'São Bento', 'Puerto Ñandú'];
const HEADINGS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'];

/** 7,200 invented rows holding 2,400 distinct localities (enough for worker threads), each repeated three times. */
export function writeRepeatedLocalities(path: string): void {
  const distinct: string[] = [];
  for (const place of PLACES) for (const heading of HEADINGS) for (let km = 1; km <= 60; km++) distinct.push(`${km} km ${heading} of ${place}`);
  const lines = ['occurrenceID,locality,countryCode,decimalLatitude,decimalLongitude'];
  for (let i = 0; i < distinct.length * 3; i++) lines.push(`c-${i},"${distinct[i % distinct.length]}",QV,${i % 7 === 0 ? '45.5,-131.0' : ','}`);
  writeFileSync(path, `${lines.join('\n')}\n`);
}

/** 4,000 invented rows holding 40 distinct localities (georeferenced in one chunk, written in four), as the rows of writeManyRowArchive. */
export function writeManyRowCsv(path: string): void {
  const lines = ['occurrenceID,locality,countryCode'];
  for (let i = 0; i < 4000; i++) lines.push(`o-${i},"${(i % 40) + 1} km N of ${PLACES[i % PLACES.length]}",QV`);
  writeFileSync(path, `${lines.join('\n')}\n`);
}
