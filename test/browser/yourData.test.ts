import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pythonRefRequire } from '../reference/pythonRef.ts';
import { fileWrite, suffixedWrite, yardFrames } from '../support/diskDatasets.ts';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

// A dataset as it lies on disk (README "Your data": gt/<site>/<key>_gt_class.png beside other encodings,
// flat preds/<key>_pred.png, photos/<key>_photo.png, stored ids mapped in classes.json) served by the app
// server of `npm start -- DIR` and opened in Chromium: the numbers equal test/reference/dataset_ref.py
// (numpy, id maps applied by hand), the "opened" notice and panel say what was paired, the readout
// shows the stored id beside the class; a folder that is no dataset gets a message, never a blank page.

const REF = join(import.meta.dirname, '..', 'reference', 'dataset_ref.py');
const SHOTS = process.env.HAIRLINE_SHOTS ?? null;
let dir = '';
let browser: Browser;
const frames = yardFrames(5, 48, 36, 31);

beforeAll(async () => {
  pythonRefRequire();
  dir = mkdtempSync(join(tmpdir(), 'hairline-yours-web-'));
  suffixedWrite(join(dir, 'yard'), frames);
  fileWrite(join(dir, 'yard', 'preds', 'stray_pred.png'), 'not a frame of this dataset');
  fileWrite(join(dir, 'scans', 'scan_a.png'), 'x');
  fileWrite(join(dir, 'scans', 'notes.txt'), 'x');
  browser = await browserLaunch();
});
afterAll(async () => {
  await browser?.close();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function served<T>(root: string, fn: (page: Page, url: string) => Promise<T>): Promise<T> {
  const { url, close } = await appServeBuilt(root);
  const page = await browser.newPage({ viewport: { width: 1400, height: 800 } });
  try {
    return await fn(page, url);
  } finally {
    await page.close();
    await close();
  }
}

describe('your data in the browser (npm start -- DIR)', () => {
  it('opens the suffixed, nested, id-mapped dataset with no renaming; scores equal dataset_ref.py; says what was opened', async () => {
    await served(join(dir, 'yard'), async (page, url) => {
      const errors = pageErrors(page);
      await page.goto(url);
      await page.locator('[role=status][data-done="5"][data-total="5"]').waitFor({ timeout: 120_000 });
      const notice = page.locator('.opened-notice');
      await expect(notice.textContent()).resolves.toContain('Opened 5 frames · 1 run · 5 with photos (folders by folder names)');
      await expect(notice.textContent()).resolves.toContain('1 file not paired');
      const report = await page.evaluate(() => (window as any).hairline.report('preds'));
      const spec = join(dir, 'ref.json');
      writeFileSync(spec, JSON.stringify({
        classes: join(dir, 'yard', 'classes.json'),
        frames: frames.map((f) => ({ name: `${f.site}/${f.key}`, truth: join(dir, 'yard', 'gt', f.site, `${f.key}_gt_class.png`), pred: join(dir, 'yard', 'preds', `${f.key}_pred.png`) })),
      }));
      const ref = JSON.parse(spawnSync('python3', [REF, spec], { encoding: 'utf8' }).stdout);
      expect(report.dataset.meanIoU).toBeCloseTo(ref.dataset.meanIoU, 9);
      for (const f of ref.frames) expect(report.frames.find((x: { name: string }) => x.name === f.name).meanIoU).toBeCloseTo(f.meanIoU, 9);
      await notice.locator('button', { hasText: 'what was opened' }).click();
      const panel = page.locator('.opened-panel');
      const text = (await panel.textContent()) ?? '';
      expect(text).toContain('truthIds: 9 stored ids → 5 classes, 3 to void');
      expect(text).toContain('predictionIds: 5 stored ids → 5 classes');
      // The probe passes over the colour map (colours not in the table), the 16-bit instance map (ids not in truthIds) and the JSON.
      expect(text).toMatch(/truth: several encodings of each frame: .*using "_gt_class" \(8-bit ids up to 255, all in the class table\); "_gt_color": .*colours that are not in classes.json.*"_gt_inst": stored ids .*"_gt_shapes": a JSON of shapes/);
      expect(text).toContain('predictions/preds/stray_pred.png: no ground-truth file with this frame key');
      if (SHOTS) await page.screenshot({ path: join(SHOTS, 'opened-panel.png') });
      await panel.locator('button', { hasText: 'close' }).click();
      // The readout names the class and the id the file stored there.
      await page.waitForFunction(() => {
        const s = (window as any).hairline.store.getState();
        return s.shown && s.shownIndex === s.frameIndex;
      });
      const box = (await page.locator('canvas').first().boundingBox())!;
      await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
      await expect(page.locator('[data-testid=readout]').textContent()).resolves.toMatch(/truth: (void|slab|hawser|skiff|beacon|kelp) \(stored id \d+\)/);
      if (SHOTS) await page.screenshot({ path: join(SHOTS, 'opened-workspace.png') });
      expect(errors).toEqual([]);
    });
  });

  it('a folder that is no dataset shows what was expected and what was found, not a blank page', async () => {
    await served(join(dir, 'scans'), async (page, url) => {
      await page.goto(url);
      const banner = page.locator('.banner[role=alert]');
      await banner.waitFor({ timeout: 60_000 });
      const text = (await banner.textContent()) ?? '';
      expect(text).toMatch(/^Could not open the served dataset: no ground-truth folder found: expected truth\/ .*Found: notes.txt, scan_a.png/);
      await expect(page.locator('.empty').textContent()).resolves.toContain('hairline.json');
      if (SHOTS) await page.screenshot({ path: join(SHOTS, 'not-a-dataset.png') });
    });
  });
});
