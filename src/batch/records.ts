/**
 * The rows of a CSV or tab-separated file (RFC 4180 quoting), streamed through csv-parse in constant
 * memory, with every malformed row kept and its problem stated by line number.
 */
import { createReadStream } from 'node:fs';
import { Transform, type TransformCallback } from 'node:stream';
import { parse } from 'csv-parse';
import iconv from 'iconv-lite';
import type { Delimiter } from '../output/csv.ts';
import type { InputFormat } from './input-format.ts';

/** One row as read. `line` is the physical line (1-based) where the row starts. */
export interface InputRecord {
  fields: string[];
  line: number;
  /** What was wrong with the row, with its line number, when it could not be read as the header says. */
  problem?: string;
}

export type { Delimiter } from '../output/csv.ts';

/** The longest row accepted [CHOICE]: a quote left open must not swallow the rest of a large file. */
export const MAX_ROW_CHARACTERS = 1_000_000;

/** The decoded text of the file, after its byte order mark. */
function decodedText(path: string, format: InputFormat): NodeJS.ReadableStream {
  return createReadStream(path, { start: format.bomBytes, highWaterMark: 1 << 20 }).pipe(iconv.decodeStream(format.encoding));
}

/**
 * The delimiter of the header line: whichever of comma, semicolon and tab occurs most often outside
 * quotes (comma on a tie or when none occurs, as RFC 4180 has it).
 * @example await detectDelimiter('records.tsv', format) // '\t'
 */
export async function detectDelimiter(path: string, format: InputFormat): Promise<Delimiter> {
  let header = '';
  for await (const chunk of decodedText(path, format) as AsyncIterable<string>) {
    header += chunk;
    const end = header.indexOf('\n');
    if (end >= 0 || header.length > 65_536) {
      header = end >= 0 ? header.slice(0, end) : header;
      break;
    }
  }
  const counts = new Map<Delimiter, number>([[',', 0], [';', 0], ['\t', 0]]);
  let quoted = false;
  for (const ch of header) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && counts.has(ch as Delimiter)) counts.set(ch as Delimiter, counts.get(ch as Delimiter)! + 1);
  }
  let best: Delimiter = ',';
  for (const [delimiter, count] of counts) if (count > counts.get(best)!) best = delimiter;
  return best;
}

/**
 * Every row of the file, the header first. Rows are never dropped: a row whose field count differs from
 * the header's, or a line where a quote is left open, comes back with `problem` set; after a quote left
 * open, reading starts again on the next line, and the line itself is kept split at each delimiter.
 * Blank lines are not rows and are passed over. Lines are counted at line feeds (a file that ends its
 * lines with a carriage return alone counts as one line). A quoted field that spans lines and starts with
 * a quote mark the parser had to keep (a quote not closed where the field should end) is read as a quote
 * left open. Reading again after such a line starts from the top of the file, so a file with many of
 * them reads slowly.
 * @example for await (const r of readRecords('in.csv', format, ',')) console.log(r.line, r.fields)
 */
