/** Debian's chromium through playwright-core, for the page tests: headless, offline but for one server. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

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
