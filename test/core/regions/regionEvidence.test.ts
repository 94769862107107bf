import { describe, expect, it } from 'vitest';
import type { LabelMap } from '../../../src/core/labelMap.ts';
import type { ConfidenceMap } from '../../../src/core/regions/confidenceMap.ts';
import { frameRegionsCompute } from '../../../src/core/regions/frameRegions.ts';
import { GRADIENT_UNKNOWN, gradientNear, photoLuma } from '../../../src/core/regions/photoEdges.ts';
import { REGION_DEFAULTS, type RegionSettings } from '../../../src/core/regions/regionSettings.ts';
import { CONFIDENCE_BINS, GRID_NOT_A_CLASS } from '../../../src/core/regions/regionTypes.ts';
import { paintRect, rngCreate, rngInt } from '../../support/paint.ts';
import { randomPair } from '../../support/randomMaps.ts';
import { refRegions } from './regionsReference.ts';

// The evidence a region carries, each against a plain per-pixel computation written out here: the
// grid's most common value per cell, run agreement, confidence histograms and per-class sums, and
// photo edges (the Sobel operator: Sobel & Feldman 1968, as given in Gonzalez & Woods, "Digital Image
// Processing", 3rd ed., §10.2 (section from memory); luma weights of ITU-R BT.601).

const IDS = [0, 1, 2, 3, 5];
const ALL: RegionSettings = { ...REGION_DEFAULTS, minArea: 0, listMax: 1e9, gridColumns: 7 };

/** Plain Sobel magnitude / 8 at (x, y) with replicate padding, rounded half up. */
function sobelRef(luma: Uint8Array, w: number, h: number, x: number, y: number): number {
  const at = (xx: number, yy: number) => luma[Math.min(h - 1, Math.max(0, yy)) * w + Math.min(w - 1, Math.max(0, xx))];
  let gx = 0, gy = 0;
  const kx = [[-1, 0, 1], [-2, 0, 2], [-1, 0, 1]];
  for (let j = -1; j <= 1; j++) for (let i = -1; i <= 1; i++) {
    gx += kx[j + 1][i + 1] * at(x + i, y + j);
    gy += kx[i + 1][j + 1] * at(x + i, y + j);
  }
  return Math.floor(Math.sqrt(gx * gx + gy * gy) / 8 + 0.5);
}

