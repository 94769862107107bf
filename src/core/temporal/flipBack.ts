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
 * 8-bit maps take flipBackBytes (4 pixels a step); others the per-pixel loop below.
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
export function flipBackCountsAdd(
  truth: LabelIds, prev: LabelIds, cur: LabelIds, next: LabelIds, codes: Uint16Array, k: number, out: FlipBackCounts,
): FlipBackCounts {
  if (truth instanceof Uint8Array && prev instanceof Uint8Array && cur instanceof Uint8Array && next instanceof Uint8Array) {
    return flipBackBytes(truth, prev, cur, next, codes, k, out);
  }
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

/** Pixels per (truth id, t-1 prediction id) pair, and flips per pair, of 8-bit maps (index truth × 256 + prev). */
let pairPixels = new Uint32Array(0);
let pairFlips = new Uint32Array(0);

/** Returns a 32-bit view of `a` when it starts on a 4-byte boundary, else null. */
function wordsOf(a: Uint8Array): Uint32Array | null {
  return a.byteOffset % 4 === 0 ? new Uint32Array(a.buffer, a.byteOffset, a.length >> 2) : null;
}

/**
 * flipBackCountsAdd for 8-bit maps, the same counts: pixels are counted per (truth id, t-1 id) pair
 * and the pairs folded into classes once at the end, so the loop does no code lookups. Four pixels
 * are taken as one 32-bit word: a word where t-1 and t agree holds no flip, and a run of words
 * repeating the same truth and t-1 word is counted once (label maps are mostly long runs of one id).
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
function flipBackBytes(
  truth: Uint8Array, prev: Uint8Array, cur: Uint8Array, next: Uint8Array, codes: Uint16Array, k: number, out: FlipBackCounts,
): FlipBackCounts {
  if (pairPixels.length === 0) {
    pairPixels = new Uint32Array(65536);
    pairFlips = new Uint32Array(65536);
  }
  const pp = pairPixels.fill(0), pf = pairFlips.fill(0);
  const n = truth.length;
  const T = wordsOf(truth), P = wordsOf(prev), C = wordsOf(cur), N = wordsOf(next);
  let i = 0;
  if (T && P && C && N) {
    const words = n >> 2;
    let runT = T[0] ^ 1, runP = 0, runLen = 0; // no run yet: runT cannot match the first word
    for (let w = 0; w < words; w++) {
      const t = T[w], p = P[w];
      if (p !== C[w]) {
        for (let j = w << 2, end = j + 4; j < end; j++) {
          const a = prev[j];
          if (a === next[j] && cur[j] !== a) pf[(truth[j] << 8) | a]++;
        }
      }
      if (t === runT && p === runP) {
        runLen++;
        continue;
      }
      if (runLen > 0) pairsAddWord(pp, truth, prev, (w - runLen) << 2, runT, runP, runLen);
      runT = t;
      runP = p;
      runLen = 1;
    }
    if (runLen > 0) pairsAddWord(pp, truth, prev, (words - runLen) << 2, runT, runP, runLen);
    i = words << 2;
  }
  for (; i < n; i++) {
    const a = prev[i];
    pp[(truth[i] << 8) | a]++;
    if (a === next[i] && cur[i] !== a) pf[(truth[i] << 8) | a]++;
  }
  const cf = out.classFlips, cp = out.classPixels;
  for (let t = 0; t < 256; t++) {
    const isClass = codes[t] < k;
    for (let a = 0, o = t << 8; a < 256; a++) {
      const px = pp[o + a];
      if (px === 0) continue;
      const fl = pf[o + a];
      if (!isClass) {
        out.pixelsVoid += px;
        out.flipsVoid += fl;
        continue;
      }
      out.pixels += px;
      out.flips += fl;
      const c = codes[a];
      if (c < k) {
        cp[c] += px;
        cf[c] += fl;
      }
    }
  }
  return out;
}

/** Adds `len` repeats of the 4 pixels at `at` (truth word `t`, t-1 word `p`) to the pair counts. */
function pairsAddWord(pp: Uint32Array, truth: Uint8Array, prev: Uint8Array, at: number, t: number, p: number, len: number): void {
  const tb = t & 255, pb = p & 255;
  if (t === tb * 0x01010101 && p === pb * 0x01010101) {
    pp[(tb << 8) | pb] += 4 * len;
    return;
  }
  for (let j = at; j < at + 4; j++) pp[(truth[j] << 8) | prev[j]] += len;
}

/** Returns `flips / pixels` as a ratio 0..1, or null when there are no pixels. */
export function flipBackRate(flips: number, pixels: number): number | null {
  return pixels > 0 ? flips / pixels : null;
}
