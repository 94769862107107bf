import { readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MARK_COLORS } from '../../src/core/composite/compositePalette.ts';
import { scoreCli } from '../cli/scoreRun.ts';
import { demoOnDisk } from '../support/demoOnDisk.ts';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

// The flicker layer on the demo in real Chromium: what the screen shows at 1:1 (a screenshot, not the
// viewer's own read-back) equals a recomputation from the demo's prediction PNGs decoded by pngjs,
// a second PNG decoder, with the definition of src/docs/metrics.md "Flicker" (pred[t-1] == pred[t+1]
// and pred[t] != pred[t-1]); the pixels it marks over classes and over void are the headless
// scorer's flipBack and flipBackVoid counts; the key 8 switches it and the legend follows.

const FRAMES = 6;
const W = 320;
const H = 160;
let dir = '';
let url = '';
let close: () => Promise<void>;
let browser: Browser;

beforeAll(async () => {
  dir = demoOnDisk('hairline-flicker-', FRAMES, W, H);
  ({ url, close } = await appServeBuilt());
  browser = await browserLaunch();
});
afterAll(async () => {
  await browser?.close();
  await close?.();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

const ids = (path: string): Uint8Array => {
  const png = PNG.sync.read(readFileSync(path));
  const out = new Uint8Array(png.width * png.height);
  for (let i = 0; i < out.length; i++) out[i] = png.data[i * 4]; // 8-bit grey: r = g = b = the id
  return out;
};
const hex = (c: number) => `#${c.toString(16).padStart(6, '0')}`;

async function frameShown(page: Page, index: number, around: boolean): Promise<void> {
  await page.waitForFunction(([i, a]) => {
    const s = (window as any).hairline.store.getState();
    return s.frameIndex === i && s.shownIndex === i && s.shown !== null && (s.shownAround !== null) === a;
  }, [index, around] as const);
  // Two animation frames: the viewer redraws on the next one.
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
}

/** Returns the frame as drawn on screen at 1:1, one 0xRRGGBB per image pixel, from a page screenshot. */
async function screenPixels(page: Page): Promise<number[]> {
  const canvas = page.locator('.viewer-host canvas').first();
  const box = (await canvas.boundingBox())!;
  const size = await canvas.evaluate((c: HTMLCanvasElement) => ({ w: c.width, h: c.height }));
  // viewOrigin (src/view/viewTransform.ts) with the view centred on the frame at scale 1; device pixel ratio 1.
  const ox = Math.round(size.w / 2 - W / 2), oy = Math.round(size.h / 2 - H / 2);
  const shot = PNG.sync.read(await page.screenshot({ clip: { x: box.x + ox, y: box.y + oy, width: W, height: H } }));
  expect([shot.width, shot.height]).toEqual([W, H]);
  const out: number[] = [];
  for (let i = 0; i < W * H; i++) out.push((shot.data[i * 4] << 16) | (shot.data[i * 4 + 1] << 8) | shot.data[i * 4 + 2]);
  return out;
}

const legend = (page: Page) => page.locator('[aria-label=legend] li').allInnerTexts();

describe('flicker layer on the demo (real Chromium)', () => {
  it('shows exactly the pixels that flip back, counted as the scorer counts them; 8 toggles it and the legend', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    const errors = pageErrors(page);
    await page.goto(`${url}?demo-frames=${FRAMES}&demo-size=${W}x${H}`);
    await page.locator(`[role=status][data-done="${FRAMES}"][data-total="${FRAMES}"]`).waitFor({ timeout: 120_000 });
    await frameShown(page, 0, false);

    const kq = join(dir, 'kq');
    const cli = scoreCli(['--truth', join(kq, 'truth'), '--pred', `run-a=${join(kq, 'predictions', 'run-a')}`, '--classes', join(kq, 'classes.json')]);
    expect(cli.status, cli.stderr).toBe(0);
    const report = JSON.parse(cli.stdout);
    const classIds = new Set<number>(JSON.parse(readFileSync(join(kq, 'classes.json'), 'utf8')).classes.map((c: { id: number }) => c.id));

    // Key 8 switches the layer; the legend gains its two entries, the address its state.
    expect((await legend(page)).some((t) => t.includes('flips back'))).toBe(false);
    await page.keyboard.press('8');
    await page.waitForFunction(() => (window as any).hairline.store.getState().layers.flicker.on);
    const withFlicker = await legend(page);
    expect(withFlicker.filter((t) => t.includes('flips back'))).toHaveLength(2);
    await page.waitForFunction(() => /fly\d+/.test(location.hash));

    // Only the flicker layer, fully opaque, at 1:1 and centred (highlight off: no outline).
    await page.evaluate(([w, h]) => {
      const s = (window as any).hairline.store.getState();
      const off = (k: string) => ({ ...s.layers[k], on: false });
      s.layersSet({ photo: off('photo'), disagree: off('disagree'), void: off('void'), highlight: off('highlight'), flicker: { ...s.layers.flicker, opacity: 255 } });
      s.placeSet({ cx: w / 2, cy: h / 2, scale: 1 });
    }, [W, H] as const);

    // The first frame is a sequence end: nothing flips back there.
    await frameShown(page, 0, false);
    expect(new Set(await screenPixels(page))).toEqual(new Set([MARK_COLORS.background]));

    for (const t of [1, 2, 3, 4]) {
      await page.keyboard.press('ArrowRight');
      await frameShown(page, t, true);
      const got = await screenPixels(page);
      const name = (k: number) => `kq-${String(k + 1).padStart(4, '0')}.png`;
      const truth = ids(join(kq, 'truth', name(t)));
      const [prev, cur, next] = [t - 1, t, t + 1].map((k) => ids(join(kq, 'predictions', 'run-a', name(k))));
      let flips = 0, pixels = 0, flipsVoid = 0, pixelsVoid = 0;
      const wrong: string[] = [];
      for (let i = 0; i < W * H; i++) {
        const x = i % W, y = Math.floor(i / W);
        const flip = prev[i] === next[i] && cur[i] !== prev[i];
        const isClass = classIds.has(truth[i]);
        if (isClass) (pixels++, (flips += flip ? 1 : 0));
        else (pixelsVoid++, (flipsVoid += flip ? 1 : 0));
        // A fill over a class; over void a checker of 2-pixel cells, light where ⌊x/2⌋ + ⌊y/2⌋ is odd.
        const want = !flip ? MARK_COLORS.background : isClass || (Math.floor(x / 2) + Math.floor(y / 2)) % 2 === 0 ? MARK_COLORS.flicker : MARK_COLORS.flickerLight;
        if (got[i] !== want && wrong.length < 5) wrong.push(`(${x}, ${y}): screen ${hex(got[i])}, want ${hex(want)}`);
      }
      expect(wrong, `frame ${name(t)}`).toEqual([]);
      expect(flips + flipsVoid, `frame ${name(t)} has flips`).toBeGreaterThan(0);
      expect(flips / pixels).toBe(report.frames[t].flipBack);
      expect(pixelsVoid === 0 ? null : flipsVoid / pixelsVoid).toBe(report.frames[t].flipBackVoid);
    }
    await page.screenshot({ path: join(dir, 'flicker.png') });

    // Off again with 8: the legend loses its entries.
    await page.keyboard.press('8');
    await page.waitForFunction(() => !(window as any).hairline.store.getState().layers.flicker.on);
    expect((await legend(page)).some((t) => t.includes('flips back'))).toBe(false);
    expect(errors.filter((e) => !e.includes('GPU stall'))).toEqual([]);
    await page.close();
  });
});
