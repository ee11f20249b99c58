/**
 * The page in a real browser (Debian's chromium through playwright-core), against a real server on
 * 127.0.0.1 over a real SQLite gazetteer. Screenshots of the main screens go to test/artifacts/.
 */
import { mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { methodChoices } from '../../src/georef/method-choices.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { DEMO_LOCALITIES, demoDatabase, listen, post, type RunningServer, type TempDatabase } from '../server/helpers.ts';
import { lookUp, openPage, uploadBatch, type TestBrowser } from './browser.ts';

const ARTIFACTS = new URL('../artifacts/', import.meta.url).pathname;
// The README's screenshots, rewritten only on purpose: UPDATE_SCREENSHOTS=1 npx vitest run test/web
const README_SHOTS = new URL('./screenshots/', import.meta.url).pathname;
const FOR_README = new Set(['lookup', 'batch-review']);
// Names with markup, as a gazetteer exported from an old system might hold them; both share an alternate name.
const HOSTILE_NAMES = ['<script>window.__pwned = 1</script>Punta', '<img src=x onerror="window.__pwned = 2">Punta'];
const hostileFeature = (name: string, i: number) => ({
  type: 'Feature',
  geometry: { type: 'Point', coordinates: [-131.2 + i * 0.05, -45.6] },
  properties: { id: `x-${i}`, name, alternateNames: 'Punta Falsa', featureType: 'cape', countryCode: 'QV', stateProvince: 'Poniente', radiusMeters: 500 },
});

let db: TempDatabase;
let server: RunningServer;
let browser: TestBrowser;
let page: Page;

beforeAll(async () => {
  mkdirSync(ARTIFACTS, { recursive: true });
  db = await demoDatabase(HOSTILE_NAMES.map(hostileFeature));
  server = await listen({ dbPath: db.dbPath, rateLimit: false });
  browser = await openPage(server.url);
  page = browser.page;
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
  db?.remove();
});

/** A screenshot under test/artifacts/ (git-ignored), and for the README when asked. */
async function shot(name: string) {
  await page.screenshot({ path: join(ARTIFACTS, `${name}.png`) });
  if (process.env.UPDATE_SCREENSHOTS === '1' && FOR_README.has(name)) {
    mkdirSync(README_SHOTS, { recursive: true });
    await page.screenshot({ path: join(README_SHOTS, `${name}.png`) });
  }
}

describe('lookup', () => {
  it('shows the right point and radius, and the map draws the circle', async () => {
    await lookUp(page, '10 km NE of Puerto Lindo');
    const api = (await post(`${server.url}/api/v1/georeference`, { locality: '10 km NE of Puerto Lindo', countryCode: 'QV' })).json;
    expect(await page.textContent('#result-latitude')).toBe(api.darwinCore.decimalLatitude);
    expect(await page.textContent('#result-longitude')).toBe(api.darwinCore.decimalLongitude);
    expect(await page.textContent('#result-radius')).toBe(api.darwinCore.coordinateUncertaintyInMeters);
    await page.waitForSelector('#lookup-map path.wa-circle');
    expect(await page.getAttribute('#lookup-map', 'data-circle-radius')).toBe(api.darwinCore.coordinateUncertaintyInMeters);
    expect(await page.locator('#lookup-map path.wa-point').count()).toBe(1);
    expect(await page.locator('#budget-table tfoot').textContent()).toContain('Total');
    expect(await page.locator('#lookup-map .leaflet-control-scale-line').count()).toBe(1);
    await page.mouse.move(1100, 450);
    expect(await page.textContent('.wa-cursor')).toMatch(/\d+\.\d{5}° [NS] {2}\d+\.\d{5}° [EW]/);
    await page.mouse.move(5, 895); // off the map, so that no hover name covers the result in the picture
    await shot('lookup');
  });

  it('downloads the Darwin Core fields as a CSV row and the point and footprint as GeoJSON', async () => {
    const [csv] = await Promise.all([page.waitForEvent('download'), page.click('#download-csv')]);
    const [row] = parse(readFileSync((await csv.path())!), { columns: true }) as Record<string, string>[];
    expect(row.locality).toBe('10 km NE of Puerto Lindo');
    expect(row.coordinateUncertaintyInMeters).toBe(await page.textContent('#result-radius'));
    const [geojson] = await Promise.all([page.waitForEvent('download'), page.click('#download-geojson')]);
    const collection = JSON.parse(readFileSync((await geojson.path())!, 'utf8'));
    // RFC 7946 §3.1.1: positions are [longitude, latitude].
    expect(collection.features[0].geometry.coordinates).toEqual([Number(row.decimalLongitude), Number(row.decimalLatitude)]);
    expect(collection.features[1].geometry.type).toMatch(/Polygon/);
  });

  it('changes the result when another candidate is chosen', async () => {
    await lookUp(page, 'Santa Rosa');
    expect(await page.textContent('#h-summary')).toContain('ambiguous');
    await shot('lookup-ambiguous');
    await page.click('label[for="cand-0"]');
    await page.waitForSelector('#result-latitude');
    const first = await page.textContent('#result-latitude');
    await page.click('label[for="cand-1"]');
    await page.waitForFunction((before) => document.querySelector('#result-latitude')?.textContent !== before, first);
    const second = await page.textContent('#result-latitude');
    expect(second).not.toBe(first);
    await page.waitForSelector('#lookup-map path.wa-circle');
    await shot('lookup-candidate');
  });

  it('takes a candidate of a second name in brackets when the text names two places of that name', async () => {
    // Both demo Santa Rosas (qv-0015, qv-0053) are listed for "Puerto Nada (Santa Rosa)"; choosing one answers
    // at that feature (its point, from gazetteer/demo.geojson, as the page rounds it).
    await lookUp(page, 'Puerto Nada (Santa Rosa)');
    expect(await page.textContent('#h-summary')).toContain('not-found');
    await page.click('li.cand:has-text("demo:qv-0053") label');
    await page.waitForSelector('#result-latitude');
    expect(Number(await page.textContent('#result-latitude'))).toBeCloseTo(-45.213296, 4);
    expect(await page.textContent('li.cand.used')).toContain('demo:qv-0053');
  });

  it('recomputes when the distance precision is edited', async () => {
    await lookUp(page, '10 km NE of Puerto Lindo');
    const before = Number(await page.textContent('#result-radius'));
    await page.fill('#e-precision', '10');
    await page.press('#e-precision', 'Enter');
    await page.dispatchEvent('#e-precision', 'change');
    await page.waitForFunction((r) => Number(document.querySelector('#result-radius')?.textContent) > r, before);
    expect(await page.inputValue('#e-precision')).toBe('10');
  });

  it('renders gazetteer names that contain markup as text', async () => {
    await lookUp(page, 'Punta Falsa');
    const text = await page.textContent('#lookup-result');
    for (const name of HOSTILE_NAMES) expect(text).toContain(name);
    expect(await page.locator('#lookup-result img, #lookup-result script').count()).toBe(0);
    expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
    await shot('lookup-markup-as-text');
  });

  it('works by keyboard alone, and every form control has a label', async () => {
    await page.click('#tab-lookup');
    await page.fill('#f-locality', '');
    await page.focus('#f-locality');
    await page.keyboard.type('5 km S of Puerto Lindo');
    await page.keyboard.press('Tab');
    await page.keyboard.type('QV');
    await page.keyboard.press('Enter'); // submits the form from a text field
    await page.waitForFunction(() => document.querySelector('#lookup-result')?.textContent?.includes('5 km S of Puerto Lindo'));
    await page.waitForSelector('#result-radius');
    const unlabelled = await page.evaluate(() =>
      [...document.querySelectorAll('input, select, textarea')]
        .filter((control) => !(control as HTMLInputElement).labels?.length && !control.getAttribute('aria-label'))
        .map((control) => control.outerHTML.slice(0, 80)),
    );
    expect(unlabelled).toEqual([]);
  });

  it('says what turns the budget total into the reported radius, in one number format', async () => {
    await lookUp(page, '10 km NE of Vila Serena');
    const api = (await post(`${server.url}/api/v1/georeference`, { locality: '10 km NE of Vila Serena', countryCode: 'QV' })).json;
    const total = Number(await page.textContent('#budget-total'));
    const rounding = Number((await page.textContent('#budget-rounding'))!.replace('+', ''));
    expect(total).toBeCloseTo(api.georeference.uncertaintyMeters, 1);
    expect(await page.textContent('#reported-radius')).toBe(api.darwinCore.coordinateUncertaintyInMeters);
    expect(total + rounding).toBeCloseTo(Number(api.darwinCore.coordinateUncertaintyInMeters), 1);
    expect(await page.textContent('#budget-table tr.rounding th')).toContain('Rounding of the coordinates to 0.0001° adds the distance it moves the point');
    // One format for meters everywhere: no thousands separators beside the reported value.
    expect(await page.innerText('#lookup-result')).not.toMatch(/\d,\d{3}\b/);
  });

  it('shows the footprint as type, vertices and area, its WKT behind copy and download', async () => {
    const api = (await post(`${server.url}/api/v1/georeference`, { locality: '10 km NE of Vila Serena', countryCode: 'QV' })).json;
    const km2 = (api.footprintSummary.areaSquareMeters / 1e6).toFixed(1);
    expect(await page.textContent('#footprint-summary')).toBe(`Polygon, ${api.footprintSummary.vertices} vertices, ${km2} km²`);
    expect(await page.innerText('#lookup-result')).not.toMatch(/POLYGON/);
    const [wkt] = await Promise.all([page.waitForEvent('download'), page.click('#download-wkt')]);
    expect(readFileSync((await wkt.path())!, 'utf8')).toBe(`${api.darwinCore.footprintWKT}\n`);
  });

  it("offers every datum the service knows, each name shown whole", async () => {
    const { datums } = await (await fetch(`${server.url}/api/v1/datums`)).json();
    const options = await page.locator('#e-datum option').allTextContents();
    expect(options.slice(1)).toEqual(datums.map((d: { name: string; epsg: string }) => `${d.name} (${d.epsg})`));
    await page.selectOption('#e-datum', 'EPSG:4225');
    await page.waitForFunction(() => (document.querySelector('#e-datum') as HTMLSelectElement | null)?.value === 'EPSG:4225');
    const cut = await page.evaluate(() => {
      const select = document.querySelector('#e-datum') as HTMLSelectElement;
      const probe = document.createElement('span');
      probe.style.font = getComputedStyle(select).font;
      probe.textContent = select.selectedOptions[0].textContent;
      document.body.append(probe);
      const wider = probe.getBoundingClientRect().width > select.clientWidth;
      probe.remove();
      return wider;
    });
    expect(cut).toBe(false);
  });

  it('labels the other candidates on the map with the name and number of the list', async () => {
    await lookUp(page, 'Santa Rosa');
    await page.click('label[for="cand-0"]');
    await page.waitForFunction(() => document.querySelector('#lookup-map .wa-label-used')?.textContent?.includes('Santa Rosa'));
    const listed = await page.locator('#lookup-result .cand-name').allTextContents();
    const onMap = await page.locator('#lookup-map .wa-label-candidate').allTextContents();
    expect(listed.length).toBeGreaterThan(1);
    expect(onMap).toEqual(listed.slice(1));
    expect(onMap[0]).toBe('2 Santa Rosa');
    expect(await page.textContent('#lookup-map .wa-label-used')).toBe(`${listed[0]} (used)`);
    expect(await page.locator('#lookup-map .wa-place').count()).toBeGreaterThan(0);
  });

  it('meets its own content security policy', () => {
    expect(browser.cspViolations).toEqual([]);
  });
});

describe('batch review', () => {
  it('shows a failed upload as a failure, in words and style, not as a full bar', async () => {
    await page.click('#tab-batch');
    await page.setInputFiles('#b-file', { name: 'records.csv', mimeType: 'text/csv', buffer: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a]) });
    await page.click('#batch-submit');
    await page.waitForSelector('#batch-progress-line[data-state="failed"]');
    expect(await page.textContent('#batch-progress-text')).toMatch(/^Upload failed: the uploaded file is a PNG image and not CSV text/);
    expect(await page.isVisible('#batch-progress')).toBe(false);
    await shot('batch-upload-failed');
  });

  it('uploads the demo file, completes, accepts a record by keyboard and downloads it with the new status', async () => {
    await uploadBatch(page, DEMO_LOCALITIES, 'R. Viewer');
    expect(await page.textContent('#batch-progress-text')).toMatch(/done: 53 rows/);
    await shot('batch-progress');
    await page.selectOption('#r-status', 'requires verification');
    await page.waitForFunction(() => document.querySelectorAll('#review-list tbody tr').length > 0 && [...document.querySelectorAll('#review-list tbody tr td:nth-child(3)')].every((td) => td.textContent?.startsWith('requires verification')));
    const row = await page.textContent('#review-list tbody tr.current td:first-child');
    await page.waitForSelector('#review-map path.wa-circle');
    await page.click('#review-list tbody tr:nth-child(3) button');
    await page.waitForFunction(() => document.querySelector('#review-record h2')?.textContent?.startsWith('Row 3'));
    await page.waitForSelector('#review-map path.wa-circle');
    await page.evaluate(() => window.scrollTo(0, 0));
    await shot('batch-review');
    await page.keyboard.press('k');
    await page.keyboard.press('k');
    await page.waitForFunction((r) => document.querySelector('#review-list tbody tr.current td:first-child')?.textContent === r, row);
    const pending = await page.locator('#review-list tbody tr').count();
    await page.focus('#review-record');
    await page.keyboard.press('a');
    // Accepted, the record leaves the "requires verification" filter.
    await page.waitForFunction((n) => document.querySelectorAll('#review-list tbody tr').length === n - 1, pending);
    await page.selectOption('#r-status', 'verified by data custodian');
    await page.waitForSelector('#review-list tbody tr.accepted');
    await page.waitForSelector('#review-map path.wa-circle');
    await page.evaluate(() => window.scrollTo(0, 0));
    await shot('batch-accepted');

    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#batch-download')]);
    const rows = parse(readFileSync((await download.path())!), { columns: true }) as Record<string, string>[];
    const reviewed = rows[Number(row) - 1];
    expect(reviewed.georeferenceVerificationStatus).toBe('verified by data custodian');
    expect(reviewed.georeferenceRemarks).toMatch(/verified by R\. Viewer/);
  });
});

