import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { converter } from 'culori';
import { describe, expect, it } from 'vitest';
import type { LabelMap } from '../../../src/core/labelMap.ts';
import { APPEARANCE_BINS, COLOUR_BINS, labBinTable, photoLabBins, textureBinOf } from '../../../src/core/regions/appearance.ts';
import { frameRegionsCompute } from '../../../src/core/regions/frameRegions.ts';
import { REGION_DEFAULTS } from '../../../src/core/regions/regionSettings.ts';
import { paintRect, rngCreate, rngInt } from '../../support/paint.ts';
import { pythonRefRequire } from '../../reference/pythonRef.ts';

// The appearance histograms (src/core/regions/appearance.ts): colour bins from CIELAB (D65) as culori
// converts it, checked cell by cell against an independent numpy conversion (test/reference/lab_ref.py:
// IEC 61966-2-1 sRGB decoding and matrix, CIE 15:2004 L*a*b*); the class sums and region histograms
// against a plain per-pixel count written out here.

const LAB_REF = fileURLToPath(new URL('../../reference/lab_ref.py', import.meta.url));

describe('colour bins', () => {
  it('every 5-bit sRGB cell falls in the bin numpy puts it in (cells within 0.5 of a bin edge aside)', () => {
    pythonRefRequire();
    const r = spawnSync('python3', [LAB_REF, '0.5'], { encoding: 'utf8', maxBuffer: 1 << 26 });
    if (r.status !== 0) throw new Error(`lab_ref.py failed: ${r.stderr}`);
    const ref = JSON.parse(r.stdout) as { bins: number[]; nearEdge: number[]; red: number[] };
    const table = labBinTable();
    let compared = 0;
    for (let i = 0; i < 32768; i++) {
      if (ref.nearEdge[i]) continue;
      compared++;
      if (table[i] !== ref.bins[i]) throw new Error(`cell ${i}: bin ${table[i]}, numpy ${ref.bins[i]}`);
    }
    expect(compared).toBeGreaterThan(28000);
    // sRGB red in CIELAB (D65): L* 53.24, a* 80.09, b* 67.20 (a commonly quoted worked value, from memory).
    const red = converter('lab65')({ mode: 'rgb', r: 1, g: 0, b: 0 });
    for (const [got, want, ours] of [[red.l, 53.24, ref.red[0]], [red.a, 80.09, ref.red[1]], [red.b, 67.2, ref.red[2]]]) {
      expect(Math.abs(got - want)).toBeLessThan(0.01);
      expect(Math.abs(got - ours)).toBeLessThan(0.05);
    }
  });

  it('a photo is binned with the table, alpha ignored', () => {
    const rng = rngCreate(5);
    const rgba = Uint8Array.from({ length: 400 }, () => rngInt(rng, 0, 255));
    const out = new Uint8Array(100);
    photoLabBins(rgba, 100, out);
    const t = labBinTable();
    for (let i = 0; i < 100; i++) expect(out[i]).toBe(t[((rgba[i * 4] >> 3) << 10) | ((rgba[i * 4 + 1] >> 3) << 5) | (rgba[i * 4 + 2] >> 3)]);
  });
});

