/**
 * Input files in the encodings and shapes collections export, each with its expected reading written by
 * hand beside it (test/fixtures/batch/*.expected.json): every row comes back, in order, with its original
 * values unchanged. Quoting and field splitting follow RFC 4180 (Shafranovich 2005); encodings follow the
 * Unicode Standard (byte order marks, §23.8) and Microsoft's Windows-1252 code page.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { startBatchJob } from '../../src/batch/run.ts';
import { appendedColumnNames, COORDINATE_FLAGS_COLUMN } from '../../src/output/csv.ts';
import { FIXTURES, fixtureGazetteer, readOutput } from './helpers.ts';

interface Expected {
  encoding: string;
  delimiter: string;
  header: string[];
  rows: { fields: string[]; problem?: string; extra?: string }[];
  distinct: number;
}

const CASES = ['windows-1252.csv', 'utf8-bom-crlf.csv', 'utf16le.tsv', 'utf16be.tsv', 'malformed.csv'];

describe('batch input in any encoding and shape', async () => {
  const { dir, dbPath } = await fixtureGazetteer();

  for (const name of CASES) {
    it(`${name}: every row accounted for, originals unchanged`, async () => {
      const expected = JSON.parse(readFileSync(join(FIXTURES, name.replace(/\.\w+$/, '.expected.json')), 'utf8')) as Expected;
      const output = join(dir, `${name}.out`);
      const { done } = await startBatchJob({ dbPath, input: join(FIXTURES, name), output, threads: 1 });
      const summary = await done;
      expect(summary.encoding).toBe(expected.encoding);
      expect(summary.delimiter).toBe(expected.delimiter);
      expect(summary.rows).toBe(expected.rows.length);
      expect(summary.distinctLocalities).toBe(expected.distinct);

      const [header, ...rows] = readOutput(output, expected.delimiter);
      expect(header).toEqual([...expected.header, ...appendedColumnNames(expected.header), COORDINATE_FLAGS_COLUMN]);
      expect(rows).toHaveLength(expected.rows.length);
      const status = header.indexOf('georeferenceVerificationStatus');
      const remarks = header.indexOf('georeferenceRemarks');
      rows.forEach((row, i) => {
        const want = expected.rows[i];
        expect(row.slice(0, expected.header.length)).toEqual(want.fields);
        expect(row[status]).not.toBe('');
        if (want.problem) {
          expect(row[status]).toBe('unable to georeference');
          expect(row[remarks]).toContain(`${want.problem}:`);
        }
        if (want.extra) expect(row[remarks]).toContain(want.extra);
      });
    });
  }

  it('writes UTF-8 without a byte order mark, whatever the input was', () => {
    const bytes = readFileSync(join(dir, 'utf16le.tsv.out'));
    expect([...bytes.subarray(0, 3)]).not.toEqual([0xef, 0xbb, 0xbf]);
    expect(new TextDecoder('utf-8', { fatal: true }).decode(bytes)).toContain('São Bento');
  });

  it('names the missing column when there is no locality column', async () => {
    const { writeFileSync } = await import('node:fs');
    const input = join(dir, 'no-locality.csv');
    writeFileSync(input, 'occurrenceID,county\nx-1,Brava\n');
    await expect(startBatchJob({ dbPath, input, output: join(dir, 'no-locality.out') })).rejects.toThrow(/no "locality" or "verbatimLocality" column/);
  });

  it('says so when the input cannot be read at all', async () => {
    await expect(startBatchJob({ dbPath, input: join(dir, 'absent.csv'), output: join(dir, 'absent.out') })).rejects.toThrow(/cannot read the input .*absent\.csv/);
  });
});
