/**
 * A batch over a Darwin Core Archive killed with SIGKILL part way and finished (by the same command run
 * again, then by --resume <job>) gives the archive of an unbroken run, every core row once. Common
 * practice, no source: compare bytes, the run timestamp aside.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { jobsDatabasePath } from '../../src/store/side-files.ts';
import { fixtureGazetteer, killWhen, progress, unzip } from './helpers.ts';
import { writeManyRowArchive } from '../support/demo-archive.ts';

const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;
describe('an archive batch killed part way', { timeout: 180_000 }, () => {
  it('finishes on resume with the archive of an unbroken run', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const input = join(dir, 'dwca.zip');
    await writeManyRowArchive(input);
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
