// The page's own scoring keeps per-frame scores in typed columns (src/state/frameColumns.ts) instead
// of an object per frame. The columns must give every value the frame list and timeline read before:
// the frame summary of the frame's digest (digestSummary, band IoU at any width) and the frame line's
// flicker and small-object values (extrasFrameLine), frames scored for real by frameJobScore.
import { describe, expect, it } from 'vitest';
import { classTableFromText } from '../../src/core/classTable.ts';
import { frameJobScore, type FrameJobResult } from '../../src/core/frameJob.ts';
import { extrasFrameLine } from '../../src/core/metrics/extrasTotals.ts';
import { digestSummary, frameDigestOf } from '../../src/core/metrics/frameDigest.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../src/core/metrics/settings.ts';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { scoringTableBuild } from '../../src/core/scoringTable.ts';
import { frameColumnsAdd, frameColumnsCreate } from '../../src/state/frameColumns.ts';
import { classFrameColumn, classFrameColumnOf } from '../../src/state/classFrames.ts';
import { DETAIL_KEEP } from '../../src/state/scoresSlice.ts';
import { frameOrderSel, frameTableSel } from '../../src/state/selectors.ts';
import { appStoreCreate } from '../../src/state/store.ts';
import { harbourPrediction, harbourTruth, HARBOUR_CLASSES } from '../support/harbourScene.ts';

const RUNS = ['a', 'b'];

function scoredFrames(n: number): FrameJobResult[] {
  const text = JSON.stringify({ ignore: 255, classes: HARBOUR_CLASSES.map((name, id) => ({ id, name, color: `#${(id * 20 + 16).toString(16)}8040` })) });
  const parsed = classTableFromText(text, 'classes.json');
  if (!parsed.ok) throw new Error(parsed.error);
  const built = scoringTableBuild(parsed.value, 255);
  if (!built.ok) throw new Error(built.error);
  const truths = Array.from({ length: n }, (_, i) => harbourTruth(48, 24, 700 + i));
  const pred = (i: number, k: number) => ({ file: `p${k}/${i}.png`, bytes: labelMapToPng(harbourPrediction(truths[i], 900 + i * 3 + k, 1 + k), { kind: 'gray', bitDepth: 8 }) });
  return truths.map((t, i) => {
    const r = frameJobScore({
      name: `f${i}`, truth: { file: `t/${i}.png`, bytes: labelMapToPng(t, { kind: 'gray', bitDepth: 8 }) }, table: built.value, settings: DEFAULT_SCORE_SETTINGS,
      preds: RUNS.map((run, k) => ({ run, file: pred(i, k) })),
      neighbours: RUNS.map((run, k) => ({ run, prev: i > 0 ? pred(i - 1, k) : null, next: i < n - 1 ? pred(i + 1, k) : null })),
    });
    // Frame 2's run b fails, as an unreadable prediction would.
    return i === 2 ? { ...r, runs: r.runs.map((x) => (x.run === 'b' ? { run: 'b', stats: null, error: 'p1/2.png: not a PNG' } : x)) } : r;
  });
}

function storeOf(n: number) {
  const store = appStoreCreate();
  const frames = Array.from({ length: n }, (_, i) => ({ name: `f${i}`, image: null, truth: `f${i}.png`, predictions: {}, confidence: {} }));
  store.setState({ dataset: { key: 'k', title: 't', source: { kind: 'demo' } as never, pairing: { frames, runs: RUNS, unpaired: [] }, table: null, tableError: null } });
  store.getState().scoringStart(1, n, HARBOUR_CLASSES.map((_, id) => id));
  return store;
}

