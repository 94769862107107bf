/** Per-column state of the inner-band scan, reusable across frames up to its width. */
export interface InnerBandWork {
  prevT: Int32Array; startT: Int32Array;
  prevP: Int32Array; startP: Int32Array;
}

/** Returns inner-band state for images up to `width` pixels wide. */
export function innerBandWorkCreate(width: number): InnerBandWork {
  return { prevT: new Int32Array(width), startT: new Int32Array(width), prevP: new Int32Array(width), startP: new Int32Array(width) };
}

/** Resets the column state before the first row of a frame. */
export function innerBandReset(work: InnerBandWork, width: number): void {
  work.prevT.fill(-2, 0, width);
  work.prevP.fill(-2, 0, width);
}

/**
 * Adds one pixel to the Boundary IoU counts given whether it lies in the inner band of its truth
 * class (`tb`) and of its predicted class (`pb`); void-truth pixels are removed after the bands are
 * made (METRICS.md), so they count for neither side.
 */
function bandPixelCount(t: number, p: number, k: number, tb: number, pb: number, inter: Uint32Array, union: Uint32Array): void {
  if (t >= k) return;
  if (t === p) {
    if (tb | pb) {
      union[t]++;
      inter[t] += tb & pb;
    }
  } else {
    union[t] += tb;
    if (p < k) union[p] += pb;
  }
}

/**
 * Streams row `y` of both code maps through the inner-band test and adds row y−dil to the Boundary
 * IoU counts (`inter`, `union` per class index, pixels). A pixel is in the inner band of its own
 * class (Cheng et al., CVPR 2021: X minus X eroded `dil` times by a 3×3 square, outside the image not
 * in X) exactly when its (2·dil+1)² window leaves the image or holds another code. Along the row, the
 * current run of equal codes says whether [x−2·dil, x] is uniform, giving centre cx = x−dil the value
 * v = its code, or −1. Down each column, the window of (cx, y−dil) is uniform iff rows y−2·dil..y
 * share one v ≠ −1, i.e. the vertical run of equal v reaching row y began at or above y−2·dil.
 * O(1) per pixel for any dil. Hot loop: flat typed arrays, no allocation per pixel.
 */
export function innerBandRow(
  truth: Uint16Array, pred: Uint16Array, width: number, y: number, dil: number, k: number,
  work: InnerBandWork, inter: Uint32Array, union: Uint32Array,
): void {
  const { prevT, startT, prevP, startP } = work;
  const o = y * width;
  const span = 2 * dil;
  const lim = y - span;
  const oc = o - dil * width;
  const produce = y >= dil;
  let runT = truth[o];
  let runP = pred[o];
  let sT = 0;
  let sP = 0;
  for (let x = 0; x < width; x++) {
    const a = truth[o + x];
    if (a !== runT) {
      runT = a;
      sT = x;
    }
    const b = pred[o + x];
    if (b !== runP) {
      runP = b;
      sP = x;
    }
    const cx = x - dil;
    if (cx < 0) continue;
    const vt = sT <= x - span ? runT : -1;
    if (vt !== prevT[cx]) {
      prevT[cx] = vt;
      startT[cx] = y;
    }
    const vp = sP <= x - span ? runP : -1;
    if (vp !== prevP[cx]) {
      prevP[cx] = vp;
      startP[cx] = y;
    }
    if (!produce) continue;
    const tb = vt === -1 || startT[cx] > lim ? 1 : 0;
    const pb = vp === -1 || startP[cx] > lim ? 1 : 0;
    // Outside both bands a pixel adds nothing, which is most pixels of large regions.
    if ((tb | pb) !== 0) bandPixelCount(truth[oc + cx], pred[oc + cx], k, tb, pb, inter, union);
  }
  // Columns whose window leaves the image on the right are band in every row.
  if (produce) {
    for (let cx = Math.max(0, width - dil); cx < width; cx++) bandPixelCount(truth[oc + cx], pred[oc + cx], k, 1, 1, inter, union);
  }
}

/** Adds the last `dil` rows (their windows leave the image, so all band) to the Boundary IoU counts. */
export function innerBandTail(
  truth: Uint16Array, pred: Uint16Array, width: number, height: number, dil: number, k: number,
  inter: Uint32Array, union: Uint32Array,
): void {
  for (let i = Math.max(0, height - dil) * width, n = width * height; i < n; i++) {
    bandPixelCount(truth[i], pred[i], k, 1, 1, inter, union);
  }
}
