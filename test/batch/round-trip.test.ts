/**
 * Original values come back byte for byte, for each delimiter: each fixture's input beside its expected
 * reading (test/fixtures/batch/roundtrip-*.expected.json, written by hand): the values of every row by
 * RFC 4180 (Shafranovich 2005) §2, the exact text of its original fields in the output, and the output
 * read again giving the same values. For comma and semicolon the output is also read by csv-parse in
 * its strict RFC 4180 mode, a reader independent of whereabouts'.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { COORDINATE_FLAGS_COLUMN, FLAG_SEPARATOR } from '../../src/output/csv.ts';
import { parseRecords, type Delimiter } from '../../src/batch/records.ts';
import { startBatchJob } from '../../src/batch/run.ts';
import { FIXTURES, fixtureGazetteer } from './helpers.ts';

interface Expected {
  delimiter: Delimiter;
  rows: { fields: string[]; written: string; flags?: string[] }[];
}

const CASES = ['roundtrip-comma.csv', 'roundtrip-semicolon.csv', 'roundtrip-tab.tsv'];

describe('original values come back byte for byte', async () => {
  const { dir, dbPath } = await fixtureGazetteer();

  for (const name of CASES) {
    it(`${name}: every original field as it stood, or quoted where RFC 4180 forbids it bare, reading back the same`, async () => {
      const expected = JSON.parse(readFileSync(join(FIXTURES, name.replace(/\.\w+$/, '.expected.json')), 'utf8')) as Expected;
      const input = readFileSync(join(FIXTURES, name), 'utf8');
      const output = join(dir, `${name}.out`);
      const summary = await (await startBatchJob({ dbPath, input: join(FIXTURES, name), output, threads: 1 })).done;
      expect(summary.delimiter).toBe(expected.delimiter);
      expect(summary.malformedRows).toBe(0);
      const text = readFileSync(output, 'utf8');
      const d = expected.delimiter;

      // The header as it stood, then each row's originals exactly as expected, each right after a line end.
      const headerLine = input.slice(0, input.indexOf('\r\n'));
      expect(text.startsWith(`${headerLine}${d}`)).toBe(true);
      let at = 0;
      for (const row of expected.rows) {
        const found = text.indexOf(`\r\n${row.written}${d}`, at);
        expect(found, row.written).toBeGreaterThan(at - 1);
        at = found + 1;
      }

      // Read back: the same values by whereabouts' reader, and by csv-parse's strict RFC 4180 mode.
      const width = headerLine.split(d).length;
      const [header, ...rows] = parseRecords(text, d);
      expect(header.fields.slice(0, width)).toEqual(headerLine.split(d));
      expect(rows.map((r) => r.fields.slice(0, width))).toEqual(expected.rows.map((r) => r.fields));
      if (d !== '\t') {
        const strict = parse(text, { delimiter: d, relax_quotes: false, relax_column_count: false }) as string[][];
        expect(strict.slice(1).map((r) => r.slice(0, width))).toEqual(expected.rows.map((r) => r.fields));
      }

      // Decimal commas are read by the coordinate check and left as written (README, Batches).
      const flagsAt = header.fields.indexOf(COORDINATE_FLAGS_COLUMN);
      rows.forEach((r, i) => {
        const want = expected.rows[i].flags;
        if (want) expect(r.fields[flagsAt] === '' ? [] : r.fields[flagsAt].split(FLAG_SEPARATOR)).toEqual(want);
      });
    });
  }

  // A first line "sep=X" declares the delimiter (common practice of spreadsheet exports, no published
  // source). It is not the header: the header is the next line, every row comes back as written, and the
  // line itself is written back first, as it stood, so the output opens in a spreadsheet as the input did.
  for (const [name, declared] of [['roundtrip-comma.csv', ','], ['roundtrip-semicolon.csv', ';'], ['roundtrip-tab.tsv', '\t']] as const) {
    it(`${name} after a "sep=" line: read by the delimiter it declares, the line written back before the header`, async () => {
      const expected = JSON.parse(readFileSync(join(FIXTURES, name.replace(/\.\w+$/, '.expected.json')), 'utf8')) as Expected;
      const plain = readFileSync(join(FIXTURES, name), 'utf8');
      const input = join(dir, `sep-${name}`);
      const declaration = `sep=${declared}\r\n`;
      writeFileSync(input, declaration + plain);
      const output = join(dir, `sep-${name}.out`);
      const summary = await (await startBatchJob({ dbPath, input, output, threads: 1 })).done;
      expect(summary.delimiter).toBe(expected.delimiter);
      expect(summary.malformedRows).toBe(0);
      const text = readFileSync(output, 'utf8');
      const headerLine = plain.slice(0, plain.indexOf('\r\n'));
      expect(text.startsWith(`${declaration}${headerLine}${declared}`)).toBe(true);
      const [, ...rows] = parseRecords(text.slice(declaration.length), declared);
      const width = headerLine.split(declared).length;
      expect(rows.map((r) => r.fields.slice(0, width))).toEqual(expected.rows.map((r) => r.fields));
      let at = 0;
      for (const row of expected.rows) {
        const found = text.indexOf(`\r\n${row.written}${declared}`, at);
        expect(found, row.written).toBeGreaterThan(at - 1);
        at = found + 1;
      }
    });
  }
});
