/** Work rows for the capped distance transform, reusable across frames up to their width. */
export interface DistanceWork {
  /** Final column distances of the row below the current one. */
  below: Int32Array;
  site: Int32Array;
  siteF: Int32Array;
  siteH: Float64Array;
}

/** Returns work rows for images up to `width` pixels wide. */
export function distanceWorkCreate(width: number): DistanceWork {
  return { below: new Int32Array(width), site: new Int32Array(width), siteF: new Int32Array(width), siteH: new Float64Array(width) };
}

/** Largest distance limit (pixels) the 8-bit column distances and 16-bit squared distances can hold. */
export const DISTANCE_LIMIT_MAX = 254;

/**
 * Writes into `out[o .. o+width)` the squared Euclidean distances (pixels²) of row o/width. Column
 * distances (rows to the nearest marked pixel in the same column; any value > limit means "farther")
 * are completed on the way: the smaller of the distance from above, `fwd[o + x]`, and one more than
 * the row below's, `below[x]`, which is then replaced by this row's. Exact wherever the result is ≤ limit²; larger values are written as
 * limit² + 1. One row of Felzenszwalb & Huttenlocher, "Distance Transforms of Sampled Functions"
 * (Theory of Computing 8, 2012): the lower envelope of parabolas (x−q)² + g(q)². Capping is exact
 * because a minimiser within `limit` has column distance ≤ limit. Envelope tests are
 * cross-multiplied integers (no rounding), and each parabola's span is walked with an incremental
 * square, so there is no division per pixel.
 * Hot loop: flat typed arrays, no allocation or closure per pixel.
 */
export function distanceRow(
  fwd: Uint8Array | Uint16Array, o: number, width: number, limit: number, out: Uint16Array, work: DistanceWork,
): void {
  const farSq = limit * limit + 1;
  const { below, site, siteF, siteH } = work;
  let top = -1;
  for (let q = 0; q < width; q++) {
    const fromAbove = fwd[o + q];
    const fromBelow = below[q] + 1;
    const gq = fromBelow < fromAbove ? fromBelow : fromAbove;
    below[q] = gq;
    if (gq > limit) continue;
    const f = gq * gq;
    const h = f + q * q;
    // Drop the last parabola while the new one meets it no later than it met its predecessor.
    while (top >= 1) {
      const v = site[top];
      if ((h - siteH[top]) * (v - site[top - 1]) <= (siteH[top] - siteH[top - 1]) * (q - v)) top--;
      else break;
    }
    top++;
    site[top] = q;
    siteF[top] = f;
    siteH[top] = h;
  }
  let x = 0;
  for (let j = 0; j <= top; j++) {
    // Parabola j+1 is lowest from the first integer x with 2x(b−a) ≥ h_b − h_a (a tie gives the same value).
    let end = width;
    if (j < top) {
      // `| 0` keeps the value a small integer: Math.ceil returns −0 for (−1, 0], which deoptimises the loop.
      const e = Math.ceil((siteH[j + 1] - siteH[j]) / (2 * (site[j + 1] - site[j]))) | 0;
      if (e < end) end = e;
    }
    if (end <= x) continue;
    const dx = x - site[j];
    let d = dx * dx + siteF[j];
    let step = 2 * dx + 1;
    for (; x < end; x++) {
      out[o + x] = d < farSq ? d : farSq;
      d += step;
      step += 2;
    }
  }
  if (x < width) out.fill(farSq, o + x, o + width);
}

/**
 * Writes into `out` the squared Euclidean distance (pixels²) from every pixel to the nearest pixel
 * with `marks[i] ≠ 0`, exact wherever it is ≤ limit²; larger distances and "no marked pixel" are
 * written as limit² + 1. `limit` ≤ DISTANCE_LIMIT_MAX.
 * Hot loop: flat typed arrays, no allocation per pixel; `out` first holds the column distances.
 */
export function distanceSquaredCapped(
  marks: Uint8Array, width: number, height: number, limit: number, out: Uint16Array, work: DistanceWork,
): void {
  const far = limit + 1;
  for (let y = 0; y < height; y++) {
    const o = y * width;
    for (let i = o, end = o + width; i < end; i++) {
      if (marks[i]) out[i] = 0;
      else {
        const up = y > 0 ? out[i - width] + 1 : far;
        out[i] = up < far ? up : far;
      }
    }
  }
  work.below.fill(far, 0, width);
  for (let y = height - 1; y >= 0; y--) distanceRow(out, y * width, width, limit, out, work);
}
