/**
 * The parts of a split batch (partition.ts) joined back into one output: the header once, then every row
 * in input order, so the file is byte for byte what one machine writes for the same input, settings,
 * version, gazetteer and run timestamp. Parts that do not belong together are refused before anything is
 * written; the output appears, whole, only at the end (written beside it, then renamed).
 */
import { closeSync, fsyncSync, openSync, readSync, renameSync, rmSync, writeSync } from 'node:fs';
import { resolve } from 'node:path';
import { sameSources } from '../store/jobs.ts';
import type { Source } from '../match/types.ts';
import { PART_FILE_MAGIC, type PartMeta } from './partition.ts';

export interface MergeOptions {
  /** The part files, in any order: one for each part 0 … N-1. */
  parts: string[];
  /** Target file, or '-' for standard output. */
  output: string;
  /** When given, the parts must have been made from this input (its SHA-256) … */
  inputSha256?: string;
  /** … and against a gazetteer with these sources (their content hashes). */
  sources?: Source[];
  /** Where output '-' goes (default process.stdout). */
  stdout?: NodeJS.WritableStream;
}

export interface MergeSummary {
  parts: number;
  rows: number;
  runTimestamp: string;
  outputPath: string;
}

/** Bytes read from a part file at a time [CHOICE]. */
const READ_CHUNK = 1 << 20;
/** Bytes gathered before a write to the output [CHOICE]. */
const WRITE_CHUNK = 1 << 20;

/**
 * Check that the parts belong together and join them.
 * @example await mergeParts({ parts: ['p0.part', 'p1.part'], output: 'out.csv' }) // { parts: 2, rows: 100000, … }
 */
export async function mergeParts(options: MergeOptions): Promise<MergeSummary> {
  if (options.parts.length === 0) throw new Error('merge needs the part files (one for each part)');
  const readers = options.parts.map((path) => new PartReader(resolve(path)));
  try {
    const meta = checkParts(readers, options);
    const header = readers.map((r) => r.header());
    const differing = readers.findIndex((_, i) => !header[i].equals(header[0]));
    if (differing >= 0) throw new Error(`${readers[differing].path} has another header line than ${readers[0].path}, so it is not a part of the same input`);
    const target = options.output === '-' ? undefined : resolve(options.output);
    const partial = target ? `${target}.merging` : undefined;
    const out = new OutputWriter(partial, options.stdout ?? process.stdout);
    try {
      await out.write(header[0]);
      // Each part's rows come in input order, so the next row is always at the head of one part.
      const byNextRow = new Map<number, PartReader>();
      for (const r of readers) r.advance(byNextRow);
      for (let row = 1; row <= meta.inputRows; row++) {
        const reader = byNextRow.get(row);
        if (!reader) throw new Error(`no part holds row ${row} of the input: ${missingRowReason(readers, row)}`);
        byNextRow.delete(row);
        await out.write(reader.rowBytes());
        reader.advance(byNextRow);
      }
      const extra = readers.find((r) => r.nextRow !== undefined);
      if (extra) throw new Error(`${extra.path} holds row ${extra.nextRow}, past the input's ${meta.inputRows} rows: the part file is damaged`);
      await out.finish();
    } catch (error) {
      out.abandon();
      throw error;
    }
    if (partial && target) renameSync(partial, target);
    return { parts: readers.length, rows: meta.inputRows, runTimestamp: meta.runTimestamp, outputPath: target ?? '-' };
  } finally {
    for (const r of readers) r.close();
  }
}

/** The checks before merging, each with the file at fault and what differs. */
function checkParts(readers: PartReader[], options: MergeOptions): PartMeta {
  const first = readers[0].meta;
  const seen = new Map<number, string>();
  for (const r of readers) {
    const m = r.meta;
    const differs = (what: string, mine: unknown, theirs: unknown) =>
      new Error(`${r.path} and ${readers[0].path} are not parts of one batch: their ${what} differ (${String(mine)} and ${String(theirs)})`);
    if (m.inputSha256 !== first.inputSha256) throw differs('inputs (SHA-256)', m.inputSha256, first.inputSha256);
    if (m.settings !== first.settings) throw differs('settings', m.settings, first.settings);
    if (m.version !== first.version) throw differs('whereabouts versions', m.version, first.version);
    if (!sameSources(m.sources, first.sources)) throw differs('gazetteers (source content hashes and ranks)', sourceList(m.sources), sourceList(first.sources));
    if (m.runTimestamp !== first.runTimestamp) throw differs('run timestamps', m.runTimestamp, first.runTimestamp);
    if (m.parts !== first.parts) throw differs('part counts', m.parts, first.parts);
    const twin = seen.get(m.part);
    if (twin) throw new Error(`${r.path} and ${twin} are both part ${m.part} of ${m.parts}`);
    seen.set(m.part, r.path);
  }
  const missing = Array.from({ length: first.parts }, (_, i) => i).filter((i) => !seen.has(i));
  if (missing.length > 0) {
    throw new Error(`part${missing.length > 1 ? 's' : ''} ${missing.slice(0, 10).join(', ')}${missing.length > 10 ? ', …' : ''} of ${first.parts} missing: give every part file of the batch`);
  }
  if (options.inputSha256 !== undefined && options.inputSha256 !== first.inputSha256) {
    throw new Error(`the parts were made from another input (SHA-256 ${first.inputSha256}) than the one given (${options.inputSha256})`);
  }
  if (options.sources !== undefined && !sameSources(options.sources, first.sources)) {
    throw new Error(`the parts were made against another gazetteer (sources ${sourceList(first.sources)}) than the one given (${sourceList(options.sources)})`);
  }
  return first;
}

