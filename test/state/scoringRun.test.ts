import { afterEach, describe, expect, it } from 'vitest';
import { threadPortCreate } from '../../src/cli/threadPort.ts';
import type { LabelMap } from '../../src/core/labelMap.ts';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import type { DatasetSource } from '../../src/data/sources/source.ts';
import { datasetFromSource, datasetInstall } from '../../src/state/datasetLoad.ts';
import { scoreOrder, scoringKeep } from '../../src/state/scoringRun.ts';
import { stateReport } from '../../src/state/stateReport.ts';
import { appStoreCreate, type AppStore } from '../../src/state/store.ts';
import { workerPoolCreate } from '../../src/workers/pool.ts';
import type { ScorePool } from '../../src/workers/scorePool.ts';
import type { ScoreJobs } from '../../src/workers/scoreJobs.ts';

const ENTRY = new URL('./fixtures/scoreWorkerThread.ts', import.meta.url);
let pool: ScorePool | null = null;
let stop: (() => void) | null = null;
afterEach(() => {
  stop?.();
  pool?.destroy();
});

function png(ids: number[], w: number): Blob {
  const map: LabelMap = { width: w, height: ids.length / w, ids: Uint8Array.from(ids) };
  return new Blob([labelMapToPng(map, { kind: 'gray', bitDepth: 8 }) as BlobPart]);
}

/** A small in-memory dataset: frames of 4×2 pixels, with a classes.json unless `classes` is false; `dies` kills the worker scoring it. */
function sourceMake(names: string[], classes = true): DatasetSource {
  const truth = png([0, 0, 1, 1, 0, 0, 1, 1], 4);
  const pred = png([0, 1, 1, 1, 0, 0, 1, 255], 4);
  return {
    kind: 'folder',
    title: 'tiny',
    listing: { images: [], truth: names.map((n) => `${n}.png`), predictions: { r: names.map((n) => `${n}.png`) } },
    classesText: classes ? JSON.stringify({ ignore: 255, classes: [{ id: 0, name: 'a', color: '#000001' }, { id: 1, name: 'b', color: '#000002' }] }) : null,
    read: async (folder) => (folder === 'truth' ? truth : pred),
  };
}

function settled(store: AppStore): Promise<void> {
  return new Promise((resolve) => {
    const check = () => {
      const s = store.getState().scoring;
      if (s.total > 0 && s.done === s.total) {
        unsub();
        resolve();
      }
    };
    const unsub = store.subscribe(check);
    check();
  });
}

