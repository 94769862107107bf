import { describe, expect, it } from 'vitest';
import type { LabelMap } from '../../../src/core/labelMap.ts';
import { frameScore, type FrameStats } from '../../../src/core/metrics/frameScore.ts';
import { boundaryFOfClass, frameBoundaryF, frameBoundaryIoU } from '../../../src/core/metrics/frameSummary.ts';
import { bandScoresAt, iouFamily } from '../../../src/core/metrics/iouFamily.ts';
import { DEFAULT_SCORE_SETTINGS, type ScoreSettings } from '../../../src/core/metrics/settings.ts';

// Tiny maps whose scores are worked out by hand below, from the definitions in src/docs/metrics.md and the
// papers it cites. Rows are written top to bottom; (x, y) is column, row.

function map(rows: number[][]): LabelMap {
  return { width: rows[0].length, height: rows.length, ids: Uint16Array.from(rows.flat()) };
}

function score(truth: LabelMap, pred: LabelMap, ids: number[], settings: Partial<ScoreSettings> = {}): FrameStats {
  const r = frameScore(truth, pred, ids, { ...DEFAULT_SCORE_SETTINGS, ...settings });
  if (!r.ok) throw new Error(r.error);
  return r.value;
}

describe('IoU family and band on a 4×2 frame', () => {
  // truth        pred          (255 = void, 9 = an id outside the table)
  // 0 0 1 1      0 1 1 1
  // 0 0 1 255    0 0 9 1
  const truth = map([[0, 0, 1, 1], [0, 0, 1, 255]]);
  const pred = map([[0, 1, 1, 1], [0, 0, 9, 1]]);
  const s = score(truth, pred, [0, 1]);

  it('confusion: void truth left out, the invalid prediction in the extra column (PASCAL VOC; src/docs/metrics.md)', () => {
    // truth 0 (4 px) predicted 0,1,0,0; truth 1 (3 px) predicted 1,1,9; the void pixel is dropped.
    expect(Array.from(s.confusion)).toEqual([3, 1, 0, 0, 2, 1]);
  });

  it('per-class IoU, means and accuracies (Long, Shelhamer, Darrell, FCN, CVPR 2015 §5)', () => {
    const f = iouFamily(s.confusion, 2);
    // IoU_0 = 3 / (3 + 0 + 1) = 3/4; IoU_1 = 2 / (2 + 1 + 1) = 1/2 (the invalid pixel is a false negative).
    expect(f.perClass.map((p) => [p.tp, p.fp, p.fn])).toEqual([[3, 0, 1], [2, 1, 1]]);
    expect(f.perClass[0].iou).toBe(3 / 4);
    expect(f.perClass[1].iou).toBe(1 / 2);
    expect(f.meanIoU).toBe(5 / 8);
    expect(f.pixelAccuracy).toBe(5 / 7); // Σ n_ii / Σ t_i
    expect(f.meanAccuracy).toBeCloseTo((3 / 4 + 2 / 3) / 2, 15); // mean of n_ii / t_i
    expect(f.fwIoU).toBeCloseTo((4 * (3 / 4) + 3 * (1 / 2)) / 7, 15); // Σ t_i IoU_i / Σ t_i
  });

  it('band: d = 0 on the truth boundary (void counts as a value), 1 for the two left pixels (Kohli et al. 2009 trimap)', () => {
    // Boundary pixels: (1,0) (2,0) (3,0, beside the void) (1,1) (2,1) (3,1). (0,0) and (0,1) are at d = 1.
    // Band(0) holds the 5 valid boundary pixels: t0→p1, t1→p1, t1→p1, t0→p0, t1→invalid.
    const b0 = bandScoresAt(s.band, 2, 0);
    expect(b0.perClass.map((p) => [p.tp, p.fp, p.fn])).toEqual([[1, 0, 1], [2, 1, 1]]);
    expect(b0.meanIoU).toBe(1 / 2);
    expect(b0.pixelAccuracy).toBe(3 / 5);
    // Band(1) already holds every valid pixel: the same numbers as the whole frame.
    expect(bandScoresAt(s.band, 2, 1).meanIoU).toBe(5 / 8);
    expect(bandScoresAt(s.band, 2, 64).pixelAccuracy).toBe(5 / 7);
  });
});

