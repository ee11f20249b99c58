/**
 * The expected file of a fixture test, never overwritten by the test itself. With UPDATE_FIXTURES=1 the
 * current output is written beside it as `<name>.expected.new.json` (only when it differs), and the test
 * still compares with the old file, so it stays red until a person has read the difference and moved the
 * new file over the old one. An expected value regenerated from the code under test has no second source;
 * this keeps a person between the two.
 */
import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';

/**
 * Reads the expected value at `expectedPath` (a `*.expected.json` file); with UPDATE_FIXTURES=1 first
 * writes `actual` beside it as `*.expected.new.json` when it differs, or removes a stale one when it agrees.
 * @example
 *   expect(actual).toEqual(expectedFixture('/repo/test/fixtures/x.expected.json', actual, 2));
 */
export function expectedFixture(expectedPath: string, actual: unknown, indent: number): unknown {
  if (!expectedPath.endsWith('.expected.json')) throw new Error(`${expectedPath}: an expected file is named *.expected.json`);
  const newPath = expectedPath.replace(/\.expected\.json$/, '.expected.new.json');
  const text = `${JSON.stringify(actual, null, indent)}\n`;
  const old = existsSync(expectedPath) ? readFileSync(expectedPath, 'utf8') : undefined;
  if (process.env.UPDATE_FIXTURES === '1') {
    if (old === text) rmSync(newPath, { force: true });
    else writeFileSync(newPath, text);
  }
  if (old === undefined) throw new Error(`no expected file ${expectedPath}: run with UPDATE_FIXTURES=1, read ${newPath}, and rename it`);
  return JSON.parse(old);
}
