import { readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { truthBandBins } from '../../src/core/bandBins.ts';
import { classTableFromText } from '../../src/core/classTable.ts';
import { compositePaletteFromTable } from '../../src/core/composite/compositePalette.ts';
import { frameComposite } from '../../src/core/composite/frameComposite.ts';
import type { LayerSettings } from '../../src/core/composite/layerSettings.ts';
import type { LabelMap } from '../../src/core/labelMap.ts';
import { labelMapFromPng } from '../../src/core/png/decodeLabel.ts';
import { photoFromPng } from '../../src/core/png/decodePhoto.ts';
import { reportDifferences } from '../reference/pythonRef.ts';
import { SCENE_KEYS } from '../cli/sceneKeys.ts';
import { scoreCli } from '../cli/scoreRun.ts';
import { demoOnDisk } from '../support/demoOnDisk.ts';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

// The workspace in real Chromium on the demo: scoring in web workers matches the headless scorer,
// keys step frames, layers toggle, and screenshot pixels at known places equal the compositing
// reference (frameComposite, which the WebGL shader must match byte for byte).

const FRAMES = 4;
const W = 320;
const H = 160;
const QUERY = `?demo-frames=${FRAMES}&demo-size=${W}x${H}`;
let dir = '';
let url = '';
let close: () => Promise<void>;
let browser: Browser;

beforeAll(async () => {
  dir = demoOnDisk('hairline-ws-', FRAMES, W, H);
  ({ url, close } = await appServeBuilt());
  browser = await browserLaunch();
});
afterAll(async () => {
  await browser?.close();
  await close?.();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function openDemo(page: Page, hash = ''): Promise<void> {
  await page.goto(`${url}${QUERY}${hash}`);
  await page.locator(`[role=status][data-done="${FRAMES}"][data-total="${FRAMES}"]`).waitFor({ timeout: 120_000 });
  await page.waitForFunction(() => {
    const s = (window as any).hairline.store.getState();
    return s.shown && s.shownIndex === s.frameIndex;
  });
}

function state<T>(page: Page, fn: string): Promise<T> {
  return page.evaluate(`(() => { const s = window.hairline.store.getState(); return (${fn})(s); })()`) as Promise<T>;
}

/** Returns the frame's files as written by `npm run demo`, decoded by the same core code. */
function frameOnDisk(name: string) {
  const kq = join(dir, 'kq');
  const table = classTableFromText(readFileSync(join(kq, 'classes.json'), 'utf8'));
  if (!table.ok) throw new Error(table.error);
  const label = (p: string): LabelMap => {
    const r = labelMapFromPng(readFileSync(join(kq, p)), { file: p, table: table.value });
    if (!r.ok) throw new Error(r.error);
    return r.value;
  };
  const photo = photoFromPng(readFileSync(join(kq, 'images', `${name}.png`)), { file: name });
  if (!photo.ok) throw new Error(photo.error);
  const truth = label(`truth/${name}.png`);
  return {
    table: table.value,
    frame: { photo: photo.value.rgba, truth, preds: { 'run-a': label(`predictions/run-a/${name}.png`), 'run-b': label(`predictions/run-b/${name}.png`) }, bandBins: truthBandBins(truth) },
  };
}

/** Screenshot pixel (RGB) of image pixel (x, y) at 1:1, using the viewer's own view (device px = CSS px here). */
async function pixelAt(page: Page, x: number, y: number): Promise<[number, number, number]> {
  const box = (await page.locator('.viewer-host canvas').first().boundingBox())!;
  const v = await page.evaluate(() => (window as any).hairlineViewer.viewGet());
  expect(v.scale).toBe(1);
  const ox = Math.round(box.width / 2 - v.cx * v.scale);
  const oy = Math.round(box.height / 2 - v.cy * v.scale);
  const shot = PNG.sync.read(await page.screenshot({ clip: { x: box.x + ox + x, y: box.y + oy + y, width: 1, height: 1 } }));
  return [shot.data[0], shot.data[1], shot.data[2]];
}

function expectedAt(f: ReturnType<typeof frameOnDisk>, layers: LayerSettings, x: number, y: number): [number, number, number] {
  const r = frameComposite(f.frame, layers, compositePaletteFromTable(f.table), { rect: { x, y, width: 1, height: 1 } });
  if (!r.ok) throw new Error(r.error);
  return [r.value[0], r.value[1], r.value[2]];
}

describe('workspace on the demo (real Chromium)', () => {
  it('scores the demo in web workers exactly as the headless scorer does', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    const errors = pageErrors(page);
    await openDemo(page);
    expect(await state<number>(page, 's => s.results.length')).toBe(FRAMES);
    const kq = join(dir, 'kq');
    const cli = scoreCli(['--truth', join(kq, 'truth'), '--pred', join(kq, 'predictions', 'run-a'), '--classes', join(kq, 'classes.json')]);
    expect(cli.status).toBe(0);
    const report = JSON.parse(cli.stdout);
    const fromPage = await page.evaluate(() => (window as any).hairline.report('run-a'));
    // Error regions and the likely-label-mistake queue are the scorer's additions; the page's report does not carry them yet.
    expect(reportDifferences(fromPage, report, 1e-12, ['unpaired', 'opened', 'runs', 'regions', 'voidSpill', 'suspects', ...SCENE_KEYS])).toEqual([]);
    // The scoreboard shows the same dataset mean IoU as the report, to its one decimal.
    const shown = await page.locator('[data-testid=headline] tr:first-child td[data-scope=dataset]').innerText();
    expect(shown).toBe((report.dataset.meanIoU * 100).toFixed(1));
    expect(errors.filter((e) => !e.includes('GPU stall'))).toEqual([]);
    await page.close();
  });

  it('steps frames with the keyboard, toggles layers, and paints the expected pixels', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    await openDemo(page);
    expect(await state<string>(page, 's => s.dataset.title')).toBe('Kestrel Quay demo');
    await page.keyboard.press('ArrowRight');
    await page.waitForFunction(() => (window as any).hairline.store.getState().shownIndex === 1);
    expect(await page.locator('.fl-current').getAttribute('data-frame')).toBe('kq-0002');
    await page.keyboard.press('O'); // 1:1
    await page.waitForTimeout(300);
    const f = frameOnDisk('kq-0002');
    const { truth } = f.frame;
    const a = f.frame.preds['run-a'];
    // A disagreement pixel whose 3×3 neighbourhood all disagrees, and a void pixel inside void.
    const inside = (test: (i: number) => boolean) => {
      for (let y = 2; y < H - 2; y++) for (let x = 2; x < W - 2; x++) {
        let all = true;
        for (let dy = -1; dy <= 1 && all; dy++) for (let dx = -1; dx <= 1 && all; dx++) all = test((y + dy) * W + x + dx);
        if (all) return { x, y };
      }
      throw new Error('no such pixel');
    };
    const wrong = inside((i) => truth.ids[i] !== 255 && a.ids[i] !== truth.ids[i] && a.ids[i] < 12);
    const voidPx = inside((i) => truth.ids[i] === 255);
    let layers = (await page.evaluate('window.hairline.layers()')) as LayerSettings;
    expect(layers.disagree.on && layers.void.on && layers.photo.on).toBe(true);
    const wrongColour = expectedAt(f, layers, wrong.x, wrong.y);
    expect(await pixelAt(page, wrong.x, wrong.y)).toEqual(wrongColour);
    expect(await pixelAt(page, voidPx.x, voidPx.y)).toEqual(expectedAt(f, layers, voidPx.x, voidPx.y));
    // Disagreement off (key 4) and void off (key 5): the photo pixel comes back.
    await page.keyboard.press('4');
    await page.keyboard.press('5');
    await page.waitForTimeout(300);
    layers = (await page.evaluate('window.hairline.layers()')) as LayerSettings;
    expect(layers.disagree.on || layers.void.on).toBe(false);
    const photoAt = (p: { x: number; y: number }) => Array.from(f.frame.photo.subarray((p.y * W + p.x) * 4, (p.y * W + p.x) * 4 + 3));
    expect(await pixelAt(page, wrong.x, wrong.y)).toEqual(photoAt(wrong));
    expect(await pixelAt(page, voidPx.x, voidPx.y)).toEqual(photoAt(voidPx));
    expect(photoAt(wrong)).not.toEqual(wrongColour);
    await page.close();
  });

  it('the band slider changes every band number, and the URL brings the same view back after a reload', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    await openDemo(page);
    const bandCell = page.locator('[data-testid=headline] tr:nth-child(5) td[data-scope=dataset]');
    const at3 = await bandCell.innerText();
    await page.locator('input[aria-label="band width"]').fill('12');
    await expect.poll(() => page.locator('[data-testid=band-width]').innerText()).toBe('12');
    expect(await bandCell.innerText()).not.toBe(at3);
    await page.keyboard.press('End');
    await page.keyboard.press('2');
    await page.keyboard.press('6');
    await page.waitForTimeout(500);
    const before = await state<{ frame: number; w: number; truth: boolean; band: boolean }>(page, 's => ({ frame: s.frameIndex, w: s.bandWidth, truth: s.layers.truth.on, band: s.layers.band.on })');
    expect(before).toEqual({ frame: FRAMES - 1, w: 12, truth: true, band: true });
    const href = page.url();
    expect(href).toContain(`f=kq-000${FRAMES}`);
    await page.goto('about:blank');
    await page.goto(href);
    await page.waitForFunction(() => (window as any).hairline.store.getState().shownIndex >= 0);
    const after = await state<typeof before>(page, 's => ({ frame: s.frameIndex, w: s.bandWidth, truth: s.layers.truth.on, band: s.layers.band.on })');
    expect(after).toEqual(before);
    await page.close();
  });
});
