/**
 * Small things a reviewer meets walking the page, in a real browser against the demo server: a key does
 * what its button does, a map with only a candidate shows the candidate's surroundings, a placeholder is
 * read whole, and a table stays inside its card on a 390 px phone. What "read whole" and "inside" mean is
 * ours (common practice, no source): the text's measured width within the field's content box, the
 * table's box within its card's.
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

/** The ground width the map shows, in meters, read off Leaflet's own scale bar (its label over its width in pixels). */
const mapWidthMeters = (p: Page, map: string) => p.$eval(map, (container) => {
  const line = container.querySelector('.leaflet-control-scale-line') as HTMLElement;
  const [value, unit] = line.textContent!.trim().split(/\s+/);
  const meters = Number(value) * (unit === 'km' ? 1000 : 1);
  return (meters / line.getBoundingClientRect().width) * Math.min(container.clientWidth, container.clientHeight);
});

/** Whether the distance precision field's placeholder fits its content box, measured in the field's own font. */
const placeholderFits = (p: Page) => p.$eval('#e-precision', (input) => {
  const field = input as HTMLInputElement;
  const style = getComputedStyle(field);
  const context = document.createElement('canvas').getContext('2d')!;
  context.font = style.font;
  const room = field.clientWidth - parseFloat(style.paddingLeft) - parseFloat(style.paddingRight);
  return { text: field.placeholder, width: context.measureText(field.placeholder).width, room };
});

describe('the review keys do what their buttons do', () => {
  it('"a" on a record without a point sends nothing and says what the disabled accept button says', async () => {
    await uploadBatch(page, DEMO_LOCALITIES, 'R. Viewer');
    await page.selectOption('#r-status', 'requires georeference');
    await page.waitForFunction(() => [...document.querySelectorAll('#review-list tbody tr td:nth-child(3)')].every((td) => td.textContent?.startsWith('requires georeference')));
    const row = await page.getAttribute('#review-list tbody tr:first-child', 'data-row');
    await page.click(`#review-list tbody tr[data-row="${row}"] button`);
    await page.waitForSelector('#review-record #accept[disabled]');
    const decisions: string[] = [];
    page.on('request', (request) => {
      if (request.method() === 'PUT' && request.url().includes('/review')) decisions.push(request.url());
    });
    await page.keyboard.press('a');
    await page.waitForFunction(() => document.querySelector('#review-message')?.textContent !== '');
    expect(decisions).toEqual([]);
    const title = await page.getAttribute('#accept', 'title');
    expect(title).toBeTruthy();
    expect(await page.textContent('#review-message')).toBe(title);
  });
});

describe('the map with a candidate and no point', () => {
  it("shows at least the candidate's own circle and its surroundings, not a close-up of the dot", async () => {
    // One candidate, Puerto Lindo (radius 3500 m in the demo gazetteer), and no point: no distance is given.
    await lookUp(page, 'N of Puerto Lindo');
    await page.waitForSelector('#lookup-map .wa-candidate');
    expect(await page.locator('#lookup-map .wa-candidate').count()).toBe(1);
    // Framed as a point's circle is (web/js/map.js): the circle, 7 km across, in about the middle third of
    // the view, so at least 21 km across; 5% off for the scale bar read to a whole pixel.
    expect(await mapWidthMeters(page, '#lookup-map')).toBeGreaterThanOrEqual(0.95 * 3 * 2 * 3500);
  });
});

describe('the "no distance in the text" placeholder reads whole', () => {
  it('at 1280×800', async () => {
    await lookUp(page, 'Puerto Lindo');
    await page.waitForSelector('#e-precision[disabled]');
    const fit = await placeholderFits(page);
    expect(fit.width, fit.text).toBeLessThanOrEqual(fit.room);
  });

  it('on a 390 px phone, where the budget table also stays inside its card in a review', async () => {
    const phone = await openPage(demo.server.url, { width: 390, height: 844 });
    try {
      await lookUp(phone.page, 'Puerto Lindo');
      await phone.page.waitForSelector('#e-precision[disabled]');
      const fit = await placeholderFits(phone.page);
      expect(fit.width, fit.text).toBeLessThanOrEqual(fit.room);

      await uploadBatch(phone.page, DEMO_LOCALITIES, 'R. Viewer');
      await phone.page.waitForSelector('#review-record #r-budget-table');
      const boxes = await phone.page.$eval('#r-budget-table', (table) => {
        const card = table.closest('.card') as HTMLElement;
        const style = getComputedStyle(card);
        const inner = card.getBoundingClientRect().right - parseFloat(style.borderRightWidth) - parseFloat(style.paddingRight);
        return { table: table.getBoundingClientRect().right, card: inner, scrolls: card.scrollWidth > card.clientWidth };
      });
      expect(boxes.table).toBeLessThanOrEqual(boxes.card + 0.5);
      expect(boxes.scrolls).toBe(false);
    } finally {
      await phone.close();
    }
  });
});
