import { rmSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCENE_KEYS } from '../cli/sceneKeys.ts';
import { scoreCli } from '../cli/scoreRun.ts';
import { reportDifferences } from '../reference/pythonRef.ts';
import { demoOnDisk } from '../support/demoOnDisk.ts';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

// Flicker and objects in real Chromium on the demo: the page's frame jobs get the neighbouring
// predictions and instance maps, so its flicker, object and iIoU scores equal the headless scorer's
// report on the same demo written by `npm run demo` (the report itself is checked against
// scipy.ndimage.label and numpy in test/reference/objects_ref.test.ts); the chart of recall by size,
// the frame list's flicker column and the missed-object list show those numbers.

const FRAMES = 6;
const W = 320;
const H = 160;
let dir = '';
let url = '';
let close: () => Promise<void>;
let browser: Browser;

beforeAll(async () => {
  dir = demoOnDisk('hairline-obj-', FRAMES, W, H);
  ({ url, close } = await appServeBuilt());
  browser = await browserLaunch();
});
afterAll(async () => {
  await browser?.close();
  await close?.();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function openDemo(page: Page): Promise<void> {
  await page.goto(`${url}?demo-frames=${FRAMES}&demo-size=${W}x${H}`);
  await page.locator(`[role=status][data-done="${FRAMES}"][data-total="${FRAMES}"]`).waitFor({ timeout: 120_000 });
  await page.waitForFunction(() => {
    const s = (window as any).hairline.store.getState();
    return s.shown && s.shownIndex === s.frameIndex;
  });
}

const pick = (o: Record<string, unknown>) => Object.fromEntries(SCENE_KEYS.filter((k) => k in o).map((k) => [k, o[k]]));

describe('flicker and objects on the demo (real Chromium)', () => {
  it('equal the scorer\'s report; the chart, the frame list and the missed objects show them', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    const errors = pageErrors(page);
    await openDemo(page);
    const kq = join(dir, 'kq');
    const cli = scoreCli([
      '--truth', join(kq, 'truth'), '--pred', `run-a=${join(kq, 'predictions', 'run-a')}`, '--pred', `run-b=${join(kq, 'predictions', 'run-b')}`,
      '--instances', join(kq, 'instances'), '--classes', join(kq, 'classes.json'),
    ]);
    expect(cli.status, cli.stderr).toBe(0);
    const report = JSON.parse(cli.stdout);
    for (const [run, dataset] of [['run-a', report.dataset], ['run-b', report.runs['run-b']]] as const) {
      const fromPage = await page.evaluate((r) => (window as any).hairline.report(r), run);
      expect(Object.keys(pick(dataset)).sort()).toEqual([...SCENE_KEYS].sort());
      expect(reportDifferences(pick(fromPage.dataset), pick(dataset), 1e-12, []), run).toEqual([]);
      if (run === 'run-a') {
        const lines = (f: { flipBack: unknown; flipBackVoid: unknown; smallObjectRecall: unknown }) => ({ flipBack: f.flipBack, flipBackVoid: f.flipBackVoid, smallObjectRecall: f.smallObjectRecall });
        expect(reportDifferences(fromPage.frames.map(lines), report.frames.map(lines), 1e-12, [])).toEqual([]);
      }
    }
    // run-a flickers on odd frames: frame 2 (index 1) has a flip-back rate, the ends none.
    expect(report.frames[1].flipBack).toBeGreaterThan(0);
    expect(report.frames[0].flipBack).toBeNull();
    const flick = await page.locator('.fl-row[data-frame="kq-0002"] .fl-col').nth(5).innerText();
    expect(flick).toBe((report.frames[1].flipBack * 100).toFixed(2));

    // Run B chosen, the Objects tab: every bar is the report's mean recall of its bin.
    await page.evaluate(() => (window as any).hairline.store.getState().runsSet({ runB: 'run-b' }));
    await page.locator('button.tab', { hasText: 'Objects' }).click();
    const bars = await page.locator('[data-testid=recall-chart] rect').evaluateAll((rs) => rs.map((r) => ({
      series: r.getAttribute('data-series'), bin: Number(r.getAttribute('data-bin')), recall: Number(r.getAttribute('data-recall')),
    })));
    const expected = (bins: { meanRecall: number | null }[], series: string) => bins.flatMap((b, bin) => (b.meanRecall === null ? [] : [{ series, bin, recall: b.meanRecall }]));
    expect(bars.filter((b) => b.series === 'a')).toEqual(expected(report.dataset.objectsBySize, 'a'));
    expect(bars.filter((b) => b.series === 'b')).toEqual(expected(report.runs['run-b'].objectsBySize, 'b'));
    expect(bars.filter((b) => b.series === 'frame').length).toBeGreaterThan(0);

    // The missed small objects of this frame: a click (and N) frames one in the viewer.
    const rows = page.locator('[data-testid=missed-objects] tbody tr');
    expect(await rows.count()).toBeGreaterThan(0);
    await rows.nth(1).click();
    const focus = await page.evaluate(() => (window as any).hairline.store.getState().focusBox);
    const missed = await page.evaluate(() => {
      const s = (window as any).hairline.store.getState();
      return s.results[s.frameIndex].runs.find((r: { run: string }) => r.run === 'run-a').extras.objects.missed;
    });
    const m = missed[1];
    expect(focus).toEqual([m.box[0], m.box[1], m.box[2] + 1, m.box[3] + 1]);
    await page.keyboard.press('n');
    const next = await page.evaluate(() => (window as any).hairline.store.getState().focusBox);
    expect(next).toEqual([missed[2].box[0], missed[2].box[1], missed[2].box[2] + 1, missed[2].box[3] + 1]);
    await page.screenshot({ path: join(dir, 'objects.png') });
    expect(errors.filter((e) => !e.includes('GPU stall'))).toEqual([]);
    await page.close();
  });
});
