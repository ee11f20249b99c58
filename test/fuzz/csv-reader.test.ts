/**
 * Fuzzing the batch CSV reader (readRecords, with inspectInput deciding the encoding) and the writer of
 * original fields (originalLine) with fast-check: files of generated records in four encodings, three
 * delimiters and both line ends, in every shape RFC 4180 (Shafranovich 2005) §2 allows, beside the
 * malformed shapes spreadsheets and people produce. Every record the generator writes must come back
 * once, in order, at the line where it starts: a well-formed one with exactly its fields, a malformed one
 * with its problem stated; and every record written back must read back to the same fields, byte for byte
 * where the output can hold it as it stood. The reference for the bytes of each encoding is Node's own
 * encoder (UTF-8, UTF-16LE) and iconv-lite's (Windows-1252), byte order marks per the Unicode Standard
 * §23.8. Seeds are fixed; a run over 2 s counts as a hang.
 *
 * RFC 4180 §2, the rules cited below by number: (1) records end at a line break; (2) the last may lack
 * one; (3) an optional header of the same form; (4) fields separated by the delimiter, spaces are part
 * of a field; (5) any field may be enclosed in double quotes, and an unenclosed one holds none; (6) a
 * field holding a line break, a double quote or the delimiter is enclosed; (7) a double quote inside an
 * enclosed field is doubled.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import iconv from 'iconv-lite';
import { describe, expect, it } from 'vitest';
import { detectDelimiter, inspectInput } from '../../src/store/input-format.ts';
import { originalLine } from '../../src/batch/original-line.ts';
import { parseRecords, readRecords, type Delimiter, type InputRecord } from '../../src/batch/records.ts';

const FILES = 4000;
const MAX_ROWS = 40;

type Row =
  /** Well-formed by RFC 4180 §2 (4)–(7). */
  | { kind: 'fields'; fields: string[]; quoted: boolean[] }
  /** A field count other than the header's (§2 (4) "should contain the same number of fields"). */
  | { kind: 'ragged'; fields: string[]; quoted: boolean[] }
  /** A quote mark inside an unquoted field (`x"…`), against §2 (5) but written by spreadsheets: kept as a character. */
  | { kind: 'stray-quote'; fields: string[]; quoted: boolean[] }
  /** A quoted field closed before the field ends, on its own line (`"São Bento" x`): plain text as written. */
  | { kind: 'closed-early'; fields: string[]; quoted: boolean[] }
  /** A quote never closed (§2 (7) broken): a problem in CSV, plain text in a tab-separated file. */
  | { kind: 'open-quote'; fields: string[]; quoted: boolean[] };

/** Characters a plain field holds; every accented one is in Windows-1252 (and none is a UTF-8 continuation byte there). */
const PLAIN = ['a', 'Z', '7', ' ', '.', 'á', 'ñ', 'ç', 'é', 'ü', 'ã', 'ô'];
/** What §2 (6) says must be enclosed: the delimiters, a double quote, line breaks (CRLF, and the LF and CR spreadsheets write). */
const SPECIAL = [',', ';', '\t', '"', '"', '\n', '\r\n', '\r'];
const ENCODINGS = ['utf-8', 'utf-8 with BOM', 'utf-16le with BOM', 'windows-1252'] as const;

const plainValue = fc.array(fc.constantFrom(...PLAIN), { maxLength: 8 }).map((chars) => chars.join(''));
/**
 * Any value §2 allows in an enclosed field, with the shapes that break naive readers made common: a
 * quote mark first or last (`"old mill"`), doubled quotes at both ends, a quote beside a delimiter or a
 * line break, line breaks anywhere, the empty value.
 */
const anyValue = fc.oneof(
  { weight: 3, arbitrary: fc.array(fc.constantFrom(...PLAIN, ...SPECIAL), { maxLength: 8 }).map((chars) => chars.join('')) },
  { weight: 2, arbitrary: fc.tuple(fc.constantFrom('"', '""', '"\n', '\r\n"', '",', '";', '"\t', ''), plainValue, fc.constantFrom('"', '""', '\n"', '"\r\n', ',"', ';"', '\t"', '')).map((parts) => parts.join('')) },
  { weight: 1, arbitrary: fc.constantFrom('', '"', '""', '"\n"', '\n', '\r\n') },
);

