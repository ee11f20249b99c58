/**
 * A batch over a Darwin Core Archive killed with SIGKILL part way and finished (by the same command run
 * again, then by --resume <job>) gives the archive of an unbroken run, every core row once. Common
 * practice, no source: compare bytes, the run timestamp aside.
 */
import { spawnSync } from 'node:child_process';
import { createWriteStream, existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import yazl from 'yazl';
import { jobsDatabasePath } from '../../src/store/side-files.ts';
import { fixtureGazetteer, killWhen, progress, unzip } from './helpers.ts';

const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;
const DWC = 'http://rs.tdwg.org/dwc/terms/';
const PLACES = ['Caleta Brava', 'San Telmo', 'Pont-Étoile', 'São Bento', 'Puerto Ñandú'];

/** 4,000 invented occurrences (Darwin Core text guide §2.2: a comma-separated, quoted core with one header line). */
async function writeArchive(path: string): Promise<void> {
  const rows = ['id,locality'];
  for (let i = 0; i < 4000; i++) rows.push(`o-${i},"${(i % 40) + 1} km N of ${PLACES[i % PLACES.length]}"`);
  const meta = `<archive xmlns="http://rs.tdwg.org/dwc/text/"><core ignoreHeaderLines="1" rowType="${DWC}Occurrence"><files><location>occurrence.csv</location></files><id index="0"/><field index="0" term="${DWC}occurrenceID"/><field index="1" term="${DWC}locality"/><field term="${DWC}countryCode" default="QV"/></core></archive>`;
  const zip = new yazl.ZipFile();
  zip.addBuffer(Buffer.from(meta), 'meta.xml');
  zip.addBuffer(Buffer.from(`${rows.join('\n')}\n`), 'occurrence.csv');
  zip.end();
  await pipeline(zip.outputStream, createWriteStream(path));
}

describe('an archive batch killed part way', { timeout: 180_000 }, () => {
  it('finishes on resume with the archive of an unbroken run', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const input = join(dir, 'dwca.zip');
    await writeArchive(input);
    const jobsPath = jobsDatabasePath(dbPath);

    const reference = join(dir, 'reference.zip');
    const full = spawnSync(process.execPath, [BIN, '--db', dbPath, 'batch', input, '--out', reference, '--quiet'], { encoding: 'utf8' });
    expect(full.status, full.stderr).toBe(0);
    const referenceTimestamp = progress(jobsPath)!.run_timestamp;

    const output = join(dir, 'output.zip');
    const args = ['--db', dbPath, 'batch', input, '--out', output, '--quiet'];
    const env = { ...process.env, WHEREABOUTS_TEST_DELAY_MS: '100' };
    await killWhen(args, env, jobsPath, (p) => p.rows_done > 0 && p.rows_done < (p.rows_total ?? 0));
    expect(existsSync(output)).toBe(false);
    // The same command again resumes the same job; killed again, then finished by its id.
    await killWhen(args, env, jobsPath, (p) => p.rows_done >= 2000 && p.rows_done < (p.rows_total ?? 0));
    const job = new Database(jobsPath, { readonly: true }).prepare("SELECT id, run_timestamp FROM batch_job WHERE state != 'done'").get() as { id: string; run_timestamp: string };
    const resumed = spawnSync(process.execPath, [BIN, '--db', dbPath, 'batch', '--resume', job.id], { encoding: 'utf8' });
    expect(resumed.status, resumed.stderr).toBe(0);
    expect(resumed.stderr).toContain('Darwin Core Archive');

    const asText = async (path: string) => new Map((await unzip(path)).map((e) => [e.name, e.bytes.toString('utf8')]));
    const [a, b] = [await asText(reference), await asText(output)];
    expect([...b.keys()]).toEqual(['meta.xml', 'occurrence.csv', 'eml.xml']);
    for (const name of a.keys()) expect(b.get(name)!.replaceAll(job.run_timestamp, '<run>')).toBe(a.get(name)!.replaceAll(referenceTimestamp, '<run>'));
    const ids = b.get('occurrence.csv')!.split('\r\n').slice(1, -1).map((line) => line.split('\t')[0]);
    expect(ids).toEqual(Array.from({ length: 4000 }, (_, i) => `o-${i}`));
    // Nothing of the job is left beside the output or the gazetteer.
    expect(readdirSync(dir).filter((f) => f.includes('core') || f.includes('archive'))).toEqual([]);
  });
});