describe('scoringKeep: the pipeline that keeps scores in step with the dataset and settings', () => {
  it('scores the frame on screen first, then its neighbours, also when the view moves to a frame after the pass started (a deep link)', async () => {
    expect(scoreOrder([0, 1, 2, 3, 4, 5, 6], 3)).toEqual([3, 4, 2, 5, 1, 6, 0]);
    expect(scoreOrder([9, 0, 5], 0)).toEqual([0, 5, 9]);
    pool = workerPoolCreate<ScoreJobs>(() => threadPortCreate(ENTRY), 1);
    const store = appStoreCreate();
    stop = scoringKeep(store, pool);
    const names = Array.from({ length: 30 }, (_, i) => `g${String(i).padStart(2, '0')}`);
    const delivered: number[] = [];
    store.subscribe((s) => s.results, (results) => results.forEach((r, i) => r && !delivered.includes(i) && delivered.push(i)));
    datasetInstall(store, datasetFromSource(sourceMake(names)));
    // The link's frame is applied once the dataset is in, as the page does it.
    store.getState().frameIndexSet(20);
    await settled(store);
    // Two jobs are handed out before the link's frame is known (frames 0 and 1); then frame 20, then its
    // neighbours (two jobs in flight at a time may finish in either order).
    expect(new Set(delivered.slice(0, 2))).toEqual(new Set([0, 1]));
    // Frames reach the store in batches (every 60 ms) and this list reads each batch in frame order, so
    // on a busy machine frame 20 may share its batch with a neighbour scored just after it.
    expect(delivered.slice(2, 4)).toContain(20);
    for (const i of delivered.slice(3, 9)) expect(Math.abs(i - 20)).toBeLessThanOrEqual(4);
    expect(delivered).toHaveLength(30);
  });

  it('scores every frame; a worker that dies marks its frame with an error, and the rest are scored', async () => {
    pool = workerPoolCreate<ScoreJobs>(() => threadPortCreate(ENTRY), 2);
    const store = appStoreCreate();
    stop = scoringKeep(store, pool);
    datasetInstall(store, datasetFromSource(sourceMake(['f1', 'f2', 'dies', 'f4', 'f5', 'f6'])));
    await settled(store);
    const { results, scoring } = store.getState();
    expect(scoring.failed).toBe(1);
    const dead = results[store.getState().dataset!.pairing.frames.findIndex((f) => f.name === 'dies')]!;
    expect(dead.error).toMatch(/^dies: the worker stopped while running this job \(exit code 9\)/);
    const ok = results.filter((r) => r && !r.error);
    expect(ok).toHaveLength(5);
    // 8 pixels: truth 0 0 1 1 / 0 0 1 1, prediction 0 1 1 1 / 0 0 1 255 → 6 right of 8.
    for (const r of ok) expect(r!.runs[0].stats!.confusion.reduce((a, b) => a + b, 0)).toBe(8);
    expect(pool.restarts()).toBe(1);
  });

  it('a settings change cancels the pass in flight and rescores with the new settings', async () => {
    pool = workerPoolCreate<ScoreJobs>(() => threadPortCreate(ENTRY), 1);
    const store = appStoreCreate();
    stop = scoringKeep(store, pool);
    datasetInstall(store, datasetFromSource(sourceMake(['a1', 'a2', 'a3', 'a4', 'a5', 'a6', 'a7', 'a8'], false)));
    const gen1 = store.getState().scoring.generation;
    await new Promise((r) => setTimeout(r, 30));
    expect(store.getState().scoring.done).toBeLessThan(8);
    // Id 1 becomes the void id (no classes.json: classes are the ids present): its ground-truth pixels leave every score.
    store.getState().settingsSet({ ignore: 1 });
    const gen2 = store.getState().scoring.generation;
    expect(gen2).toBeGreaterThan(gen1);
    await settled(store);
    const s = store.getState();
    expect(s.scoring.generation).toBe(gen2);
    expect(s.scoring.done).toBe(8);
    expect(s.results.every((r) => r && !r.error)).toBe(true);
    // Results of the cancelled pass never land in the new one: every frame counts 4 valid pixels, not 8.
    expect(s.scoring.failed).toBe(0);
    for (const r of s.results) expect(r!.runs[0].stats!.confusion.reduce((a, b) => a + b, 0)).toBe(4);
  });

  it('a void id that is a class id is refused naming the class: every frame fails with the reason (as the command line refuses)', async () => {
    pool = workerPoolCreate<ScoreJobs>(() => threadPortCreate(ENTRY), 1);
    const store = appStoreCreate();
    stop = scoringKeep(store, pool);
    datasetInstall(store, datasetFromSource(sourceMake(['b1', 'b2', 'b3'])));
    await settled(store);
    expect(store.getState().scoring.failed).toBe(0);
    store.getState().settingsSet({ ignore: 1 });
    await settled(store);
    const s = store.getState();
    expect(s.scoring.failed).toBe(3);
    for (const r of s.results) expect(r!.error).toBe('void id 1 is the id of class "b" in classes.json; choose another void id');
  });

  it('passes each run\'s neighbouring predictions and the instance map to the frame jobs: the page\'s report has flicker, objects and iIoU', async () => {
    // Hand-worked (src/docs/metrics.md "Flicker"): truth 0 0 1 1 / 0 0 1 1 on three frames of one
    // sequence; the prediction of s2 differs from s1 and s3 (which agree) at one pixel of truth 0, so
    // s2 flips back 1 of its 8 non-void pixels and the sequence ends have no value. Instances: ids 1
    // on the class-1 pixels (one instance of 4 pixels, all predicted right: iIoU of class 1 = its IoU
    // without false positives, 4 / (4 + fp)).
    pool = workerPoolCreate<ScoreJobs>(() => threadPortCreate(ENTRY), 1);
    const store = appStoreCreate();
    stop = scoringKeep(store, pool);
    const steady = png([0, 0, 1, 1, 0, 0, 1, 1], 4), flipped = png([0, 1, 1, 1, 0, 0, 1, 1], 4);
    const inst = new Blob([labelMapToPng({ width: 4, height: 2, ids: Uint16Array.from([0, 0, 1, 1, 0, 0, 1, 1]) }, { kind: 'gray', bitDepth: 16 }) as BlobPart]);
    const base = sourceMake(['s1', 's2', 's3']);
    const source: DatasetSource = {
      ...base,
      listing: { ...base.listing, instances: ['s1.png', 's2.png', 's3.png'] },
      read: async (folder, path) => (folder === 'truth' ? steady : folder === 'instances' ? inst : path === 's2.png' ? flipped : steady),
    };
    datasetInstall(store, datasetFromSource(source));
    await settled(store);
    const report = stateReport(store.getState(), 'r')!;
    expect(report.frames.map((f) => f.flipBack)).toEqual([null, 1 / 8, null]);
    expect(report.frames.map((f) => f.flipBackVoid)).toEqual([null, null, null]);
    expect(report.dataset.flipBack).toBe(1 / 8);
    // Class 1 over three frames: 12 truth pixels all predicted right, 1 false positive (s2) → 12 / 13.
    expect(report.dataset.iIoU!.perClass.find((c) => c.id === 1)!.value).toBeCloseTo(12 / 13, 12);
    // Objects: per frame one class-0 object of 4 pixels and one class-1 object of 4; s2 misses 1 of class 0's.
    expect(report.dataset.objectsBySize![0]).toEqual({ minArea: 1, maxArea: 16, objects: 6, meanRecall: (6 - 0.25) / 6, detected: 1 });
  });
});
