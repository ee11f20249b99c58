/**
 * How the real CLI reads its arguments: written coordinates that begin with a minus sign are text, not
 * options, and every help text states each default once. Child processes, a real SQLite file.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { beforeAll, describe, expect, it } from 'vitest';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const cli = join(root, 'bin/whereabouts.js');
const db = join(mkdtempSync(join(tmpdir(), 'whereabouts-args-')), 'demo.sqlite');

function whereabouts(...args: string[]) {
  return run(process.execPath, [cli, ...args], { cwd: root, maxBuffer: 16 << 20 });
}

beforeAll(async () => {
  await whereabouts('--db', db, 'import', 'gazetteer/demo.geojson', '--source', 'Isla Verdemar demo gazetteer (invented)');
}, 120_000);

describe('a locality that begins with a minus sign', () => {
  it.each([
    ['-45.3, -131.0', -45.3, -131],
    ['-45.3010 -131.2000', -45.301, -131.2],
  ])('"%s" is read as written coordinates, before or after the options', async (text, latitude, longitude) => {
    for (const args of [['locate', text, '--country-code', 'QV'], ['locate', '--country-code', 'QV', text]]) {
      const body = JSON.parse((await whereabouts('--db', db, ...args, '--json')).stdout);
      expect(body.interpretation.type).toBe('coordinates');
      expect(body.interpretation.coordinates.latitude).toBe(latitude);
      expect(body.interpretation.coordinates.longitude).toBe(longitude);
    }
  });

  it('still refuses an option it does not know', async () => {
    await expect(whereabouts('--db', db, 'locate', '-45.3, -131.0', '--no-such-option')).rejects.toMatchObject({ stderr: expect.stringContaining("unknown option '--no-such-option'") });
  });
});

describe('help texts', () => {
  it.each([[], ['import'], ['gazetteer'], ['locate'], ['batch'], ['merge'], ['cluster-script'], ['serve'], ['doctor']])('whereabouts %s --help names each default once', async (...verb) => {
    const { stdout } = await whereabouts(...verb.flat(), '--help');
    // One entry an option: from a line starting with "-" to the next such line.
    const entries = stdout.split(/\n(?=\s+-)/).map((entry) => entry.replace(/\s+/g, ' '));
    for (const entry of entries) {
      expect((entry.match(/default/gi) ?? []).length, entry).toBeLessThanOrEqual(1);
      expect(entry).not.toMatch(/\(default: \{\}\)/);
    }
  });
});