/** A field as written: enclosed when it must be (§2 (6)), with inner quotes doubled (§2 (7)), and sometimes when it need not be (§2 (5)). */
function writeField(value: string, quoted: boolean, delimiter: Delimiter): string {
  const mustQuote = value.includes(delimiter) || value.includes('"') || value.includes('\n') || value.includes('\r');
  return mustQuote || quoted ? `"${value.replaceAll('"', '""')}"` : value;
}

const file = fc.record({
  columns: fc.integer({ min: 2, max: 6 }),
  delimiter: fc.constantFrom<Delimiter>(',', ';', '\t'),
  lineEnd: fc.constantFrom('\n', '\r\n'),
  encoding: fc.constantFrom(...ENCODINGS),
  finalLineEnd: fc.boolean(),
  kinds: fc.array(fc.constantFrom('fields', 'fields', 'fields', 'ragged', 'stray-quote', 'closed-early'), { minLength: 4, maxLength: MAX_ROWS }),
  /** Where a quote is left open (past the end: nowhere); the rows after it hold no quote mark, so it runs to the end. */
  openQuoteAt: fc.integer({ min: 0, max: MAX_ROWS * 2 }),
  seedValues: fc.array(anyValue, { minLength: 400, maxLength: 400 }),
  seedPlain: fc.array(plainValue, { minLength: 400, maxLength: 400 }),
  seedCounts: fc.array(fc.integer({ min: 1, max: 9 }), { minLength: MAX_ROWS, maxLength: MAX_ROWS }),
  seedQuoted: fc.array(fc.boolean(), { minLength: 400, maxLength: 400 }),
});

type GeneratedFile = typeof file extends fc.Arbitrary<infer T> ? T : never;

