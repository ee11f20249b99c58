/**
 * The rows of a CSV or tab-separated file, streamed in constant memory, read by RFC 4180 (Shafranovich
 * 2005, §2) with every malformed row kept and its problem stated by line number.
 *
 * The splitting is written here rather than left to csv-parse: csv-parse has one switch (relax_quotes)
 * for both a quote mark inside an unquoted field (kept here, as spreadsheets write them) and a quoted
 * field closed where the field does not end (a quote left open, which must be reported by its line);
 * with the switch on the second is silently merged into the field, with it off the parser stops at the
 * first of either and cannot go on from the next line. Neither keeps the line numbers the README promises.
 */
import type { Delimiter } from '../output/csv.ts';
import { decodedText, type InputFormat } from '../store/input-format.ts';

/** One row as read. `line` is the physical line (1-based) where the row starts. */
export interface InputRecord {
  fields: string[];
  /**
   * Which fields the file enclosed in quote marks (RFC 4180 §2.5): such a field stood as `"` + its
   * value with each `"` doubled + `"`, so the writer gives back its very bytes.
   */
  quoted: boolean[];
  line: number;
  /** What was wrong with the row, with its line number, when it could not be read as the header says. */
  problem?: string;
  /** The row is a line that could not be read, cut at each delimiter as written (quote marks included). */
  splitAsWritten?: boolean;
}

export type { Delimiter } from '../output/csv.ts';

/** The longest row accepted [CHOICE]: a quote left open must not swallow the rest of a large file. */
export const MAX_ROW_CHARACTERS = 1_000_000;

/** Bytes read from the file at a time. */
const READ_BYTES = 1 << 16;

const QUOTE = 0x22;
const LF = 0x0a;
const CR = 0x0d;

/**
 * Every row of the file, the header first. Rows are never dropped: a row whose field count differs from
 * the header's comes back with `problem` set, and so does a line where a quote is left open (a quoted
 * field never closed, or closed by a quote mark that is not followed by a delimiter or a line end,
 * RFC 4180 §2.7, on a later line than it opened); that line is kept as written, cut at each delimiter,
 * and reading goes on from the next line. A quoted row spanning lines whose field count differs from the
 * header's is taken for a quote left open in the same way. A quoted field closed on its own line before
 * the field ends (`"São Bento" x`) is read as the plain text it is, quote marks included. In a
 * tab-separated file, where a quote mark is commonly an ordinary character, a field is read as quoted
 * only when its quoting closes properly; otherwise it is the text up to the next tab, quote marks
 * included, and not a problem. A quote mark inside an unquoted field is kept as a character (RFC 4180
 * §2.5 forbids it; spreadsheets write it). Blank lines are not rows. Lines end at LF or CRLF; lines are
 * counted at line feeds.
 * @example for await (const r of readRecords('in.csv', format, ',')) console.log(r.line, r.fields)
 */
export async function* readRecords(path: string, format: InputFormat, delimiter: Delimiter): AsyncGenerator<InputRecord> {
  // a delimiter declaration line ("sep=;") is skipped by decodedText; lines are still counted from the file's first
  const splitter = new RecordSplitter(delimiter, format.delimiterDeclaration ? 2 : 1);
  // 64 KiB reads [CHOICE]: a chunk's rows are held at once, and on 1 MiB reads the main thread's heap doubled.
  for await (const chunk of decodedText(path, format, READ_BYTES) as AsyncIterable<string>) yield* splitter.push(chunk, false);
  yield* splitter.push('', true);
}

/**
 * The rows of text already in memory, by the same rules as `readRecords`.
 * @example parseRecords('a,b\r\n1,"x ""y"""\r\n', ',')[1].fields // ['1', 'x "y"']
 */
export function parseRecords(text: string, delimiter: Delimiter): InputRecord[] {
  return new RecordSplitter(delimiter).push(text, true);
}

/** A field that could not be read as quoted, and why. */
interface Unclosed {
  why: string;
  /** Whether the text from the opening quote to where reading gave up holds a line end. */
  spansLines: boolean;
}