describe('region evidence against plain per-pixel versions', () => {
  for (const seed of [1, 2, 3]) {
    it(`random maps, seed ${seed}: grids, agreement, confidence histograms and sums`, () => {
      const w = 45, h = 31;
      const a = randomPair(w, h, 300 + seed, { classIds: IDS, ignore: 255, invalidIds: [4, 200], voids: true, shapes: 14 });
      const b = randomPair(w, h, 400 + seed, { classIds: IDS, ignore: 255, invalidIds: [7], voids: true, shapes: 14 });
      const rng = rngCreate(seed);
      const conf: ConfidenceMap = { width: w, height: h, values: Uint16Array.from({ length: w * h }, () => rngInt(rng, 0, 65535)), max: 65535 };
      const r = frameRegionsCompute({
        truth: a.truth, preds: [{ run: 'a', map: a.pred, confidence: conf }, { run: 'b', map: b.pred, confidence: null }], classIds: IDS, ignore: 255, photo: null,
      }, ALL);
      if (!r.ok) throw new Error(r.error);
      const { grid, runs } = r.value;

      // Grid: most common value per cell, ties to the smaller code (classes ascending, then void, then other).
      const cell = Math.ceil(w / 7);
      expect([grid.columns, grid.rows, grid.cell]).toEqual([Math.ceil(w / cell), Math.ceil(h / cell), cell]);
      const codeOf = (id: number, isTruth: boolean) => (IDS.includes(id) ? IDS.indexOf(id) : isTruth && id !== 255 ? IDS.length + 1 : IDS.length);
      const valueOf = (code: number, isTruth: boolean) => (code < IDS.length ? IDS[code] : code === IDS.length && isTruth ? 255 : GRID_NOT_A_CLASS);
      const modeGrid = (m: LabelMap, isTruth: boolean) => {
        const out: number[] = [];
        for (let gy = 0; gy < grid.rows; gy++) for (let gx = 0; gx < grid.columns; gx++) {
          const counts = new Array(IDS.length + 2).fill(0);
          for (let y = gy * cell; y < Math.min(h, (gy + 1) * cell); y++) for (let x = gx * cell; x < Math.min(w, (gx + 1) * cell); x++) counts[codeOf(m.ids[y * w + x], isTruth)]++;
          out.push(valueOf(counts.indexOf(Math.max(...counts)), isTruth));
        }
        return out;
      };
      expect(Array.from(grid.truth)).toEqual(modeGrid(a.truth, true));
      expect(Array.from(runs[0]!.grid)).toEqual(modeGrid(a.pred, false));
      expect(Array.from(runs[1]!.grid)).toEqual(modeGrid(b.pred, false));

      // Agreement and confidence per region, from the flood-fill reference's pixels.
      const ref = refRegions(a.truth, a.pred, IDS, 255);
      const clamp = (id: number) => (IDS.includes(id) ? id : null);
      for (const region of runs[0]!.regions) {
        const px = ref[region.id].pixels;
        const agree = px.filter((i) => clamp(b.pred.ids[i]) === region.predictedClass).length / px.length;
        expect(region.evidence.agreement).toEqual([{ run: 'b', share: agree }]);
        const hist = new Array(CONFIDENCE_BINS).fill(0);
        for (const i of px) hist[Math.min(CONFIDENCE_BINS - 1, Math.floor((conf.values[i] / 65535) * CONFIDENCE_BINS))]++;
        expect(region.evidence.confidence).toEqual(hist);
      }
      expect(runs[1]!.regions.every((x) => x.evidence.confidence === null)).toBe(true);
      const c = runs[0]!.confidence!;
      IDS.forEach((id, k) => {
        let sum = 0, count = 0;
        for (let i = 0; i < w * h; i++) if (a.truth.ids[i] === id && a.pred.ids[i] === id) (sum += conf.values[i] / 65535), count++;
        expect(c.count[k]).toBe(count);
        expect(c.sum[k]).toBeCloseTo(sum, 9);
      });
    });
  }

  it('gradientNear equals the plain Sobel maximum over the window, on random luma, computed lazily', () => {
    const w = 23, h = 17, rng = rngCreate(9);
    const rgba = Uint8Array.from({ length: w * h * 4 }, () => rngInt(rng, 0, 255));
    const luma = new Uint8Array(w * h);
    photoLuma(rgba, w * h, luma);
    for (let i = 0; i < w * h; i++) expect(luma[i]).toBe((77 * rgba[4 * i] + 150 * rgba[4 * i + 1] + 29 * rgba[4 * i + 2] + 128) >> 8);
    const grad = new Uint8Array(w * h).fill(GRADIENT_UNKNOWN);
    for (const r of [0, 1, 2]) {
      for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
        let best = 0;
        for (let yy = Math.max(0, y - r); yy <= Math.min(h - 1, y + r); yy++) for (let xx = Math.max(0, x - r); xx <= Math.min(w - 1, x + r); xx++) best = Math.max(best, sobelRef(luma, w, h, xx, yy));
        expect(gradientNear(luma, grad, w, h, x, y, r)).toBe(best);
      }
    }
  });
});

describe('photo edges along a region outline', () => {
  // A bright object on a dark ground with sharp edges at x = 40 and x = 60; the label's object is
  // shifted 4 px right of it. The region where the prediction (right) says object and the label does
  // not has the prediction's outline on the photo's edge and the label's on flat ground.
  const w = 100, h = 40;
  const rgba = new Uint8Array(w * h * 4);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) rgba.set(x >= 40 && x < 60 ? [200, 200, 200, 255] : [30, 30, 30, 255], (y * w + x) * 4);
  const photo = { width: w, height: h, rgba };
  const map = (x0: number) => {
    const m: LabelMap = { width: w, height: h, ids: new Uint8Array(w * h) };
    paintRect(m, x0, 0, x0 + 20, h, 1);
    return m;
  };
  const edgesOf = (truth: LabelMap, pred: LabelMap) => {
    const r = frameRegionsCompute({ truth, preds: [{ run: 'a', map: pred, confidence: null }], classIds: [0, 1], ignore: 255, photo }, { ...REGION_DEFAULTS });
    if (!r.ok) throw new Error(r.error);
    return r.value.runs[0]!.regions.find((x) => x.bbox[0] === 40 || x.bbox[0] === 44)!.evidence.edges!;
  };

  it('a wrong label outline: strong edges along the prediction-only outline, none along the truth-only one', () => {
    const e = edgesOf(map(44), map(40));
    // Step of 170 levels: Sobel/8 reads 85 on the pixels beside it.
    expect(e.predicted).toBe(85);
    expect(e.truth).toBe(0);
    expect(e.outline).toEqual({ predicted: h, truth: h, shared: 0 });
  });

  it('a wrong prediction outline: the label-only outline has the edges', () => {
    const e = edgesOf(map(40), map(44));
    expect(e.truth).toBe(85);
    expect(e.predicted).toBe(0);
  });

  it('without a photo there is no edge evidence', () => {
    const r = frameRegionsCompute({ truth: map(40), preds: [{ run: 'a', map: map(44), confidence: null }], classIds: [0, 1], ignore: 255, photo: null }, { ...REGION_DEFAULTS });
    expect(r.ok && r.value.runs[0]!.regions.every((x) => x.evidence.edges === null)).toBe(true);
  });
});
