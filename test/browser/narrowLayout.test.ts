import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

// Nothing cut off on a narrow window (checked by element geometry in real Chromium at an 800 px-wide
// viewport): the top bar's controls, the scoreboard's tabs, the settings' class-table picker; and the
// legends: the band curve's line samples drawn like their curves, the timeline's colour scale.

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

/** For each shown element: its text, whether it lies inside the viewport and its `within` ancestor, and whether its text fits. */
const fits = (els: Element[], within: string) => els.filter((el) => el.getClientRects().length > 0).map((el) => {
  const r = el.getBoundingClientRect();
  const box = el.closest(within)!.getBoundingClientRect();
  return {
    text: (el as HTMLElement).innerText.trim() || el.getAttribute('aria-label') || el.tagName,
    inside: r.width > 0 && r.left >= Math.max(0, box.left) - 0.5 && r.right <= Math.min(innerWidth, box.right) + 0.5 && r.bottom <= box.bottom + 0.5,
    textFits: el.scrollWidth <= el.clientWidth + 1,
  };
});

describe('narrow window (real Chromium, 800 px wide)', () => {
  it('cuts off no control of the top bar, the scoreboard tabs or the settings; legends for the band curve and the timeline', async () => {
    const page = await browser.newPage({ viewport: { width: 800, height: 700 } });
    const errors = pageErrors(page);
    await page.goto(`${url}?demo-frames=4&demo-size=320x160`);
    await page.locator('[role=status][data-done="4"][data-total="4"]').waitFor({ timeout: 120_000 });
    const top = await page.$$eval('header.top > *:not(.spacer)', fits, 'header.top');
    expect(top.map((t) => t.text).join(' | ')).toContain('Open results…');
    for (const t of top) expect(t, t.text).toMatchObject({ inside: true });
    const buttons = await page.$$eval('header.top button', fits, 'header.top');
    for (const b of buttons) expect(b, b.text).toMatchObject({ inside: true, textFits: true });
    const tabs = await page.$$eval('.scoreboard .tabs .tab', fits, 'aside');
    expect(tabs.map((t) => t.text)).toContain('Settings');
    for (const t of tabs) expect(t, t.text).toMatchObject({ inside: true, textFits: true });
    // The viewer keeps a usable width between the panes.
    expect((await page.locator('.viewer-pane').boundingBox())!.width).toBeGreaterThanOrEqual(240);

    await page.locator('.scoreboard .tab', { hasText: 'Settings' }).click();
    const picker = await page.$$eval('.file-pick', fits, 'aside');
    expect(picker).toEqual([expect.objectContaining({ text: 'choose file…', inside: true, textFits: true })]);

    await page.locator('.scoreboard .tab', { hasText: 'Band' }).click();
    // One line sample per curve, dashed exactly where its curve is.
    const legend = await page.$$eval('.band-curve .legend li', (lis) => lis.map((li) => getComputedStyle(li.querySelector('svg.key line')!).strokeDasharray));
    const curves = await page.$$eval('.band-curve path.curve', (ps) => ps.map((p) => getComputedStyle(p).strokeDasharray));
    expect(legend).toEqual(curves);
    expect(new Set(legend).size).toBe(2);

    const scale = page.locator('[data-testid=timeline-scale]');
    expect((await scale.innerText()).replace(/\s+/g, ' ')).toBe('worst best mean IoU');
    expect(await scale.getAttribute('title')).toMatch(/coloured by mean IoU of run A between the dataset's worst and best frames/);
    expect(errors.filter((e) => !e.includes('GPU stall'))).toEqual([]);
    await page.close();
  });
});
