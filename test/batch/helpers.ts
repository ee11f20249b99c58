/** Shared set-up for the batch tests: a real SQLite gazetteer imported from the invented fixture. */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
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
