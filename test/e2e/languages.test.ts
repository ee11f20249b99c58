/**
 * The end-to-end table (test/support/method-table.ts: every locality type in English, Spanish, Portuguese
 * and French) through a third edge, the real CLI's `whereabouts batch`, against the demo gazetteer in a
 * temporary SQLite file: each output row's status, locality type, reported point and reported total
 * compared with the table's independent computation. Label conventions per language are those of the
 * parser's corpus (test/fixtures/parse); the places are the invented ones of gazetteer/demo.geojson.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import { beforeAll, describe, it } from 'vitest';
import { METHOD_TABLE, expectBatchRow } from '../support/method-table.ts';
import { BIN, demoDatabase } from '../server/helpers.ts';

const run = promisify(execFile);
const id = (index: number) => `table-${index + 1}`;

let output: Record<string, string>[];

beforeAll(async () => {
  const db = await demoDatabase();
  const input = join(mkdtempSync(join(tmpdir(), 'whereabouts-languages-')), 'labels.csv');
  writeFileSync(input, stringify([['occurrenceID', 'locality', 'countryCode', 'county'], ...METHOD_TABLE.map((row, i) => [id(i), row.label, 'QV', row.county ?? ''])]));
  const out = input.replace(/\.csv$/, '-out.csv');
  await run(process.execPath, [BIN, '--db', db.dbPath, 'batch', input, '--out', out, '--quiet']);
  output = parse(readFileSync(out), { columns: true }) as Record<string, string>[];
  db.remove();
}, 120_000);

describe('every locality type in four languages through the CLI batch, against an independent computation', () => {
  METHOD_TABLE.forEach((row, i) => {
    it(`${row.language} ${row.type}: "${row.label}"`, () => expectBatchRow(output.find((r) => r.occurrenceID === id(i))!, row));
  });
});
