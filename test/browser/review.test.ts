// Review persistence in real Chromium: IndexedDB through idb-keyval and BroadcastChannel between two
// pages of one browser context (two tabs of one profile), the reload path, and the layout-1 migration.
import { fileURLToPath } from 'node:url';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { createServer, type ViteDevServer } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { browserLaunch, pageErrors } from './harness.ts';

const PAGE = fileURLToPath(new URL('./pages/review.html', import.meta.url));
const REPO = fileURLToPath(new URL('../..', import.meta.url));
let server: ViteDevServer;
let url: string;
let browser: Browser;
let context: BrowserContext;
const errors: string[] = [];

type Hl = Record<string, (...a: unknown[]) => unknown>;
function call<T>(page: Page, name: string, ...args: unknown[]): Promise<T> {
  return page.evaluate(([n, a]) => (window as unknown as { hl: Hl }).hl[n as string](...(a as unknown[])), [name, args] as const) as Promise<T>;
}

async function tabOpen(): Promise<Page> {
  const page = await context.newPage();
  errors.push(...pageErrors(page));
  await page.goto(url);
  await page.waitForFunction(() => document.title === 'review test page ready', null, { timeout: 120_000 });
  expect(await call(page, 'ready')).toBe('ready');
  return page;
}

async function reload(page: Page): Promise<void> {
  await page.reload();
  await page.waitForFunction(() => document.title === 'review test page ready', null, { timeout: 120_000 });
  expect(await call(page, 'ready')).toBe('ready');
}

async function notesBecome(page: Page, want: string[]): Promise<void> {
  await page.waitForFunction((w) => JSON.stringify((window as unknown as { hl: Hl }).hl.notes()) === JSON.stringify(w), want, { timeout: 10_000 });
}

beforeAll(async () => {
  server = await createServer({
    configFile: 'vite.config.ts',
    logLevel: 'error',
    cacheDir: 'node_modules/.vite-review-test',
    optimizeDeps: { include: ['idb-keyval', 'zustand/vanilla'] },
    server: { port: 0, host: '127.0.0.1', strictPort: false, hmr: false, fs: { allow: [REPO] } },
  });
  await server.listen();
  const addr = server.httpServer!.address();
  if (!addr || typeof addr === 'string') throw new Error('vite did not bind a TCP port');
  url = `http://127.0.0.1:${addr.port}/@fs${PAGE}`;
  browser = await browserLaunch();
  context = await browser.newContext();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

describe('review persistence in Chromium (IndexedDB + BroadcastChannel)', () => {
  it('two tabs see each other\'s flags at once, edits and deletes travel, and a reload keeps everything', async () => {
    const A = await tabOpen();
    const B = await tabOpen();
    expect(await call(A, 'notes')).toEqual([]);
    expect(await call(A, 'add', 'a', 'from A')).toBe(true);
    expect(await call(B, 'add', 'b', 'from B')).toBe(true);
    await notesBecome(A, ['from A', 'from B']);
    await notesBecome(B, ['from A', 'from B']);
    await call(B, 'edit', 'from A', 'from A, edited in B');
    await notesBecome(A, ['from A, edited in B', 'from B']);
    await call(A, 'remove', 'from B');
    await notesBecome(B, ['from A, edited in B']);
    await call(A, 'idle');
    await call(B, 'idle');
    await reload(B);
    expect(await call(B, 'notes')).toEqual(['from A, edited in B']);
    expect(errors).toEqual([]);
    await A.close();
    await B.close();
  });

  it('bulk changes survive a reload 300 ms later: 1,000 imported flags, then 200 added one by one', async () => {
    const page = await tabOpen();
    const before = await call<number>(page, 'count');
    expect(await call(page, 'importMany', 1000, 'bulk')).toBe(1000);
    await page.waitForTimeout(300);
    await reload(page);
    expect(await call<number>(page, 'count')).toBe(before + 1000);
    expect(await call(page, 'addMany', 200, 'one-by-one')).toBe(200);
    await page.waitForTimeout(300);
    await reload(page);
    expect(await call<number>(page, 'count')).toBe(before + 1200);
    expect(await call(page, 'pending')).toBe(false);
    await page.close();
  });
});