function sourceList(sources: Source[]): string {
  return sources.map((s) => `${s.id}:${s.contentHash.slice(0, 12)}${s.priority ? ` ranked ${s.priority}` : ''}`).join(' ') || 'none';
}

function missingRowReason(readers: PartReader[], row: number): string {
  const heads = readers.map((r) => `${r.path} is at ${r.nextRow ?? 'its end'}`).join(', ');
  return `a part file is damaged or was cut short (${heads}; row ${row} should be next)`;
}

/** A part file read frame by frame, with a buffer of its bytes. */
class PartReader {
  readonly meta: PartMeta;
  /** The row number of the frame at the head, or undefined at the end of the file. */
  nextRow: number | undefined;
  private readonly fd: number;
  private buffer = Buffer.alloc(0);
  private ended = false;
  private row: Buffer = Buffer.alloc(0);

  constructor(readonly path: string) {
    try {
      this.fd = openSync(path, 'r');
    } catch (error) {
      throw new Error(`cannot read the part file ${path}: ${(error as NodeJS.ErrnoException).code ?? String(error)}`);
    }
    if (this.line() !== PART_FILE_MAGIC) throw new Error(`${path} is not a whereabouts part file (write one with: whereabouts batch … --part K/N)`);
    try {
      this.meta = JSON.parse(this.line() ?? '') as PartMeta;
    } catch {
      throw new Error(`${path}: its second line, what the part was made from, is not readable JSON; the file is damaged`);
    }
  }

  /** The output's header line. */
  header(): Buffer {
    const label = this.line();
    const match = label ? /^H (\d+)$/.exec(label) : null;
    if (!match) throw new Error(`${this.path}: the header line's frame is missing; the file is damaged`);
    return this.take(Number(match[1]));
  }

  /** Read the next frame and put this reader in the map under its row number. */
  advance(byNextRow: Map<number, PartReader>): void {
    const label = this.line();
    if (label === undefined) {
      this.nextRow = undefined;
      return;
    }
    const match = /^R (\d+) (\d+)$/.exec(label);
    if (!match) throw new Error(`${this.path}: "${label.slice(0, 40)}" is not a row frame; the file is damaged`);
    const row = Number(match[1]);
    if (this.nextRow !== undefined && row <= this.nextRow) throw new Error(`${this.path}: row ${row} follows row ${this.nextRow}; the file is damaged`);
    this.row = this.take(Number(match[2]));
    this.nextRow = row;
    byNextRow.set(row, this);
  }

  /** The bytes of the row at the head. */
  rowBytes(): Buffer {
    return this.row;
  }

  close(): void {
    closeSync(this.fd);
  }

  /** The next line without its line feed, or undefined at the end of the file. */
  private line(): string | undefined {
    for (;;) {
      const end = this.buffer.indexOf(0x0a);
      if (end >= 0) {
        const text = this.buffer.subarray(0, end).toString('utf8');
        this.buffer = this.buffer.subarray(end + 1);
        return text;
      }
      if (!this.fill()) {
        if (this.buffer.length > 0) throw new Error(`${this.path} ends part way through a line; the file was cut short`);
        return undefined;
      }
    }
  }

  private take(bytes: number): Buffer {
    while (this.buffer.length < bytes) {
      if (!this.fill()) throw new Error(`${this.path} ends part way through a row; the file was cut short`);
    }
    const taken = Buffer.from(this.buffer.subarray(0, bytes));
    this.buffer = this.buffer.subarray(bytes);
    return taken;
  }

  private fill(): boolean {
    if (this.ended) return false;
    const chunk = Buffer.allocUnsafe(READ_CHUNK);
    const n = readSync(this.fd, chunk, 0, READ_CHUNK, null);
    if (n === 0) {
      this.ended = true;
      return false;
    }
    this.buffer = this.buffer.length === 0 ? chunk.subarray(0, n) : Buffer.concat([this.buffer, chunk.subarray(0, n)]);
    return true;
  }
}

/** The merged bytes, gathered into large writes, to a file (fsynced) or to a stream. */
class OutputWriter {
  private pending: Buffer[] = [];
  private size = 0;
  private readonly fd: number | undefined;

  constructor(private readonly path: string | undefined, private readonly stream: NodeJS.WritableStream) {
    this.fd = path ? openSync(path, 'w') : undefined;
  }

  async write(bytes: Buffer): Promise<void> {
    this.pending.push(bytes);
    this.size += bytes.length;
    if (this.size >= WRITE_CHUNK) await this.flush();
  }

  async finish(): Promise<void> {
    await this.flush();
    if (this.fd !== undefined) {
      fsyncSync(this.fd);
      closeSync(this.fd);
    }
  }

  abandon(): void {
    if (this.fd === undefined) return;
    closeSync(this.fd);
    rmSync(this.path!, { force: true });
  }

  private async flush(): Promise<void> {
    const bytes = Buffer.concat(this.pending);
    this.pending = [];
    this.size = 0;
    if (this.fd !== undefined) {
      for (let written = 0; written < bytes.length; ) written += writeSync(this.fd, bytes, written, bytes.length - written);
    } else if (!this.stream.write(bytes)) {
      await new Promise<void>((done) => this.stream.once('drain', () => done()));
    }
  }
}
