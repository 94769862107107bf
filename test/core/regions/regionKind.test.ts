import { describe, expect, it } from 'vitest';
import type { LabelMap } from '../../../src/core/labelMap.ts';
import { frameRegionsCompute } from '../../../src/core/regions/frameRegions.ts';
import { REGION_DEFAULTS } from '../../../src/core/regions/regionSettings.ts';
import type { ErrorRegion } from '../../../src/core/regions/regionTypes.ts';
import { paintRect } from '../../support/paint.ts';

// Kinds on constructed cases whose answer is plain from the picture (README "Error regions" gives
// the rules): a one-pixel shift of an edge, a deleted object, a hallucinated blob, an interior patch,
// a prediction over void. Band(3) as src/docs/metrics.md defines it.

const IDS = [0, 1, 2, 3];
const W = 80, H = 60;

function maps(): { truth: LabelMap; pred: LabelMap } {
  return { truth: { width: W, height: H, ids: new Uint8Array(W * H) }, pred: { width: W, height: H, ids: new Uint8Array(W * H) } };
}

function regions(truth: LabelMap, pred: LabelMap): ErrorRegion[] {
  const r = frameRegionsCompute({ truth, preds: [{ run: 'a', map: pred, confidence: null }], classIds: IDS, ignore: 255, photo: null }, { ...REGION_DEFAULTS });
  if (!r.ok) throw new Error(r.error);
  return r.value.runs[0]!.regions;
}

describe('region kinds on constructed cases', () => {
  it('an edge shifted by one pixel is boundary: a one-pixel-wide sliver, all inside Band(3)', () => {
    const { truth, pred } = maps();
    paintRect(truth, 40, 0, W, H, 1);
    paintRect(pred, 41, 0, W, H, 1);
    const r = regions(truth, pred);
    expect(r).toHaveLength(1);
    expect(r[0]).toMatchObject({ kind: 'boundary', truthClass: 1, predictedClass: 0, area: H, bbox: [40, 0, 41, H], bandShare: 1, thickness: 1 });
  });

  it('a deleted object is a missed object: the region is the whole truth segment', () => {
    const { truth, pred } = maps();
    paintRect(truth, 20, 20, 32, 36, 2);
    const r = regions(truth, pred);
    expect(r).toHaveLength(1);
    expect(r[0]).toMatchObject({ kind: 'missedObject', truthClass: 2, predictedClass: 0, area: 12 * 16 });
    expect(r[0].truthSegment.covered).toBe(1);
  });

  it('a hallucinated blob is a false object: the predicted segment is all region, none of it right', () => {
    const { truth, pred } = maps();
    paintRect(pred, 50, 10, 62, 22, 3);
    const r = regions(truth, pred);
    expect(r).toHaveLength(1);
    expect(r[0]).toMatchObject({ kind: 'falseObject', truthClass: 0, predictedClass: 3, area: 144 });
    expect(r[0].predSegment).toMatchObject({ covered: 1, truthAgrees: 0 });
    // The truth segment (the whole background) is barely touched.
    expect(r[0].truthSegment.covered).toBeCloseTo(144 / (W * H), 12);
  });

  it('an interior patch of a truth segment predicted as a class seen elsewhere is class confusion', () => {
    // Truth: class 2 on the left, class 1 on the right. Prediction: class 2 is right on the left and
    // reaches into the class-1 area through a thin bar to a 16×16 patch far from any label boundary.
    const { truth, pred } = maps();
    paintRect(truth, 0, 0, 30, H, 2);
    paintRect(truth, 30, 0, W, H, 1);
    paintRect(pred, 0, 0, 30, H, 2);
    paintRect(pred, 30, 0, W, H, 1);
    paintRect(pred, 30, 29, 46, 31, 2);
    paintRect(pred, 46, 22, 62, 38, 2);
    const r = regions(truth, pred);
    expect(r).toHaveLength(1);
    expect(r[0]).toMatchObject({ kind: 'classConfusion', truthClass: 1, predictedClass: 2, area: 16 * 2 + 256 });
    expect(r[0].bandShare).toBeLessThan(0.5);
    expect(r[0].truthSegment.covered).toBeLessThan(0.5);
    expect(r[0].predSegment.covered).toBeLessThan(0.5);
    expect(r[0].thickness).toBe(8);
  });

  it('a prediction over void is no region at all, only void spill', () => {
    const { truth, pred } = maps();
    paintRect(truth, 10, 10, 30, 30, 255);
    paintRect(pred, 10, 10, 30, 30, 1);
    const res = frameRegionsCompute({ truth, preds: [{ run: 'a', map: pred, confidence: null }], classIds: IDS, ignore: 255, photo: null }, { ...REGION_DEFAULTS });
    expect(res.ok && res.value.runs[0]!.regions).toEqual([]);
    expect(res.ok && res.value.runs[0]!.voidSpill.pixels).toBe(400);
    expect(res.ok && res.value.runs[0]!.counts.all.pixels).toBe(0);
  });

  it('a prediction of no class (an id outside the table) over an object is its own predicted value', () => {
    const { truth, pred } = maps();
    paintRect(truth, 20, 20, 30, 30, 2);
    paintRect(pred, 20, 20, 25, 30, 200);
    paintRect(pred, 25, 20, 30, 30, 255);
    const r = regions(truth, pred);
    // Both ids are "not a class": one region, not two.
    expect(r.map((x) => [x.predictedClass, x.area, x.kind])).toEqual([[null, 100, 'missedObject']]);
  });
});
