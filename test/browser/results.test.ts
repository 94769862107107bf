// The page opening a results folder (npm start -- DATASET --results DIR, and a picked folder): the
// frame count, every frame's scores and the dataset scores are those of the tables (read back here
// with hyparquet in Node), no frame is scored but the one on screen, which is checked against its row.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, unlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { parquetReadObjects } from 'hyparquet';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';
import { resultsSynthesize, synthName } from '../support/resultsSynth.ts';

const FRAMES = 3000;
let tmp: string;
let data: Awaited<ReturnType<typeof resultsSynthesize>>;
let browser: Browser;

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'hairline-results-page-'));
  data = await resultsSynthesize(tmp, { frames: FRAMES, runs: ['a', 'b'], classes: 5 });
  browser = await browserLaunch();
}, 300_000);

afterAll(async () => {
  await browser?.close();
  rmSync(tmp, { recursive: true, force: true });
});

/** Truth files the page fetched (each frame scored or shown reads its ground truth once). */
function truthReads(page: Page): Set<string> {
  const seen = new Set<string>();
  page.on('request', (r) => {
    const m = /\/dataset\/file\/truth\/([^?]+)\.png/.exec(r.url());
    if (m) seen.add(decodeURIComponent(m[1]));
  });
  return seen;
}

async function tableRows(): Promise<Record<string, unknown>[]> {
  const buf = readFileSync(join(data.results, 'frames.parquet'));
  const file = buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength);
  return (await parquetReadObjects({ file, columns: ['frameIndex', 'run', 'meanIoU', 'boundaryF', 'errorPixels'] })) as Record<string, unknown>[];
}

