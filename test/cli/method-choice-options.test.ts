/**
 * Method choices set from the command line: `whereabouts locate --route-kilometre-post <rule>` sets
 * [CHOICE routeKilometrePost] (docs/method.md, every choice in one list; our choice, no source) as the API's
 * options.routeKilometrePost does, and `whereabouts method` names the option. The real CLI in a child process
 * over a real SQLite file holding the demo gazetteer (invented, gazetteer/README.md).
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

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
    expect(choices.find((c) => c.id === 'routeKilometrePost')?.changedBy).toMatch(/CLI locate --route-kilometre-post; API options\.routeKilometrePost/);
  });
});
