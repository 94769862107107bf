/**
 * Band(w) membership (METRICS.md) for the pixels of regions only, without a distance transform of the
 * whole frame: per row, a running count of ground-truth boundary pixels, so "is there a boundary pixel
 * within dx of column x in row y'" is one subtraction, and a pixel lies in Band(w) exactly when some
 * row y' with |y' − y| ≤ w has one within floor(√(w² − (y' − y)²)).
 */

/**
 * Writes into `out` ((width + 1) × height counts) for each row the number of ground-truth boundary
 * pixels left of each column: out[y·(width+1) + x] counts columns < x. A boundary pixel has a
 * 4-neighbour inside the image with another code (void is a value; the border is no boundary).
 * Hot loop: flat typed arrays, row offsets hoisted, no allocation per pixel.
 */
export function truthEdgePrefix(tc: Uint16Array, width: number, height: number, out: Int32Array): void {
  const stride = width + 1;
  for (let y = 0; y < height; y++) {
    const o = y * width, p = y * stride;
    // A missing neighbour (first or last row) reads the pixel itself: no change.
    const up = y > 0 ? -width : 0, down = y < height - 1 ? width : 0;
    let count = 0;
    out[p] = 0;
    let left = tc[o];
    for (let x = 0; x < width; x++) {
      const i = o + x;
      const v = tc[i];
      const right = x < width - 1 ? tc[i + 1] : v;
      // XOR is non-zero exactly where codes differ; OR of the four says "some neighbour differs".
      if (((v ^ left) | (v ^ right) | (v ^ tc[i + up]) | (v ^ tc[i + down])) !== 0) count++;
      out[p + x + 1] = count;
      left = v;
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
 * (pixel centres) of a ground-truth boundary pixel. `prefix` from truthEdgePrefix, `reach` from bandReach(w).
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
export function bandCountRun(
  prefix: Int32Array, width: number, height: number, y: number, x0: number, x1: number, w: number, reach: Int32Array,
): number {
  const stride = width + 1;
  let inside = 0;
  for (let x = x0; x < x1; x++) {
    // Rows nearest first (0, −1, +1, −2, …): most pixels of a region near a boundary stop early.
    for (let k = 0; k <= 2 * w; k++) {
      const dy = k & 1 ? -((k + 1) >> 1) : k >> 1;
      const yy = y + dy;
      if (yy < 0 || yy >= height) continue;
      const dx = reach[dy + w];
      const p = yy * stride;
      const lo = x - dx > 0 ? x - dx : 0, hi = x + dx + 1 < width ? x + dx + 1 : width;
      if (prefix[p + hi] - prefix[p + lo] > 0) {
        inside++;
        break;
      }
    }
  }
  return inside;
}