/** Splits text, given a chunk at a time, into rows; holds the unfinished end of the text between chunks. */
class RecordSplitter {
  private text = '';
  /** Line number of the first character of `text`. */
  private line: number;
  private headerLength: number | undefined;
  private readonly delimiterCode: number;
  /** Positions in `text` of the next delimiter and line feed (-1: not looked for yet; MAX_SAFE_INTEGER: none left). */
  private nextDelimiter = -1;
  private nextLineFeed = -1;

  constructor(private readonly delimiter: Delimiter, firstLine = 1) {
    this.delimiterCode = delimiter.charCodeAt(0);
    this.line = firstLine;
  }

  /** The rows complete in the text read so far; with `last`, every row left. */
  push(chunk: string, last: boolean): InputRecord[] {
    this.text = this.text === '' ? chunk : this.text + chunk;
    this.nextDelimiter = this.nextLineFeed = -1;
    const records: InputRecord[] = [];
    let position = 0;
    while (position < this.text.length) {
      const read = this.readRecord(position, last);
      if (read === undefined) break;
      if (read.record) {
        if (this.headerLength === undefined) this.headerLength = read.record.fields.length;
        records.push(read.record);
      }
      this.line += read.lines;
      position = read.end;
    }
    this.text = this.text.slice(position);
    return records;
  }

  /** The row starting at `start`, where it ends and how many line feeds it holds; undefined when more text is needed. */
  private readRecord(start: number, last: boolean): { end: number; lines: number; record?: InputRecord } | undefined {
    const text = this.text;
    const first = text.charCodeAt(start);
    if (first === LF) return { end: start + 1, lines: 1 };
    if (first === CR && start + 1 < text.length && text.charCodeAt(start + 1) === LF) return { end: start + 2, lines: 1 };
    if (first === CR && start + 1 === text.length) return last ? { end: start + 1, lines: 0 } : undefined;
    const fields: string[] = [];
    const quoted: boolean[] = [];
    let lines = 0;
    let position = start;
    for (;;) {
      let closedAt = -1;
      if (text.charCodeAt(position) === QUOTE) {
        const field = this.quotedField(position, start, last);
        if (field === undefined) return undefined;
        if ('why' in field) {
          // §2.7 broken: closed on its own line, or in a tab-separated file, the field is plain text as
          // written; a CSV quote that runs on to other lines is a quote left open, and the line a problem.
          if (field.spansLines && this.delimiter !== '\t') return this.unreadableLine(start, last, field.why);
        } else {
          fields.push(field.value);
          quoted.push(true);
          lines += field.lineFeeds;
          closedAt = field.end;
        }
      }
      if (closedAt < 0) {
        const end = this.plainFieldEnd(position, last);
        if (end === undefined) return undefined;
        const fieldEnd = end < text.length && text.charCodeAt(end - 1) === CR && text.charCodeAt(end) === LF && end > position ? end - 1 : end;
        fields.push(text.slice(position, fieldEnd));
        quoted.push(false);
        closedAt = fieldEnd;
      }
      position = closedAt;
      const next = text.charCodeAt(position);
      if (next === this.delimiterCode) {
        position++;
        if (position === text.length && !last) return undefined;
        continue;
      }
      let end = position;
      if (next === LF) end = position + 1;
      else if (next === CR) end = position + 2;
      const record: InputRecord = { fields, quoted, line: this.line };
      if (this.headerLength !== undefined && fields.length !== this.headerLength) {
        if (lines > 0) {
          const spanned = lines;
          return this.unreadableLine(start, last, `a quoted field opened on this line is not closed where the field should end, so the row runs on to line ${this.line + spanned} with ${fields.length} fields (the header has ${this.headerLength})`);
        }
        record.problem = raggedProblem(fields, this.headerLength, this.line);
      }
      return { end, lines: lines + (end > position ? 1 : 0), record };
    }
  }

