/**
 * Every column the batch appends is a Darwin Core term, or proposed_ + one, except the documented flags
 * column. Term list: test/fixtures/darwin-core-terms.txt (TDWG Darwin Core, dwc terms list; CC BY 4.0).
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DARWIN_CORE_TERMS } from '../support/darwin-core-terms.ts';
import { COORDINATE_FLAGS_COLUMN } from '../../src/output/csv.ts';
import { startBatchJob } from '../../src/batch/run.ts';
import { FIXTURES, fixtureGazetteer, readOutput } from './helpers.ts';

describe('appended columns', () => {
  it('are Darwin Core terms, proposed_ + a term, or the documented flags column', async () => {
    const { dir, dbPath } = await fixtureGazetteer();
    const output = join(dir, 'out.csv');
    await (await startBatchJob({ dbPath, input: join(FIXTURES, 'utf8-bom-crlf.csv'), output, threads: 1 })).done;
    const header = readOutput(output, ';')[0];
    const appended = header.slice(5);
    expect(appended).toContain('proposed_decimalLatitude'); // the input has decimalLatitude already
    for (const name of appended) {
      if (name === COORDINATE_FLAGS_COLUMN) continue;
      expect(DARWIN_CORE_TERMS.has(name.replace(/^proposed_/, '')), name).toBe(true);
    }
    expect(DARWIN_CORE_TERMS.has(COORDINATE_FLAGS_COLUMN)).toBe(false);
  });
});
