// The review workspace in real Chromium on the built app with the Kestrel Quay demo: side panes
// resize by their handles and keep their width after a reload; queue items show their score, reasons
// and every action whatever the pane's width (checked by element geometry); stepping with Q keeps
// the selected item in view; the progress line counts verdicts; the list filters by verdict and
// sorts by score.
import { readFileSync } from 'node:fs';
import { strFromU8, unzipSync } from 'fflate';
import type { Browser, Page } from 'playwright-core';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { labelMapFromPng } from '../../src/core/png/decodeLabel.ts';
import { MARK_COLORS } from '../../src/core/composite/compositePalette.ts';
import { APP_COMMAND_LIST } from '../../src/ui/commands/appCommands.ts';
import { appServeBuilt, browserLaunch, pageErrors } from './harness.ts';

const FRAMES = 8;
const QUERY = `?demo-frames=${FRAMES}&demo-size=320x160`;
let url = '';
let close: () => Promise<void>;
let browser: Browser;

beforeAll(async () => {
  ({ url, close } = await appServeBuilt());
  browser = await browserLaunch();
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await close?.();
});

async function openQueue(page: Page): Promise<void> {
  await page.goto(`${url}${QUERY}`);
  await page.locator(`[role=status][data-done="${FRAMES}"][data-total="${FRAMES}"]`).waitFor({ timeout: 180_000 });
  await page.locator('.left-pane .tab', { hasText: /^Doubts$/ }).first().click();
  await page.locator('.queue-item').first().waitFor();
}

/** Drags the left pane's handle so the pane is `width` CSS pixels wide. */
async function leftPaneDrag(page: Page, width: number): Promise<void> {
  const handle = (await page.locator('.splitter-left').boundingBox())!;
  const pane = (await page.locator('aside.left').boundingBox())!;
  const x = handle.x + handle.width / 2;
  const y = handle.y + 200;
  await page.mouse.move(x, y);
  await page.mouse.down();
  await page.mouse.move(x + (width - pane.width) / 2, y, { steps: 3 });
  await page.mouse.move(x + (width - pane.width), y, { steps: 3 });
  await page.mouse.up();
}

/** For each of the first queue items: whether the score, every button and the reasons lie inside the list horizontally and nothing overflows. */
function itemsFit(page: Page) {
  return page.$$eval('.queue-item', (els) => {
    const list = els[0].closest('aside')!.getBoundingClientRect();
    const inside = (e: Element | null) => {
      if (!e) return false;
      const r = e.getBoundingClientRect();
      return r.width > 0 && r.left >= list.left - 0.5 && r.right <= list.right + 0.5;
    };
    return els.slice(0, 6).map((el) => ({
      score: inside(el.querySelector('.qi-score')),
      buttons: [...el.querySelectorAll('.qi-verdicts button')].length >= 4 && [...el.querySelectorAll('.qi-verdicts button')].every(inside),
      reasons: [...el.querySelectorAll('.qi-reasons li')].every((r) => inside(r) && r.scrollWidth <= r.clientWidth + 1),
      noOverflow: el.scrollWidth <= el.clientWidth + 1,
    }));
  });
}

