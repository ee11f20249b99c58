/**
 * The page as a curator meets it, in a real browser (Debian's chromium through playwright-core) against a
 * real server on 127.0.0.1 over the demo gazetteer: every answer says its georeferenceVerificationStatus
 * (Darwin Core's recommended values, TDWG dwc terms list) beside the point and radius, a wrong entry is
 * kept as typed and answered beside its field, and the review fits a 1280×800 screen and a 390 px phone.
 * What "fits" means here is ours (common practice, no source): no table column hidden behind a scroll bar,
 * no page wider than the window, no map control drawn over another.
 */
import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_LOCALITIES } from '../server/helpers.ts';
import { lookUp, openPage, uploadBatch, useDemoPage } from './browser.ts';

const demo = useDemoPage({ width: 1280, height: 800 });
let page: Page;
beforeAll(() => {
  page = demo.page;
});

/** Whether two boxes overlap. */
const overlap = (a: DOMRect, b: DOMRect) => a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;

/** Whether the map's bottom controls (scale bar, pointer coordinates, attribution) overlap, or the scale's words run past its bar. */
async function mapControlsOverlap(map: string): Promise<boolean> {
  // The narrowest bar Leaflet draws is half its maxWidth (120 px here): its round numbers 1, 2, 3, 5 × 10ⁿ
  // leave at least half (Leaflet 1.9 Control.Scale, _getRoundNum). A six-character label must fit that bar.
  const scaleOverflows = await page.$eval(`${map} .leaflet-control-scale-line`, (line) => {
    const bar = line.cloneNode() as HTMLElement;
    Object.assign(bar.style, { width: '60px', position: 'absolute', visibility: 'hidden' });
    bar.textContent = '300 km';
    line.parentElement!.append(bar);
    const overflows = bar.scrollWidth > bar.clientWidth;
    bar.remove();
    return overflows;
  });
  if (scaleOverflows) return true;
  const boxes = await page.$$eval(`${map} .leaflet-control-scale, ${map} .wa-cursor, ${map} .leaflet-control-attribution`, (nodes) => nodes.map((n) => n.getBoundingClientRect().toJSON() as DOMRect));
  expect(boxes).toHaveLength(3);
  return boxes.some((a, i) => boxes.some((b, j) => j > i && overlap(a, b)));
}

/** Ids that more than one element of the page carries. */
const duplicateIds = () => page.$$eval('[id]', (nodes) => {
  const seen = new Map<string, number>();
  for (const n of nodes) seen.set(n.id, (seen.get(n.id) ?? 0) + 1);
  return [...seen].filter(([, count]) => count > 1).map(([id]) => id);
});

