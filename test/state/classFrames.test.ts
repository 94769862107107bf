// Drill-down by class: the histogram of frame scores against numpy.histogram (bins over [0, 1], the
// last bin closed, as numpy documents), the class order against a plain sort, and per-frame class
// IoU / Boundary IoU from hand-made counts (IoU = TP / (TP + FP + FN), PASCAL VOC, Everingham et al.
// IJCV 2010; Boundary IoU = boundary intersection / boundary union, Cheng et al. CVPR 2021).
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { classFrameColumn, classFrameOrder, classWorstRegion, histogramOf } from '../../src/state/classFrames.ts';
import type { StoredFrame } from '../../src/state/scoresSlice.ts';
import { pythonRefRequire } from '../reference/pythonRef.ts';

/** A frame's stored result with a 2-class confusion (rows truth, columns prediction + invalid) and boundary sums. */
function frame(confusion: number[], biouInter: number[], biouUnion: number[], error: string | null = null): StoredFrame {
  const stats = { classIds: [3, 7], confusion: Uint32Array.from(confusion), biouInter: Float64Array.from(biouInter), biouUnion: Float64Array.from(biouUnion) };
  return {
    name: 'f', width: 4, height: 4, error, runs: [{ run: 'a', error: null, stats: stats as never, regions: {
      regions: [{ truthClass: 3, predictedClass: 3, bbox: [0, 0, 1, 1] }, { truthClass: 3, predictedClass: 7, bbox: [1, 1, 3, 3] }, { truthClass: 7, predictedClass: 3, bbox: [2, 2, 4, 4] }],
    } as never }],
  } as unknown as StoredFrame;
}

describe('class drill-down values', () => {
  it('histogram counts equal numpy.histogram over [0, 1] with 20 bins', () => {
    pythonRefRequire();
    let seed = 7;
    const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const values = Float64Array.from({ length: 500 }, (_, i) => (i % 50 === 0 ? NaN : i % 97 === 0 ? 1 : i % 89 === 0 ? 0 : rand()));
    const finite = [...values].filter(Number.isFinite);
    const r = spawnSync('python3', ['-c', 'import json,sys,numpy as np; v=json.load(sys.stdin); print(json.dumps(np.histogram(v, bins=20, range=(0,1))[0].tolist()))'], { input: JSON.stringify(finite), encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect(histogramOf(values, 20)).toEqual(JSON.parse(r.stdout));
  });

  it('per-frame IoU and Boundary IoU of a class from the counts, sorted worst first with undefined frames last', () => {
    // Class 3 (index 0): tp 6, fn 2 + 1 invalid, fp 1 → 6 / 10. Class 7: tp 4, fn 1, fp 2 → 4 / 7.
    const a = frame([6, 2, 1, 1, 4, 0], [3, 1], [4, 4]);
    // Class 3: tp 1, fn 0, fp 3 → 1 / 4.
    const b = frame([1, 0, 0, 3, 5, 0], [0, 2], [0, 2]);
    // Class 3 in neither map: undefined.
    const c = frame([0, 0, 0, 0, 9, 0], [0, 0], [0, 0]);
    const failed = frame([6, 2, 1, 1, 4, 0], [3, 1], [4, 4], 'unreadable');
    const results = [a, b, c, failed, undefined];
    const iou = classFrameColumn(results, 5, 'a', 3, 'iou', 3);
    expect([...iou].slice(0, 2)).toEqual([6 / 10, 1 / 4]);
    expect([...iou].slice(2).every(Number.isNaN)).toBe(true);
    expect(classFrameColumn(results, 5, 'a', 7, 'iou', 3)[0]).toBe(4 / 7);
    const biou = classFrameColumn(results, 5, 'a', 3, 'biou', 3);
    expect(biou[0]).toBe(3 / 4);
    expect(Number.isNaN(biou[1])).toBe(true);
    expect(classFrameOrder(iou, true)).toEqual([1, 0, 2, 3, 4]);
    expect(classFrameOrder(iou, false)).toEqual([0, 1, 2, 3, 4]);
    // The worst region of class 7 on frame a is the first listed region that involves it.
    expect(classWorstRegion(a, 'a', 7)).toEqual([1, 1, 3, 3]);
    expect(classWorstRegion(a, 'a', 9)).toBeNull();
  });
});
