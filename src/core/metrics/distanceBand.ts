import { columnDistanceUp, distanceRow, type DistanceWork } from './distanceCapped.ts';

/**
 * Adds the class-truth pixels of one row to `band` at `binOffsets[d²] + t·(k+1) + min(p, k)`.
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
function bandRowAdd(
  dist2: Uint16Array, truth: Uint16Array, pred: Uint16Array, o: number, width: number, k: number,
  binOffsets: Int32Array, band: Uint32Array,
): void {
  const k1 = k + 1;
  for (let i = o, end = o + width; i < end; i++) {
    const t = truth[i];
    if (t >= k) continue;
    const p = pred[i];
    band[binOffsets[dist2[i]] + t * k1 + (p < k ? p : k)]++;
  }
}

/**
 * Finishes the capped distance transform to the truth boundary from the forward column distances
 * `fwd` (bottom row first, completing each column from below) and fills the band histogram row by
 * row while the row is in cache. Writes `dist2` (pixels², values above limit² as limit² + 1) and
 * adds every class-truth pixel to `band` (see bandHistogram.ts for the layout).
 */
export function distanceBandRows(
  fwd: Uint8Array, truth: Uint16Array, pred: Uint16Array, width: number, height: number, k: number,
  limit: number, binOffsets: Int32Array, band: Uint32Array, dist2: Uint16Array, work: DistanceWork,
): void {
  work.below.fill(limit + 1, 0, width);
  for (let y = height - 1; y >= 0; y--) {
    const o = y * width;
    columnDistanceUp(fwd, o, width, work.below);
    distanceRow(work.below, width, limit, dist2, o, work);
    bandRowAdd(dist2, truth, pred, o, width, k, binOffsets, band);
  }
}
