// The WebGL viewer against the CPU composite in real headless Chromium: every read-back byte must
// equal frameComposite's (src/core/composite/frameComposite.ts), across random frames and settings,
// 16-bit ids, odd widths and frames split into many tiles.
//
// WebGL2 here comes from SwiftShader: Debian's chromium with --disable-gpu (harness.ts CHROMIUM_ARGS)
// plus --enable-unsafe-swiftshader, which playwright-core adds by default (dropping its default
// arguments would lose it, and pixi would then fall back silently to a renderer that draws nothing).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import type { ViteDevServer } from 'vite';
import { chromium } from 'playwright-core';
import { browserLaunch, CHROMIUM_ARGS, CHROMIUM_PATH, pageErrors } from './harness.ts';
import { viewerPageServe } from './viewerServe.ts';
import type { FrameSpec } from './pages/viewerPage.ts';

let server: ViteDevServer;
let pageUrl: string;
let browser: Browser;
let page: Page;
let errors: string[];

type Hl = Record<string, (...a: unknown[]) => unknown>;

async function call<T>(name: string, ...args: unknown[]): Promise<T> {
  return (await page.evaluate(([n, a]) => (window as unknown as { hl: Hl }).hl[n as string](...(a as unknown[])), [name, args] as const)) as T;
}

async function pageOpen(): Promise<void> {
  page = await browser.newPage({ viewport: { width: 800, height: 600 } });
  errors = pageErrors(page);
  await page.goto(pageUrl);
  await page.waitForFunction(() => document.title === 'viewer test page ready', null, { timeout: 120_000 });
}

