/** The built CLI (bin/whereabouts.js) run as a user runs it, for the tests that hand it real files. */
import { execFile } from 'node:child_process';
import { join } from 'node:path';
import { promisify } from 'node:util';

const run = promisify(execFile);
const cli = join(new URL('../..', import.meta.url).pathname, 'bin/whereabouts.js');

/**
 * The CLI on a store, in the folder `cwd`: its exit status and what it printed, whether it succeeded or not.
 * @example (await whereaboutsOn(store, dir, 'import', 'towns.csv')).code // 0
 */
export async function whereaboutsOn(store: string, cwd: string, ...args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await run(process.execPath, [cli, '--db', store, ...args], { cwd, maxBuffer: 64 << 20 });
    return { code: 0, stdout, stderr };
  } catch (error) {
    const e = error as { code: number; stdout: string; stderr: string };
    return { code: e.code, stdout: e.stdout, stderr: e.stderr };
  }
}