describe('the page opens a results folder', () => {
  it('shows the frame count, the tables\' scores and the stored queue without scoring the dataset again', async () => {
    const { url, close } = await appServeBuilt(data.dataset, data.results);
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    const errors = pageErrors(page);
    const reads = truthReads(page);
    try {
      await page.goto(url);
      const status = page.locator('[role=status][data-results]');
      await status.waitFor({ timeout: 60_000 });
      expect(await status.getAttribute('data-done')).toBe(String(FRAMES));
      expect(await status.textContent()).toContain('3,000 frames from results');
      await page.locator('.results-bar', { hasText: 'matches its stored row' }).waitFor({ timeout: 30_000 });

      // Every frame's scores in the page equal the table's (source: frames.parquet read with hyparquet).
      const rows = await tableRows();
      expect(rows.length).toBe(FRAMES * 2);
      const page_ = await page.evaluate(() => {
        const s = (window as unknown as { hairline: { store: { getState(): { stored: { runs: Record<string, { meanIoU: Float64Array; boundaryF: Float64Array; errorPixels: Float64Array }> } } } } }).hairline.store.getState();
        const pick = (r: string) => ({ meanIoU: [...s.stored.runs[r].meanIoU], boundaryF: [...s.stored.runs[r].boundaryF], errorPixels: [...s.stored.runs[r].errorPixels] });
        return { a: pick('a'), b: pick('b') };
      });
      for (const r of rows) {
        const cols = page_[r.run as 'a' | 'b'];
        const i = r.frameIndex as number;
        expect(cols.meanIoU[i]).toBe(r.meanIoU ?? NaN);
        expect(cols.boundaryF[i]).toBe(r.boundaryF ?? NaN);
        expect(cols.errorPixels[i]).toBe(r.errorPixels);
      }
      // The list shows them: each rendered row's mIoU and BF cells are the table's values of its frame.
      const byName = new Map(rows.filter((r) => r.run === 'a').map((r) => [synthName(r.frameIndex as number), r]));
      const shown = await page.locator('.fl-row').evaluateAll((els) => els.map((e) => [e.getAttribute('data-frame'), ...[...e.querySelectorAll('.fl-col')].map((c) => c.textContent)]));
      expect(shown.length).toBeGreaterThan(10);
      expect(shown.length).toBeLessThan(100);
      for (const [name, miou, , , bf] of shown) {
        const r = byName.get(name!)!;
        expect(miou).toBe(((r.meanIoU as number) * 100).toFixed(1));
        expect(bf).toBe(((r.boundaryF as number) * 100).toFixed(1));
      }
      // Dataset scores from the stored sums: the scoreboard's mean IoU is summary.json's.
      const board = await page.locator('.right').textContent();
      expect(board).toContain((data.summary.dataset.meanIoU! * 100).toFixed(1));
      // The queue is the stored one (queue.parquet's first entry first).
      await page.getByRole('tab', { name: /queue|mistakes/i }).first().click().catch(() => undefined);
      expect(await page.evaluate(() => (window as unknown as { hairline: { store: { getState(): { stored: { queue: unknown[] } } } } }).hairline.store.getState().stored.queue.length)).toBe(data.summary.rows.queue);

      // Nothing was scored but the frame on screen: one scoring job, the pool idle since; files read
      // only for the frame on screen and the neighbours the viewer decodes ahead (at most 3).
      const jobs = () => page.evaluate(() => {
        const h = (window as unknown as { hairline: { store: { getState(): { scoring: { done: number } } }; scorePool: { pending(): number; running(): number } } }).hairline;
        return { done: h.store.getState().scoring.done, busy: h.scorePool.pending() + h.scorePool.running() };
      });
      await page.waitForTimeout(1500);
      expect(await jobs()).toEqual({ done: 1, busy: 0 });
      expect(reads.size).toBeLessThanOrEqual(4);
      // Another frame is scored and checked when it comes on screen, and only it.
      await page.locator('.fl-row').nth(3).click();
      await page.locator('.results-bar', { hasText: 'matches its stored row' }).waitFor({ timeout: 30_000 });
      await page.waitForTimeout(500);
      expect(await jobs()).toEqual({ done: 2, busy: 0 });

      // A changed setting marks the stored scores stale; 3,000 frames get the headless command.
      await page.getByRole('tab', { name: 'Settings' }).click();
      const tol = page.locator('label.setting', { hasText: 'Boundary F tolerance' }).locator('input');
      await tol.fill('0.02');
      await tol.press('Enter');
      const stale = page.locator('.results-bar [data-stale]');
      await stale.waitFor();
      expect(await stale.textContent()).toContain('Boundary F tolerance ratio 0.0075 → 0.02');
      expect(await page.locator('.rb-command').textContent()).toContain('--bf-tolerance 0.02');
      // The stale frame on screen is scored again with the new setting, and no other.
      await page.waitForTimeout(1000);
      expect((await jobs()).done).toBeLessThanOrEqual(1);
      expect(errors).toEqual([]);
    } finally {
      await page.close();
      await close();
    }
  }, 180_000);

  it('shows a mismatch when the frame on screen changed since the results were written', async () => {
    // Frame 0's ground truth replaced by another map (its own file now, the other names keep theirs).
    const path = join(data.dataset, 'truth', `${synthName(0)}.png`);
    unlinkSync(path);
    const ids = new Uint8Array(48 * 24).fill(1);
    writeFileSync(path, labelMapToPng({ width: 48, height: 24, ids }, { kind: 'gray', bitDepth: 8 }));
    const { url, close } = await appServeBuilt(data.dataset, data.results);
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    try {
      await page.goto(url);
      const mismatch = page.locator('.results-bar [data-mismatch]');
      await mismatch.waitFor({ timeout: 60_000 });
      expect(await mismatch.textContent()).toMatch(/mIoU stored [\d.]+, now [\d.]+/);
    } finally {
      await page.close();
      await close();
    }
  }, 120_000);

  it('refuses a results folder of another dataset, naming the difference', async () => {
    const other = await resultsSynthesize(join(tmp, 'other'), { frames: 40 });
    const { url, close } = await appServeBuilt(data.dataset, other.results);
    const page = await browser.newPage();
    try {
      await page.goto(url);
      const alert = page.locator('[role=alert]', { hasText: 'Could not open the results' });
      await alert.waitFor({ timeout: 60_000 });
      expect(await alert.textContent()).toContain(`holds the results of 40 frames, the open dataset has ${FRAMES}`);
      // The dataset itself stays open and is scored in the page instead.
      await page.locator('[role=status][data-total]').first().waitFor();
    } finally {
      await page.close();
      await close();
    }
  }, 120_000);
});
