/**
 * The README's R and Python recipes: the README shows examples/georeference.R and examples/georeference.py
 * verbatim, and both run (Rscript with Debian's r-cran-httr and r-cran-jsonlite; python3 with its standard
 * library) against a real server on 127.0.0.1 over the demo gazetteer. The answers each binds to its
 * records by occurrenceID must be those of the one-record route.
 */
import { execFile } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { post, useDemoServer } from '../server/helpers.ts';

const run = promisify(execFile);
const EXAMPLES = new URL('../../examples/', import.meta.url).pathname;
const README = new URL('../../README.md', import.meta.url).pathname;

const hasRscript = await run('Rscript', ['--version']).then(() => true, () => false);
if (!hasRscript) console.warn('Rscript is missing: the R recipe is not run (install r-base-core r-cran-httr r-cran-jsonlite; npm test does when run as root)');

const demo = useDemoServer();

/** The README's fenced code blocks in a language. */
function readmeBlocks(language: string): string[] {
  const text = readFileSync(README, 'utf8');
  return [...text.matchAll(new RegExp('```' + language + '\\n([\\s\\S]*?)```', 'g'))].map((match) => match[1]);
}

/** Each bound row's answer must be the one-record route's answer for the same record. */
async function expectBoundAsSingle(csv: string) {
  const rows: Record<string, string>[] = parse(csv, { columns: true });
  expect(rows.map((row) => row.occurrenceID)).toEqual(['QV-1', 'QV-2', 'QV-3', 'QV-4']);
  for (const row of rows) {
    const { json } = await post(`${demo.server.url}/api/v1/georeference`, { locality: row.locality, countryCode: row.countryCode });
    expect(row.status, row.occurrenceID).toBe(json.status);
    for (const term of ['decimalLatitude', 'decimalLongitude', 'coordinateUncertaintyInMeters', 'georeferenceRemarks', 'georeferenceVerificationStatus']) {
      // R writes an empty term as NA in its CSV.
      expect(row[term] === 'NA' ? '' : row[term], `${row.occurrenceID} ${term}`).toBe(json.darwinCore[term]);
    }
  }
}

describe('R and Python recipes', () => {
  it('the README shows both files verbatim', () => {
    expect(readmeBlocks('r')).toContain(readFileSync(`${EXAMPLES}georeference.R`, 'utf8'));
    expect(readmeBlocks('python')).toContain(readFileSync(`${EXAMPLES}georeference.py`, 'utf8'));
  });

  it('Python (standard library) binds the answers back by occurrenceID', async () => {
    const { stdout } = await run('python3', [`${EXAMPLES}georeference.py`, demo.server.url]);
    await expectBoundAsSingle(stdout);
  });

  it.skipIf(!hasRscript)('R (httr, jsonlite) binds the answers back by occurrenceID', async () => {
    const { stdout } = await run('Rscript', [`${EXAMPLES}georeference.R`, demo.server.url]);
    await expectBoundAsSingle(stdout);
  });
});
