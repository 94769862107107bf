import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { unzipSync, strFromU8 } from 'fflate';
import { PNG } from 'pngjs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { classTableFromText } from '../../src/core/classTable.ts';
import { labelMapFromPng } from '../../src/core/png/decodeLabel.ts';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

// The review workflow in real Chromium on the demo: flag a frame and a drawn box through the UI,
// reload (IndexedDB), export the tiles ZIP from the dialog, then check every label crop against the
// same demo written to disk by `npm run demo` — decoded by our decoder and by pngjs — pixel for pixel.

const FRAMES = 3;
const QUERY = `?demo-frames=${FRAMES}&demo-size=320x160`;
let dir = '';
let url = '';
let close: () => Promise<void>;
let browser: Browser;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'hairline-flags-'));
  const gen = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/demo.ts', '--out', join(dir, 'kq'), '--frames', String(FRAMES), '--size', '320x160'], { encoding: 'utf8' });
  if (gen.status !== 0) throw new Error(`demo generation failed: ${gen.stderr}`);
  ({ url, close } = await appServeBuilt());
  browser = await browserLaunch();
});
afterAll(async () => {
  await browser?.close();
  await close?.();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function ready(page: Page): Promise<void> {
  await page.locator(`[role=status][data-done="${FRAMES}"]`).waitFor({ timeout: 120_000 });
  await page.waitForFunction(() => (window as any).hairline.store.getState().reviewStatus === 'ready');
}

describe('flags and tile export through the workspace (real Chromium)', () => {
  it('flags survive a reload, and exported label crops equal the source pixels', async () => {
    const context = await browser.newContext({ viewport: { width: 1400, height: 860 }, acceptDownloads: true });
    const page = await context.newPage();
    const errors = pageErrors(page);
    await page.goto(url + QUERY);
    await ready(page);
    // A whole frame, with a note.
    await page.keyboard.press('M');
    await page.locator('.flag-dialog textarea').fill('truck outline is sloppy, "quoted", with a comma');
    await page.keyboard.press('Control+Enter');
    // A box drawn with Shift+drag on frame 2, with a tag of our own.
    await page.keyboard.press('ArrowRight');
    await page.waitForFunction(() => (window as any).hairline.store.getState().shownIndex === 1);
    const host = (await page.locator('.viewer-host').boundingBox())!;
    await page.keyboard.down('Shift');
    await page.mouse.move(host.x + host.width / 2 - 60, host.y + host.height / 2 - 40);
    await page.mouse.down();
    await page.mouse.move(host.x + host.width / 2 + 50, host.y + host.height / 2 + 30, { steps: 6 });
    await page.mouse.up();
    await page.keyboard.up('Shift');
    await page.locator('.flag-dialog input[type=text]').fill('occlusion');
    await page.locator('.flag-dialog button.primary').click();
    await page.locator('.left-pane .tab', { hasText: 'Flags' }).click();
    await expect.poll(() => page.locator('.flag-row').count()).toBe(2);
    await page.waitForTimeout(500);

    await page.reload();
    await ready(page);
    await page.locator('.left-pane .tab', { hasText: 'Flags' }).click();
    await expect.poll(() => page.locator('.flag-row').count()).toBe(2);
    const flags = await page.evaluate(() => (window as any).hairline.store.getState().reviewFlags.map((f: any) => ({ kind: f.kind, frame: f.frame, reason: f.reason, bbox: f.bbox })));
    expect(flags.map((f: { kind: string }) => f.kind).sort()).toEqual(['frame', 'rect']);
    expect(flags.find((f: { kind: string }) => f.kind === 'rect')).toMatchObject({ frame: 'kq-0002', reason: 'occlusion' });

    await page.locator('button', { hasText: 'export tiles' }).click();
    const [download] = await Promise.all([page.waitForEvent('download', { timeout: 120_000 }), page.locator('.flag-dialog button.primary').click()]);
    const zip = unzipSync(new Uint8Array(readFileSync((await download.path())!)));
    await page.locator('[data-testid=export-result]').waitFor();
    const manifest = JSON.parse(strFromU8(zip['manifest.json']));
    expect(manifest.tiles.length).toBeGreaterThanOrEqual(2);
    expect(manifest.failed).toEqual([]);
    const csv = strFromU8(zip['tiles.csv']).trim().split(/\r\n/);
    expect(csv.length).toBe(1 + manifest.tiles.length);

    const kq = join(dir, 'kq');
    const table = classTableFromText(readFileSync(join(kq, 'classes.json'), 'utf8'));
    if (!table.ok) throw new Error(table.error);
    for (const tile of manifest.tiles) {
      const [x0, y0, x1, y1] = tile.box;
      const parts = [
        { file: tile.truth.file, source: join(kq, 'truth', `${tile.frame}.png`) },
        ...tile.preds.map((p: { file: string; run: string }) => ({ file: p.file, source: join(kq, 'predictions', p.run, `${tile.frame}.png`) })),
      ];
      for (const part of parts) {
        const src = labelMapFromPng(readFileSync(part.source), { file: part.source, table: table.value });
        const crop = labelMapFromPng(zip[part.file], { file: part.file, table: table.value });
        if (!src.ok || !crop.ok) throw new Error('decode failed');
        expect([crop.value.width, crop.value.height]).toEqual([x1 - x0, y1 - y0]);
        // Independent decoder (pngjs) reads the same ids (gray: the value; palette: through the palette).
        const other = PNG.sync.read(Buffer.from(zip[part.file]), { skipRescale: true } as never);
        for (let y = y0; y < y1; y++) {
          for (let x = x0; x < x1; x++) {
            const want = src.value.ids[y * src.value.width + x];
            const i = (y - y0) * crop.value.width + (x - x0);
            expect(crop.value.ids[i]).toBe(want);
            if (crop.value.encoding.kind === 'gray') expect(other.data[i * 4]).toBe(want);
          }
        }
      }
    }
    expect(errors.filter((e) => !e.includes('GPU stall'))).toEqual([]);
    await context.close();
  });

  it('hostile flags files: 50,000 flags load as counts in a windowed list, the same file loads twice, far-future times and huge strings are refused, save JSON still works', async () => {
    const context = await browser.newContext({ viewport: { width: 1400, height: 860 }, acceptDownloads: true });
    const page = await context.newPage();
    const errors = pageErrors(page);
    await page.goto(url + QUERY);
    await ready(page);
    await page.locator('.left-pane .tab', { hasText: 'Flags' }).click();
    const dataset = await page.evaluate(() => {
      const s = (window as any).hairline.store.getState();
      return { key: s.dataset.key, title: s.dataset.title, frames: s.dataset.pairing.frames.map((f: { name: string }) => f.name) };
    });
    const t = new Date().toISOString();
    const flag = (i: number, extra: Record<string, unknown> = {}) => ({
      id: `bulk-${i}`, frame: dataset.frames[i % dataset.frames.length], kind: 'rect', bbox: [1, 1, 20, 20], reason: 'unsure', note: `n${i}`, run: null,
      createdAt: t, updatedAt: t, ...extra,
    });
    const file = (flags: unknown[]) => Buffer.from(JSON.stringify({ format: 'hairline-flags', version: 2, dataset: { key: dataset.key, title: dataset.title, frames: dataset.frames.length }, exportedAt: t, flags, verdicts: [] }));
    const input = page.locator('.flags input[type=file]');
    const big = file(Array.from({ length: 50_000 }, (_, i) => flag(i)));
    const t0 = Date.now();
    await input.setInputFiles({ name: 'big.json', mimeType: 'application/json', buffer: big });
    await page.locator('.flags p.small', { hasText: 'big.json: 50000 added, 0 updated, 0 skipped' }).waitFor({ timeout: 60_000 });
    await page.locator('.flag-list[data-count="50000"]').waitFor();
    const loadSeconds = (Date.now() - t0) / 1000;
    const rows = await page.locator('.flag-row').count();
    expect(rows).toBeLessThan(60);
    // Scrolled to the end, the last rows are there (the oldest flag is listed last).
    await page.locator('.flags').evaluate((el) => (el.scrollTop = el.scrollHeight));
    await page.locator('.flag-row[data-flag="bulk-0"]').waitFor();
    // The same file again: a change event, all skipped as already here.
    await input.setInputFiles({ name: 'big.json', mimeType: 'application/json', buffer: big });
    await page.locator('.flags p.small', { hasText: 'big.json: 0 added, 0 updated, 50000 skipped' }).waitFor({ timeout: 60_000 });
    // Far-future time, 5 MB of reasons, 50,001 flags: refused with the reason, nothing imported.
    const refused: [string, Buffer, RegExp][] = [
      ['future.json', file([flag(1, { id: 'f', updatedAt: 1e300 })]), /"updatedAt" must be a time between 1970 and 2200/],
      ['ahead.json', file([flag(1, { id: 'g', updatedAt: Date.now() + 3 * 86_400_000 })]), /more than a day ahead/],
      ['long.json', file([flag(1, { id: 'h', kind: 'region', region: { kind: 'x', truthClass: 1, predictedClass: 2, score: 1, reasons: ['r'.repeat(5_000_000)] } })]), /"reasons" has one of 5000000 characters \(at most 300\)/],
      ['many.json', file(Array.from({ length: 50_001 }, (_, i) => flag(i))), /holds 50,001 flags; at most 50,000 are read/],
    ];
    for (const [name, buffer, why] of refused) {
      await input.setInputFiles({ name, mimeType: 'application/json', buffer });
      await expect.poll(() => page.locator('.flags p.bad, .flags p.small').allTextContents(), { timeout: 30_000 }).toContainEqual(expect.stringMatching(why));
    }
    expect(await page.evaluate(() => (window as any).hairline.store.getState().reviewFlags.length)).toBe(50_000);
    const [download] = await Promise.all([page.waitForEvent('download'), page.locator('button', { hasText: 'save JSON' }).click()]);
    const saved = JSON.parse(readFileSync(await download.path(), 'utf8'));
    expect(saved.flags.length).toBe(50_000);
    console.log(`50,000 flags: loaded and listed in ${loadSeconds.toFixed(1)} s, ${rows} rows in the DOM`);
    await page.screenshot({ path: process.env.HAIRLINE_SHOT ?? join(dir, 'flags-50000.png') });
    expect(errors).toEqual([]);
    await context.close();
  }, 300_000);
});
