import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PNG } from 'pngjs';
import type { Browser } from 'playwright-core';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

let close: () => Promise<void>;
let url: string;
let browser: Browser;

beforeAll(async () => {
  ({ close, url } = await appServeBuilt());
  browser = await browserLaunch();
});
afterAll(async () => {
  await browser?.close();
  await close?.();
});

/** An 8-bit grayscale PNG written by pngjs (an encoder independent of ours). */
function grayPng(width: number, height: number, idAt: (x: number, y: number) => number): Buffer {
  const png = new PNG({ width, height, colorType: 0, inputColorType: 0, bitDepth: 8 });
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) png.data[y * width + x] = idAt(x, y);
  return PNG.sync.write(png, { colorType: 0, inputColorType: 0, bitDepth: 8, inputHasAlpha: false });
}

describe('file check page (real Chromium)', () => {
  it('decodes dropped label PNGs and shows size, ids and errors per file', async () => {
    const page = await browser.newPage();
    const errors = pageErrors(page);
    await page.goto(url + '?check');
    const good = grayPng(30, 20, (x) => (x < 10 ? 0 : x < 25 ? 3 : 255));
    const classes = JSON.stringify({ ignore: 255, classes: [{ id: 0, name: 'sky', color: '#7fb2e5' }, { id: 3, name: 'quay', color: '#9a8f7a' }] });
    await page.locator('.file-check input[type=file]').setInputFiles([
      { name: 'classes.json', mimeType: 'application/json', buffer: Buffer.from(classes) },
      { name: 'good.png', mimeType: 'image/png', buffer: good },
      { name: 'cut.png', mimeType: 'image/png', buffer: good.subarray(0, 40) },
      { name: 'notes.png', mimeType: 'image/png', buffer: Buffer.from('hello, not a png') },
    ]);
    const goodRow = page.locator('.fc-row[data-file="good.png"]');
    await goodRow.waitFor();
    const text = await goodRow.innerText();
    expect(text).toContain('30 × 20 px');
    expect(text).toContain('grayscale 8-bit');
    // 10 columns × 20 rows of id 0, 15 × 20 of id 3, 5 × 20 void.
    expect(text).toMatch(/0\s+sky\s+200/);
    expect(text).toMatch(/3\s+quay\s+300/);
    expect(text).toMatch(/255\s+void\s+100/);
    expect(await page.locator('.fc-row[data-file="cut.png"] .fc-error').innerText()).toMatch(/^cut\.png: /);
    expect(await page.locator('.fc-row[data-file="notes.png"] .fc-error').innerText()).toMatch(/not a PNG/i);
    expect(errors).toEqual([]);
    await page.close();
  });
});
