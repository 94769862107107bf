// The dataset server seen from a real browser: our page reads a served dataset; a page on another
// name pointed at 127.0.0.1 (DNS rebinding, simulated with Chromium's host resolver rules) gets
// nothing; HTML and scripts inside the dataset never run as the app's origin.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type Browser } from 'playwright-core';
import { appServeBuilt, browserLaunch, CHROMIUM_ARGS, CHROMIUM_PATH, pageErrors } from './harness.ts';

let close: () => Promise<void>;
let url: string;
let browser: Browser;
let tmp: string;

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'hairline-serve-browser-'));
  const gen = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/demo.ts', '--out', tmp, '--frames', '2', '--size', '160x96', '--threads', '1'], { encoding: 'utf8' });
  if (gen.status !== 0) throw new Error(gen.stderr);
  mkdirSync(join(tmp, 'web'));
  // A page in the dataset that, if it ran as the app's origin, would read the listing and mark the app.
  writeFileSync(join(tmp, 'web', 'page.html'), '<!doctype html><script src="x.js"></script>');
  writeFileSync(join(tmp, 'web', 'x.js'), 'fetch("/dataset/index.json").then((r) => r.text()).then((t) => fetch("/leak?" + t.length));');
  ({ close, url } = await appServeBuilt(tmp));
  browser = await browserLaunch();
});
afterAll(async () => {
  await browser?.close();
  await close?.();
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});

describe('dataset server in Chromium', () => {
  it('our own page opens and scores the served dataset', async () => {
    const page = await browser.newPage();
    const errors = pageErrors(page);
    await page.goto(url);
    await page.locator('[role=status][data-done="2"]').waitFor({ timeout: 120_000 });
    expect(errors).toEqual([]);
    await page.close();
  });

  it('a page on a rebinding name reaching 127.0.0.1 gets 421 and no listing', async () => {
    const port = new URL(url).port;
    const rebound = await chromium.launch({
      executablePath: CHROMIUM_PATH,
      args: [...CHROMIUM_ARGS, '--host-resolver-rules=MAP evil.example 127.0.0.1'],
    });
    try {
      const page = await rebound.newPage();
      const res = await page.goto(`http://evil.example:${port}/dataset/index.json`);
      expect(res!.status()).toBe(421);
      expect(await page.content()).not.toContain('truth/');
    } finally {
      await rebound.close();
    }
  });

  it('dataset HTML opened in the browser never runs: its script is never even requested', async () => {
    const page = await browser.newPage();
    const requested: string[] = [];
    page.on('request', (r) => requested.push(new URL(r.url()).pathname));
    // Opened directly, the page would run as the app's origin if it were served as text/html.
    await page.goto(url + 'dataset/file/web/page.html').catch(() => undefined);
    await page.waitForTimeout(1500);
    expect(requested).toContain('/dataset/file/web/page.html');
    expect(requested).not.toContain('/dataset/file/web/x.js');
    await page.goto(url);
    const direct = await page.evaluate(async () => {
      const r = await fetch('/dataset/file/web/page.html');
      return { type: r.headers.get('content-type'), disposition: r.headers.get('content-disposition'), csp: r.headers.get('content-security-policy') };
    });
    expect(direct).toEqual({ type: 'application/octet-stream', disposition: 'attachment', csp: "sandbox; default-src 'none'" });
    await page.close();
  });
});
