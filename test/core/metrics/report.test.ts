import { describe, expect, it } from 'vitest';
import type { LabelMap } from '../../../src/core/labelMap.ts';
import { datasetTotalsAdd, datasetTotalsCreate, datasetTotalsMerge } from '../../../src/core/metrics/datasetTotals.ts';
import { frameScore, type FrameStats } from '../../../src/core/metrics/frameScore.ts';
import { frameSummary } from '../../../src/core/metrics/frameSummary.ts';
import { bandConfusionAt, bandConfusions, iouFamily } from '../../../src/core/metrics/iouFamily.ts';
import { reportFrameLine, scoreReport, scoreReportOfFrames } from '../../../src/core/metrics/report.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../../src/core/metrics/settings.ts';
import { randomPair } from '../../support/randomMaps.ts';

// The report must have exactly the keys of src/docs/metrics.md "What the scorer prints", dataset scores from
// the confusion summed over frames (PASCAL VOC convention), frame-mean IoU and Boundary F as means
// over frames, failed frames left out of every sum, and null (never NaN) where a score is undefined.

const IDS = [0, 1, 2, 4];
const CLASSES = IDS.map((id) => ({ id, name: `c${id}` }));

function stats(seed: number, w = 21, h = 17): FrameStats {
  const { truth, pred } = randomPair(w, h, seed, { classIds: [0, 1, 2], ignore: 255, invalidIds: [9], voids: true });
  const r = frameScore(truth, pred, IDS, DEFAULT_SCORE_SETTINGS);
  if (!r.ok) throw new Error(r.error);
  return r.value;
}

describe('scoreReport', () => {
  const frames = [
    { name: 'a', stats: stats(1), error: null },
    { name: 'b', stats: null, error: 'truth/b.png: not a PNG file' },
    { name: 'c', stats: stats(2, 30, 8), error: null },
  ];
  const report = scoreReportOfFrames(CLASSES, IDS, DEFAULT_SCORE_SETTINGS, frames);

  it('has exactly the src/docs/metrics.md keys, in order', () => {
    expect(Object.keys(report)).toEqual(['classes', 'settings', 'dataset', 'frames']);
    expect(Object.keys(report.settings)).toEqual(['ignore', 'biouDilationRatio', 'bfTolerance']);
    expect(Object.keys(report.dataset)).toEqual(['pixelAccuracy', 'meanAccuracy', 'meanIoU', 'fwIoU', 'frameMeanIoU', 'perClass', 'band', 'boundaryIoU', 'boundaryF']);
    expect(Object.keys(report.dataset.perClass[0])).toEqual(['id', 'iou', 'tp', 'fp', 'fn']);
    expect(Object.keys(report.dataset.band[0])).toEqual(['width', 'meanIoU', 'pixelAccuracy']);
    expect(Object.keys(report.dataset.boundaryIoU)).toEqual(['mean', 'perClass']);
    expect(Object.keys(report.dataset.boundaryF)).toEqual(['mean']);
    expect(Object.keys(report.frames[0])).toEqual(['name', 'meanIoU', 'pixelAccuracy', 'boundaryIoU', 'boundaryF', 'error']);
    expect(report.dataset.band.map((b) => b.width)).toEqual(Array.from({ length: 65 }, (_, w) => w));
  });

  it('sums the scored frames only; a failed frame has null scores and its message', () => {
    const conf = new Float64Array(frames[0].stats!.confusion.length);
    for (const f of [frames[0], frames[2]]) f.stats!.confusion.forEach((v, i) => (conf[i] += v));
    const fam = iouFamily(conf, IDS.length);
    expect(report.dataset.meanIoU).toBe(fam.meanIoU);
    expect(report.dataset.perClass.map((p) => p.tp)).toEqual(fam.perClass.map((p) => p.tp));
    const perFrame = [frames[0], frames[2]].map((f) => iouFamily(f.stats!.confusion, IDS.length).meanIoU!);
    expect(report.dataset.frameMeanIoU).toBeCloseTo((perFrame[0] + perFrame[1]) / 2, 15);
    expect(report.frames[1]).toEqual({ name: 'b', meanIoU: null, pixelAccuracy: null, boundaryIoU: null, boundaryF: null, error: 'truth/b.png: not a PNG file' });
    expect(report.frames[0].error).toBeNull();
    const bf = [frames[0], frames[2]].map((f) => reportFrameLine(f.name, f.stats).boundaryF!);
    expect(report.dataset.boundaryF.mean).toBeCloseTo((bf[0] + bf[1]) / 2, 15);
  });

  it('writes null, never NaN, for a class that never occurs and for an empty dataset', () => {
    const c4 = report.dataset.perClass.find((p) => p.id === 4)!;
    expect(c4).toEqual({ id: 4, iou: null, tp: 0, fp: 0, fn: 0 });
    expect(report.dataset.boundaryIoU.perClass.find((p) => p.id === 4)!.value).toBeNull();
    const empty = scoreReport(CLASSES, DEFAULT_SCORE_SETTINGS, datasetTotalsCreate(IDS), []);
    expect(JSON.stringify(empty)).not.toContain('NaN');
    expect(empty.dataset.meanIoU).toBeNull();
    expect(empty.dataset.band[64].pixelAccuracy).toBeNull();
    expect(empty.dataset.boundaryF.mean).toBeNull();
  });
});