describe('frame columns: the page scoring keeps typed columns, not objects per frame', () => {
  const results = scoredFrames(5);

  it('give the same values as each frame digest and extras (every key, band IoU at several widths, both runs)', () => {
    const store = storeOf(5);
    // Frames land out of order, as the scoring pass around the frame on screen delivers them.
    store.getState().scoringFramesDone(1, [3, 0, 4].map((index) => ({ index, result: results[index] })));
    store.getState().scoringFramesDone(1, [2, 1].map((index) => ({ index, result: results[index] })));
    for (const run of RUNS) {
      store.getState().runsSet({ runA: run });
      for (const w of [0, 3, 11, 64]) {
        store.getState().bandWidthSet(w);
        const table = frameTableSel(store.getState());
        expect(table.bandWidth).toBe(w);
        results.forEach((r, i) => {
          const x = r.runs.find((y) => y.run === run)!;
          if (!x.stats) {
            expect(table.error(i)).toBe('p1/2.png: not a PNG');
            expect(table.value(i, 'meanIoU')).toBeNull();
            return;
          }
          const before = { ...digestSummary(frameDigestOf(x.stats), w), ...extrasFrameLine(x.extras) };
          expect(table.pending(i)).toBe(false);
          expect(table.error(i)).toBeNull();
          for (const key of ['meanIoU', 'bandIoU', 'boundaryIoU', 'boundaryF', 'errorPixels', 'flipBack', 'flipBackVoid', 'smallObjectRecall'] as const) {
            expect(table.value(i, key), `${run} frame ${i} ${key} at ${w}`).toBe(before[key]);
          }
        });
      }
    }
    // Per-class IoU and Boundary IoU (the drill-down by class) equal those of the frames' digests.
    const st = store.getState();
    for (const run of RUNS) {
      for (const measure of ['iou', 'biou'] as const) {
        for (const id of [0, 2, 5]) {
          const fromColumns = classFrameColumnOf(st.columns, [], 5, run, id, measure, 3);
          const fromDigests = classFrameColumn(st.results, 5, run, id, measure, 3);
          expect([...fromColumns], `${run} class ${id} ${measure}`).toEqual([...fromDigests]);
        }
      }
    }
    // Flicker is defined in the middle of the sequence (both neighbours present) and not at its ends.
    const table = frameTableSel(store.getState());
    expect(table.value(1, 'flipBack')).not.toBeNull();
    expect(table.value(0, 'flipBack')).toBeNull();
  });

  it('sort worst first with failed and pending frames last, and make a new table when frames land', () => {
    const store = storeOf(5);
    store.getState().runsSet({ runA: 'b' });
    store.getState().scoringFramesDone(1, [0, 1, 2].map((index) => ({ index, result: results[index] })));
    const t1 = frameTableSel(store.getState());
    expect(t1.pending(3)).toBe(true);
    const m = [0, 1].map((i) => t1.value(i, 'meanIoU')!);
    const worst = m[0] <= m[1] ? [0, 1] : [1, 0];
    // Frame 2 failed for run b; 3 and 4 are pending: all after the scored frames, in frame order.
    expect(frameOrderSel(store.getState())).toEqual([...worst, 2, 3, 4]);
    store.getState().scoringFramesDone(1, [{ index: 4, result: results[4] }]);
    expect(frameTableSel(store.getState())).not.toBe(t1);
    expect(frameTableSel(store.getState()).pending(4)).toBe(false);
  });

  it('grow by doubling up to the dataset size, keeping what they hold', () => {
    const c = frameColumnsCreate(1000, ['a']);
    expect(c.capacity).toBe(64);
    const stats = frameDigestOf(results[0].runs[0].stats!);
    frameColumnsAdd(c, 3, null, [{ run: 'a', stats, error: null }]);
    frameColumnsAdd(c, 130, null, [{ run: 'a', stats, error: null }]);
    expect(c.capacity).toBe(256);
    expect(c.runs.a.values.meanIoU.length).toBe(256);
    expect(c.runs.a.values.meanIoU[3]).toBe(c.runs.a.values.meanIoU[130]);
    expect(Number.isNaN(c.runs.a.values.meanIoU[4])).toBe(true);
    frameColumnsAdd(c, 999, null, [{ run: 'a', stats, error: null }]);
    expect(c.capacity).toBe(1000);
  });
});

describe('full results kept for a short window only', () => {
  it('holds DETAIL_KEEP frames plus the frame on screen; a frame scored again to show it adds nothing to the sums', () => {
    const n = DETAIL_KEEP + 44;
    const store = storeOf(n);
    const fail = (i: number) => ({ name: `f${i}`, width: 4, height: 2, error: null, runs: [{ run: 'a', stats: null, error: `f${i}: a unreadable` }, { run: 'b', stats: null, error: null }] });
    for (let i = 0; i < n; i += 10) store.getState().scoringFramesDone(1, Array.from({ length: Math.min(10, n - i) }, (_, k) => ({ index: i + k, result: fail(i + k) })));
    const s = store.getState();
    expect(s.scoring.done).toBe(n);
    // Frame 0 is on screen, so it stays; of the rest only the last DETAIL_KEEP to land.
    const held = s.results.flatMap((r, i) => (r ? [i] : []));
    expect(held).toEqual([0, ...Array.from({ length: DETAIL_KEEP - 1 }, (_, k) => n - DETAIL_KEEP + 1 + k)]);
    expect(frameTableSel(s).error(5)).toBe('f5: a unreadable');
    s.scoringFramesDone(1, [{ index: 5, result: fail(5) }]);
    expect(store.getState().results[5]).toBeDefined();
    expect(store.getState().scoring.done).toBe(n);
    expect(store.getState().scoring.failed).toBe(s.scoring.failed);
  });
});
