/**
 * A batch cut into parts (`--part K/N`) and merged gives the bytes of one run (common practice, no
 * source: compare bytes), for CSV and tab-separated input with malformed rows; the merge refuses parts
 * that do not belong together, each with a message naming what differs.
 */
import { copyFileSync, readFileSync, writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { mergeParts } from '../../src/batch/merge.ts';
import { parsePartSpec, partOfKey } from '../../src/batch/partition.ts';
import { gazetteerSources, startBatchJob, type BatchJobOptions } from '../../src/batch/run.ts';
import { FIXTURES, fixtureGazetteer } from './helpers.ts';

const RUN_TIMESTAMP = '2026-05-01T09:30:00Z';

async function batch(options: BatchJobOptions) {
  return (await startBatchJob(options)).done;
}

/** Every part of `input`, written as `<dir>/<name>-K.wpart`. */
async function parts(dbPath: string, input: string, count: number, dir: string, extra: Partial<BatchJobOptions> = {}): Promise<string[]> {
  const paths: string[] = [];
  for (let index = 0; index < count; index++) {
    const output = join(dir, `${basename(input)}-${count}-${index}${extra.coverAmbiguous ? '-cover' : ''}.wpart`);
    await batch({ dbPath, input, output, part: { index, count }, runTimestamp: RUN_TIMESTAMP, ...extra });
    paths.push(output);
  }
  return paths;
}

describe('partOfKey', () => {
  it('takes the first 6 bytes of SHA-256 as the number to divide', () => {
    // SHA-256("abc") begins ba7816bf8f01 (FIPS 180-2, appendix B.1): 0xba7816bf8f01 = 205,024,940,494,593.
    expect(partOfKey('abc', 1_000_000)).toBe(205_024_940_494_593 % 1_000_000);
    expect(partOfKey('abc', 7)).toBe(205_024_940_494_593 % 7);
  });

  it('puts rows that could not be read in part 0', () => {
    expect(partOfKey(undefined, 5)).toBe(0);
  });
});

describe('parsePartSpec', () => {
  it('reads K/N with K from 0', () => {
    expect(parsePartSpec('3/4')).toEqual({ index: 3, count: 4 });
  });

  it.each(['4/4', '1', '-1/4', '0/0', 'a/b'])('refuses %s', (text) => {
    expect(() => parsePartSpec(text)).toThrow(/--part takes K\/N/);
  });
});

describe('a batch in parts, merged', () => {
  it.each([
    ['malformed.csv', 3],
    ['utf16le.tsv', 2],
    ['malformed.csv', 1],
  ])('gives the bytes of one run for %s in %i parts', async (fixture, count) => {
    const { dir, dbPath } = await fixtureGazetteer();
    const input = join(FIXTURES, fixture);
    await batch({ dbPath, input, output: join(dir, 'one.csv'), runTimestamp: RUN_TIMESTAMP });
    const written = await parts(dbPath, input, count, dir);
    const summary = await mergeParts({ parts: [...written].reverse(), output: join(dir, 'merged.csv'), sources: gazetteerSources(dbPath) });
    expect(readFileSync(join(dir, 'merged.csv')).equals(readFileSync(join(dir, 'one.csv')))).toBe(true);
    expect(summary.runTimestamp).toBe(RUN_TIMESTAMP);
  });

  it('refuses parts that do not belong together, and writes nothing', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const input = join(FIXTURES, 'malformed.csv');
    const [p0, p1, p2] = await parts(dbPath, input, 3, dir);
    const [, covered1] = await parts(dbPath, input, 3, dir, { coverAmbiguous: true });
    const [q0] = await parts(dbPath, join(FIXTURES, 'windows-1252.csv'), 3, dir);
    const output = join(dir, 'merged.csv');
    const merge = (list: string[], more: { inputSha256?: string } = {}) => mergeParts({ parts: list, output, ...more });
    await expect(merge([p0, p1])).rejects.toThrow(/part 2 of 3 missing/);
    await expect(merge([p0, p1, p1])).rejects.toThrow(/are both part 1 of 3/);
    await expect(merge([p0, covered1, p2])).rejects.toThrow(/their settings differ/);
    await expect(merge([q0, p1, p2])).rejects.toThrow(/their inputs \(SHA-256\) differ/);
    await expect(merge([p0, p1, p2], { inputSha256: '0'.repeat(64) })).rejects.toThrow(/made from another input/);
    await expect(mergeParts({ parts: [p0, p1, p2], output, sources: [] })).rejects.toThrow(/made against another gazetteer/);

    const cut = join(dir, 'cut.wpart');
    const bytes = readFileSync(p1);
    writeFileSync(cut, bytes.subarray(0, bytes.length - 5));
    await expect(merge([p0, cut, p2])).rejects.toThrow(/cut short/);
    const other = join(dir, 'other-timestamp.wpart');
    copyFileSync(p2, other);
    writeFileSync(other, readFileSync(other, 'utf8').replace(RUN_TIMESTAMP, '2026-05-02T09:30:00Z'));
    await expect(merge([p0, p1, other])).rejects.toThrow(/their run timestamps differ/);
    await expect(merge([p0, p1, input])).rejects.toThrow(/is not a whereabouts part file/);
    expect(() => readFileSync(output)).toThrow();
  });

  it('needs an output file and a run timestamp for a part', async () => {
    const { dbPath } = await fixtureGazetteer();
    const input = join(FIXTURES, 'malformed.csv');
    await expect(startBatchJob({ dbPath, input, part: { index: 0, count: 2 }, runTimestamp: RUN_TIMESTAMP })).rejects.toThrow(/needs an output file/);
    await expect(startBatchJob({ dbPath, input, output: '/tmp/x.wpart', part: { index: 0, count: 2 } })).rejects.toThrow(/needs --run-timestamp/);
    await expect(startBatchJob({ dbPath, input, output: '/tmp/x.csv', runTimestamp: '2026-05-01 09:30' })).rejects.toThrow(/UTC time to the second/);
  });
});
