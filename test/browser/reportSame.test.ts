import { readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { scoreCli } from '../cli/scoreRun.ts';
import { reportDifferences } from '../reference/pythonRef.ts';
import { demoOnDisk } from '../support/demoOnDisk.ts';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

// The page's "save report" (Shift+D) on the demo in real Chromium is the file the headless scorer
// writes for the same demo written by `npm run demo` (photos and instance maps given): every key at
// every depth present on both sides (regions, voidSpill, suspects, unpaired, runs, opened, …) and
// every number within 1e-12. The scorer's numbers themselves are checked against numpy / scipy in
// test/reference; this test holds the page to them.

const FRAMES = 6;
const W = 320;
const H = 160;
let dir = '';
let url = '';
let close: () => Promise<void>;
let browser: Browser;

beforeAll(async () => {
  dir = demoOnDisk('hairline-rep-', FRAMES, W, H);
  ({ url, close } = await appServeBuilt());
  browser = await browserLaunch();
});
afterAll(async () => {
  await browser?.close();
  await close?.();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('saved report (real Chromium)', () => {
  it('equals the headless scorer\'s report on the demo, every key', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    const errors = pageErrors(page);
    await page.goto(`${url}?demo-frames=${FRAMES}&demo-size=${W}x${H}`);
    await page.locator(`[role=status][data-done="${FRAMES}"][data-total="${FRAMES}"]`).waitFor({ timeout: 120_000 });
    const kq = join(dir, 'kq');
    const cli = scoreCli([
      '--truth', join(kq, 'truth'), '--pred', `run-a=${join(kq, 'predictions', 'run-a')}`, '--pred', `run-b=${join(kq, 'predictions', 'run-b')}`,
      '--images', join(kq, 'images'), '--instances', join(kq, 'instances'), '--classes', join(kq, 'classes.json'),
    ]);
    expect(cli.status, cli.stderr).toBe(0);
    const report = JSON.parse(cli.stdout);

    await page.locator('body').click({ position: { x: 5, y: 5 } });
    const [download] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.keyboard.press('Shift+D')]);
    expect(download.suggestedFilename()).toBe('hairline-report-run-a.json');
    const saved = JSON.parse(readFileSync((await download.path())!, 'utf8'));

    // The keys the page's report lacked before it was built by the scorer's builder.
    for (const k of ['classes', 'settings', 'dataset', 'frames', 'runs', 'unpaired', 'opened', 'suspects']) expect(saved, k).toHaveProperty(k);
    for (const k of ['regions', 'voidSpill', 'flipBack', 'smallObjectRecall']) expect(saved.frames[0], k).toHaveProperty(k);
    expect(Object.keys(saved).sort()).toEqual(Object.keys(report).sort());
    expect(report.suspects.length).toBeGreaterThan(10);
    expect(report.frames.some((f: { regions: unknown[] | null }) => (f.regions?.length ?? 0) > 0)).toBe(true);
    // Every key at every depth, numbers at 1e-12 (reportDifferences skips nothing here).
    expect(reportDifferences(saved, report, 1e-12, [])).toEqual([]);
    expect(errors.filter((e) => !e.includes('GPU stall'))).toEqual([]);
    await page.close();
  });
});
