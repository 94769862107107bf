import { describe, expect, it } from 'vitest';
import type { LabelMap } from '../../../src/core/labelMap.ts';
import { frameScore, type FrameStats } from '../../../src/core/metrics/frameScore.ts';
import { scoreScratchCreate } from '../../../src/core/metrics/scratch.ts';
import { DEFAULT_SCORE_SETTINGS, type ScoreSettings } from '../../../src/core/metrics/settings.ts';
import { randomPair, type RandomPairOptions } from '../../support/randomMaps.ts';
import { plainDistance2, plainEdges, plainFrameStats } from './plainScores.ts';

// The fast multi-label kernels must give exactly the counts of the plain per-class reference in
// plainScores.ts (written from src/docs/metrics.md: brute-force Euclidean distances, erosion repeated dil
// times with a 3×3 square as in Cheng et al. CVPR 2021, Boundary F per class as in Csurka et al.
// BMVC 2013). One scratch is shared by all cases so buffer reuse across sizes is exercised too.

const scratch = scoreScratchCreate();

function statsPlain(s: FrameStats) {
  return {
    width: s.width, height: s.height, classIds: s.classIds,
    confusion: Array.from(s.confusion), band: Array.from(s.band),
    biouInter: Array.from(s.biouInter), biouUnion: Array.from(s.biouUnion),
    bfPredMatched: Array.from(s.bfPredMatched), bfPredTotal: Array.from(s.bfPredTotal),
    bfTruthMatched: Array.from(s.bfTruthMatched), bfTruthTotal: Array.from(s.bfTruthTotal),
  };
}

function expectSame(truth: LabelMap, pred: LabelMap, classIds: number[], settings: ScoreSettings): FrameStats {
  const fast = frameScore(truth, pred, classIds, settings, scratch);
  if (!fast.ok) throw new Error(fast.error);
  expect(statsPlain(fast.value)).toEqual(statsPlain(plainFrameStats(truth, pred, classIds, settings)));
  return fast.value;
}

const SIZES: [number, number][] = [[1, 1], [1, 9], [9, 1], [2, 2], [3, 3], [17, 13], [31, 7], [40, 33], [64, 5], [5, 70]];

describe('frameScore against the plain per-class reference', () => {
  const cases: { name: string; o: RandomPairOptions; settings?: Partial<ScoreSettings> }[] = [
    { name: '8-bit, void blobs and strips, invalid ids', o: { classIds: [0, 1, 2, 3, 5], ignore: 255, invalidIds: [4, 200, 255], voids: true } },
    { name: '16-bit ids', o: { classIds: [3, 700, 40000, 65534], ignore: 1000, invalidIds: [65535, 9], voids: true, sixteenBit: true } },
    { name: 'two classes, many shapes', o: { classIds: [1, 2], ignore: 0, voids: true, shapes: 40 } },
    { name: 'wide dilation and tolerance', o: { classIds: [0, 1, 2], ignore: 255, voids: true }, settings: { biouDilationRatio: 0.2, bfTolerance: 0.3 } },
    { name: 'zero tolerance, dilation floor of 1', o: { classIds: [0, 1, 2], ignore: 255, voids: true }, settings: { biouDilationRatio: 0, bfTolerance: 0 } },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const settings = { ...DEFAULT_SCORE_SETTINGS, ...c.settings, ignore: c.o.ignore };
      let seed = 11;
      for (const [w, h] of SIZES) {
        for (let rep = 0; rep < 3; rep++) {
          const { truth, pred } = randomPair(w, h, seed++, c.o);
          expectSame(truth, pred, c.o.classIds, settings);
        }
      }
    });
  }

  it('a tolerance past the 64 px band cap (θ = 0.5 · diagonal ≈ 90 px) is still exact', () => {
    const settings = { ...DEFAULT_SCORE_SETTINGS, bfTolerance: 0.5 };
    for (let seed = 0; seed < 3; seed++) {
      const { truth, pred } = randomPair(150, 100, 900 + seed, { classIds: [0, 1, 2], ignore: 255, invalidIds: [7], voids: true, shapes: 5 });
      expectSame(truth, pred, [0, 1, 2], settings);
    }
    // A prediction edge ~187 px from the only truth edge, with θ ≈ 100.5 px: a miss, not a match.
    const w = 200, h = 20;
    const t: LabelMap = { width: w, height: h, ids: new Uint8Array(w * h) };
    const p: LabelMap = { width: w, height: h, ids: new Uint8Array(w * h) };
    for (let y = 0; y < h; y++) {
      for (let x = 0; x < 3; x++) t.ids[y * w + x] = 1;
      for (let x = 188; x < 193; x++) if (y > 5 && y < 12) p.ids[y * w + x] = 1;
    }
    const s = expectSame(t, p, [0, 1], settings);
    expect(s.bfPredMatched[0]).toBeLessThan(s.bfPredTotal[0]);
  });

  it('a one-label frame has an empty band: every pixel in bin 65', () => {
    const truth: LabelMap = { width: 23, height: 11, ids: new Uint8Array(23 * 11).fill(2) };
    const pred: LabelMap = { width: 23, height: 11, ids: new Uint8Array(23 * 11).fill(2) };
    pred.ids[5 * 23 + 4] = 1;
    const s = expectSame(truth, pred, [1, 2], DEFAULT_SCORE_SETTINGS);
    const k = 2, cells = k * (k + 1);
    let inBand = 0;
    for (let i = 0; i < 65 * cells; i++) inBand += s.band[i];
    expect(inBand).toBe(0);
    expect(s.band[65 * cells + 1 * (k + 1) + 1]).toBe(23 * 11 - 1);
  });

  it('truth ids outside the table are scored as void and do not crash', () => {
    const { truth, pred } = randomPair(19, 17, 5, { classIds: [0, 1, 2, 7], ignore: 255, voids: true });
    const r = frameScore(truth, pred, [0, 1, 2], DEFAULT_SCORE_SETTINGS, scratch);
    expect(r.ok).toBe(true);
    expectSame(truth, pred, [0, 1, 2], DEFAULT_SCORE_SETTINGS);
  });
});

