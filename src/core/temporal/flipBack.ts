import type { LabelIds } from '../labelMap.ts';

/**
 * Additive flip-back counts of one frame t (src/docs/metrics.md "Flicker"): a pixel flips back when
 * `pred[t-1] == pred[t+1]` and `pred[t] != pred[t-1]`. Counted over pixels whose truth at t is a
 * class (`flips` of `pixels`) and over void truth (`flipsVoid` of `pixelsVoid`); per class over the
 * non-void pixels whose t-1 prediction is that class.
 */
export interface FlipBackCounts {
  flips: number;
  pixels: number;
  flipsVoid: number;
  pixelsVoid: number;
  /** Per class index (position in the ascending class ids): flips and pixels whose t-1 prediction is the class. */
  classFlips: Uint32Array;
  classPixels: Uint32Array;
}

/** Returns zeroed counts for `k` classes. */
export function flipBackCountsCreate(k: number): FlipBackCounts {
  return { flips: 0, pixels: 0, flipsVoid: 0, pixelsVoid: 0, classFlips: new Uint32Array(k), classPixels: new Uint32Array(k) };
}

/**
 * Adds frame t's flip-back counts to `out`. `codes` maps an id to its class index (0..k-1) or to
 * k and above for void and ids that are no class (src/core/metrics/codes.ts); truth ids that are no
 * class count as void, as everywhere in scoring. All four maps hold the same number of pixels.
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
export function flipBackCountsAdd(
  truth: LabelIds, prev: LabelIds, cur: LabelIds, next: LabelIds, codes: Uint16Array, k: number, out: FlipBackCounts,
): FlipBackCounts {
  const n = truth.length;
  let flips = 0, pixels = 0, flipsVoid = 0, pixelsVoid = 0;
  const cf = out.classFlips, cp = out.classPixels;
  for (let i = 0; i < n; i++) {
    const a = prev[i];
    const flip = a === next[i] && cur[i] !== a ? 1 : 0;
    if (codes[truth[i]] < k) {
      pixels++;
      flips += flip;
      const c = codes[a];
      if (c < k) {
        cp[c]++;
        cf[c] += flip;
      }
    } else {
      pixelsVoid++;
      flipsVoid += flip;
    }
  }
  out.flips += flips;
  out.pixels += pixels;
  out.flipsVoid += flipsVoid;
  out.pixelsVoid += pixelsVoid;
  return out;
}

/** Returns `flips / pixels` as a ratio 0..1, or null when there are no pixels. */
export function flipBackRate(flips: number, pixels: number): number | null {
  return pixels > 0 ? flips / pixels : null;
}
