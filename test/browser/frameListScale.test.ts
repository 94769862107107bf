// The frame list on a long dataset scored in the page: only the rows in view are in the document,
// and while the pointer is over the list its order holds as frames land (so a row does not move from
// under the pointer); 'sort now' takes the current order.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';
import { resultsSynthesize } from '../support/resultsSynth.ts';

const FRAMES = 3000;
const ROW_H = 24;
let tmp: string;
let dataset: string;
let browser: Browser;

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'hairline-frame-list-'));
  dataset = (await resultsSynthesize(tmp, { frames: FRAMES, classes: 5 })).dataset;
  browser = await browserLaunch();
}, 300_000);

afterAll(async () => {
  await browser?.close();
  rmSync(tmp, { recursive: true, force: true });
});

const done = async (page: Page) => Number(await page.locator('[role=status][data-done]').getAttribute('data-done'));

/** Names of the rows in the document, top to bottom, and which still wait for scores ('…'). */
async function visibleRows(page: Page): Promise<{ name: string; pending: boolean }[]> {
  return page.$$eval('.fl-row', (rows) =>
    rows
      .map((r) => ({ top: parseFloat((r as HTMLElement).style.top), name: r.getAttribute('data-frame')!, pending: (r.textContent ?? '').includes('…') }))
      .sort((a, b) => a.top - b.top)
      .map(({ name, pending }) => ({ name, pending })),
  );
}

describe('the frame list at 3,000 frames scored in the page', () => {
  it('keeps only the rows in view in the document and holds its order while the pointer is over it', async () => {
    const { url, close } = await appServeBuilt(dataset);
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    const errors = pageErrors(page);
    try {
      await page.goto(url);
      await page.waitForFunction(() => Number(document.querySelector('[role=status][data-done]')?.getAttribute('data-done')) >= 30, null, { timeout: 120_000 });
      const scroller = page.locator('.fl-scroll');
      expect(await scroller.evaluate((el) => el.scrollHeight)).toBe(FRAMES * ROW_H);
      const inDom = await page.locator('.fl-row').count();
      expect(inDom).toBeGreaterThan(5);
      expect(inDom).toBeLessThan(60);

      // Pointer over the list: it holds. Scroll to where the scored rows end and the pending ones begin.
      await scroller.hover();
      await page.locator('.frame-list[data-held]').waitFor();
      const at = await done(page);
      await scroller.evaluate((el, top) => (el.scrollTop = top), Math.max(0, (at - 3) * ROW_H));
      await page.waitForTimeout(100);
      const before = await visibleRows(page);
      const waiting = before.filter((r) => r.pending).map((r) => Number(r.name.slice(1)));
      expect(waiting.length).toBeGreaterThan(0);
      expect(before.length).toBeLessThan(60);

      // Frames land meanwhile: the rows stay where they were, now with their scores.
      const until = Math.max(...waiting) + 20;
      await page.waitForFunction((n) => Number(document.querySelector('[role=status][data-done]')?.getAttribute('data-done')) >= n, until, { timeout: 120_000 });
      const after = await visibleRows(page);
      expect(after.map((r) => r.name)).toEqual(before.map((r) => r.name));
      expect(after.filter((r) => waiting.includes(Number(r.name.slice(1)))).every((r) => !r.pending)).toBe(true);

      // 'Sort now' takes the order of the frames scored by now: other frames fill these places.
      await page.locator('.fl-resort').click();
      await page.waitForTimeout(100);
      const resorted = await visibleRows(page);
      expect(resorted.map((r) => r.name)).not.toEqual(before.map((r) => r.name));
      await page.screenshot({ path: process.env.HAIRLINE_SHOT ?? join(tmp, 'list.png') });
      expect(errors).toEqual([]);
    } finally {
      await page.close();
      await close();
    }
  }, 300_000);
});
