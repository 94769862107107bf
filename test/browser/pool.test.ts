// The worker pool's watchdog in real Chromium: a worker stuck in a busy loop and one that closed
// itself (no error event reaches the page) each fail their job with a clear message after the
// deadline, are terminated and replaced, and every other job is answered.
import { fileURLToPath } from 'node:url';
import type { Browser } from 'playwright-core';
import { createServer, type ViteDevServer } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { browserLaunch, pageErrors } from './harness.ts';

const PAGE = fileURLToPath(new URL('./pages/pool.html', import.meta.url));
const REPO = fileURLToPath(new URL('../..', import.meta.url));
let server: ViteDevServer;
let url: string;
let browser: Browser;

beforeAll(async () => {
  server = await createServer({
    configFile: 'vite.config.ts',
    logLevel: 'error',
    cacheDir: 'node_modules/.vite-pool-test',
    server: { port: 0, host: '127.0.0.1', strictPort: false, hmr: false, fs: { allow: [REPO] } },
  });
  await server.listen();
  const addr = server.httpServer!.address();
  if (!addr || typeof addr === 'string') throw new Error('vite did not bind a TCP port');
  url = `http://127.0.0.1:${addr.port}/@fs${PAGE}`;
  browser = await browserLaunch();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

describe('worker pool watchdog in Chromium', () => {
  it('a stalled worker and a worker that closed itself fail their jobs at the deadline, are replaced, and the rest are answered', async () => {
    const page = await browser.newPage();
    const errors = pageErrors(page);
    await page.goto(url);
    await page.waitForFunction(() => document.title === 'pool test page ready', null, { timeout: 120_000 });
    const t0 = Date.now();
    const r = (await page.evaluate(() =>
      (window as unknown as { hl: { runAll(c: string[]): unknown } }).hl.runAll(['echo', 'spin', 'close', 'echo', 'echo', 'echo']),
    )) as { outcomes: (number | string)[]; restarts: number };
    const stuck = 'error: the worker did not finish this job within 2 s (stuck, or it closed itself); it was stopped and replaced';
    expect(r.outcomes).toEqual([0, stuck, stuck, 6, 8, 10]);
    expect(r.restarts).toBe(2);
    expect(Date.now() - t0).toBeGreaterThanOrEqual(2000);
    expect(errors).toEqual([]);
    await page.close();
  });
});
