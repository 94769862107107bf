import { describe, expect, it } from 'vitest';
import type { LabelMap } from '../../../src/core/labelMap.ts';
import { codeTableBuild } from '../../../src/core/metrics/codes.ts';
import { componentStatsCreate, componentStatsFill } from '../../../src/core/regions/componentStats.ts';
import { frameRegionsCompute } from '../../../src/core/regions/frameRegions.ts';
import { regionLabelMap, segmentLabelMap } from '../../../src/core/regions/regionLabels.ts';
import { thicknessByRuns, thicknessByWindow, thicknessWorkCreate } from '../../../src/core/regions/regionThickness.ts';
import { RUN_KEEP, runTableCreate, runsLabel } from '../../../src/core/regions/runLabel.ts';
import { regionSettingsCheck, type RegionSettings } from '../../../src/core/regions/regionSettings.ts';
import type { ErrorRegion, RunRegions } from '../../../src/core/regions/regionTypes.ts';
import { randomPair } from '../../support/randomMaps.ts';
import { frameScore } from '../../../src/core/metrics/frameScore.ts';
import { scoreScratchCreate } from '../../../src/core/metrics/scratch.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../../src/core/metrics/settings.ts';
import { refBandShare, refBoundary, refRegions, refSegments, refThickness } from './regionsReference.ts';

// Region extraction against the plain reference in regionsReference.ts (breadth-first flood fill,
// brute-force distances): 8-connected components as in Rosenfeld & Pfaltz, "Sequential Operations in
// Digital Picture Processing", JACM 13(4), 1966 (the two-pass labelling the runs implement); Band(w)
// as src/docs/metrics.md defines it.

const IDS = [0, 1, 2, 3, 5];
function settingsOf(partial: Partial<RegionSettings>): RegionSettings {
  const r = regionSettingsCheck(partial);
  if (!r.ok) throw new Error(r.error);
  return r.value;
}
const ALL = settingsOf({ minArea: 0, listMax: 1e9 });

function regionsOf(truth: LabelMap, pred: LabelMap, settings = ALL, classIds = IDS, truthDist2: Uint16Array | null = null): RunRegions {
  const r = frameRegionsCompute({ truth, preds: [{ run: 'a', map: pred, confidence: null }], classIds, ignore: 255, photo: null, truthDist2 }, settings);
  if (!r.ok) throw new Error(r.error);
  return r.value.runs[0]!;
}

