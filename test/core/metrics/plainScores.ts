import type { LabelMap } from '../../../src/core/labelMap.ts';
import type { FrameStats } from '../../../src/core/metrics/frameScore.ts';
import type { ScoreSettings } from '../../../src/core/metrics/settings.ts';

/**
 * Plain per-class reference versions of every frame count, written straight from src/docs/metrics.md with
 * no shared code and no speed tricks (brute-force distances, erosion repeated `dil` times), to check
 * the fast multi-label kernels against. Small maps only: distances are O(pixels × boundary pixels).
 */

/** Returns per pixel true where a 4-neighbour inside the image has a different value. */
export function plainEdges(values: ArrayLike<number>, width: number, height: number): boolean[] {
  const out: boolean[] = [];
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const v = values[y * width + x];
      const differs = (xx: number, yy: number) =>
        xx >= 0 && yy >= 0 && xx < width && yy < height && values[yy * width + xx] !== v;
      out.push(differs(x - 1, y) || differs(x + 1, y) || differs(x, y - 1) || differs(x, y + 1));
    }
  }
  return out;
}

/** Returns per pixel the squared Euclidean distance to the nearest marked pixel (Infinity if none). */
export function plainDistance2(marks: boolean[], width: number, height: number): number[] {
  const sites: [number, number][] = [];
  for (let i = 0; i < marks.length; i++) if (marks[i]) sites.push([i % width, Math.floor(i / width)]);
  const out: number[] = [];
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      let best = Infinity;
      for (const [sx, sy] of sites) best = Math.min(best, (sx - x) ** 2 + (sy - y) ** 2);
      out.push(best);
    }
  }
  return out;
}

/** Returns X minus X eroded `dil` times by a 3×3 square, pixels outside the image not in X. */
export function plainInnerBand(mask: boolean[], width: number, height: number, dil: number): boolean[] {
  let cur = mask.slice();
  for (let it = 0; it < dil; it++) {
    const next: boolean[] = [];
    for (let y = 0; y < height; y++) {
      for (let x = 0; x < width; x++) {
        let all = true;
        for (let dy = -1; dy <= 1; dy++) {
          for (let dx = -1; dx <= 1; dx++) {
            const xx = x + dx, yy = y + dy;
            if (xx < 0 || yy < 0 || xx >= width || yy >= height || !cur[yy * width + xx]) all = false;
          }
        }
        next.push(all);
      }
    }
    cur = next;
  }
  return mask.map((m, i) => m && !cur[i]);
}

/** Returns the pixels of `mask` with a 4-neighbour inside the image not in `mask`. */
function plainMaskEdge(mask: boolean[], width: number, height: number): boolean[] {
  return plainEdges(mask.map((m) => (m ? 1 : 0)), width, height).map((e, i) => e && mask[i]);
}

/** Returns the counts of FrameStats computed the plain way (same layout as frameScore). */
export function plainFrameStats(truth: LabelMap, pred: LabelMap, classIds: number[], settings: ScoreSettings): FrameStats {
  const { width, height } = truth;
  const n = width * height;
  const k = classIds.length;
  const index = (id: number) => (id === settings.ignore ? -1 : classIds.indexOf(id));
  const t = Array.from(truth.ids, index);
  const p = Array.from(pred.ids, index);
  const valid = t.map((c) => c >= 0);

  const dist2 = plainDistance2(plainEdges(truth.ids, width, height), width, height);
  const band = new Uint32Array(66 * k * (k + 1));
  const confusion = new Uint32Array(k * (k + 1));
  for (let i = 0; i < n; i++) {
    if (!valid[i]) continue;
    const col = p[i] >= 0 ? p[i] : k;
    const bin = Math.min(Math.ceil(Math.sqrt(dist2[i])), 65);
    band[(bin * k + t[i]) * (k + 1) + col]++;
    confusion[t[i] * (k + 1) + col]++;
  }

  const diag = Math.sqrt(width * width + height * height);
  const dil = Math.max(1, pythonRound(settings.biouDilationRatio * diag));
  const theta = settings.bfTolerance * diag;
  const biouInter = new Uint32Array(k), biouUnion = new Uint32Array(k);
  const bf = [0, 1, 2, 3].map(() => new Uint32Array(k));
  for (let c = 0; c < k; c++) {
    const g = t.map((v) => v === c);
    const q = p.map((v) => v === c);
    const gd = plainInnerBand(g, width, height, dil).map((b, i) => b && valid[i]);
    const pd = plainInnerBand(q, width, height, dil).map((b, i) => b && valid[i]);
    for (let i = 0; i < n; i++) {
      if (gd[i] && pd[i]) biouInter[c]++;
      if (gd[i] || pd[i]) biouUnion[c]++;
    }
    const ge = plainMaskEdge(g, width, height);
    const pe = plainMaskEdge(q, width, height).map((b, i) => b && valid[i]);
    const toG = plainDistance2(ge, width, height);
    const toP = plainDistance2(pe, width, height);
    for (let i = 0; i < n; i++) {
      if (pe[i]) {
        bf[1][c]++;
        if (Math.sqrt(toG[i]) <= theta) bf[0][c]++;
      }
      if (ge[i]) {
        bf[3][c]++;
        if (Math.sqrt(toP[i]) <= theta) bf[2][c]++;
      }
    }
  }
  return {
    width, height, classIds: [...classIds], confusion, band, biouInter, biouUnion,
    bfPredMatched: bf[0], bfPredTotal: bf[1], bfTruthMatched: bf[2], bfTruthTotal: bf[3],
  };
}

/** Python 3's round(): nearest integer, ties to even. */
function pythonRound(v: number): number {
  const f = Math.floor(v);
  if (v - f !== 0.5) return Math.round(v);
  return f % 2 === 0 ? f : f + 1;
}