describe('distances kept by frameScore', () => {
  it('equal the brute-force squared distance to the truth boundary, capped past 64 px', () => {
    // Long thin map so some pixels are farther than 64 px from the only boundary.
    const w = 150, h = 9;
    const truth: LabelMap = { width: w, height: h, ids: new Uint8Array(w * h).fill(1) };
    for (let y = 0; y < h; y++) for (let x = 0; x < 3; x++) truth.ids[y * w + x] = 0;
    truth.ids[4 * w + 70] = 255;
    const r = frameScore(truth, truth, [0, 1], DEFAULT_SCORE_SETTINGS, scratch);
    expect(r.ok).toBe(true);
    const want = plainDistance2(plainEdges(truth.ids, w, h), w, h);
    const got = Array.from(scratch.dist2.subarray(0, w * h));
    expect(got).toEqual(want.map((d) => (d <= 64 * 64 ? d : 64 * 64 + 1)));
  });
});

describe('frameScore input errors', () => {
  const map = (w: number, h: number): LabelMap => ({ width: w, height: h, ids: new Uint8Array(w * h) });
  it('names sizes that differ', () => {
    const r = frameScore(map(4, 3), map(3, 4), [0], DEFAULT_SCORE_SETTINGS);
    expect(r).toEqual({ ok: false, error: 'prediction is 3×4 but ground truth is 4×3' });
  });
  it('rejects a class list that holds the void id or is not ascending', () => {
    expect(frameScore(map(2, 2), map(2, 2), [0, 255], DEFAULT_SCORE_SETTINGS).ok).toBe(false);
    expect(frameScore(map(2, 2), map(2, 2), [2, 1], DEFAULT_SCORE_SETTINGS).ok).toBe(false);
    expect(frameScore(map(2, 2), map(2, 2), [], DEFAULT_SCORE_SETTINGS).ok).toBe(false);
  });
  it('refuses a class list whose band histogram would not fit in memory, saying how many classes fit', () => {
    const ids = Array.from({ length: 1200 }, (_, i) => i);
    const r = frameScore(map(2, 2), map(2, 2), ids, { ...DEFAULT_SCORE_SETTINGS, ignore: 65535 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(/1200 classes would need a \d+ MB band histogram per frame; at most 256 classes are scored/);
  });
  it('rejects unusable settings and id arrays of the wrong length', () => {
    expect(frameScore(map(2, 2), map(2, 2), [0], { ...DEFAULT_SCORE_SETTINGS, bfTolerance: NaN }).ok).toBe(false);
    const bad = { width: 2, height: 2, ids: new Uint8Array(3) };
    expect(frameScore(bad, map(2, 2), [0], DEFAULT_SCORE_SETTINGS).ok).toBe(false);
  });
});
