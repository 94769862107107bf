// Viewer redraw time at 2048×1024 after one layer toggle, in headless Chromium (software WebGL2,
// SwiftShader), with every layer on and the whole frame on screen at 1:1; and the CPU composite of the
// same frame in Node (the no-WebGL path). Run: npx tsx test/bench/viewerRedraw.bench.ts
import { browserLaunch } from '../browser/harness.ts';
import { viewerPageServe } from '../browser/viewerServe.ts';
import { compositePaletteFromTable } from '../../src/core/composite/compositePalette.ts';
import { frameComposite } from '../../src/core/composite/frameComposite.ts';
import { LAYER_KEYS, layerSettingsDefault } from '../../src/core/composite/layerSettings.ts';
import { frameRandom } from '../core/composite/randomFrame.ts';

const W = 2048, H = 1024;
const spec = { seed: 9, width: W, height: H };

async function main(): Promise<void> {
  const { pageUrl, server } = await viewerPageServe();
  const browser = await browserLaunch();
  try {
    const page = await browser.newPage({ viewport: { width: W + 16, height: H + 16 } });
    await page.goto(pageUrl);
    await page.waitForFunction(() => document.title === 'viewer test page ready', null, { timeout: 120_000 });
    type Hl = Record<string, (...a: unknown[]) => unknown>;
    const call = (name: string, ...args: unknown[]) =>
      page.evaluate(([n, a]) => (window as unknown as { hl: Hl }).hl[n as string](...(a as unknown[])), [name, args] as const);
    await call('setup', { width: W, height: H });
    for (const [label, only] of [['all layers', undefined], ['photo + disagreement', ['photo']]] as const) {
      const r = (await call('redrawTime', spec, 15, only)) as { median: number; all: number[]; backToBack: number };
      console.log(`WebGL redraw after a layer toggle, ${W}×${H} at 1:1, ${label}: median ${r.median.toFixed(1)} ms ` +
        `(min ${Math.min(...r.all).toFixed(1)}, max ${Math.max(...r.all).toFixed(1)}, ${r.all.length} redraws, each waited for); ` +
        `back to back ${r.backToBack.toFixed(1)} ms per redraw`);
    }
  } finally {
    await browser.close();
    await server.close();
  }
  const { frame, table } = frameRandom(spec.seed, W, H);
  const palette = compositePaletteFromTable(table);
  const s = layerSettingsDefault();
  for (const k of LAYER_KEYS) s[k].on = true;
  s.runA = 'run1';
  s.runB = 'run2';
  s.highlight.boxes = [{ x: 500, y: 200, width: 400, height: 300 }];
  const out = new Uint8Array(W * H * 4);
  const times: number[] = [];
  for (let i = 0; i < 8; i++) {
    const t0 = performance.now();
    frameComposite(frame, s, palette, { out });
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  console.log(`CPU frameComposite (Node), ${W}×${H}, all layers: median ${times[4].toFixed(1)} ms (min ${times[0].toFixed(1)})`);
}

await main();
