/**
 * The end-to-end table (test/support/method-table.ts): every label run through the real CLI
 * (`whereabouts locate --json`) and through the real HTTP service on 127.0.0.1 (POST /api/v1/georeference),
 * both over the demo gazetteer in a temporary SQLite file, and each answer compared with the table's own
 * independent computation of the point and of every uncertainty term.
 */
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { describe, it } from 'vitest';
import { METHOD_TABLE, expectAnswer, type TableRow } from '../support/method-table.ts';
import { BIN, post, useDemoServer } from '../server/helpers.ts';

const run = promisify(execFile);
const demo = useDemoServer();

const through: Record<string, (row: TableRow) => Promise<unknown>> = {
  'the CLI': async ({ label, county }) => {
    const args = ['--db', demo.db.dbPath, 'locate', label, '--country-code', 'QV', ...(county ? ['--county', county] : []), '--json'];
    return JSON.parse((await run(process.execPath, [BIN, ...args])).stdout);
  },
  'the HTTP service': async ({ label, county }) => {
    const { status, json } = await post(`${demo.server.url}/api/v1/georeference`, { locality: label, countryCode: 'QV', ...(county ? { county } : {}) });
    if (status !== 200) throw new Error(`HTTP ${status}: ${JSON.stringify(json)}`);
    return json;
  },
};

for (const [edge, ask] of Object.entries(through)) {
  describe(`every locality type end to end through ${edge}, against an independent computation`, () => {
    for (const row of METHOD_TABLE) {
      it(`${row.language} ${row.type}: "${row.label}"`, async () => expectAnswer(await ask(row), row));
    }
  });
}
