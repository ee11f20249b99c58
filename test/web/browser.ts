/** Debian's chromium through playwright-core, for the page tests: headless, offline but for one server. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { useDemoServer, type RunningServer } from '../server/helpers.ts';

export interface TestBrowser {
  context: BrowserContext;
  page: Page;
  /** Console messages about the page's content security policy. */
  cspViolations: string[];
  close(): Promise<void>;
}

/**
 * A fresh browser profile whose only reachable site is `serverUrl` (any other request fails the run),
 * with the page already loaded and ready.
 */
export async function openPage(serverUrl: string, viewport = { width: 1440, height: 900 }): Promise<TestBrowser> {
  const profile = mkdtempSync(join(tmpdir(), 'whereabouts-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    acceptDownloads: true,
    viewport,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const cspViolations: string[] = [];
  page.on('console', (message) => {
    if (/Content Security Policy/i.test(message.text())) cspViolations.push(message.text());
  });
  await context.route((url) => !url.href.startsWith(serverUrl), (route) => route.abort());
  await page.goto(serverUrl);
  await page.waitForSelector('body[data-ready="true"]');
  return {
    context,
    page,
    cspViolations,
    close: async () => {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Uploads a file in the batch view as a reviewer would, and waits until its review list opens. */
export async function uploadBatch(page: Page, file: string, reviewer: string): Promise<void> {
  await page.click('#tab-batch');
  await page.fill('#b-reviewer', reviewer);
  await page.setInputFiles('#b-file', file);
  await page.click('#batch-submit');
  await page.waitForSelector('#batch-review:not([hidden])', { timeout: 60_000 });
}

/** The demo server (as `useDemoServer`, no rate limit) and a browser with its page open, for one test file. */
export interface DemoPage {
  readonly server: RunningServer;
  readonly browser: TestBrowser;
  readonly page: Page;
}

/**
 * Registers beforeAll/afterAll for a test file: the demo gazetteer, a server over it and a fresh browser
 * on its page at `viewport`; read them inside the tests.
 * @example const demo = useDemoPage({ width: 1280, height: 800 }); it('looks up', () => lookUp(demo.page, 'Puerto Lindo'));
 */
export function useDemoPage(viewport?: { width: number; height: number }): DemoPage {
  const demo = useDemoServer({ rateLimit: false });
  let browser: TestBrowser | undefined;
  beforeAll(async () => {
    browser = await openPage(demo.server.url, viewport);
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
  });
  const opened = () => browser ?? (() => { throw new Error('the browser is opened in beforeAll; read it inside a test'); })();
  return {
    get server() {
      return demo.server;
    },
    get browser() {
      return opened();
    },
    get page() {
      return opened().page;
    },
  };
}

/** Looks up one locality in the lookup view as a person would, and waits for its answer or its error. */
export async function lookUp(page: Page, locality: string, countryCode = 'QV'): Promise<void> {
  await page.click('#tab-lookup');
  await page.fill('#f-locality', locality);
  await page.fill('#f-countryCode', countryCode);
  await page.click('#lookup-submit');
  await page.waitForSelector('#h-summary, #lookup-result .error');
}
