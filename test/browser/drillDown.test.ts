import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

// Drill-down by class in real Chromium on the demo: a click on a class in the scoreboard sorts the
// frame list by that class's per-frame IoU (worst first), Shift+I steps to band IoU and Boundary IoU;
// the expected values are computed here from each frame's stored counts with the textbook
// definitions (IoU = TP / (TP + FP + FN) from the confusion matrix, Everingham et al., PASCAL VOC,
// IJCV 2010; Boundary IoU = |boundary intersection| / |boundary union|, Cheng et al., CVPR 2021), and
// the uPlot charts' data are those values and their histogram.

const FRAMES = 8;
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

type Measure = 'iou' | 'band' | 'biou';

/** Each frame's measure of class `id` for run A from the frames' stored counts (null where undefined). */
function expected(page: Page, id: number, measure: Measure): Promise<(number | null)[]> {
  return page.evaluate(([id, measure]) => {
    const s = (window as any).hairline.store.getState();
    const run = s.runA ?? s.dataset.pairing.runs[0];
    return s.results.map((r: any) => {
      const d = r?.runs.find((x: any) => x.run === run)?.stats;
      if (!d) return null;
      const k = d.classIds.length, c = d.classIds.indexOf(id);
      if (c < 0) return null;
      if (measure === 'biou') return d.biouUnion[c] > 0 ? d.biouInter[c] / d.biouUnion[c] : null;
      if (measure === 'band') {
        const at = (s.bandWidth * k + c) * 3;
        const tp = d.bandClass[at], union = d.bandClass[at + 1] + d.bandClass[at + 2] - tp;
        return union > 0 ? tp / union : null;
      }
      let tp = 0, fp = 0, fn = 0;
      for (let g = 0; g < k; g++) for (let p = 0; p <= k; p++) {
        const v = d.confusion[g * (k + 1) + p];
        if (g === c && p === c) tp += v;
        else if (g === c) fn += v;
        else if (p === c) fp += v;
      }
      return tp + fp + fn > 0 ? tp / (tp + fp + fn) : null;
    });
  }, [id, measure] as const);
}

/** Frame names in order of `values`, lowest first, undefined last, ties by frame order. */
function orderOf(values: (number | null)[], names: string[]): string[] {
  return values.map((v, i) => ({ v, i })).sort((a, b) => (a.v === null || b.v === null ? (a.v === b.v ? a.i - b.i : a.v === null ? 1 : -1) : a.v - b.v || a.i - b.i)).map((x) => names[x.i]);
}

describe('drill-down by class (real Chromium)', () => {
  it('a class click sorts the frame list by its per-frame IoU, Shift+I by band IoU and Boundary IoU; the plots draw those values', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
    const errors = pageErrors(page);
    await page.goto(`${url}?demo-frames=${FRAMES}&demo-size=320x160`);
    await page.locator(`[role=status][data-done="${FRAMES}"][data-total="${FRAMES}"]`).waitFor({ timeout: 180_000 });
    const names = await page.evaluate(() => (window as any).hairline.store.getState().dataset.pairing.frames.map((f: { name: string }) => f.name));
    const truck = await page.evaluate(() => (window as any).hairline.store.getState().dataset.table.classes.find((c: { name: string }) => c.name === 'truck').id);
    const listed = () => page.locator('.fl-row').evaluateAll((rows) => rows.map((r) => (r as HTMLElement).dataset.frame!));
    const before = await listed();

    await page.locator(`[data-testid=class-table] tr[data-class="${truck}"] .class-pick`).click();
    for (const measure of ['iou', 'band', 'biou'] as Measure[]) {
      if (measure !== 'iou') await page.keyboard.press('Shift+I');
      await expect.poll(() => page.locator('[data-testid=frame-sort]').getAttribute('data-measure')).toBe(measure);
      const values = await expected(page, truck, measure);
      expect(values.filter((v) => v !== null).length, measure).toBeGreaterThan(3);
      await expect.poll(listed).toEqual(orderOf(values, names));
      expect((await page.locator('[data-testid=frame-sort]').textContent())!.replace(/\s+/g, ' ')).toMatch(new RegExp(`truck ${{ iou: 'IoU', band: 'band IoU', biou: 'Boundary IoU' }[measure]}, worst first`));
      // The line chart's y values are the frames' values in %, the histogram's the counts of 5 % bins.
      const chart = await page.evaluate(() => {
        const line = (document.querySelector('[data-testid=plot-frames]') as any).hairlineChart;
        const hist = (document.querySelector('[data-testid=plot-histogram]') as any).hairlineChart;
        // The tick labels uPlot drew on the canvas (its axis `_values`), count axis second.
        const ticks = hist.axes.map((a: { _values: string[] | null }) => (a._values ?? []).join(' '));
        return { line: line.data[1], hist: hist.data[1], ticks };
      });
      chart.line.forEach((v: number | null, i: number) => {
        if (values[i] === null) expect(v).toBeNull();
        else expect(Math.abs(v! - values[i]! * 100)).toBeLessThan(1e-9);
      });
      const counts = new Array(20).fill(0);
      for (const v of values) if (v !== null) counts[Math.min(19, Math.floor(v * 20))]++;
      expect(chart.hist).toEqual(counts);
      // The count axis shows whole-number ticks (0 and at least one more).
      const countTicks = chart.ticks[1].split(/\s+/).filter((t: string) => /^\d+$/.test(t)).map(Number);
      expect(countTicks.length, chart.ticks[1]).toBeGreaterThanOrEqual(2);
      expect(countTicks).toContain(0);
    }
    // The jump: the worst frame by IoU is on screen, framed on run A's worst region of a truck.
    await page.keyboard.press('Shift+I');
    await expect.poll(() => page.locator('[data-testid=frame-sort]').getAttribute('data-measure')).toBe('iou');
    const worst = orderOf(await expected(page, truck, 'iou'), names)[0];
    const at = await page.evaluate(() => {
      const s = (window as any).hairline.store.getState();
      const run = s.runA ?? s.dataset.pairing.runs[0];
      const regions = s.results[s.frameIndex].runs.find((x: any) => x.run === run).regions.regions;
      return { frame: s.dataset.pairing.frames[s.frameIndex].name, focus: s.focusBox, regions: regions.map((r: any) => ({ bbox: r.bbox, t: r.truthClass, p: r.predictedClass })) };
    });
    expect(at.frame).toBe(worst);
    expect(at.focus).toEqual(at.regions.find((r: { t: number; p: number }) => r.t === truck || r.p === truck).bbox);
    // × goes back to the score the list was sorted by.
    await page.locator('.fl-sort-x').click();
    await expect.poll(listed).toEqual(before);
    expect(errors.filter((e) => !e.includes('GPU stall'))).toEqual([]);
    await page.close();
  });
});