  /**
   * A quoted field starting at `at` (RFC 4180 §2.5–2.7: `""` stands for one quote mark; the closing quote
   * is followed by a delimiter, a line end or the end of the file). Undefined when more text is needed.
   */
  private quotedField(at: number, rowStart: number, last: boolean): { value: string; end: number; lineFeeds: number } | Unclosed | undefined {
    const text = this.text;
    for (let from = at + 1; ;) {
      const close = text.indexOf('"', from);
      if (close < 0 || close - rowStart > MAX_ROW_CHARACTERS) {
        if (close < 0 && !last && text.length - rowStart <= MAX_ROW_CHARACTERS) return undefined;
        return {
          spansLines: true,
          why: close < 0 && text.length - rowStart <= MAX_ROW_CHARACTERS
            ? 'a quoted field opened on this line is never closed (the file ends inside it)'
            : `a quoted field opened on this line runs over ${MAX_ROW_CHARACTERS.toLocaleString('en')} characters (a quote left open?)`,
        };
      }
      if (close + 1 === text.length && !last) return undefined;
      const after = text.charCodeAt(close + 1);
      if (after === QUOTE) {
        from = close + 2;
        continue;
      }
      if (after === CR && close + 2 === text.length && !last) return undefined;
      const ends = close + 1 === text.length || after === this.delimiterCode || after === LF || (after === CR && text.charCodeAt(close + 2) === LF);
      const inner = text.slice(at + 1, close);
      if (!ends) return { why: 'a quoted field opened on this line is not closed where the field should end, so it runs on to later lines', spansLines: inner.includes('\n') };
      return { value: inner.includes('""') ? inner.replaceAll('""', '"') : inner, end: close + 1, lineFeeds: lineFeeds(inner) };
    }
  }

  /** Where an unquoted field starting at `at` ends (a delimiter, a line feed or the end); undefined when more text is needed. */
  private plainFieldEnd(at: number, last: boolean): number | undefined {
    const text = this.text;
    if (this.nextDelimiter !== Number.MAX_SAFE_INTEGER && this.nextDelimiter < at) {
      const found = text.indexOf(this.delimiter, at);
      this.nextDelimiter = found < 0 ? Number.MAX_SAFE_INTEGER : found;
    }
    if (this.nextLineFeed !== Number.MAX_SAFE_INTEGER && this.nextLineFeed < at) {
      const found = text.indexOf('\n', at);
      this.nextLineFeed = found < 0 ? Number.MAX_SAFE_INTEGER : found;
    }
    const end = Math.min(this.nextDelimiter, this.nextLineFeed);
    if (end !== Number.MAX_SAFE_INTEGER) return end;
    return last ? text.length : undefined;
  }

  /** The line starting at `start`, kept as written and cut at each delimiter, with its problem. */
  private unreadableLine(start: number, last: boolean, why: string): { end: number; lines: number; record: InputRecord } | undefined {
    const text = this.text;
    const lineFeed = text.indexOf('\n', start);
    if (lineFeed < 0 && !last) return undefined;
    const lineEnd = lineFeed < 0 ? text.length : lineFeed;
    const written = text.slice(start, lineEnd > start && text.charCodeAt(lineEnd - 1) === CR ? lineEnd - 1 : lineEnd);
    const fields = written.split(this.delimiter);
    const problem = `line ${this.line}: ${why}; the line is kept as written, split at each delimiter, quote marks included`;
    // The cached positions may lie inside the abandoned row: look again from the next line.
    this.nextDelimiter = this.nextLineFeed = -1;
    return { end: lineFeed < 0 ? text.length : lineFeed + 1, lines: 1, record: { fields, quoted: fields.map(() => false), line: this.line, problem, splitAsWritten: true } };
  }
}

function lineFeeds(text: string): number {
  let n = 0;
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) n++;
  return n;
}

function raggedProblem(fields: string[], headerLength: number, line: number): string | undefined {
  if (fields.length < headerLength) {
    return `line ${line}: the row has ${fields.length} fields where the header has ${headerLength}; the missing ones are left empty`;
  }
  const extra = fields.slice(headerLength).map((v) => JSON.stringify(v)).join(', ');
  return `line ${line}: the row has ${fields.length} fields where the header has ${headerLength}; the fields past the header's last column are kept here as written: ${extra}`;
}
