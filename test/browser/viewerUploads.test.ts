import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

// Texture uploads in the workspace on the demo, counted at the WebGL calls themselves (texImage2D and
// texSubImage2D): a step to a neighbour that was prefetched uploads nothing, a jump to a frame never
// prefetched uploads its textures, a layer toggle uploads nothing, and the flicker layer draws from
// the neighbours' maps already on the GPU.

const FRAMES = 6;
let url = '';
let close: () => Promise<void>;
let browser: Browser;

beforeAll(async () => {
  ({ url, close } = await appServeBuilt());
  browser = await browserLaunch();
});
afterAll(async () => {
  await browser?.close();
  await close?.();
});

const uploads = (page: Page) => page.evaluate(() => (window as any).__uploads as number);

/** Waits until frame `i` is shown, its neighbours are decoded and handed on, and the prefetch had time to run. */
async function settled(page: Page, i: number): Promise<void> {
  await page.waitForFunction((k) => {
    const s = (window as any).hairline.store.getState();
    return s.frameIndex === k && s.shownIndex === k && s.shown !== null && s.shownNearby.length > 0;
  }, i);
  await page.waitForTimeout(400);
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
}

describe('viewer texture uploads on the demo (real Chromium)', () => {
  it('a prefetched step and a layer toggle upload nothing; a jump to an unseen frame does', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    const errors = pageErrors(page);
    await page.addInitScript(() => {
      (window as any).__uploads = 0;
      const proto = WebGL2RenderingContext.prototype as any;
      for (const name of ['texImage2D', 'texSubImage2D']) {
        const orig = proto[name];
        proto[name] = function (...args: unknown[]) {
          (window as any).__uploads++;
          return orig.apply(this, args);
        };
      }
    });
    await page.goto(`${url}?demo-frames=${FRAMES}&demo-size=320x160`);
    await page.locator(`[role=status][data-done="${FRAMES}"][data-total="${FRAMES}"]`).waitFor({ timeout: 120_000 });
    expect(await page.evaluate(() => (window as any).hairlineViewer.mode)).toBe('webgl');
    await settled(page, 0);
    expect(await uploads(page)).toBeGreaterThan(0); // the counter sees the first frame's uploads

    // → to frame 2: its truth, photo, band bins and run A went up while frame 1 was on screen.
    // Counted in the page from the key press to the frame painted, before the next prefetch starts.
    const step = await page.evaluate(() => new Promise<number>((resolve) => {
      const w = window as any;
      const before = w.__uploads;
      const check = () => {
        const s = w.hairline.store.getState();
        if (s.shownIndex !== 1 || !s.shown) return;
        unsub();
        requestAnimationFrame(() => resolve(w.__uploads - before));
      };
      const unsub = w.hairline.store.subscribe(check);
      window.dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowRight', bubbles: true }));
      check();
    }));
    await settled(page, 1);
    let before: number;

    // A toggle is a uniform change and a redraw.
    before = await uploads(page);
    await page.keyboard.press('4');
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    expect((await uploads(page)) - before).toBe(0);

    // Flicker on frame 2 draws from run A at frames 1 and 3: both on the GPU already (shown, prefetched).
    await page.waitForFunction(() => (window as any).hairline.store.getState().shownAround !== null);
    before = await uploads(page);
    await page.keyboard.press('8');
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    expect((await uploads(page)) - before).toBe(0);

    // End jumps to frame 6, never prefetched: its textures go up then (photo, truth, bins, run A at least).
    before = await uploads(page);
    await page.keyboard.press('End');
    await page.waitForFunction(() => {
      const s = (window as any).hairline.store.getState();
      return s.shownIndex === s.frameIndex && s.frameIndex === 5;
    });
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    const jump = (await uploads(page)) - before;
    expect(jump).toBeGreaterThanOrEqual(4);
    expect(step).toBe(0);
    expect(errors.filter((e) => !e.includes('GPU stall'))).toEqual([]);
    await page.close();
  });
});
