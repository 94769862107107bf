/** Largest band width answered (src/docs/metrics.md: every integer width 0..64). */
export const BAND_WIDTH_MAX = 64;
/** Histogram bins: ceil(d) = 0..64, and 65 for everything farther (including "no boundary"). */
export const BAND_BINS = BAND_WIDTH_MAX + 2;

/**
 * Returns, for every squared distance 0..limit²+1 (pixels²), the offset of its bin in a band
 * histogram of `k` classes: min(ceil(d), 65) · k · (k+1). Pixel d ≤ w exactly when ceil(d) ≤ w for
 * integer w, so Band(w) is the sum of bins 0..w. `Math.sqrt` is exact on perfect squares and
 * never rounds a non-square up to an integer at these sizes, so `ceil` is exact.
 */
export function bandBinOffsets(limit: number, k: number): Int32Array {
  const size = limit * limit + 2;
  const out = new Int32Array(size);
  const stride = k * (k + 1);
  for (let n = 0; n < size; n++) {
    const bin = Math.min(Math.ceil(Math.sqrt(n)), BAND_BINS - 1);
    out[n] = bin * stride;
  }
  return out;
}

/** Writes into `out` (k × (k+1)) the sum of `band` over all bins: the frame's confusion matrix (pixels). */
export function bandConfusionTotal(band: Uint32Array, k: number, out: Uint32Array): void {
  const cells = k * (k + 1);
  out.fill(0, 0, cells);
  for (let b = 0; b < BAND_BINS; b++) {
    const o = b * cells;
    for (let c = 0; c < cells; c++) out[c] += band[o + c];
  }
}
