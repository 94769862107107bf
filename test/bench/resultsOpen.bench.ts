/**
 * The page opening a results folder (`npm start -- DATASET --results DIR`): time from navigation to
 * the first paint of the frame list with the stored scores, and the page's JS heap after a garbage
 * collection, at two dataset sizes. The results folders are written by the real results writer
 * (test/support/resultsSynth.ts: a few distinct 32×16 frames, scored for real, under many names).
 * Targets (issue): 100,000 frames of results open in ≤ 3 s with the page's JS heap ≤ 150 MB.
 * Run: npm run bench -- resultsOpen   (or npx tsx test/bench/resultsOpen.bench.ts [small=10000] [large=100000])
 */
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'vite';
import { appServerStart } from '../../src/cli/appServer.ts';
import { browserLaunch } from '../browser/harness.ts';
import { resultsSynthesize } from '../support/resultsSynth.ts';

const [small = 10000, large = 100000] = process.argv.slice(2).map(Number);
const TARGET_SECONDS = 3, TARGET_HEAP_MB = 150;

async function main(): Promise<void> {
  const tmp = mkdtempSync(join(tmpdir(), 'hairline-results-open-'));
  try {
    await build({ configFile: 'vite.config.ts', logLevel: 'warn', build: { outDir: '../dist-bench', emptyOutDir: true } });
    const browser = await browserLaunch();
    console.log('page opening a results folder: 32×16 frames, 4 classes, one run (first paint of the frame list with stored scores; JS heap after GC)');
    const figures: Record<number, { seconds: number; heapMb: number }> = {};
    for (const n of [small, large]) {
      const root = join(tmp, String(n));
      const t0 = Date.now();
      const data = await resultsSynthesize(root, { frames: n, width: 32, height: 16, classes: 4 });
      const mb = statSync(join(data.results, 'frames.parquet')).size / 1e6;
      console.log(`  ${String(n).padStart(6)} frames: results written in ${((Date.now() - t0) / 1000).toFixed(0)} s (frames.parquet ${mb.toFixed(1)} MB)`);
      const { server, url } = await appServerStart({ appDir: 'dist-bench', datasetDir: data.dataset, resultsDir: data.results, port: 0 });
      // The server lists the dataset folder once; list it before the clock starts, as a running server has.
      await fetch(`${url}dataset/index.json`).then((r) => r.arrayBuffer());
      const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
      const cdp = await page.context().newCDPSession(page);
      await cdp.send('Performance.enable');
      const start = Date.now();
      await page.goto(url);
      await page.locator(`[role=status][data-results][data-done="${n}"]`).waitFor({ timeout: 600_000 });
      await page.locator('.fl-row').first().waitFor({ timeout: 600_000 });
      // First paint of the list: the next animation frame after the rows are in the document.
      await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => r(null))));
      const seconds = (Date.now() - start) / 1000;
      await page.waitForTimeout(1000);
      await cdp.send('HeapProfiler.collectGarbage');
      const { metrics } = (await cdp.send('Performance.getMetrics')) as { metrics: { name: string; value: number }[] };
      const heapMb = (metrics.find((m) => m.name === 'JSHeapUsedSize')?.value ?? NaN) / 1e6;
      figures[n] = { seconds, heapMb };
      console.log(`  ${String(n).padStart(6)} frames: frame list painted ${seconds.toFixed(2)} s after navigation, page JS heap ${heapMb.toFixed(0)} MB (${((heapMb * 1e3) / n).toFixed(2)} kB per frame)`);
      await page.close();
      server.close();
      rmSync(root, { recursive: true, force: true });
    }
    await browser.close();
    const f = figures[large];
    console.log(`target at ${large} frames: open ≤ ${TARGET_SECONDS} s -> ${f.seconds.toFixed(2)} s (${(f.seconds / TARGET_SECONDS).toFixed(2)} of the target, ${f.seconds <= TARGET_SECONDS ? 'met' : 'NOT met'}); ` +
      `JS heap ≤ ${TARGET_HEAP_MB} MB -> ${f.heapMb.toFixed(0)} MB (${(f.heapMb / TARGET_HEAP_MB).toFixed(2)} of the target, ${f.heapMb <= TARGET_HEAP_MB ? 'met' : 'NOT met'})`);
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
