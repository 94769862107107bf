/**
 * Band(w) membership (src/docs/metrics.md) for the pixels of regions only, without a distance transform of the
 * whole frame: per pixel, the distance along its row to the row's nearest ground-truth boundary
 * pixel, so a pixel lies in Band(w) exactly when some row y' with |y' − y| ≤ w has one within
 * floor(√(w² − (y' − y)²)) of its column: one read per row looked at.
 */

/** Largest along-row distance truthEdgeReach stores; farther (or no boundary in the row) reads this. */
export const EDGE_REACH_FAR = 255;

/**
 * Writes into `out` (width × height) for every pixel the distance along its row (pixels, capped at
 * EDGE_REACH_FAR) to the nearest ground-truth boundary pixel of that row. A boundary pixel has a
 * 4-neighbour inside the image with another code (void is a value; the border is no boundary).
 * Hot loop: flat typed arrays, row offsets hoisted, one forward and one backward pass per row.
 */
export function truthEdgeReach(tc: Uint16Array, width: number, height: number, out: Uint8Array): void {
  for (let y = 0; y < height; y++) {
    const o = y * width;
    // A missing neighbour (first or last row) reads the pixel itself: no change.
    const up = y > 0 ? -width : 0, down = y < height - 1 ? width : 0;
    let left = tc[o], d = EDGE_REACH_FAR;
    for (let x = 0; x < width; x++) {
      const i = o + x;
      const v = tc[i];
      const right = x < width - 1 ? tc[i + 1] : v;
      // XOR is non-zero exactly where codes differ; OR of the four says "some neighbour differs".
      if (((v ^ left) | (v ^ right) | (v ^ tc[i + up]) | (v ^ tc[i + down])) !== 0) d = 0;
      else if (d < EDGE_REACH_FAR) d++;
      out[i] = d;
      left = v;
    }
    for (let i = o + width - 2; i >= o; i--) {
      const v = out[i + 1] + 1;
      if (v < out[i]) out[i] = v;
    }
  }
}

/** Returns, for dy = −w..w (index dy + w), the largest dx with dx² + dy² ≤ w² (integers, exact). */
export function bandReach(w: number): Int32Array {
  const out = new Int32Array(2 * w + 1);
  for (let dy = -w; dy <= w; dy++) {
    let dx = Math.floor(Math.sqrt(w * w - dy * dy));
    while ((dx + 1) * (dx + 1) + dy * dy <= w * w) dx++;
    while (dx > 0 && dx * dx + dy * dy > w * w) dx--;
    out[dy + w] = dx;
  }
  return out;
}

/**
 * Returns how many pixels of row y, columns [x0, x1), lie in Band(w): within Euclidean distance w
 * (pixel centres) of a ground-truth boundary pixel. `reachMap` from truthEdgeReach, `reach` from bandReach(w).
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
export function bandCountRun(
  reachMap: Uint8Array, width: number, height: number, y: number, x0: number, x1: number, w: number, reach: Int32Array,
): number {
  let inside = 0;
  for (let x = x0; x < x1; x++) {
    // Rows nearest first (0, −1, +1, −2, …): most pixels of a region near a boundary stop early.
    for (let k = 0; k <= 2 * w; k++) {
      const dy = k & 1 ? -((k + 1) >> 1) : k >> 1;
      const yy = y + dy;
      if (yy < 0 || yy >= height) continue;
      if (reachMap[yy * width + x] <= reach[dy + w]) {
        inside++;
        break;
      }
    }
  }
  return inside;
}

/**
 * Returns how many pixels [from, to) lie in Band(w) by their squared distance to the truth boundary
 * (`dist2`, exact at least up to w²): the same count as bandCountRun, one read per pixel.
 * Hot loop: flat typed arrays.
 */
export function bandCountDist2(dist2: Uint16Array, from: number, to: number, w2: number): number {
  let inside = 0;
  for (let i = from; i < to; i++) if (dist2[i] <= w2) inside++;
  return inside;
}
