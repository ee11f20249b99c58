/**
 * Fuzzing the batch CSV reader (readRecords, with inspectInput deciding the encoding) with fast-check:
 * files of generated records in four encodings, three delimiters and both line ends, quoted fields
 * holding delimiters, quote marks and line feeds (RFC 4180 §2), rows with too few or too many fields,
 * stray quote marks inside unquoted fields, and a quote left open on a line. Every record the generator
 * writes must come back once, in order, at the line where it starts: a well-formed one with exactly its
 * fields, a malformed one with its problem stated. The reference for the bytes of each encoding is
 * Node's own encoder (UTF-8, UTF-16LE) and iconv-lite's (Windows-1252), byte order marks per the
 * Unicode Standard §23.8. Seeds are fixed; a run over 2 s counts as a hang.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import iconv from 'iconv-lite';
import { describe, expect, it } from 'vitest';
import { inspectInput } from '../../src/batch/input-format.ts';
import { detectDelimiter, readRecords, type Delimiter, type InputRecord } from '../../src/batch/records.ts';

const FILES = 4000;
const MAX_ROWS = 40;

type Row =
  | { kind: 'fields'; fields: string[]; quoted: boolean[] }
  | { kind: 'ragged'; fields: string[]; quoted: boolean[] }
  | { kind: 'open-quote'; fields: string[] };

/** Characters a plain field holds; every accented one is in Windows-1252 (and none is a UTF-8 continuation byte there). */
const PLAIN = ['a', 'Z', '7', ' ', '.', 'á', 'ñ', 'ç', 'é', 'ü', 'ã', 'ô'];
const SPECIAL = [',', ';', '\t', '"', '\n'];
const ENCODINGS = ['utf-8', 'utf-8 with BOM', 'utf-16le with BOM', 'windows-1252'] as const;

const plainValue = fc.array(fc.constantFrom(...PLAIN), { maxLength: 8 }).map((chars) => chars.join(''));
const anyValue = fc.array(fc.constantFrom(...PLAIN, ...SPECIAL), { maxLength: 8 }).map((chars) => chars.join(''))
  // readRecords' documented limit: a field spanning lines that starts with a quote mark reads as a quote left open.
  .map((value) => (value.startsWith('"') ? value.replaceAll('\n', ' ') : value));

/** A field as written: quoted when it must be (RFC 4180 §2.6, §2.7), and sometimes when it need not be. */
function writeField(value: string, quoted: boolean, delimiter: Delimiter): string {
  const mustQuote = value.includes(delimiter) || value.includes('"') || value.includes('\n');
  return mustQuote || quoted ? `"${value.replaceAll('"', '""')}"` : value;
}

const file = fc.record({
  columns: fc.integer({ min: 2, max: 6 }),
  delimiter: fc.constantFrom<Delimiter>(',', ';', '\t'),
  lineEnd: fc.constantFrom('\n', '\r\n'),
  encoding: fc.constantFrom(...ENCODINGS),
  finalLineEnd: fc.boolean(),
  kinds: fc.array(fc.constantFrom('fields', 'fields', 'fields', 'ragged', 'stray-quote'), { minLength: 4, maxLength: MAX_ROWS }),
  /** Where a quote is left open (past the end: nowhere); the rows after it hold no quote mark, so it runs to the end. */
  openQuoteAt: fc.integer({ min: 0, max: MAX_ROWS * 2 }),
  seedValues: fc.array(anyValue, { minLength: 400, maxLength: 400 }),
  seedPlain: fc.array(plainValue, { minLength: 400, maxLength: 400 }),
  seedCounts: fc.array(fc.integer({ min: 1, max: 9 }), { minLength: MAX_ROWS, maxLength: MAX_ROWS }),
  seedQuoted: fc.array(fc.boolean(), { minLength: 400, maxLength: 400 }),
});

type GeneratedFile = typeof file extends fc.Arbitrary<infer T> ? T : never;