describe('every answer says how far to trust it', () => {
  it('says on every view that a georeference is an estimate, and that sensitive localities may need generalising', async () => {
    for (const view of ['lookup', 'batch', 'method']) {
      await page.click(`#tab-${view}`);
      expect(await page.isVisible('#caution'), view).toBe(true);
    }
    const caution = await page.textContent('#caution');
    expect(caution).toContain('A georeference is an estimate to verify, not a fact');
    expect(caution).toContain("Precise localities of threatened or sensitive taxa may need generalising under the holder's policy and local law");
    // It points to where the generalisation is, not to "below" on a view that has none.
    expect(caution).toContain('the options of an upload under Batch review');
  });

  it('a point: the radius in words and "requires verification" in the headline card', async () => {
    await lookUp(page, '10 km NE of Puerto Lindo');
    const summary = page.locator('#lookup-result .summary');
    expect(await page.textContent('#result-verification')).toBe('requires verification');
    const radius = await page.textContent('#result-radius');
    expect(await summary.textContent()).toContain(`the place lies within ${radius} m of the point: check the point, the circle and the feature used`);
    expect(await mapControlsOverlap('#lookup-map')).toBe(false);
  });

  it('no point: "requires georeference", and the candidates are a choice to make, not "the feature used"', async () => {
    await lookUp(page, 'Santa Rosa');
    expect(await page.textContent('#h-summary')).toContain('ambiguous');
    expect(await page.textContent('#result-verification')).toBe('requires georeference');
    expect(await page.textContent('#lookup-result .candidates legend')).toBe('None is used yet: choose the feature the text means, if one is');
    await page.click('label[for="cand-0"]');
    await page.waitForSelector('#result-latitude');
    expect(await page.textContent('#lookup-result .candidates legend')).toBe('Feature used for the georeference');
  });

  it('reads written coordinates back in degrees a person can read (at most 7 decimals), not as binary fractions', async () => {
    await page.click('#tab-lookup');
    await page.fill('#f-verbatimCoordinates', "45°12'S 131°32'W");
    await lookUp(page, 'Puerto Lindo');
    await page.fill('#f-verbatimCoordinates', '');
    // 12′ = 0.2°, 32′ = 0.5333…°, 1′ = 0.01666…° (1° = 60′).
    expect(await page.textContent('#lookup-result table.pairs tr:has(th:text-is("Coordinates")) td')).toBe(`"45°12'S 131°32'W" → -45.2, -131.5333333 (degrees-minutes, precision 0.0166667°)`);
  });

  it('text that cannot be read: "unable to georeference"', async () => {
    await lookUp(page, 'along the creek behind the old sawmill');
    expect(await page.textContent('#result-verification')).toBe('unable to georeference');
  });
});

interface Ring { name: string; ring: number[][] }

describe('the basemap', () => {
  // Natural Earth 1:110m (world-atlas 2.0.2, public domain) holds Fiji's ring at -180° and +180° at once;
  // drawn as it is, its edge crossed the whole map as a band at 16–17° S.
  it('draws no ring across the whole map: a ring over the antimeridian is moved whole turns to one side of it', async () => {
    // A string, so that the test runner does not rewrite the page's own import().
    const rings: { raw: Ring[]; drawn: Ring[] } = await page.evaluate(`(async () => {
      const { basemapFeatures } = await import('/js/basemap.js');
      const topo = await (await fetch('/vendor/countries-110m.json')).json();
      const ringsOf = (fc) => fc.features.flatMap((f) => (f.geometry.type === 'Polygon' ? [f.geometry.coordinates] : f.geometry.coordinates).flat().map((ring) => ({ name: f.properties.name, ring })));
      return { raw: ringsOf(topojson.feature(topo, topo.objects.countries)), drawn: ringsOf(basemapFeatures(structuredClone(topo))) };
    })()`);
    expect(rings.drawn.length).toBe(rings.raw.length);
    const span = (ring: number[][]) => Math.max(...ring.map(([lon]) => lon)) - Math.min(...ring.map(([lon]) => lon));
    const moved: string[] = [];
    const acrossTheMap: string[] = [];
    rings.drawn.forEach(({ name, ring }, i) => {
      const raw = rings.raw[i].ring;
      // Not one vertex moves on the globe: the same latitude, the longitude the same or a whole turn on.
      if (ring.length !== raw.length || ring.some(([lon, lat], j) => lat !== raw[j][1] || ![0, 360].includes(Math.round(lon - raw[j][0])))) moved.push(name);
      if (!ring.some(([, lat]) => Math.abs(lat) > 80) && span(ring) > 180) acrossTheMap.push(name);
    });
    expect(moved).toEqual([]);
    expect(acrossTheMap).toEqual([]);
    const fiji = rings.drawn.filter((r) => r.name === 'Fiji').flatMap((r) => r.ring.map(([lon]) => lon));
    expect(Math.min(...fiji)).toBeGreaterThan(170);
    expect(Math.max(...fiji)).toBeLessThan(190);
  });
});

