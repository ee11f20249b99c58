/**
 * A Darwin Core Archive through the page in a real browser (Debian's chromium through playwright-core),
 * against a real server on 127.0.0.1 over a real SQLite gazetteer: the archive (built by the rules of
 * the Darwin Core text guide, Darwin Core Maintenance Group 2023, TDWG, "guide §";
 * test/support/demo-archive.ts) is picked and uploaded, its core rows are listed for review, one is
 * accepted, and the new archive is downloaded and read back with yauzl and csv-parse.
 */
import { mkdirSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { unzip } from '../batch/helpers.ts';
import { ARCHIVE_FILES, coreRows, multimedia, zipFiles } from '../support/demo-archive.ts';
import { demoDatabase, listen, type RunningServer, type TempDatabase } from '../server/helpers.ts';
import { openPage, uploadBatch, type TestBrowser } from './browser.ts';

const ARTIFACTS = new URL('../artifacts/', import.meta.url).pathname;
let db: TempDatabase;
let server: RunningServer;
let browser: TestBrowser;
let page: Page;
const archive = join(mkdtempSync(join(tmpdir(), 'whereabouts-page-archive-')), 'herbarium-dwca.zip');

beforeAll(async () => {
  mkdirSync(ARTIFACTS, { recursive: true });
  await zipFiles(archive, ARCHIVE_FILES);
  db = await demoDatabase();
  server = await listen({ dbPath: db.dbPath, rateLimit: false });
  browser = await openPage(server.url);
  page = browser.page;
}, 60_000);

afterAll(async () => {
  await browser?.close();
  await server?.close();
  db?.remove();
});

describe('a Darwin Core Archive on the page', () => {
  it("uploads the archive and lists its core's rows, each with a status", async () => {
    await uploadBatch(page, archive, 'R. Viewer');
    expect(await page.textContent('#batch-progress-text')).toBe(`done: ${coreRows.length} rows of the archive's core`);
    const rows = page.locator('#review-list tbody tr');
    expect(await rows.count()).toBe(coreRows.length);
    const statuses = await page.locator('#review-list tbody tr td:nth-child(3)').allTextContents();
    for (const status of statuses) expect(status).toMatch(/^(requires verification|requires georeference|unable to georeference)/);
    // Every download the job offers, the archive among them.
    for (const id of ['#batch-download', '#batch-download-geojson', '#batch-download-gpkg', '#batch-download-zip']) expect(await page.isVisible(id)).toBe(true);
    await page.screenshot({ path: join(ARTIFACTS, 'batch-archive.png') });
  });

  it('accepts a record and downloads the new archive: the extension byte for byte, the decision in the core', async () => {
    const row = page.locator('#review-list tbody tr', { hasText: 'requires verification' }).first();
    const number = Number(await row.getAttribute('data-row'));
    await row.click();
    await page.waitForSelector(`#review-record h2:text("Row ${number} of the batch")`);
    await page.click('#accept');
    await page.waitForSelector(`#review-list tbody tr.accepted[data-row="${number}"]`);

    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#batch-download-zip')]);
    expect(download.suggestedFilename()).toMatch(/^whereabouts-reviewed-.*\.zip$/);
    const entries = await unzip((await download.path())!);
    expect(entries.map((e) => e.name)).toEqual(ARCHIVE_FILES.map(([name]) => name));
    expect(entries.find((e) => e.name === 'multimedia.txt')!.bytes.equals(multimedia)).toBe(true);
    // guide §2.2: the core as the new meta.xml describes it (tab-separated, '"' enclosing, one header line).
    const [header, ...body] = parse(entries.find((e) => e.name === 'occurrence.txt')!.bytes, { delimiter: '\t', record_delimiter: '\r\n', relax_column_count: true }) as string[][];
    expect(body.map((r) => r[0])).toEqual(coreRows.map((r) => r[0]));
    const status = header.indexOf('georeferenceVerificationStatus');
    expect(body[number - 1][status]).toBe('verified by data custodian');
    expect(body.every((r) => r[status] !== '')).toBe(true);
  });

  it('downloads the same rows as CSV', async () => {
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#batch-download')]);
    const rows = parse(readFileSync((await download.path())!), { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.occurrenceID)).toEqual(coreRows.map((r) => r[0]));
    expect(rows.filter((r) => r.georeferenceVerificationStatus === 'verified by data custodian')).toHaveLength(1);
  });

  it('meets its own content security policy', () => {
    expect(browser.cspViolations).toEqual([]);
  });
});
