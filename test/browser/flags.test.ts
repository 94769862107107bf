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
});