export async function* readRecords(path: string, format: InputFormat, delimiter: Delimiter): AsyncGenerator<InputRecord> {
  let headerLength: number | undefined;
  let segment: Segment = { firstLine: 1 };
  for (;;) {
    const skipped = new LineSkipper(segment.badLine ? segment.badLine.line - 1 : segment.firstLine - 1, Boolean(segment.badLine));
    const parser = decodedText(path, format).pipe(skipped).pipe(
      parse({ delimiter, relax_column_count: true, relax_quotes: true, max_record_size: MAX_ROW_CHARACTERS }),
    );
    const firstLine = segment.firstLine;
    let linesRead = 0;
    let restart: Segment | undefined;
    try {
      for await (const record of parser as AsyncIterable<string[]>) {
        if (skipped.captured !== undefined && segment.badLine) {
          const text = skipped.captured;
          yield { fields: text.split(delimiter), line: segment.badLine.line, problem: segment.badLine.problem };
          skipped.captured = undefined;
        }
        // Line ends stand only inside quoted fields or at the row's end, so a row spans 1 + its fields' line feeds.
        const line = firstLine + linesRead;
        const lastLine = line + record.reduce((n, field) => n + lineFeeds(field), 0);
        linesRead += lastLine - line + 1;
        if (record.length === 1 && record[0] === '') continue;
        if (headerLength === undefined) {
          headerLength = record.length;
          yield { fields: record, line };
          continue;
        }
        if (lastLine > line && (record.length !== headerLength || record.some((f) => f.startsWith('"') && lineFeeds(f) > 0))) {
          const fields = record.length;
          restart = badLineSegment(line, () => `a quoted field opened on this line is not closed where the field should end, so the row runs on to line ${lastLine} with ${fields} fields (the header has ${headerLength})`);
          break;
        }
        yield { fields: record, line, problem: raggedProblem(record, headerLength, line) };
      }
    } catch (error) {
      if (!String((error as { code?: string }).code).startsWith('CSV_')) throw error;
      const line = firstLine + linesRead;
      restart = badLineSegment(line, () => parseProblem(error));
    }
    if (skipped.captured !== undefined && segment.badLine) {
      yield { fields: skipped.captured.split(delimiter), line: segment.badLine.line, problem: segment.badLine.problem };
    }
    (parser as unknown as { destroy(): void }).destroy();
    if (!restart) return;
    segment = restart;
  }
}

/** Where reading starts again: after a line that could not be read, which is kept as a row of its own. */
interface Segment {
  firstLine: number;
  badLine?: { line: number; problem: string };
}

function lineFeeds(text: string): number {
  let n = 0;
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) n++;
  return n;
}

function badLineSegment(line: number, why: () => string): Segment {
  return {
    firstLine: line + 1,
    badLine: { line, problem: `line ${line}: ${why()}; the line is kept as written, split at each delimiter, quote marks included` },
  };
}

function parseProblem(error: unknown): string {
  const code = (error as { code?: string }).code;
  if (code === 'CSV_QUOTE_NOT_CLOSED') return 'a quoted field opened on this line is never closed (the file ends inside it)';
  if (code === 'CSV_MAX_RECORD_SIZE') return `a row starting on this line runs over ${MAX_ROW_CHARACTERS.toLocaleString('en')} characters (a quote left open?)`;
  return error instanceof Error ? error.message : String(error);
}

function raggedProblem(record: string[], headerLength: number, line: number): string | undefined {
  if (record.length === headerLength) return undefined;
  if (record.length < headerLength) {
    return `line ${line}: the row has ${record.length} fields where the header has ${headerLength}; the missing ones are left empty`;
  }
  const extra = record.slice(headerLength).map((v) => JSON.stringify(v)).join(', ');
  return `line ${line}: the row has ${record.length} fields where the header has ${headerLength}; the fields past the header's last column are kept here as written: ${extra}`;
}

/**
 * Passes decoded text through after dropping its first `skip` lines; with `capture`, the next line is
 * held in `captured` (without its line end) instead of being passed on.
 */
class LineSkipper extends Transform {
  captured?: string;
  private toSkip: number;
  private capturing: boolean;
  private partial = '';

  constructor(skip: number, capture: boolean) {
    super({ decodeStrings: false, encoding: 'utf8' });
    this.toSkip = skip;
    this.capturing = capture;
  }

  override _transform(chunk: string | Buffer, _encoding: BufferEncoding, done: TransformCallback): void {
    let text = String(chunk);
    while (this.toSkip > 0 && text.length > 0) {
      const end = text.indexOf('\n');
      if (end < 0) return done();
      this.toSkip--;
      text = text.slice(end + 1);
    }
    if (this.toSkip === 0 && this.capturing) {
      const end = text.indexOf('\n');
      if (end < 0) {
        this.partial += text;
        return done();
      }
      this.captured = (this.partial + text.slice(0, end)).replace(/\r$/, '');
      this.capturing = false;
      text = text.slice(end + 1);
    }
    done(null, text.length > 0 ? text : undefined);
  }

  override _flush(done: TransformCallback): void {
    if (this.capturing && this.toSkip === 0) {
      this.captured = this.partial.replace(/\r$/, '');
      this.capturing = false;
    }
    done();
  }
}