describe('a wrong entry is kept as typed and answered beside its field', () => {
  it("a country's name in the country code field is not cut to its first two letters (Mexico is not ME)", async () => {
    await lookUp(page, 'Puerto Lindo', 'Mexico');
    await page.waitForSelector('#f-countryCode[aria-invalid="true"]');
    expect(await page.inputValue('#f-countryCode')).toBe('Mexico');
    const error = await page.getAttribute('#f-countryCode', 'aria-describedby');
    expect(await page.textContent(`#${error}`)).toMatch(/a two-letter ISO 3166-1 alpha-2 code such as MX; a country's name goes in "country"/);
    // Put right, the error and its link go.
    await lookUp(page, 'Puerto Lindo', 'QV');
    expect(await page.getAttribute('#f-countryCode', 'aria-invalid')).toBeNull();
    expect(await page.getAttribute('#f-countryCode', 'aria-describedby')).toBeNull();
    expect(await page.locator('.field-error').count()).toBe(0);
  });
});

describe('the review at 1280×800', () => {
  it('shows an empty progress bar as empty: a light track, never a full dark bar', async () => {
    await page.click('#tab-batch');
    const colourAt = async (value: number) => {
      await page.$eval('#batch-progress', (p, v) => ((p as HTMLProgressElement).value = v), value);
      return averageColour(await page.locator('#batch-progress').screenshot());
    };
    const empty = await colourAt(0);
    expect(Math.min(...empty)).toBeGreaterThan(200); // light: every channel of the track above 200 of 255
    const full = await colourAt(1);
    expect(full[1] - full[0]).toBeGreaterThan(60); // the filled bar is the green of --ok (#009e73)
  });

  it("shows every column of the list, keeps the map's controls apart, says the review's own status and goes on to the next record after a decision", async () => {
    await uploadBatch(page, DEMO_LOCALITIES, 'R. Viewer');
    await page.waitForSelector('#review-map path.wa-circle, #review-record #r-result-verification');
    const fits = await page.$eval('.review-list-wrap', (wrap) => wrap.scrollWidth <= wrap.clientWidth);
    expect(fits).toBe(true);
    expect(await mapControlsOverlap('#review-map')).toBe(false);
    // With every download shown (an archive's job offers four), no filter is squeezed below a usable width.
    await page.$eval('#batch-download-zip', (link) => ((link as HTMLElement).hidden = false));
    const narrowest = await page.$$eval('.filters .field', (fields) => Math.min(...fields.map((f) => f.getBoundingClientRect().width)));
    expect(narrowest).toBeGreaterThanOrEqual(100);
    await page.$eval('#batch-download-zip', (link) => ((link as HTMLElement).hidden = true));
    // The review's copies of the answer's sections carry ids of their own, so each heading labels its own section.
    expect(await duplicateIds()).toEqual([]);

    await page.selectOption('#r-status', 'requires verification');
    await page.waitForFunction(() => [...document.querySelectorAll('#review-list tbody tr td:nth-child(3)')].every((td) => td.textContent?.startsWith('requires verification')));
    const listed = await page.$$eval('#review-list tbody tr', (rows) => rows.map((r) => (r as HTMLElement).dataset.row));
    expect(listed.length).toBeGreaterThan(2);
    const [, row, next] = listed;
    await page.click(`#review-list tbody tr[data-row="${row}"] button`);
    await page.waitForFunction((r) => document.querySelector('#review-record h2')?.textContent === `Row ${r} of the batch`, row);
    expect(await page.textContent('#r-result-verification')).toBe('requires verification');
    expect(await page.textContent('#review-record .summary')).toContain('check the point, the circle and the feature used');
    await page.click('#accept');
    // Accepted, the record leaves this filter and the one after it takes its place under review (not the top of the list).
    await page.waitForFunction((n) => document.querySelectorAll('#review-list tbody tr').length === n - 1, listed.length);
    await page.waitForFunction((r) => document.querySelector('#review-record h2')?.textContent === `Row ${r} of the batch`, next);
    expect(await page.getAttribute('#review-list tbody tr.current', 'data-row')).toBe(next);
    await page.selectOption('#r-status', 'verified by data custodian');
    await page.waitForSelector(`#review-list tbody tr.accepted[data-row="${row}"]`);
    await page.waitForFunction(() => document.querySelector('#r-result-verification')?.textContent === 'verified by data custodian');
    expect(await page.textContent('#review-record .summary')).not.toContain('check the point, the circle');
  });

  it('keeps the focus ring visible on the dark masthead (white, not the blue used on paper)', async () => {
    await page.click('#tab-batch');
    await page.keyboard.press('Shift+Tab');
    await page.keyboard.press('Tab');
    const ring = await page.evaluate(() => {
      const focused = document.activeElement as HTMLElement;
      return { id: focused.id, colour: getComputedStyle(focused).outlineColor, style: getComputedStyle(focused).outlineStyle };
    });
    expect(ring).toEqual({ id: 'tab-batch', colour: 'rgb(255, 255, 255)', style: 'solid' });
  });
});

describe('on a 390 px phone', () => {
  it('brings a new answer into view below the form, and writes each view tab on one line', async () => {
    const phone = await openPage(demo.server.url, { width: 390, height: 844 });
    try {
      await lookUp(phone.page, '10 km NE of Puerto Lindo');
      await phone.page.waitForFunction(() => {
        const box = document.querySelector('#lookup-result .summary')!.getBoundingClientRect();
        return box.top >= 0 && box.bottom <= innerHeight;
      });
      // The lines a tab's words take: the distinct tops of the boxes of its text.
      const lines = await phone.page.$$eval('nav .tab', (nodes) => nodes.map((n) => {
        const range = document.createRange();
        range.selectNodeContents(n);
        return [n.textContent, new Set([...range.getClientRects()].map((r) => Math.round(r.top))).size];
      }));
      for (const [text, count] of lines) expect(count, String(text)).toBe(1);
    } finally {
      await phone.close();
    }
  });

  it('shows the review no wider than the window, with the list scrolling in its own box so that the record follows it', async () => {
    const phone = await openPage(demo.server.url, { width: 390, height: 844 });
    try {
      await uploadBatch(phone.page, DEMO_LOCALITIES, 'R. Viewer');
      const sizes = await phone.page.evaluate(() => {
        const wrap = document.querySelector('.review-list-wrap') as HTMLElement;
        return { page: document.documentElement.scrollWidth, window: innerWidth, listHeight: wrap.getBoundingClientRect().height, listFits: wrap.scrollWidth <= wrap.clientWidth };
      });
      expect(sizes.page).toBeLessThanOrEqual(sizes.window);
      expect(sizes.listFits).toBe(true);
      expect(sizes.listHeight).toBeLessThan(844 / 2);
    } finally {
      await phone.close();
    }
  });
});

/**
 * The mean colour of the middle row of a PNG, as [r, g, b], decoded by the browser itself on a blank page
 * (no PNG decoder of our own to trust).
 */
async function averageColour(png: Buffer): Promise<[number, number, number]> {
  const blank = await demo.browser.context.newPage();
  try {
    return await blank.evaluate(async (data) => {
      const image = new Image();
      image.src = `data:image/png;base64,${data}`;
      await image.decode();
      const canvas = document.createElement('canvas');
      canvas.width = image.width;
      canvas.height = image.height;
      const context = canvas.getContext('2d')!;
      context.drawImage(image, 0, 0);
      // The inner part of the middle row: the rounded ends and the border are left out.
      const inset = Math.ceil(image.width * 0.1);
      const pixels = context.getImageData(inset, Math.floor(image.height / 2), image.width - 2 * inset, 1).data;
      const sum = [0, 0, 0];
      for (let i = 0; i < pixels.length; i += 4) for (let c = 0; c < 3; c++) sum[c] += pixels[i + c];
      const n = pixels.length / 4;
      return sum.map((s) => s / n) as [number, number, number];
    }, png.toString('base64'));
  } finally {
    await blank.close();
  }
}
