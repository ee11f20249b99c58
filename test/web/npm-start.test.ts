/**
 * The page as `npm start` starts it: the package's start command (`whereabouts serve --demo`) run as a
 * child process in a fresh working directory, with the default relative database `./whereabouts.sqlite`,
 * then a batch uploaded and reviewed in a real browser. Records without a point are resolved each of
 * the three ways before they are accepted; the review keys and row clicks work wherever the focus is.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { ChildProcess } from 'node:child_process';
import { parse } from 'csv-parse/sync';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_LOCALITIES, spawnServe } from '../server/helpers.ts';
import { openPage, uploadBatch, type TestBrowser } from './browser.ts';

const PACKAGE = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { scripts: Record<string, string> };

let cwd: string;
let child: ChildProcess;
let url: string;
let browser: TestBrowser;
let page: Page;

beforeAll(async () => {
  // The start script as written, with a free port instead of the fixed one (other runs may hold it).
  const [node, bin, ...args] = PACKAGE.scripts.start.split(' ');
  expect([node, bin]).toEqual(['node', 'bin/whereabouts.js']);
  expect(args).toEqual(['serve', '--demo']);
  cwd = mkdtempSync(join(tmpdir(), 'whereabouts-start-'));
  ({ url, child } = await spawnServe([...args.slice(1), '--port', '0'], cwd));
  browser = await openPage(url);
  page = browser.page;
});

afterAll(async () => {
  await browser?.close();
  child?.kill('SIGTERM');
  if (cwd) rmSync(cwd, { recursive: true, force: true });
});

const heading = () => page.textContent('#review-record h2');
const openRow = async (row: number) => {
  await page.click(`#review-list tbody tr[data-row="${row}"] td.loc`);
  await page.waitForFunction((r) => document.querySelector('#review-record h2')?.textContent === `Row ${r} of the batch`, row);
};

describe('npm start, then a batch review', () => {
  it('serves the demo from ./whereabouts.sqlite in the working directory', () => {
    expect(existsSync(join(cwd, 'whereabouts.sqlite'))).toBe(true);
  });

  it('uploads the demo file and opens the review (no "not started by this service")', async () => {
    await uploadBatch(page, DEMO_LOCALITIES, 'R. Viewer');
    expect(await page.textContent('#batch-progress-text')).toMatch(/done: 53 rows/);
    expect(await page.getAttribute('#batch-progress-line', 'data-state')).toBe('done');
    await page.waitForSelector('#review-list tbody tr');
    expect(await heading()).toBe('Row 1 of the batch');
  });

  it('opens a record by a click anywhere on its row', async () => {
    await openRow(3);
    expect(await page.getAttribute('#review-list tbody tr.current', 'data-index')).toBe('2');
  });

  it('takes the review keys wherever the focus is, but not while typing in a text field', async () => {
    await page.focus('#tab-batch'); // a button in the page's header
    await page.keyboard.press('j');
    await page.waitForFunction(() => document.querySelector('#review-record h2')?.textContent === 'Row 4 of the batch');
    await page.focus('#review-map'); // the map
    await page.keyboard.press('k');
    await page.waitForFunction(() => document.querySelector('#review-record h2')?.textContent === 'Row 3 of the batch');
    await page.focus('#r-radius-min'); // typing a number into a filter moves nothing
    await page.keyboard.press('j');
    await page.focus('#b-reviewer');
    await page.keyboard.type('ja');
    await page.fill('#b-reviewer', 'R. Viewer');
    expect(await heading()).toBe('Row 3 of the batch');
    // Accept by key with the focus on the map: row 3 is georeferenced.
    await page.focus('#review-map');
    await page.keyboard.press('a');
    await page.waitForSelector('#review-list tbody tr.accepted[data-row="3"]');
  });

  it('leaves the focus where the person put it while a slow record loads', async () => {
    // A record answer held back, as on a loaded machine: the page must not pull the focus to the record
    // once it arrives, or the next key typed into a filter would move through the list instead.
    const recordAnswer = /\/api\/v1\/batches\/[^/]+\/records\/\d+(\?|$)/;
    await page.route(recordAnswer, async (route) => {
      await new Promise((resolve) => setTimeout(resolve, 400));
      await route.continue();
    });
    try {
      await page.focus('#review-map');
      await page.keyboard.press('j');
      await page.focus('#r-radius-min');
      await page.waitForFunction(() => document.querySelector('#review-record h2')?.textContent === 'Row 4 of the batch');
      await page.waitForTimeout(200); // the map is drawn after the heading
      expect(await page.evaluate(() => document.activeElement?.id)).toBe('r-radius-min');
    } finally {
      await page.unroute(recordAnswer);
    }
    await page.focus('#review-map');
    await page.keyboard.press('k');
    await page.waitForFunction(() => document.querySelector('#review-record h2')?.textContent === 'Row 3 of the batch');
  });

  it('refuses to accept a record without a point, and offers the three ways to give it one', async () => {
    await openRow(23); // Villa Quimera: in no loaded gazetteer, no coordinates of its own
    expect(await page.isDisabled('#accept')).toBe(true);
    expect(await page.textContent('#h-resolve')).toBe('Give this record a point before accepting it');
    await page.focus('#review-map');
    await page.keyboard.press('a');
    await page.waitForFunction(() => /no point to verify/.test(document.querySelector('#review-message')?.textContent ?? ''));
    expect(await page.locator('#review-list tbody tr.accepted[data-row="23"]').count()).toBe(0);
    expect(await page.textContent('#review-record')).toContain('The record has no coordinates of its own.');
  });

  it('accepts a record once a corrected locality gives it a point', async () => {
    await page.fill('#resolve-locality', '3 km N of Vila Serena');
    await page.click('#resolve-locality-submit');
    await page.waitForSelector('#r-result-radius');
    expect(await page.textContent('#resolution-note')).toContain('locality text corrected by the reviewer to "3 km N of Vila Serena"');
    expect(await page.isDisabled('#accept')).toBe(false);
    await page.click('#accept');
    await page.waitForSelector('#review-list tbody tr.accepted[data-row="23"]');
  });

  it('accepts an ambiguous record once a candidate is chosen', async () => {
    await openRow(18); // Santa Rosa: two places of that name
    expect(await page.isDisabled('#accept')).toBe(true);
    await page.click('label[for="rcand-1"]');
    await page.waitForSelector('#r-result-radius');
    await page.click('#accept');
    await page.waitForSelector('#review-list tbody tr.accepted[data-row="18"]');
  });

  it("accepts the record's own coordinates, with the sign error the check found corrected", async () => {
    await openRow(36); // Val-Marin: its longitude has lost its sign
    expect(await page.textContent('#review-record')).toContain('corrected as the coordinate check found: fits-if-longitude-sign-flipped');
    await page.click('#use-record-coordinates');
    await page.waitForSelector('#resolution-note');
    expect(await page.textContent('#resolution-note')).toMatch(/with the sign of longitude inverted/);
    expect(await page.textContent('#r-result-longitude')).toMatch(/^-130\.5/);
    await page.click('#accept');
    await page.waitForSelector('#review-list tbody tr.accepted[data-row="36"]');
  });

  it('does not offer coordinates the check found unusable (latitude beyond ±90°)', async () => {
    await openRow(37); // Rio Fundo, town square: ambiguous, its coordinates written in the wrong order and out of range
    expect(await page.locator('#use-record-coordinates').count()).toBe(0);
    expect(await page.textContent('#own-coordinates-unusable')).toContain('the coordinate check says beyond-valid-range');
  });

  it('downloads the reviewed file with every decision and how each point was given', async () => {
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#batch-download')]);
    const rows = parse(readFileSync((await download.path())!), { columns: true }) as Record<string, string>[];
    const term = (row: Record<string, string>, name: string) => row[`proposed_${name}`] ?? row[name];
    for (const n of [3, 18, 23, 36]) expect(term(rows[n - 1], 'georeferenceVerificationStatus')).toBe('verified by data custodian');
    for (const n of [3, 18, 23, 36]) expect(term(rows[n - 1], 'decimalLatitude')).not.toBe('');
    expect(term(rows[22], 'georeferenceRemarks')).toContain('locality text corrected by the reviewer');
    expect(rows[22].locality).toBe('Villa Quimera');
    expect(term(rows[35], 'georeferenceRemarks')).toContain('with the sign of longitude inverted');
    expect(rows[35].decimalLongitude).toBe('130.538611');
    expect(browser.cspViolations).toEqual([]);
  });
});