describe('batch generalisation', () => {
  it("offers the upload's generalisation with the sentence that it follows the holder's policy and local law", async () => {
    await page.click('#tab-batch');
    expect(await page.textContent('#b-generalise-note')).toContain("Generalising follows the holder's policy and local law, which whereabouts does not decide.");
    for (const id of ['b-taxa', 'b-column', 'b-by', 'b-size']) expect(await page.locator(`label[for="${id}"]`).count(), id).toBe(1);
    // A marking column the file lacks: refused before the job starts, said in words.
    await page.setInputFiles('#b-file', DEMO_LOCALITIES);
    await page.fill('#b-column', 'nosuch');
    await page.selectOption('#b-by', 'gridDegrees');
    await page.fill('#b-size', '0.1');
    await page.click('#batch-submit');
    await page.waitForSelector('#batch-progress-line[data-state="failed"]');
    expect(await page.textContent('#batch-progress-text')).toMatch(/^Upload failed: .*no column "nosuch"/);
    await page.fill('#b-column', '');
    await page.fill('#b-size', '');
  });

  it('generalises the listed taxa by a grid in meters: the reviewed CSV holds the cell, dataGeneralizations and informationWithheld', async () => {
    await page.setInputFiles('#b-taxa', { name: 'taxa.csv', mimeType: 'text/csv', buffer: Buffer.from('scientificName,gridMeters\nVerdemaria lindoensis,2000\n') });
    // The review of the earlier batch is still shown: wait for this one's progress to say done (the last said failed).
    await page.setInputFiles('#b-file', DEMO_LOCALITIES);
    await page.click('#batch-submit');
    await page.waitForSelector('#batch-progress-line[data-state="done"]', { timeout: 60_000 });
    await page.setInputFiles('#b-taxa', []);
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#batch-download')]);
    const rows = parse(readFileSync((await download.path())!), { columns: true }) as Record<string, string>[];
    const listed = rows.filter((r) => r.scientificName === 'Verdemaria lindoensis' && r.proposed_decimalLatitude !== '');
    expect(listed.length).toBeGreaterThan(0);
    for (const r of listed) {
      // Darwin Core dataGeneralizations and informationWithheld (TDWG term list), filled on the listed rows only.
      expect(r.dataGeneralizations).toMatch(/^Coordinates generalized from the original georeference to the centre of a 2000 m cell of the UTM zone \d+S grid/);
      expect(r.informationWithheld).toMatch(/^Precise location information withheld/);
    }
    expect(rows.filter((r) => r.scientificName !== 'Verdemaria lindoensis').every((r) => r.dataGeneralizations === '')).toBe(true);
  });
});

