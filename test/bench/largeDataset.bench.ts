/**
 * The app on a large served dataset: N frames (4 distinct 320×160 frames hard-linked under many
 * names, each read, decoded and scored for real), scored in the page's workers; prints the page's JS
 * heap and the time to score all frames at two sizes, and the heap's growth per frame between them
 * (the page keeps per-frame scores in typed columns and full results for its last 256 frames only).
 * Run: npx tsx test/bench/largeDataset.bench.ts [small=1000] [large=10000]
 */
import { spawnSync } from 'node:child_process';
import { linkSync, mkdirSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'vite';
import { appServerStart } from '../../src/cli/appServer.ts';
import { browserLaunch } from '../browser/harness.ts';

const [small = 1000, large = 10000] = process.argv.slice(2).map(Number);

function datasetMake(root: string, seedDir: string, n: number): void {
  for (const dir of ['images', 'truth', 'predictions/run-a', 'predictions/run-b']) {
    mkdirSync(join(root, dir), { recursive: true });
    const files = readdirSync(join(seedDir, dir));
    for (let i = 0; i < n; i++) linkSync(join(seedDir, dir, files[i % files.length]), join(root, dir, `f${String(i).padStart(5, '0')}.png`));
  }
  linkSync(join(seedDir, 'classes.json'), join(root, 'classes.json'));
}

async function main(): Promise<void> {
  const tmp = mkdtempSync(join(tmpdir(), 'hairline-large-'));
  try {
    const seed = join(tmp, 'seed');
    const gen = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/demo.ts', '--out', seed, '--frames', '4', '--size', '320x160'], { encoding: 'utf8' });
    if (gen.status !== 0) throw new Error(gen.stderr);
    await build({ configFile: 'vite.config.ts', logLevel: 'warn', build: { outDir: '../dist-bench', emptyOutDir: true } });
    const browser = await browserLaunch();
    console.log('app on a served dataset of 320×160 frames, two runs, scored in the page');
    const heaps: number[] = [];
    for (const n of [small, large]) {
      const root = join(tmp, `ds${n}`);
      datasetMake(root, seed, n);
      const { server, url } = await appServerStart({ appDir: 'dist-bench', datasetDir: root, port: 0 });
      const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
      const cdp = await page.context().newCDPSession(page);
      await cdp.send('Performance.enable');
      const t0 = Date.now();
      await page.goto(url);
      await page.locator(`[role=status][data-done="${n}"]`).waitFor({ timeout: 3_600_000 });
      const seconds = (Date.now() - t0) / 1000;
      // Sorting the frame list by another score and back, then a settled heap.
      await page.locator('.fl-head button', { hasText: 'BIoU' }).click();
      await page.locator('.fl-head button', { hasText: 'mIoU' }).click();
      await cdp.send('HeapProfiler.collectGarbage');
      const { metrics } = (await cdp.send('Performance.getMetrics')) as { metrics: { name: string; value: number }[] };
      const heap = metrics.find((m) => m.name === 'JSHeapUsedSize')?.value ?? NaN;
      heaps.push(heap);
      console.log(`  ${String(n).padStart(6)} frames: scored in ${seconds.toFixed(0)} s (${(n / seconds).toFixed(1)} frames/s), page JS heap ${(heap / 1e6).toFixed(0)} MB (${((heap / n) / 1e3).toFixed(1)} kB per frame)`);
      await page.close();
      server.close();
    }
    await browser.close();
    console.log(`  page JS heap growth ${small} → ${large} frames: ${((heaps[1] - heaps[0]) / 1e6).toFixed(1)} MB (${((heaps[1] - heaps[0]) / (large - small) / 1e3).toFixed(1)} kB per frame)`);
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

await main();