describe('review workspace layout (real Chromium)', () => {
  it('resizes panes by dragging, fits queue items at narrow and wide widths, remembers the width', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    const errors = pageErrors(page);
    await openQueue(page);
    const all = { score: true, buttons: true, reasons: true, noOverflow: true };
    for (const width of [190, 260, 600]) {
      await leftPaneDrag(page, width);
      const w = (await page.locator('aside.left').boundingBox())!.width;
      expect(Math.abs(w - width)).toBeLessThanOrEqual(2);
      const fit = await itemsFit(page);
      expect(fit.length).toBeGreaterThan(0);
      for (const f of fit) expect(f).toEqual(all);
    }
    await page.reload();
    await page.locator(`[role=status][data-done="${FRAMES}"]`).waitFor({ timeout: 180_000 });
    expect(Math.abs((await page.locator('aside.left').boundingBox())!.width - 600)).toBeLessThanOrEqual(2);
    expect(errors.filter((e) => !e.includes('GPU stall'))).toEqual([]);
    await page.close();
  });

  it('fits the frame list at narrow and wide panes: no number runs into the next, the name keeps its room, fewer columns when narrow', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    await openQueue(page);
    await page.locator('.left-pane .tab', { hasText: /^Frames$/ }).first().click();
    const shown: number[] = [];
    for (const width of [180, 260, 600]) {
      await leftPaneDrag(page, width);
      const rows = await page.$$eval('.fl-head, .fl-row', (els) => els.map((row) => {
        const box = row.getBoundingClientRect();
        const cells = [...row.children].filter((c) => getComputedStyle(c).display !== 'none').map((c) => {
          const r = c.getBoundingClientRect();
          return { text: c.textContent ?? '', left: r.left, right: r.right, whole: c.scrollWidth <= c.clientWidth + 1, name: c.classList.contains('fl-name') || c.classList.contains('fl-resort') };
        });
        return { left: box.left, right: box.right, cells };
      }));
      expect(rows.length).toBeGreaterThan(1);
      for (const row of rows) {
        for (const [i, c] of row.cells.entries()) {
          expect(c.left, `${width}px: ${c.text}`).toBeGreaterThanOrEqual(row.left - 0.5);
          expect(c.right, `${width}px: ${c.text}`).toBeLessThanOrEqual(row.right + 0.5);
          expect(c.whole, `${width}px: '${c.text}' cut off`).toBe(true);
          if (i > 0) expect(c.left, `${width}px: '${c.text}' overlaps the cell before it`).toBeGreaterThanOrEqual(row.cells[i - 1].right);
          if (c.name) expect(c.right - c.left).toBeGreaterThanOrEqual(46);
        }
      }
      shown.push(rows[1].cells.length);
    }
    // 180 px shows the name and three scores, 260 px the same, 600 px every column.
    expect(shown).toEqual([4, 4, 8]);
    await page.close();
  });

  it('shows each Doubts item\'s signals as a strip that fits at 180 px and wide, bar values equal to the item\'s evidence', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    await openQueue(page);
    const queue = await page.evaluate(() => (window as any).hairline.queue() as { frame: string; signals: Record<string, number | null>; contributions: Record<string, number> }[]);
    for (const width of [180, 600]) {
      await leftPaneDrag(page, width);
      expect(Math.abs((await page.locator('aside.left').boundingBox())!.width - width)).toBeLessThanOrEqual(2);
      const strips = await page.$$eval('.queue-item', (els) => els.slice(0, 8).map((el) => {
        const item = el.getBoundingClientRect();
        const list = el.closest('aside')!.getBoundingClientRect();
        return {
          frame: (el as HTMLElement).dataset.frame,
          cells: [...el.querySelectorAll('.qs-cell')].map((c) => {
            const r = c.getBoundingClientRect();
            const bar = c.querySelector('.qs-bar')?.getBoundingClientRect();
            const track = c.querySelector('.qs-track')!.getBoundingClientRect();
            return {
              signal: (c as HTMLElement).dataset.signal!, value: (c as HTMLElement).dataset.value!, title: (c as HTMLElement).title,
              inside: r.width >= 8 && r.left >= Math.max(item.left, list.left) - 0.5 && r.right <= Math.min(item.right, list.right) + 0.5,
              barShare: bar ? bar.height / (track.height - 2) : null,
            };
          }),
        };
      }));
      expect(strips.length).toBeGreaterThan(3);
      strips.forEach((st, i) => {
        const q = queue[i];
        expect(st.frame).toBe(q.frame);
        // The eight signals in their order, each within the item and the pane.
        expect(st.cells.map((c) => c.signal)).toEqual(['agreement', 'image', 'temporal', 'geometry', 'confidence', 'appearance', 'habit', 'steady']);
        for (const c of st.cells) {
          expect(c.inside, `${q.frame} ${c.signal} at ${width}px`).toBe(true);
          const v = q.signals[c.signal];
          expect(c.value === '' ? null : Number(c.value), c.signal).toBe(v);
          if (v === null) expect(c.title).toMatch(/not measured/);
          else {
            expect(c.title).toContain(v.toFixed(2));
            expect(Math.abs(c.barShare! - v)).toBeLessThan(0.08);
          }
        }
      });
    }
    // The legend names every letter's signal.
    await page.locator('[data-testid=signal-legend] summary').click();
    const legend = await page.locator('[data-testid=signal-legend] .qs-legend-item').allInnerTexts();
    expect(legend.map((t) => t.slice(0, 1))).toEqual(['A', 'E', 'F', 'G', 'C', 'P', 'R', 'S']);
    await page.close();
  });

  it('keeps the item Q selects in view, counts verdicts, filters by verdict and sorts by score', async () => {
    const page = await browser.newPage({ viewport: { width: 1300, height: 700 } });
    await openQueue(page);
    const total = await page.locator('.queue-item').count();
    expect(total).toBeGreaterThan(5);
    const steps = Math.min(total, 12);
    for (let i = 0; i < steps; i++) await page.keyboard.press('q');
    const seen = await page.$eval('.queue-item.selected', (el) => {
      const r = el.getBoundingClientRect();
      const list = el.closest('.queue')!.getBoundingClientRect();
      return r.top >= list.top - 0.5 && r.bottom <= list.bottom + 0.5;
    });
    expect(seen).toBe(true);
    // The list is ranked, not by raw score; L judges the selected item and the progress line counts it.
    await page.keyboard.press('l');
    const progress = () => page.$eval('[data-testid=review-progress]', (el) => [...el.childNodes].filter((n) => n.nodeName !== 'BUTTON').map((n) => n.textContent!.trim()).join(' '));
    await expect.poll(progress).toBe(`judged 1 of ${total} label mistake 1 model error 0 unsure 0`);
    await page.selectOption('select[aria-label="filter by verdict"]', 'label-mistake');
    expect(await page.locator('.queue-item').count()).toBe(1);
    await page.selectOption('select[aria-label="filter by verdict"]', 'all');
    await page.selectOption('select[aria-label="order"]', 'score-high');
    const scores = await page.$$eval('.queue-item .qi-score', (els) => els.map((e) => Number(e.textContent)));
    expect(scores.length).toBe(total);
    for (let i = 1; i < scores.length; i++) expect(scores[i]).toBeLessThanOrEqual(scores[i - 1]);
    // Keys still work after a drop-down was used: Q steps the list in its new order.
    const at = () => page.$$eval('.queue-item', (els) => els.findIndex((e) => e.classList.contains('selected')));
    const before = await at();
    expect(before).toBeGreaterThanOrEqual(0);
    await page.keyboard.press(before < total - 1 ? 'q' : 'Shift+Q');
    await expect.poll(at).toBe(before < total - 1 ? before + 1 : before - 1);
    await page.close();
  });

  it('closes help, the flag form, the export dialog and the opened panel with Esc, and lists every keyed command in help', async () => {
    const page = await browser.newPage({ viewport: { width: 1300, height: 760 } });
    const errors = pageErrors(page);
    await openQueue(page);
    const help = page.locator('[role=dialog][aria-label="Keyboard commands"]');
    await page.keyboard.press('?');
    await help.waitFor();
    const keyed = APP_COMMAND_LIST.filter((c) => c.keys.length > 0).length;
    expect(await help.locator('tbody tr').count()).toBe(keyed);
    await page.keyboard.press('Escape');
    await help.waitFor({ state: 'detached' });
    // The flag form: Esc closes it, also with the note field focused.
    const form = page.locator('.flag-dialog[role=dialog]').first();
    await page.keyboard.press('m');
    await form.waitFor();
    await page.keyboard.press('Escape');
    await form.waitFor({ state: 'detached' });
    await page.keyboard.press('m');
    await form.locator('button.primary').click();
    await form.waitFor({ state: 'detached' });
    const exportDialog = page.locator('[role=dialog][aria-label="Export tiles"]');
    await page.keyboard.press('Shift+T');
    await exportDialog.waitFor();
    await page.keyboard.press('Escape');
    await exportDialog.waitFor({ state: 'detached' });
    const opened = page.locator('[role=dialog][aria-label="What was opened"]');
    await page.keyboard.press('Shift+O');
    await opened.waitFor();
    await page.keyboard.press('Escape');
    await opened.waitFor({ state: 'detached' });
    expect(errors.filter((e) => !e.includes('GPU stall'))).toEqual([]);
    await page.close();
  });

  it('shows a legend for the layers on, in the colours the compositor paints', async () => {
    const page = await browser.newPage({ viewport: { width: 1300, height: 760 } });
    await openQueue(page);
    const swatch = (marks: string) => page.locator(`.legend-strip li[data-marks="${marks}"] .lg-swatch`);
    const rgb = (n: number) => `rgb(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255})`;
    // A patterned swatch (bands, stripes) paints its colour through a gradient, a plain one as its background colour.
    const paint = (marks: string) => swatch(marks).evaluate((e) => { const s = getComputedStyle(e); return `${s.backgroundColor} ${s.backgroundImage}`; });
    expect(await page.locator('.layer-bar input[type=checkbox]').nth(3).isChecked()).toBe(true);
    expect(await swatch('wrong').evaluate((e) => getComputedStyle(e).backgroundColor)).toBe(rgb(MARK_COLORS.wrong));
    expect(await paint('invalid')).toContain(rgb(MARK_COLORS.invalid));
    await page.keyboard.press('4');
    await swatch('wrong').waitFor({ state: 'detached' });
    await page.keyboard.press('Shift+R');
    await page.keyboard.press('7');
    await swatch('fixed').waitFor();
    expect(await paint('broke')).toContain(rgb(MARK_COLORS.broke));
    await page.close();
  });

  it('a deep link restores its frame and zoom exactly, and that frame is scored before the rest', async () => {
    const page = await browser.newPage({ viewport: { width: 1300, height: 760 } });
    await page.goto(`${url}${QUERY}#f=kq-0008&w=5&z=100.0,60.0,4`);
    // As soon as the link's frame has scores, at most the jobs handed out before it (two per worker) and one neighbour are done too, not every frame before it.
    await page.waitForFunction(() => {
      const s = (window as any).hairline?.store.getState();
      const at = s?.dataset?.pairing.frames.findIndex((f: { name: string }) => f.name === 'kq-0008') ?? -1;
      return at >= 0 && s.results[at] != null;
    }, undefined, { timeout: 180_000, polling: 10 });
    const doneThen = await page.evaluate(() => (window as any).hairline.store.getState().results.filter((r: unknown) => r != null).length);
    const workers = await page.evaluate(() => navigator.hardwareConcurrency);
    expect(doneThen).toBeLessThanOrEqual(2 * workers + 2);
    expect(doneThen).toBeLessThan(FRAMES);
    await page.locator(`[role=status][data-done="${FRAMES}"]`).waitFor({ timeout: 180_000 });
    await page.waitForTimeout(400);
    const view = await page.evaluate(() => (window as any).hairlineViewer.viewGet());
    expect([view.cx, view.cy, view.scale]).toEqual([100, 60, 4]);
    const s = await page.evaluate(() => { const s = (window as any).hairline.store.getState(); return [s.dataset.pairing.frames[s.frameIndex].name, s.bandWidth]; });
    expect(s).toEqual(['kq-0008', 5]);
    expect(await page.evaluate(() => location.hash)).toMatch(/z=100\.0%2C60\.0%2C4(&|$)/);
    await page.close();
  });

  it('turns label-mistake verdicts into a tile ZIP in one step (Shift+E), each tile with its region, reasons and score', async () => {
    const page = await browser.newPage({ viewport: { width: 1300, height: 760 } });
    await openQueue(page);
    // Judge the first three items: two label mistakes, one model error.
    for (const key of ['l', 'e', 'l']) {
      await page.keyboard.press('q');
      await page.keyboard.press(key);
    }
    const judged = await page.evaluate(() =>
      Object.values((window as any).hairline.store.getState().reviewVerdicts as Record<string, { verdict: string; frame: string; bbox: number[] }>).filter((v) => v.verdict === 'label-mistake').map((v) => `${v.frame}|${v.bbox.join(',')}`),
    );
    expect(judged).toHaveLength(2);
    await page.keyboard.press('Shift+E');
    const dialog = page.locator('[role=dialog][aria-label="Export tiles"]');
    await dialog.waitFor();
    await expect.poll(() => dialog.locator('button.primary').innerText()).toBe('export 2 flags');
    const [download] = await Promise.all([page.waitForEvent('download', { timeout: 120_000 }), dialog.locator('button.primary').click()]);
    const zip = unzipSync(new Uint8Array(readFileSync((await download.path())!)));
    const manifest = JSON.parse(strFromU8(zip['manifest.json']));
    expect(manifest.failed).toEqual([]);
    const tiles = manifest.tiles as { frame: string; flagBox: number[]; reason: string; region: { score: number; reasons: string[] } | null }[];
    expect(new Set(tiles.map((t) => `${t.frame}|${t.flagBox.join(',')}`))).toEqual(new Set(judged));
    // Each label crop comes with a colour preview: the exact id PNG read by our decoder (checked against
    // pngjs in test/cli/export.test.ts), the preview by pngjs; every pixel is its id's class colour (void dark gray).
    const table = await page.evaluate(() => {
      const d = (window as any).hairline.store.getState().dataset.table;
      return { ignore: d.ignore as number, colors: Object.fromEntries(d.classes.map((c: { id: number; color: string }) => [c.id, c.color])) as Record<number, string> };
    });
    for (const t of manifest.tiles as { truth: { file: string; preview: string }; preds: { file: string; preview: string }[] }[]) {
      for (const f of [t.truth, ...t.preds]) {
        const ids = labelMapFromPng(zip[f.file], { file: f.file });
        if (!ids.ok) throw new Error(ids.error);
        const preview = PNG.sync.read(Buffer.from(zip[f.preview]));
        expect([preview.width, preview.height]).toEqual([ids.value.width, ids.value.height]);
        for (let i = 0; i < ids.value.ids.length; i++) {
          const id = ids.value.ids[i];
          const want = id === table.ignore ? '#202020' : table.colors[id];
          const got = `#${[0, 1, 2].map((c) => preview.data[i * 4 + c].toString(16).padStart(2, '0')).join('')}`;
          if (got !== want) throw new Error(`${f.preview}: pixel ${i} is ${got}, id ${id} is ${want}`);
        }
      }
    }
    for (const t of tiles) {
      expect(t.reason).toBe('label-mistake');
      expect(t.region!.score).toBeGreaterThan(0);
      expect(t.region!.reasons.length).toBeGreaterThan(0);
    }
    // Again: the judged items are flagged already, so no second flag is made.
    await page.keyboard.press('Escape');
    await page.keyboard.press('Shift+E');
    await expect.poll(() => dialog.locator('button.primary').innerText()).toBe('export 2 flags');
    await page.close();
  });
});
