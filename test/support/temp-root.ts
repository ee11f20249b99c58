/**
 * Vitest global setup: gives the test run its own temporary folder and removes it, with everything the
 * tests and the commands they spawn left there, when the run ends. Tests call `tmpdir()` as usual; the
 * folder is handed on through TMPDIR, which Node's `os.tmpdir()`, SQLite, GDAL and Chromium all read.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export default function tempRoot(): () => void {
  const root = mkdtempSync(join(tmpdir(), 'whereabouts-test-run-'));
  process.env.TMPDIR = root;
  return () => rmSync(root, { recursive: true, force: true });
}
