/**
 * npm run bench:server: 16 concurrent clients on loopback against the demo gazetteer, bounded in
 * requests and time; p99 of POST /api/v1/georeference (target ≤ 20 ms) and errors (target 0), then
 * the page's first-load transfer in a real browser (target ≤ 1.5 MB).
 */
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { describe, quantile, run, startService } from './server-harness.ts';

const CLIENTS = 16;
const MAX_REQUESTS = 20_000;
const MAX_SECONDS = 30;
const P99_TARGET_MS = 20;
const FIRST_LOAD_TARGET_BYTES = 1.5 * 1024 * 1024;

// Options after `--` go to `whereabouts serve` (e.g. `npm run bench:server -- --threads 0`, to pair runs).
const serveArgs = process.argv.slice(2);
if (serveArgs.length) console.log(`whereabouts serve ${serveArgs.join(' ')}`);

// Two runs: as served (repeated demo records come from the result cache), and with no cache, so every
// request is computed from the gazetteer (the figure for distinct localities).
for (const [label, args] of [['as served (result cache on)', []], ['every request computed (--cache 0)', ['--cache', '0']]] as const) {
  const service = await startService([...args, ...serveArgs]);
  try {
    await run(service.url, CLIENTS, 500, 10); // warm-up: JIT and SQLite page cache
    const result = await run(service.url, CLIENTS, MAX_REQUESTS, MAX_SECONDS);
    const p99 = quantile(result.latenciesMs, 0.99);
    console.log(`POST /api/v1/georeference, ${CLIENTS} concurrent clients on loopback, ${label}`);
    console.log(describe(result));
    console.log(`p99 target ≤ ${P99_TARGET_MS} ms: ${p99 <= P99_TARGET_MS ? 'met' : 'NOT met'}; errors target 0: ${result.errors === 0 ? 'met' : 'NOT met'}\n`);
  } finally {
    await service.stop();
  }
}

const service = await startService();
try {
  if (existsSync('/usr/bin/chromium')) {
    const bytes = await firstLoadBytes(service.url);
    console.log(`page first load: ${(bytes / 1024).toFixed(0)} KiB transferred (target ≤ ${(FIRST_LOAD_TARGET_BYTES / 1024).toFixed(0)} KiB: ${bytes <= FIRST_LOAD_TARGET_BYTES ? 'met' : 'NOT met'})`);
  } else {
    console.log('page first load: not measured (no /usr/bin/chromium)');
  }
} finally {
  await service.stop();
}

/** Bytes on the wire for a cold load of the page until it is ready (Chrome DevTools Protocol, encodedDataLength). */
async function firstLoadBytes(url: string): Promise<number> {
  const profile = mkdtempSync(join(tmpdir(), 'whereabouts-bench-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  try {
    const page = context.pages()[0] ?? (await context.newPage());
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
    let total = 0;
    cdp.on('Network.loadingFinished', (event) => (total += event.encodedDataLength));
    await page.goto(url);
    await page.waitForSelector('body[data-ready="true"]');
    await page.waitForLoadState('networkidle');
    return total;
  } finally {
    await context.close();
    rmSync(profile, { recursive: true, force: true });
  }
}