/** The rows the generator means, and the text it writes for each (without its line end). */
function build(spec: GeneratedFile): { rows: Row[]; lines: string[]; text: string } {
  let v = 0;
  const header = Array.from({ length: spec.columns }, (_, i) => `col${i}`);
  const rows: Row[] = [];
  spec.kinds.forEach((kind, index) => {
    const afterOpenQuote = index > spec.openQuoteAt;
    const value = () => (afterOpenQuote ? spec.seedPlain : spec.seedValues)[v++ % 400];
    const quoted = () => !afterOpenQuote && spec.seedQuoted[v % 400];
    const plainRow = () => Array.from({ length: spec.columns }, () => spec.seedPlain[v++ % 400]);
    if (index === spec.openQuoteAt) {
      const fields = plainRow();
      fields[spec.columns - 1] = `"left open ${fields[spec.columns - 1]}`;
      rows.push({ kind: 'open-quote', fields, quoted: fields.map(() => false) });
      return;
    }
    if (kind === 'closed-early' && !afterOpenQuote) {
      const fields = plainRow();
      fields[0] = `"${fields[0]}" ${fields[0]}x`;
      rows.push({ kind: 'closed-early', fields, quoted: fields.map(() => false) });
      return;
    }
    let count = spec.columns;
    if (kind === 'ragged') {
      count = spec.seedCounts[index] === spec.columns ? spec.columns + 1 : spec.seedCounts[index];
      if (count === spec.columns) count++;
    }
    // A row of one empty unquoted field is a blank line, which is no row: give it a letter. A ragged row
    // spanning lines is read as a quote left open, line by line (readRecords' documented rule): keep it on one line.
    const fields = Array.from({ length: count }, value)
      .map((f) => (count === spec.columns ? f : f.replaceAll('\r\n', ' ').replaceAll('\n', ' ')))
      .map((f, i) => (count === 1 && i === 0 ? `x${f}` : f));
    const stray = kind === 'stray-quote' && !afterOpenQuote;
    if (stray) fields[0] = `x"${spec.seedPlain[v % 400]}`;
    const quotedFields = fields.map((f, i) => !(stray && i === 0) && (quoted() || /["\r\n,;\t]/.test(f)));
    rows.push({ kind: count !== spec.columns ? 'ragged' : stray ? 'stray-quote' : 'fields', fields, quoted: quotedFields });
  });
  const lines = rows.map((row) => row.fields.map((f, i) => (row.quoted[i] ? writeField(f, true, spec.delimiter) : f)).join(spec.delimiter));
  const text = [header.join(spec.delimiter), ...lines].join(spec.lineEnd) + (spec.finalLineEnd ? spec.lineEnd : '');
  return { rows, lines, text };
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
  const written = { fields: 0, ragged: 0, 'stray-quote': 0, 'closed-early': 0, 'open-quote': 0 };
  const shapes = { 'quote first': 0, 'quote last': 0, 'spans lines (LF)': 0, 'spans lines (CRLF)': 0, 'empty quoted': 0, 'quote beside delimiter': 0, 'quote first and spans lines': 0 };

  it(`returns every record of ${FILES.toLocaleString('en')} files once, with its fields or its problem, and writes it back to the same fields`, { timeout: 120_000 }, async () => {
    await fc.assert(fc.asyncProperty(file, async (spec) => {
      const { rows, lines, text } = build(spec);
      writeFileSync(path, encode(text, spec.encoding));
      const format = await inspectInput(path);
      const ascii = !/[^\x00-\x7f]/.test(text);
      expect(format.encoding).toBe(spec.encoding.startsWith('utf-16le') ? 'utf-16le' : spec.encoding === 'windows-1252' && !ascii ? 'windows-1252' : 'utf-8');
      // §2 (3): the header names the delimiter (no quoted header fields are generated).
      expect(await detectDelimiter(path, format)).toBe(spec.delimiter);
      const read: InputRecord[] = [];
      for await (const record of readRecords(path, format, spec.delimiter)) read.push(record);
      const [header, ...body] = read;
      expect(header.problem).toBeUndefined();
      // §2 (1), (2): one record a row, with or without a line break after the last.
      expect(body).toHaveLength(rows.length);
      let line = 2;
      rows.forEach((row, i) => {
        const got = body[i];
        expect(got.line).toBe(line);
        // §2 (4)–(7): each field's value, quotes undone, line breaks and delimiters inside kept.
        expect(got.fields).toEqual(row.fields);
        const problem = row.kind === 'ragged' || (row.kind === 'open-quote' && spec.delimiter !== '\t');
        if (problem) expect(got.problem).toMatch(new RegExp(`^line ${line}: `));
        else expect(got.problem).toBeUndefined();
        // Written back: byte for byte where the output may hold the field as it stood (a well-formed
        // field, or anything in a tab-separated file); always reading back to the same fields.
        const back = originalLine(got, got.fields.length, spec.delimiter);
        const forced = spec.delimiter !== '\t' && (row.kind === 'stray-quote' || row.kind === 'closed-early' || row.kind === 'open-quote');
        if (!forced) expect(back).toBe(lines[i]);
        const again = parseRecords(`${back}\r\n`, spec.delimiter);
        expect(again).toHaveLength(1);
        expect(again[0].fields).toEqual(row.fields);
        line += 1 + row.fields.join('').split('\n').length - 1;
        written[row.kind]++;
        row.fields.forEach((f, j) => {
          if (!row.quoted[j]) return;
          if (f.startsWith('"')) shapes['quote first']++;
          if (f.endsWith('"')) shapes['quote last']++;
          if (/(^|[^\r])\n/.test(f)) shapes['spans lines (LF)']++;
          if (f.includes('\r\n')) shapes['spans lines (CRLF)']++;
          if (f === '') shapes['empty quoted']++;
          if (/"[,;\t]|[,;\t]"/.test(f)) shapes['quote beside delimiter']++;
          if (f.startsWith('"') && f.includes('\n')) shapes['quote first and spans lines']++;
        });
      });
    }), { numRuns: FILES, seed: 7101, timeout: 2000 });
    // Each kind and shape met often enough to mean something.
    expect(Math.min(...Object.values(written))).toBeGreaterThan(500);
    expect(Math.min(...Object.values(shapes))).toBeGreaterThan(500);
  });

  it('reads the shape of issue 16 as one well-formed row (RFC 4180 §2 (5)–(7))', () => {
    const records = parseRecords('id,note\r\n1,"""old mill""\r\nby the ford"\r\n2,x\r\n', ',');
    expect(records.map((r) => [r.line, r.fields, r.problem])).toEqual([
      [1, ['id', 'note'], undefined],
      [2, ['1', '"old mill"\r\nby the ford'], undefined],
      [4, ['2', 'x'], undefined],
    ]);
  });
});