describe('Boundary IoU and Boundary F on a 5×5 frame', () => {
  // truth: class 1 is the 3×3 square x,y ∈ 1..3; pred: the same square moved right by one (x ∈ 2..4).
  const sq = (x0: number) => Array.from({ length: 5 }, (_, y) => Array.from({ length: 5 }, (_, x) => (x >= x0 && x <= x0 + 2 && y >= 1 && y <= 3 ? 1 : 0)));
  const truth = map(sq(1));
  const pred = map(sq(2));

  it('Boundary IoU (Cheng et al., CVPR 2021): dil = max(1, round(0.02·√50)) = 1', () => {
    const s = score(truth, pred, [0, 1]);
    // Class 1: eroding each square once leaves its centre, so G_d and P_d are 8-pixel rings sharing
    // (2,1) (3,1) (2,3) (3,3): 4 / (8 + 8 − 4). Class 0 is the border ring of 16 pixels in the truth and
    // 16 pixels in the prediction, all touching the outside or the square, so all band; they share
    // 16 − 3 pixels ((4,1..3) are class 1 in the prediction): 13 / (16 + 16 − 13).
    expect(Array.from(s.biouInter)).toEqual([13, 4]);
    expect(Array.from(s.biouUnion)).toEqual([19, 12]);
    expect(frameBoundaryIoU(s)).toBeCloseTo((13 / 19 + 1 / 3) / 2, 15);
  });

  it('Boundary IoU removes void-truth pixels after the bands are made', () => {
    const t = map(sq(1));
    t.ids[0] = 255; // (0,0) void
    const s = score(t, pred, [0, 1]);
    // Class 0: G_d is the ring without (0,0) (15), P_d loses (0,0) too (15); shared 13 − 1 = 12.
    expect(Array.from(s.biouInter)).toEqual([12, 4]);
    expect(Array.from(s.biouUnion)).toEqual([18, 12]);
  });

  it('Boundary F (Csurka et al., BMVC 2013) with θ = 0.0075·√50 ≈ 0.05 px: only coinciding pixels match', () => {
    const s = score(truth, pred, [0, 1]);
    // ∂G_1: the 8-pixel ring. ∂P_1: its ring without (4,2), whose only outside neighbour is the image
    // border (no boundary): 7. Shared: 4. ∂G_0: the 12 non-corner border pixels; ∂P_0: (1,1..3),
    // (2..4,0), (2..4,4) = 9; shared (2,0) (3,0) (2,4) (3,4) = 4.
    expect(Array.from(s.bfTruthTotal)).toEqual([12, 8]);
    expect(Array.from(s.bfPredTotal)).toEqual([9, 7]);
    expect(Array.from(s.bfPredMatched)).toEqual([4, 4]);
    expect(Array.from(s.bfTruthMatched)).toEqual([4, 4]);
    // F_1 = 2·(4/7)(1/2)/(4/7 + 1/2) = 8/15; F_0 = 2·(4/9)(1/3)/(4/9 + 1/3) = 8/21.
    expect(boundaryFOfClass(s, 1)).toBeCloseTo(8 / 15, 15);
    expect(boundaryFOfClass(s, 0)).toBeCloseTo(8 / 21, 15);
    expect(frameBoundaryF(s)).toBeCloseTo((8 / 15 + 8 / 21) / 2, 15);
  });

  it('Boundary F with θ = 0.15·√50 ≈ 1.06 px: neighbours one pixel away match, diagonals do not', () => {
    const s = score(truth, pred, [0, 1], { bfTolerance: 0.15 });
    // Class 1: every ∂P_1 pixel is within 1 of ∂G_1 (7/7) and every ∂G_1 pixel within 1 of ∂P_1 (8/8).
    // Class 0: all 9 ∂P_0 pixels are within 1 of ∂G_0; of ∂G_0 only (4,2) is not (its nearest ∂P_0
    // pixels (4,0) and (4,4) are 2 away): 11/12. F_0 = 2·1·(11/12)/(1 + 11/12) = 22/23.
    expect(Array.from(s.bfPredMatched)).toEqual([9, 7]);
    expect(Array.from(s.bfTruthMatched)).toEqual([11, 8]);
    expect(boundaryFOfClass(s, 1)).toBe(1);
    expect(boundaryFOfClass(s, 0)).toBeCloseTo(22 / 23, 15);
  });

  it('Boundary F is 0 when only one side has boundary pixels and undefined when neither has', () => {
    // Class 2 appears only in the prediction (one pixel): ∂P_2 = 1, ∂G_2 = 0 → F = 0 (src/docs/metrics.md).
    const p = map(sq(2));
    p.ids[12] = 2;
    const s = score(truth, p, [0, 1, 2, 3]);
    expect(boundaryFOfClass(s, 2)).toBe(0);
    expect(boundaryFOfClass(s, 3)).toBeNull(); // class 3 is nowhere
    expect(s.biouUnion[3]).toBe(0);
  });
});
