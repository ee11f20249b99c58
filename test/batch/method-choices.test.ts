/**
 * A batch job records the value of every method choice it used (src/georef/method-choices.ts), shows them
 * when it starts or is resumed through the real CLI, and a job database made before jobs recorded them still
 * opens (its jobs say "not recorded"). Checked against the list in force, so a reviewer can reproduce a run.
 */
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { gazetteerSources } from '../../src/batch/run.ts';
import { inspectInput } from '../../src/store/input-format.ts';
import { methodChoiceValues } from '../../src/georef/method-choices.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { insertJob, jobProgress, loadJob, openJobs } from '../../src/store/jobs.ts';
import { jobsDatabasePath } from '../../src/store/side-files.ts';
import { VERSION } from '../../src/version.ts';
import { fixtureGazetteer } from './helpers.ts';

const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;

function writeInput(dir: string): string {
  const input = join(dir, 'in.csv');
  writeFileSync(input, 'occurrenceID,locality,countryCode\nm-1,5 km N of San Telmo,QV\nm-2,near Caleta Brava,QV\n');
  return input;
}

describe('a batch job and its method choices', { timeout: 60_000 }, () => {
  it('records the values in force and prints them when it starts', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const input = writeInput(dir);
    const run = spawnSync(process.execPath, [BIN, '--db', dbPath, 'batch', input, '--out', join(dir, 'out.csv')], { encoding: 'utf8' });
    expect(run.status, run.stderr).toBe(0);
    expect(run.stderr).toContain(`method choices: `);
    expect(run.stderr).toContain(`nearMinimumMeters=${METHOD_DEFAULTS.nearMinimumMeters}`);
    const jobs = openJobs(jobsDatabasePath(dbPath));
    try {
      const id = (jobs.prepare('SELECT id FROM batch_job').get() as { id: string }).id;
      expect(loadJob(jobs, id).methodChoices).toEqual(methodChoiceValues());
      expect(jobProgress(jobs, id).methodChoices).toEqual(methodChoiceValues());
    } finally {
      jobs.close();
    }
  });

  it('shows the recorded values on `batch --resume`, and "not recorded" for a job stored before', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const input = writeInput(dir);
    const format = await inspectInput(input);
    const jobsPath = jobsDatabasePath(dbPath);
    // An old job file: the table as it was before jobs recorded their choices, runner or part.
    const old = new Database(jobsPath);
    old.exec(`CREATE TABLE batch_job (
      id TEXT PRIMARY KEY, state TEXT NOT NULL, input_path TEXT NOT NULL, input_is_spool INTEGER NOT NULL, input_sha256 TEXT NOT NULL, input_bytes INTEGER NOT NULL,
      encoding TEXT NOT NULL, delimiter TEXT NOT NULL, output_path TEXT NOT NULL, partial_path TEXT NOT NULL, gazetteer_path TEXT NOT NULL, settings TEXT NOT NULL,
      version TEXT NOT NULL, sources TEXT NOT NULL, run_timestamp TEXT NOT NULL, rows_total INTEGER, rows_done INTEGER NOT NULL DEFAULT 0,
      output_bytes INTEGER NOT NULL DEFAULT 0, distinct_total INTEGER, distinct_done INTEGER NOT NULL DEFAULT 0, tallies TEXT NOT NULL DEFAULT '{}',
      started_at TEXT NOT NULL, finished_at TEXT, error TEXT)`);
    old.close();
    const jobs = openJobs(jobsPath);
    const job = (id: string, methodChoices: Record<string, number | string> | null, out: string) => ({
      id, state: 'reading' as const, inputPath: input, inputIsSpool: false, inputSha256: format.sha256, inputBytes: format.bytes, encoding: format.encoding,
      delimiter: ',', outputPath: join(dir, out), partialPath: join(dir, `${out}.partial`), resultFormat: null, resultPath: null, gazetteerPath: dbPath,
      settings: JSON.stringify({ administrativeFallback: false, coverAmbiguous: false }), methodChoices, version: VERSION, sources: gazetteerSources(dbPath),
      runTimestamp: '2026-05-01T09:30:00Z', partIndex: null, partCount: null, rowsTotal: null, rowsDone: 0, outputBytes: 0, distinctTotal: null,
      distinctDone: 0, tallies: {}, startedAt: new Date().toISOString(), finishedAt: null, error: null,
    });
    try {
      insertJob(jobs, job('oldjob01', null, 'old.csv'));
      insertJob(jobs, job('newjob01', methodChoiceValues(), 'new.csv'));
      expect(loadJob(jobs, 'oldjob01').methodChoices).toBeNull();
    } finally {
      jobs.close();
    }
    const resumeOld = spawnSync(process.execPath, [BIN, '--db', dbPath, 'batch', '--resume', 'oldjob01'], { encoding: 'utf8' });
    expect(resumeOld.status, resumeOld.stderr).toBe(0);
    expect(resumeOld.stderr).toContain('method choices: not recorded');
    const resumeNew = spawnSync(process.execPath, [BIN, '--db', dbPath, 'batch', '--resume', 'newjob01'], { encoding: 'utf8' });
    expect(resumeNew.status, resumeNew.stderr).toBe(0);
    expect(resumeNew.stderr).toContain(`unknownDatumMeters=${METHOD_DEFAULTS.unknownDatumMeters}`);
    expect(resumeNew.stderr).toContain('job resumed');
  });
});
