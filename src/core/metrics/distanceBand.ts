import { distanceRow, type DistanceWork } from './distanceCapped.ts';

/**
 * Adds the class-truth pixels [start, end) to `band` at `binOffsets[d²] + t·(k+1) + min(p, k)`.
 * Neighbouring pixels mostly hit the same cell, and a read-modify-write per pixel on one cell
 * chains every increment behind the previous store; counting runs of equal cells in a register and
 * adding each run once is several times faster.
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
function bandAdd(
  dist2: Uint16Array, truth: Uint16Array, pred: Uint16Array, start: number, end: number, k: number,
  binOffsets: Int32Array, band: Uint32Array,
): void {
  const k1 = k + 1;
  let cell = -1;
  let run = 0;
  for (let i = start; i < end; i++) {
    const t = truth[i];
    if (t >= k) continue;
    const p = pred[i];
    const c = binOffsets[dist2[i]] + t * k1 + (p < k ? p : k);
    if (c === cell) run++;
    else {
      if (run > 0) band[cell] += run;
      cell = c;
      run = 1;
    }
  }
  if (run > 0) band[cell] += run;
}

/**
 * Finishes the capped distance transform to the truth boundary from the forward column distances
 * `fwd` (bottom row first, completing each column from below), then fills the band histogram in
 * one pass (kept apart: inlined into the row loop it ran markedly slower). Writes `dist2`
 * (pixels², values above limit² as limit² + 1) and adds every class-truth pixel to `band` (see
 * bandHistogram.ts for the layout). `dist2Known`: `dist2` already holds this truth's distances (an
 * earlier run of the same frame), so only the histogram is filled.
 */
export function distanceBandRows(
  fwd: Uint8Array, truth: Uint16Array, pred: Uint16Array, width: number, height: number, k: number,
  limit: number, binOffsets: Int32Array, band: Uint32Array, dist2: Uint16Array, work: DistanceWork, dist2Known = false,
): void {
  if (!dist2Known) {
    work.below.fill(limit + 1, 0, width);
    for (let y = height - 1; y >= 0; y--) distanceRow(fwd, y * width, width, limit, dist2, work);
  }
  bandAdd(dist2, truth, pred, 0, width * height, k, binOffsets, band);
}