describe('method choices', () => {
  it('lists every choice with the value in force, from GET /api/v1/method', async () => {
    await page.click('#tab-method');
    await page.waitForSelector('#method-choices[data-loaded="true"]');
    const ids = await page.$$eval('#method-choices tbody tr', (rows) => rows.map((r) => (r as HTMLElement).dataset.choice));
    expect(ids).toEqual(methodChoices().map((c) => c.id));
    const near = await page.textContent('#method-choices tr[data-choice="nearMinimumMeters"] td');
    expect(near).toBe(`${METHOD_DEFAULTS.nearMinimumMeters} m`);
    await shot('method-choices');
    expect(browser.cspViolations).toEqual([]);
  });
});

describe('on a phone', () => {
  it('never breaks a number across lines at 375 px', async () => {
    const phone = await openPage(server.url, { width: 375, height: 800 });
    try {
      await phone.page.fill('#f-locality', '10 km NE of Vila Serena');
      await phone.page.fill('#f-countryCode', 'QV');
      await phone.page.click('#lookup-submit');
      await phone.page.waitForSelector('#result-radius');
      await phone.page.screenshot({ path: join(ARTIFACTS, 'lookup-phone.png'), fullPage: true });
      const broken = await phone.page.evaluate(() => {
        // Numbers as values, not digits inside identifiers (a DOI, a feature id), which may break like words.
        const found: string[] = [];
        const walker = document.createTreeWalker(document.querySelector('#lookup-result')!, NodeFilter.SHOW_TEXT);
        for (let node = walker.nextNode(); node; node = walker.nextNode()) {
          for (const match of (node.textContent ?? '').matchAll(/(?<![\p{L}\d._/:-])[-+]?\d[\d.,]*\d/gu)) {
            const range = document.createRange();
            range.setStart(node, match.index!);
            range.setEnd(node, match.index! + match[0].length);
            const tops = new Set([...range.getClientRects()].map((r) => Math.round(r.top)));
            if (tops.size > 1) found.push(match[0]);
          }
        }
        return found;
      });
      expect(broken).toEqual([]);
    } finally {
      await phone.close();
    }
  });
});
