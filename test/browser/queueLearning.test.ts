// The label-check queue learning from verdicts in real Chromium, on the built app with the Kestrel Quay
// demo: every item shows what each signal contributed; judging an item re-ranks the list at once, and
// items like it say why they moved. Screenshots of the queue before and after go to
// HAIRLINE_SHOTS when it is set (for looking at the screen, not for checking).
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

const FRAMES = 24;
const QUERY = `?demo-frames=${FRAMES}&demo-size=512x256`;
const SHOTS = process.env.HAIRLINE_SHOTS ?? null;
let url = '';
let close: () => Promise<void>;
let browser: Browser;

beforeAll(async () => {
  ({ url, close } = await appServeBuilt());
  browser = await browserLaunch();
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await close?.();
});

interface Item { key: string; pair: string; learned: string | null; parts: string }

/** Returns the queue as listed on screen, top first. */
function listed(page: Page): Promise<Item[]> {
  return page.$$eval('.queue-item', (els) =>
    els.map((el) => ({
      key: `${el.getAttribute('data-frame')}|${el.querySelector('.qi-pair')?.textContent ?? ''}|${el.querySelector('.qi-head')?.textContent ?? ''}`,
      pair: [...el.querySelectorAll('.qi-pair b')].map((b) => b.textContent).join('>'),
      learned: el.querySelector('.qi-learned')?.textContent ?? null,
      parts: el.querySelector('.qi-parts')?.textContent ?? '',
    })),
  );
}

async function shot(page: Page, name: string): Promise<void> {
  if (!SHOTS) return;
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: join(SHOTS, name) });
}

describe('label check queue: contributions and learning from verdicts', () => {
  it('shows contributions, and a verdict re-ranks the list with the reason shown', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
    const errors = pageErrors(page);
    await page.goto(`${url}${QUERY}`);
    await page.locator(`[role=status][data-done="${FRAMES}"][data-total="${FRAMES}"]`).waitFor({ timeout: 240_000 });
    await page.evaluate(() => (window as any).hairline.store.getState().leftTabSet('queue'));
    await page.locator('.queue-item').first().waitFor();
    const before = await listed(page);
    expect(before.length).toBeGreaterThan(10);
    for (const q of before) expect(q.parts).toMatch(/^(run agreement|confidence|appearance|image edges|shape|common confusion|label flip|steady|thin sliver) [+−]\d\.\d\d/);
    expect(before.every((q) => q.learned === null)).toBe(true);
    await shot(page, 'queue-before.png');

    // Judge a building → container item (the runs' shared habit) a model error: the items of its class
    // pair move down, and say that a similar item was judged a model error.
    const at = before.findIndex((q) => q.pair === 'building>container');
    expect(at).toBeGreaterThanOrEqual(0);
    await page.locator('.queue-item').nth(at).locator('.qi-verdicts button', { hasText: 'model error' }).click();
    await page.waitForFunction(() => [...document.querySelectorAll('.qi-learned')].some((e) => /similar item/.test(e.textContent ?? '')), null, { timeout: 10_000 });
    const after = await listed(page);
    expect(after.map((q) => q.key)).not.toEqual(before.map((q) => q.key));
    const moved = after.filter((q) => q.pair === 'building>container' && q.learned);
    expect(moved.length).toBeGreaterThan(0);
    for (const q of moved) {
      expect(q.learned).toMatch(/similar items? (was|were) judged model errors? \(down 0\.\d\d\)|your verdicts weigh its evidence down/);
      expect(q.parts).toMatch(/your verdicts −0\.\d\d/);
    }
    await shot(page, 'queue-after.png');
    expect(errors).toEqual([]);
    await page.close();
  }, 300_000);
});