describe('frameRegionsCompute against a brute-force flood fill (random maps)', () => {
  const sizes: [number, number][] = [[1, 1], [2, 3], [33, 17], [40, 30], [7, 45], [64, 9]];
  sizes.forEach(([w, h], s) => {
    for (const seed of [1, 2, 3]) {
      it(`${w}×${h} seed ${seed}: every component, its measurements and segments`, () => {
        const { truth, pred } = randomPair(w, h, 40 * s + seed, { classIds: IDS, ignore: 255, invalidIds: [4, 200, 255], voids: true, shapes: 8 + s * 2 });
        const got = regionsOf(truth, pred);
        const ref = refRegions(truth, pred, IDS, 255);
        // Band membership read from the scores' truth distances (as frameJobScore passes them) gives the same regions, at several band widths.
        const scratch = scoreScratchCreate();
        if (!frameScore(truth, pred, IDS, { ...DEFAULT_SCORE_SETTINGS, ignore: 255 }, scratch).ok) throw new Error('frameScore failed');
        expect(regionsOf(truth, pred, ALL, IDS, scratch.dist2)).toEqual(got);
        for (const bandWidth of [0, 7]) {
          const other = settingsOf({ minArea: 0, listMax: 1e9, bandWidth });
          expect(regionsOf(truth, pred, other, IDS, scratch.dist2)).toEqual(regionsOf(truth, pred, other));
        }
        const boundary = refBoundary(truth);
        const truthSegs = refSegments(truth, null);
        const predSegs = refSegments(pred, IDS);
        const segOf = (segs: number[][], i: number) => segs.findIndex((seg) => seg.includes(i));
        const errors = ref.map((c, id) => ({ c, id })).filter(({ c }) => !c.isVoidSpill);
        expect(got.regions.map((r) => r.id).sort((a, b) => a - b)).toEqual(errors.map((e) => e.id));
        const byId = new Map<number, ErrorRegion>(got.regions.map((r) => [r.id, r]));
        for (const { c, id } of errors) {
          const r = byId.get(id)!;
          expect([r.truthClass, r.predictedClass, r.area]).toEqual([c.truthClass, c.predictedClass, c.pixels.length]);
          expect(r.bbox).toEqual(c.bbox);
          expect(r.centroid[0]).toBeCloseTo(c.centroid[0], 9);
          expect(r.centroid[1]).toBeCloseTo(c.centroid[1], 9);
          expect(r.bandShare).toBeCloseTo(refBandShare(c.pixels, boundary, w, 3), 12);
          expect(r.thickness).toBeCloseTo(refThickness(c.pixels, w, h), 12);
          const ts = segOf(truthSegs, c.first), ps = segOf(predSegs, c.first);
          expect(r.truthSegment).toEqual({ id: ts, area: truthSegs[ts].length, covered: c.pixels.length / truthSegs[ts].length });
          const agrees = predSegs[ps].filter((i) => IDS.includes(pred.ids[i]) && truth.ids[i] === pred.ids[i]).length;
          expect(r.predSegment).toEqual({ id: ps, area: predSegs[ps].length, covered: c.pixels.length / predSegs[ps].length, truthAgrees: agrees / predSegs[ps].length });
        }
        const wrong = Array.from(truth.ids).filter((g, i) => IDS.includes(g) && pred.ids[i] !== g).length;
        expect(got.counts.all.pixels).toBe(wrong);
        expect(got.counts.all.regions).toBe(errors.length);
        const spill = Array.from(truth.ids).filter((g, i) => g === 255 && IDS.includes(pred.ids[i])).length;
        expect(got.voidSpill.pixels).toBe(spill);
        expect(got.voidSpill.regions.map((v) => v.area).sort((a, b) => a - b)).toEqual(ref.filter((c) => c.isVoidSpill).map((c) => c.pixels.length).sort((a, b) => a - b));
        const pairPixels = got.counts.byPair.reduce((a, p) => a + p.pixels, 0);
        expect(pairPixels).toBe(wrong);
        // Per-pixel maps for painting carry the same ids as the lists.
        const labels = regionLabelMap(truth, pred, IDS, 255);
        const expectedLabels = new Int32Array(w * h).fill(-1);
        ref.forEach((c, id) => c.pixels.forEach((i) => (expectedLabels[i] = id)));
        expect(labels.ok && Array.from(labels.value)).toEqual(Array.from(expectedLabels));
        const segIds = (segs: number[][]) => {
          const out = new Int32Array(w * h);
          segs.forEach((seg, id) => seg.forEach((i) => (out[i] = id)));
          return Array.from(out);
        };
        expect(Array.from(segmentLabelMap(truth, IDS, 255, 'truth'))).toEqual(segIds(truthSegs));
        expect(Array.from(segmentLabelMap(pred, IDS, 255, 'prediction'))).toEqual(segIds(predSegs));
      });
    }
  });
});

