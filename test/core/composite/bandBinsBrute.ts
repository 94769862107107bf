// Band bins straight from the definitions in src/docs/metrics.md: a boundary pixel has a 4-neighbour inside
// the image with a different truth value; bin = min(ceil(d), 65) with d the Euclidean distance between
// pixel centres to the nearest boundary pixel (65 when there is none).
import type { LabelMap } from '../../../src/core/labelMap.ts';

export const BIN_CAP = 65;

/** Returns 1 where a pixel is a ground-truth boundary pixel. */
export function boundaryOf(map: LabelMap): Uint8Array {
  const { width: w, height: h, ids } = map;
  const edge = new Uint8Array(w * h);
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      const v = ids[y * w + x];
      if ((x > 0 && ids[y * w + x - 1] !== v) || (x < w - 1 && ids[y * w + x + 1] !== v) ||
          (y > 0 && ids[(y - 1) * w + x] !== v) || (y < h - 1 && ids[(y + 1) * w + x] !== v)) edge[y * w + x] = 1;
    }
  }
  return edge;
}

/** Returns the smallest integer k with k² ≥ d2 (ceil of the square root, exactly). */
function ceilSqrt(d2: number): number {
  let k = Math.floor(Math.sqrt(d2));
  while (k * k < d2) k++;
  while (k > 0 && (k - 1) * (k - 1) >= d2) k--;
  return k;
}

/** Returns band bins by checking every boundary pixel for every pixel (slow; small maps only). */
export function bandBinsBrute(map: LabelMap): Uint8Array {
  const { width: w, height: h } = map;
  const edge = boundaryOf(map);
  const pts: number[] = [];
  for (let i = 0; i < w * h; i++) if (edge[i]) pts.push(i % w, (i / w) | 0);
  const bins = new Uint8Array(w * h);
  for (let i = 0; i < w * h; i++) {
    const x = i % w, y = (i / w) | 0;
    let best = Infinity;
    for (let k = 0; k < pts.length; k += 2) best = Math.min(best, (pts[k] - x) ** 2 + (pts[k + 1] - y) ** 2);
    bins[i] = best === Infinity ? BIN_CAP : Math.min(BIN_CAP, ceilSqrt(best));
  }
  return bins;
}

/**
 * Returns the same bins faster, for the larger test frames: per pixel, per row within 65 of it, the
 * nearest boundary pixel of that row by binary search (a nearer one in that row cannot exist, and rows
 * farther than 65 cannot change a capped bin). Checked against bandBinsBrute in the tests.
 */
export function bandBinsOf(map: LabelMap): Uint8Array {
  const { width: w, height: h } = map;
  const edge = boundaryOf(map);
  const rows: number[][] = [];
  for (let y = 0; y < h; y++) {
    const xs: number[] = [];
    for (let x = 0; x < w; x++) if (edge[y * w + x]) xs.push(x);
    rows.push(xs);
  }
  const bins = new Uint8Array(w * h);
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      let best = Infinity;
      for (let yy = Math.max(0, y - BIN_CAP); yy <= Math.min(h - 1, y + BIN_CAP); yy++) {
        const xs = rows[yy];
        if (xs.length === 0) continue;
        let lo = 0, hi = xs.length - 1;
        while (lo < hi) {
          const mid = (lo + hi) >> 1;
          if (xs[mid] < x) lo = mid + 1;
          else hi = mid;
        }
        let dx = Math.abs(xs[lo] - x);
        if (lo > 0) dx = Math.min(dx, Math.abs(xs[lo - 1] - x));
        best = Math.min(best, dx * dx + (yy - y) ** 2);
      }
      bins[y * w + x] = best === Infinity ? BIN_CAP : Math.min(BIN_CAP, ceilSqrt(best));
    }
  }
  return bins;
}