describe('dataset totals', () => {
  it('merge by addition: shards summed apart equal one running total', () => {
    const all = datasetTotalsCreate(IDS), left = datasetTotalsCreate(IDS), right = datasetTotalsCreate(IDS);
    const s = [1, 2, 3, 4].map((seed) => stats(seed));
    s.forEach((x) => datasetTotalsAdd(all, x));
    s.slice(0, 2).forEach((x) => datasetTotalsAdd(left, x));
    s.slice(2).forEach((x) => datasetTotalsAdd(right, x));
    const merged = datasetTotalsMerge(left, right);
    expect(merged.ok).toBe(true);
    // Counts are integers and add exactly; the two per-frame means are float sums (order may round).
    const { frameBFSum, frameMeanIoUSum, ...counts } = left;
    const { frameBFSum: bfAll, frameMeanIoUSum: miouAll, ...countsAll } = all;
    expect(counts).toEqual(countsAll);
    expect(frameBFSum).toBeCloseTo(bfAll, 12);
    expect(frameMeanIoUSum).toBeCloseTo(miouAll, 12);
    expect(datasetTotalsMerge(left, datasetTotalsCreate([0, 1])).ok).toBe(false);
  });

  it('keeps sums past 2^32 exactly (Float64 totals)', () => {
    const t = datasetTotalsCreate([0]);
    const big: FrameStats = { ...stats(1), classIds: [0], confusion: new Uint32Array([0xffffffff, 0]), band: new Uint32Array(66 * 2), biouInter: new Uint32Array(1), biouUnion: new Uint32Array(1), bfPredMatched: new Uint32Array(1), bfPredTotal: new Uint32Array(1), bfTruthMatched: new Uint32Array(1), bfTruthTotal: new Uint32Array(1) };
    datasetTotalsAdd(t, big);
    datasetTotalsAdd(t, big);
    expect(t.confusion[0]).toBe(2 * 0xffffffff);
  });

  it('maps a frame scored on fewer classes into the totals by id', () => {
    const truth: LabelMap = { width: 3, height: 1, ids: new Uint8Array([0, 2, 2]) };
    const pred: LabelMap = { width: 3, height: 1, ids: new Uint8Array([0, 2, 0]) };
    const r = frameScore(truth, pred, [0, 2], DEFAULT_SCORE_SETTINGS);
    if (!r.ok) throw new Error(r.error);
    const t = datasetTotalsCreate(IDS);
    datasetTotalsAdd(t, r.value);
    const k1 = IDS.length + 1;
    expect(t.confusion[0 * k1 + 0]).toBe(1);
    expect(t.confusion[2 * k1 + 2]).toBe(1); // id 2 is index 2 of IDS
    expect(t.confusion[2 * k1 + 0]).toBe(1);
  });
});

describe('band helpers', () => {
  it('give at width w the prefix sum of bins 0..w, the same as the full curve, and 64 = beyond the cap', () => {
    const s = stats(5, 40, 33);
    const k = IDS.length;
    const curve = bandConfusions(s.band, k);
    for (const w of [0, 1, 7, 64]) expect(Array.from(bandConfusionAt(s.band, k, w))).toEqual(Array.from(curve[w]));
    const sum = (m: ArrayLike<number>) => Array.from(m).reduce((a, b) => a + b, 0);
    expect(sum(curve[64]) + sum(s.band.subarray(65 * k * (k + 1)))).toBe(sum(s.confusion));
    expect(frameSummary(s, 7).bandIoU).toBe(iouFamily(curve[7], k).meanIoU);
  });
});