describe('class and region appearance', () => {
  // 40×30: class 0 on the left, class 1 on the right (x ≥ 20), a square of class 2 the label calls 1;
  // run a agrees with the label but predicts 2 on the square; run b predicts 2 there too and 0 on a strip.
  const W = 40, H = 30;
  const map = (paint: (m: LabelMap) => void): LabelMap => {
    const m: LabelMap = { width: W, height: H, ids: new Uint8Array(W * H) };
    paintRect(m, 20, 0, 40, 30, 1);
    paint(m);
    return m;
  };
  const truth = map(() => {});
  const a = map((m) => paintRect(m, 26, 10, 34, 18, 2));
  const b = map((m) => (paintRect(m, 26, 10, 34, 18, 2), paintRect(m, 4, 20, 10, 26, 1)));
  const rng = rngCreate(9);
  const rgba = new Uint8Array(W * H * 4);
  for (let i = 0; i < W * H; i++) {
    const base = [[90, 140, 60], [200, 80, 40], [40, 60, 190]][a.ids[i]];
    for (let k = 0; k < 3; k++) rgba[i * 4 + k] = Math.max(0, Math.min(255, base[k] + rngInt(rng, -20, 20)));
    rgba[i * 4 + 3] = 255;
  }
  const res = frameRegionsCompute(
    { truth, preds: [{ run: 'a', map: a, confidence: null }, { run: 'b', map: b, confidence: null }], classIds: [0, 1, 2], ignore: 255, photo: { width: W, height: H, rgba } },
    { ...REGION_DEFAULTS, minArea: 0 },
  );
  if (!res.ok) throw new Error(res.error);
  const bins = new Uint8Array(W * H);
  photoLabBins(rgba, W * H, bins);
  const luma = (i: number) => (77 * rgba[i * 4] + 150 * rgba[i * 4 + 1] + 29 * rgba[i * 4 + 2] + 128) >> 8;
  const sobel = (x: number, y: number) => {
    const at = (xx: number, yy: number) => luma(Math.min(H - 1, Math.max(0, yy)) * W + Math.min(W - 1, Math.max(0, xx)));
    const gx = at(x + 1, y - 1) + 2 * at(x + 1, y) + at(x + 1, y + 1) - at(x - 1, y - 1) - 2 * at(x - 1, y) - at(x - 1, y + 1);
    const gy = at(x - 1, y + 1) + 2 * at(x, y + 1) + at(x + 1, y + 1) - at(x - 1, y - 1) - 2 * at(x, y - 1) - at(x + 1, y - 1);
    return (Math.sqrt(gx * gx + gy * gy) * 0.125 + 0.5) | 0;
  };
  /** Plain: a label boundary pixel (4-neighbour of another label value) within 1 px along the row of (x, y). */
  const nearBoundary = (x: number, y: number) => {
    const t = (xx: number, yy: number) => truth.ids[Math.min(H - 1, Math.max(0, yy)) * W + Math.min(W - 1, Math.max(0, xx))];
    const edge = (xx: number, yy: number) => xx >= 0 && xx < W && [[1, 0], [-1, 0], [0, 1], [0, -1]].some(([dx, dy]) => {
      const nx = xx + dx, ny = yy + dy;
      return nx >= 0 && nx < W && ny >= 0 && ny < H && t(nx, ny) !== t(xx, yy);
    });
    return [-1, 0, 1].some((d) => edge(x + d, y));
  };

  it('classes are described by their undisputed pixels only: even rows and columns, label and every run agreeing, off label boundaries', () => {
    const want = new Uint32Array(3 * APPEARANCE_BINS);
    for (let y = 0; y < H; y += 2) {
      for (let x = 0; x < W; x += 2) {
        const i = y * W + x, c = truth.ids[i];
        if (a.ids[i] !== c || b.ids[i] !== c) continue;
        if (nearBoundary(x, y) || nearBoundary(x, Math.max(0, y - 2)) || nearBoundary(x, Math.min(H - 1, y + 2))) continue;
        want[c * APPEARANCE_BINS + bins[i]]++;
        want[c * APPEARANCE_BINS + COLOUR_BINS + textureBinOf(sobel(x, y))]++;
      }
    }
    expect(res.value.appearance!.classIds).toEqual([0, 1, 2]);
    expect(Array.from(res.value.appearance!.counts)).toEqual(Array.from(want));
    // Class 2 is never undisputed (the label does not say it), so it has no pixels.
    expect(res.value.appearance!.counts.slice(2 * APPEARANCE_BINS).every((v) => v === 0)).toBe(true);
  });

  it("a region's histogram counts its pixels on even rows and columns, colour and texture", () => {
    const sq = res.value.runs[0]!.regions.find((r) => r.truthClass === 1 && r.predictedClass === 2)!;
    const want = new Array(APPEARANCE_BINS).fill(0);
    for (let y = 10; y < 18; y += 2) for (let x = 26; x < 34; x += 2) (want[bins[y * W + x]]++, want[COLOUR_BINS + textureBinOf(sobel(x, y))]++);
    expect(sq.evidence.appearance).toEqual(want);
    const noPhoto = frameRegionsCompute({ truth, preds: [{ run: 'a', map: a, confidence: null }], classIds: [0, 1, 2], ignore: 255, photo: null }, REGION_DEFAULTS);
    expect(noPhoto.ok && noPhoto.value.appearance === null && noPhoto.value.runs[0]!.regions.every((r) => r.evidence.appearance === null)).toBe(true);
  });
});