describe('frameRegionsCompute: hand-checked cases', () => {
  it('two diagonal pixels of one pair are one region (8-connected); another pair beside them is its own', () => {
    // truth all 0; prediction: 1 at (1,1) and (2,2) — one diagonal region; 2 at (3,2) — a separate pair.
    const truth: LabelMap = { width: 5, height: 4, ids: new Uint8Array(20) };
    const pred: LabelMap = { width: 5, height: 4, ids: new Uint8Array(20) };
    pred.ids[1 * 5 + 1] = 1;
    pred.ids[2 * 5 + 2] = 1;
    pred.ids[2 * 5 + 3] = 2;
    const got = regionsOf(truth, pred);
    expect(got.regions.map((r) => [r.id, r.truthClass, r.predictedClass, r.area, r.bbox])).toEqual([
      [0, 0, 1, 2, [1, 1, 3, 3]],
      [1, 0, 2, 1, [3, 2, 4, 3]],
    ]);
    // Centroid of pixel centres (1.5, 1.5) and (2.5, 2.5).
    expect(got.regions[0].centroid).toEqual([2, 2]);
    // Both lie in the one truth segment (id 0, 20 pixels): 2/20 and 1/20 of it.
    expect(got.regions[0].truthSegment).toEqual({ id: 0, area: 20, covered: 0.1 });
    // The truth has no boundary (one label): Band(3) is empty.
    expect(got.regions[0].bandShare).toBe(0);
  });

  it('a 5×5 square is 3 thick, a one-pixel line 1, a 2-wide bar 1 (distance to the nearest outside pixel centre)', () => {
    const truth: LabelMap = { width: 12, height: 9, ids: new Uint8Array(108) };
    const pred: LabelMap = { width: 12, height: 9, ids: new Uint8Array(108) };
    for (let y = 1; y <= 5; y++) for (let x = 1; x <= 5; x++) pred.ids[y * 12 + x] = 1;
    for (let y = 0; y < 9; y++) pred.ids[y * 12 + 8] = 2;
    for (let y = 2; y < 8; y++) pred.ids.fill(3, y * 12 + 10, y * 12 + 12);
    const got = regionsOf(truth, pred);
    const byClass = Object.fromEntries(got.regions.map((r) => [r.predictedClass, r.thickness]));
    expect(byClass).toEqual({ 1: 3, 2: 1, 3: 1 });
  });

  it('prediction over void is no region: it is counted as void spill only', () => {
    const truth: LabelMap = { width: 10, height: 10, ids: new Uint8Array(100) };
    const pred: LabelMap = { width: 10, height: 10, ids: new Uint8Array(100) };
    for (let y = 2; y < 8; y++) truth.ids.fill(255, y * 10 + 2, y * 10 + 8);
    for (let y = 2; y < 8; y++) pred.ids.fill(1, y * 10 + 2, y * 10 + 8);
    const got = regionsOf(truth, pred);
    expect(got.regions).toEqual([]);
    expect(got.counts.all).toEqual({ regions: 0, pixels: 0 });
    expect(got.voidSpill).toEqual({ pixels: 36, regions: [{ predictedClass: 1, area: 36, bbox: [2, 2, 8, 8] }] });
  });

  it('regions under minArea are counted as tiny, not listed; listMax keeps the worst', () => {
    const truth: LabelMap = { width: 30, height: 10, ids: new Uint8Array(300) };
    const pred: LabelMap = { width: 30, height: 10, ids: new Uint8Array(300) };
    pred.ids[0] = 1; // 1 pixel
    for (let y = 2; y < 8; y++) pred.ids.fill(2, y * 30 + 5, y * 30 + 11); // 36 pixels
    for (let y = 2; y < 6; y++) pred.ids.fill(3, y * 30 + 20, y * 30 + 25); // 20 pixels
    const got = regionsOf(truth, pred, settingsOf({ minArea: 5, listMax: 1 }));
    expect(got.counts.tiny).toEqual({ regions: 1, pixels: 1 });
    expect(got.regions.map((r) => r.area)).toEqual([36]);
    expect(got.counts.unlisted).toBe(1);
    expect(got.counts.all).toEqual({ regions: 3, pixels: 57 });
  });
});

describe('thickness: both ways of computing it against brute force', () => {
  for (const seed of [5, 6, 7, 8]) {
    it(`random maps, seed ${seed}: the bbox distance transform and the run-wise minimum agree with brute force on every component`, () => {
      const w = 37, h = 23;
      const { truth, pred } = randomPair(w, h, 900 + seed, { classIds: IDS, ignore: 255, invalidIds: [4], voids: true, shapes: 16 });
      const table = new Uint16Array(65536);
      codeTableBuild(IDS, 255, table);
      const tc = Uint16Array.from(truth.ids, (v) => table[v]);
      const pc = Uint16Array.from(pred.ids, (v) => Math.min(table[v], IDS.length));
      const t = runTableCreate(), s = componentStatsCreate(), work = thicknessWorkCreate();
      runsLabel(tc, pc, null, w, h, IDS.length, RUN_KEEP.pairs, t);
      componentStatsFill(t, s);
      const ref = refRegions(truth, pred, IDS, 255);
      expect(s.count).toBe(ref.length);
      for (let c = 0; c < s.count; c++) {
        const expected = refThickness(ref[c].pixels, w, h) ** 2;
        expect(thicknessByWindow(t, s, c, work)).toBeCloseTo(expected, 9);
        expect(thicknessByRuns(t, s, c, work)).toBeCloseTo(expected, 9);
      }
    });
  }
});