/** The rows the generator means, and the text it writes for them. */
function build(spec: GeneratedFile): { rows: Row[]; text: string } {
  let v = 0;
  const header = Array.from({ length: spec.columns }, (_, i) => `col${i}`);
  const rows: Row[] = [];
  spec.kinds.forEach((kind, index) => {
    const afterOpenQuote = index > spec.openQuoteAt;
    const value = () => (afterOpenQuote ? spec.seedPlain : spec.seedValues)[v++ % 400];
    const quoted = () => !afterOpenQuote && spec.seedQuoted[v % 400];
    if (index === spec.openQuoteAt) {
      const fields = Array.from({ length: spec.columns }, () => spec.seedPlain[v++ % 400]);
      fields[spec.columns - 1] = `"left open ${fields[spec.columns - 1]}`;
      rows.push({ kind: 'open-quote', fields });
      return;
    }
    let count = spec.columns;
    if (kind === 'ragged') {
      count = spec.seedCounts[index] === spec.columns ? spec.columns + 1 : spec.seedCounts[index];
      if (count === spec.columns) count++;
    }
    // A row of one empty field is a blank line, which is no row: give it a letter. A ragged row spanning
    // lines is read as a quote left open, line by line (readRecords' documented rule): keep it on one line.
    const fields = Array.from({ length: count }, value)
      .map((f) => (count === spec.columns ? f : f.replaceAll('\n', ' ')))
      .map((f, i) => (count === 1 && i === 0 ? `x${f}` : f));
    if (kind === 'stray-quote' && !afterOpenQuote) fields[0] = `x"${spec.seedPlain[v % 400]}`;
    rows.push({ kind: count === spec.columns ? 'fields' : 'ragged', fields, quoted: fields.map(quoted) });
  });
  const lines = [header.join(spec.delimiter), ...rows.map((row) =>
    row.kind === 'open-quote' ? row.fields.join(spec.delimiter) : row.fields.map((f, i) => writeField(f, row.quoted[i] && !f.startsWith('x"'), spec.delimiter)).join(spec.delimiter))];
  return { rows, text: lines.join(spec.lineEnd) + (spec.finalLineEnd ? spec.lineEnd : '') };
}

function encode(text: string, encoding: (typeof ENCODINGS)[number]): Buffer {
  if (encoding === 'utf-8') return Buffer.from(text, 'utf8');
  if (encoding === 'utf-8 with BOM') return Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text, 'utf8')]);
  if (encoding === 'utf-16le with BOM') return Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]);
  return iconv.encode(text, 'windows-1252');
}

describe(`CSV reader fuzzing, ${FILES.toLocaleString('en')} generated files of up to ${MAX_ROWS} records`, () => {
  const dir = mkdtempSync(join(tmpdir(), 'whereabouts-fuzz-csv-'));
  const path = join(dir, 'generated.csv');
  const written = { fields: 0, ragged: 0, 'open-quote': 0 };

  it(`returns every record of ${FILES.toLocaleString('en')} files once, with its fields or its problem`, { timeout: 60_000 }, async () => {
    await fc.assert(fc.asyncProperty(file, async (spec) => {
      const { rows, text } = build(spec);
      writeFileSync(path, encode(text, spec.encoding));
      const format = await inspectInput(path);
      const ascii = !/[^\x00-\x7f]/.test(text);
      expect(format.encoding).toBe(spec.encoding.startsWith('utf-16le') ? 'utf-16le' : spec.encoding === 'windows-1252' && !ascii ? 'windows-1252' : 'utf-8');
      expect(await detectDelimiter(path, format)).toBe(spec.delimiter);
      const read: InputRecord[] = [];
      for await (const record of readRecords(path, format, spec.delimiter)) read.push(record);
      const [header, ...body] = read;
      expect(header.problem).toBeUndefined();
      expect(body).toHaveLength(rows.length);
      let line = 2;
      rows.forEach((row, i) => {
        const got = body[i];
        expect(got.line).toBe(line);
        expect(got.fields).toEqual(row.fields);
        if (row.kind === 'fields') expect(got.problem).toBeUndefined();
        else expect(got.problem).toMatch(new RegExp(`^line ${line}: `));
        line += 1 + row.fields.join('').split('\n').length - 1;
      });
      for (const row of rows) written[row.kind]++;
    }), { numRuns: FILES, seed: 7101, timeout: 2000 });
    // Each kind met often enough to mean something (with this seed: 33,284 well-formed, 8,236 ragged, 949 left open).
    expect(Math.min(...Object.values(written))).toBeGreaterThan(500);
  });
});
