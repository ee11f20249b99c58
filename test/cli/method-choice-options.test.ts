/**
 * Method choices set from the command line: `--route-kilometre-post <rule>` of `locate`, `batch` and
 * `cluster-script` sets [CHOICE routeKilometrePost] (docs/method.md, every choice in one list; our choice, no
 * source) as the API's options.routeKilometrePost does; a batch job records the value it used, and `whereabouts
 * method` names the option. The real CLI in a child process over a real SQLite file holding the demo gazetteer
 * (invented, gazetteer/README.md). Verification statuses are Darwin Core's recommended values.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jobsDatabasePath } from '../../src/batch/index.ts';
import { methodChoiceValues } from '../../src/georef/method-choices.ts';
import { loadJob, openJobs } from '../../src/store/jobs.ts';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const db = join(mkdtempSync(join(tmpdir(), 'whereabouts-choices-')), 'demo.sqlite');
const whereabouts = (...args: string[]) => run(process.execPath, [join(root, 'bin/whereabouts.js'), '--db', db, ...args], { cwd: root, maxBuffer: 16 << 20 });
const ROUTE = ['locate', 'Puerto Lindo - Santa Rosa road, km 12', '--country-code', 'QV', '--state-province', 'Poniente', '--json'];

beforeAll(async () => {
  await whereabouts('import', 'gazetteer/demo.geojson', '--source', 'Isla Verdemar demo gazetteer (invented)');
}, 120_000);
afterAll(() => rmSync(dirname(db), { recursive: true, force: true }));

describe('locate --route-kilometre-post', () => {
  it("answers the whole route, the post not placed, unless told 'decline'", async () => {
    const unset = JSON.parse((await whereabouts(...ROUTE)).stdout);
    expect(unset.status).toBe('georeferenced');
    expect(unset.georeference.remarks.join('\n')).toContain('"km 12" not placed');
    expect(JSON.parse((await whereabouts(...ROUTE, '--route-kilometre-post', 'route')).stdout).georeference.latitude).toBe(unset.georeference.latitude);
    const declined = JSON.parse((await whereabouts(...ROUTE, '--route-kilometre-post', 'decline')).stdout);
    expect(declined.status).toBe('not-found');
    expect(declined.reason).toMatch(/cannot be placed without the road's line \[CHOICE routeKilometrePost/);
  });

  it('refuses a rule it does not know, naming the ones it takes', async () => {
    await expect(whereabouts(...ROUTE, '--route-kilometre-post', 'skip')).rejects.toMatchObject({ stderr: expect.stringMatching(/--route-kilometre-post.*'skip' is invalid.*route, decline/s) });
  });

  it('is named where `whereabouts method` lists the choice', async () => {
    const choices = JSON.parse((await whereabouts('method', '--json')).stdout) as { id: string; changedBy: string }[];
    expect(choices.find((c) => c.id === 'routeKilometrePost')?.changedBy).toMatch(/CLI locate, batch and cluster-script --route-kilometre-post; API options\.routeKilometrePost/);
  });
});

describe('batch and cluster-script --route-kilometre-post', () => {
  const input = join(dirname(db), 'routes.csv');
  const batch = async (out: string, ...rule: string[]) => {
    writeFileSync(input, 'occurrenceID,locality,countryCode,stateProvince\nk-1,"Puerto Lindo - Santa Rosa road, km 12",QV,Poniente\n');
    await whereabouts('batch', input, '--out', join(dirname(db), out), '--quiet', ...rule);
    return (parse(readFileSync(join(dirname(db), out)), { columns: true }) as Record<string, string>[])[0]!;
  };

  it('declines the route with a post when told, and the job records the rule it used', async () => {
    expect((await batch('unset.csv')).georeferenceVerificationStatus).toBe('requires verification');
    const declined = await batch('declined.csv', '--route-kilometre-post', 'decline');
    expect(declined.georeferenceVerificationStatus).toBe('requires georeference');
    expect(declined.decimalLatitude).toBe('');
    const jobs = openJobs(jobsDatabasePath(db));
    try {
      const recorded = (jobs.prepare('SELECT id FROM batch_job ORDER BY started_at').all() as { id: string }[]).map(({ id }) => loadJob(jobs, id).methodChoices);
      expect(recorded).toEqual([methodChoiceValues(), { ...methodChoiceValues(), routeKilometrePost: 'decline' }]);
    } finally {
      jobs.close();
    }
  });

  it('passes the rule on to every task of a cluster script', async () => {
    const { stdout } = await whereabouts('cluster-script', input, '--parts', '2', '--work-dir', join(dirname(db), 'parts'), '--out', join(dirname(db), 'merged.csv'), '--route-kilometre-post', 'decline');
    expect(stdout).toMatch(/ batch [^\n]*\\\n[^]*--route-kilometre-post decline\n/);
  });
});