beforeAll(async () => {
  ({ server, pageUrl } = await viewerPageServe());
  browser = await browserLaunch();
  await pageOpen();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

interface Check {
  tiles: number;
  settings: number;
  differingBytes: number;
  firstDifference: string | null;
}

const seeds = (from: number, n: number) => Array.from({ length: n }, (_, i) => from + i);

describe('viewer (WebGL2 in headless Chromium)', () => {
  it('runs on pixi.js WebGL2, not a fallback renderer', async () => {
    const info = await call<Record<string, unknown>>('setup', {});
    expect(info.mode).toBe('webgl');
    expect(info.renderer).toBe('webgl');
    expect(info.webglVersion).toBe(2);
    expect(info.glVersion).toMatch(/^WebGL 2\.0/);
    expect(String(info.unmasked)).toMatch(/SwiftShader/i);
    expect(info.maxTextureSize as number).toBeGreaterThanOrEqual(2048);
  });

  const cases: { name: string; spec: FrameSpec; tileSize?: number; minTiles: number; settings?: number }[] = [
    { name: '8-bit ids, odd width', spec: { seed: 101, width: 37, height: 23 }, minTiles: 1 },
    { name: '8-bit ids, wider frame', spec: { seed: 102, width: 160, height: 96 }, minTiles: 1 },
    { name: '16-bit ids', spec: { seed: 103, width: 61, height: 45, wide: true }, minTiles: 1 },
    { name: 'no photo, no band bins, one run', spec: { seed: 104, width: 50, height: 30, photo: false, bins: false, runs: 1 }, minTiles: 1 },
    { name: 'forced 64-pixel tiles (8-bit)', spec: { seed: 105, width: 203, height: 141 }, tileSize: 64, minTiles: 12 },
    { name: 'forced 50-pixel tiles (16-bit)', spec: { seed: 106, width: 177, height: 103, wide: true }, tileSize: 50, minTiles: 12 },
    { name: 'wider than one 2048-pixel read-back piece', spec: { seed: 110, width: 2300, height: 21 }, minTiles: 1, settings: 6 },
  ];
  for (const c of cases) {
    it(`draws exactly frameComposite's bytes: ${c.name}`, async () => {
      await call('setup', { tileSize: c.tileSize });
      const all = await call('everything', c.spec);
      const n = c.settings ?? 24;
      const r = await call<Check>('check', c.spec, seeds(c.spec.seed * 100, n), [all]);
      expect(r.tiles).toBeGreaterThanOrEqual(c.minTiles);
      expect(r.settings).toBe(n + 1);
      expect(r.firstDifference).toBeNull();
      expect(r.differingBytes).toBe(0);
    });
  }

  it('stays exact while stepping frame to frame on one viewer (sizes, id widths and palettes change)', async () => {
    await call('setup', { tileSize: 64 });
    const specs: FrameSpec[] = [
      { seed: 111, width: 90, height: 70 },
      { seed: 112, width: 90, height: 70 },
      { seed: 113, width: 130, height: 41, wide: true },
      { seed: 114, width: 90, height: 70, photo: false },
    ];
    for (const spec of specs) {
      const r = await call<Check>('check', spec, seeds(spec.seed * 10, 4));
      expect(r.firstDifference, `frame seed ${spec.seed}`).toBeNull();
    }
    expect(errors).toEqual([]);
  });

  it('changes only uniforms on layer, opacity, colour-mode, solo, band and curtain changes (no texture uploads)', async () => {
    await call('setup', { tileSize: 64 });
    const spec: FrameSpec = { seed: 107, width: 150, height: 90 };
    const before = await call<number>('uploads');
    await call('load', spec);
    const s = (await call('everything', spec)) as Record<string, Record<string, unknown>>;
    s.runB = 'run2' as never;
    const afterFirst = await call<number>('drawWith', s);
    expect(afterFirst - before).toBeGreaterThanOrEqual(6 * 5); // 6 tiles × photo, truth, two runs, bins (the counter works)
    const variants = [
      { ...s, truth: { ...s.truth, on: false } },
      { ...s, band: { ...s.band, width: 12, opacity: 40 } },
      { ...s, disagree: { ...s.disagree, mode: 'pred' } },
      { ...s, solo: { on: true, classId: 3, dim: 200 } },
      { ...s, curtain: { on: true, x: 70 } },
      { ...s, void: { ...s.void, period: 4 } },
      s,
    ];
    let n = afterFirst;
    for (const v of variants) n = await call<number>('drawWith', v);
    expect(n).toBe(afterFirst);
    // A run shown for the first time is uploaded once (one texture per tile: 3×2 tiles); then kept.
    const swapped = { ...s, runA: 'run2', runB: 'run1' };
    const afterSwap = await call<number>('drawWith', swapped);
    // Both runs were already on the GPU as A and B; only the flicker layer's neighbour maps of the
    // new run A are uploaded, once (previous and next frame: 2 textures × 6 tiles).
    expect(afterSwap).toBe(afterFirst + 2 * 6);
    const single = await call<number>('drawWith', { ...s, runA: 'run1', runB: null });
    expect(single).toBe(afterSwap);
    const flickerOff = await call<number>('drawWith', { ...swapped, flicker: { ...s.flicker, on: false } });
    expect(flickerOff).toBe(afterSwap);
  });

  it('refuses a frame over 8192 pixels on a side with a clear message', async () => {
    await call('setup', {});
    const r = await call<{ ok: boolean; error?: string }>('frameSetRaw', 8193, 2);
    expect(r.ok).toBe(false);
    expect(r.error).toMatch(/8193×2 pixels; the viewer shows frames up to 8192 pixels on the long side/);
  });

  it('zooms at the cursor with the wheel and pans by dragging (real mouse input)', async () => {
    await call('setup', { width: 640, height: 400 });
    await call('load', { seed: 108, width: 64, height: 40 });
    const box = (await page.locator('#host').boundingBox())!;
    type View = { cx: number; cy: number; scale: number };
    expect((await call<View>('viewGet')).scale).toBe(10);
    await page.mouse.move(box.x + 105, box.y + 155); // image point (10.5, 15.5)
    await page.mouse.wheel(0, -240); // one doubling
    await page.waitForFunction(() => (window as unknown as { hl: { viewGet(): View } }).hl.viewGet().scale > 10);
    const zoomed = await call<View>('viewGet');
    expect(zoomed.scale).toBeCloseTo(20, 6);
    // The image point under the cursor stayed there: centre moved halfway towards it.
    expect(zoomed.cx).toBeCloseTo(32 + (10.5 - 32) / 2, 6);
    expect(zoomed.cy).toBeCloseTo(20 + (15.5 - 20) / 2, 6);
    await page.mouse.down();
    await page.mouse.move(box.x + 145, box.y + 135, { steps: 4 });
    await page.mouse.up();
    const panned = await call<View>('viewGet');
    expect(panned.cx).toBeCloseTo(zoomed.cx - 40 / 20, 6);
    expect(panned.cy).toBeCloseTo(zoomed.cy + 20 / 20, 6);
  });

  it('reads out the integer image pixel under the pointer, null outside the image', async () => {
    await call('setup', { width: 640, height: 400 });
    await call('load', { seed: 108, width: 64, height: 40 });
    // Fitted: 10 device px per image pixel (device pixel ratio 1 in this page), image filling the host.
    expect(await call('readoutAt', 5, 5)).toEqual({ x: 0, y: 0 });
    expect(await call('readoutAt', 639, 399)).toEqual({ x: 63, y: 39 });
    expect(await call('readoutAt', 325, 213)).toEqual({ x: 32, y: 21 });
    await call('viewSet', { cx: 32, cy: 20, scale: 1 });
    expect(await call('readoutAt', 10, 10)).toBeNull();
    expect(await call('readoutAt', 320, 200)).toEqual({ x: 32, y: 20 });
    expect(errors).toEqual([]);
  });
});

describe('viewer without WebGL (Chromium with --disable-3d-apis)', () => {
  it("reports mode 'none' with a reason and shows the CPU composite it is given, pixel for pixel", async () => {
    const noGl = await chromium.launch({ executablePath: CHROMIUM_PATH, args: [...CHROMIUM_ARGS, '--disable-3d-apis'] });
    try {
      const p = await noGl.newPage({ viewport: { width: 800, height: 600 } });
      const errs = pageErrors(p);
      await p.goto(pageUrl);
      await p.waitForFunction(() => document.title === 'viewer test page ready', null, { timeout: 120_000 });
      const info = (await p.evaluate(() => (window as unknown as { hl: Hl }).hl.setup({ width: 640, height: 400 }))) as Record<string, unknown>;
      expect(info.mode).toBe('none');
      expect(String(info.reason)).toMatch(/WebGL2/);
      const r = (await p.evaluate(() => (window as unknown as { hl: Hl }).hl.cpuCheck({ seed: 109, width: 64, height: 40 }))) as Record<string, unknown>;
      expect(r.mode).toBe('none');
      expect(r.scale).toBe(10);
      expect(String(r.wrongLength)).toMatch(/composite holds 8 bytes; the 64×40 frame needs 10240/);
      expect(r.differing).toBe(0);
      expect(errs).toEqual([]);
    } finally {
      await noGl.close();
    }
  });
});
