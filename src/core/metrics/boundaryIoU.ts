/**
 * Per-column state of the inner-band scan, interleaved per column so one array serves the hot loop:
 * [4x] truth row value of the previous row, [4x+1] row where its vertical run began, [4x+2..3] the
 * same for the prediction. Reusable across frames up to its width.
 */
export interface InnerBandWork {
  state: Int32Array;
}

/** Returns inner-band state for images up to `width` pixels wide. */
export function innerBandWorkCreate(width: number): InnerBandWork {
  return { state: new Int32Array(4 * width) };
}

/** Resets the column state before the first row of a frame. */
export function innerBandReset(work: InnerBandWork, width: number): void {
  const st = work.state;
  for (let x = 0; x < width; x++) {
    st[4 * x] = -2;
    st[4 * x + 2] = -2;
  }
}

/**
 * Adds `n` pixels of truth code t and prediction code p to the Boundary IoU counts, given whether
 * they lie in the inner band of their truth class (`tb`) and of their predicted class (`pb`);
 * void-truth pixels are removed after the bands are made (src/docs/metrics.md), so they count for neither.
 */
function bandRunCount(t: number, p: number, k: number, tb: number, pb: number, n: number, inter: Uint32Array, union: Uint32Array): void {
  if (t >= k || n === 0) return;
  if (t === p) {
    if (tb | pb) {
      union[t] += n;
      inter[t] += (tb & pb) * n;
    }
  } else {
    union[t] += tb * n;
    if (p < k) union[p] += pb * n;
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
 * O(1) per pixel for any dil ≥ 1. Band pixels are counted in runs of equal (truth, prediction, flags),
 * one update per run: an update per pixel on the same counter chains every increment behind the last.
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
export function innerBandRow(
  truth: Uint16Array, pred: Uint16Array, width: number, y: number, dil: number, k: number,
  work: InnerBandWork, inter: Uint32Array, union: Uint32Array,
): void {
  const st = work.state;
  const o = y * width;
  const span = 2 * dil;
  const lim = y - span;
  const oc = o - dil * width;
  const produce = y >= dil;
  let runT = truth[o];
  let runP = pred[o];
  let sT = 0;
  let sP = 0;
  let rt = -1, rp = -1, rtb = 0, rpb = 0, run = 0;
  for (let x = 1; x < width; x++) {
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
    const far = x - span;
    const vt = sT <= far ? runT : -1;
    const vp = sP <= far ? runP : -1;
    const j = 4 * cx;
    if (vt !== st[j]) {
      st[j] = vt;
      st[j + 1] = y;
    }
    if (vp !== st[j + 2]) {
      st[j + 2] = vp;
      st[j + 3] = y;
    }
    if (!produce) continue;
    const tb = vt === -1 || st[j + 1] > lim ? 1 : 0;
    const pb = vp === -1 || st[j + 3] > lim ? 1 : 0;
    // Outside both bands a pixel adds nothing, which is most pixels of large regions.
    if ((tb | pb) === 0) continue;
    const t = truth[oc + cx];
    const p = pred[oc + cx];
    if (t === rt && p === rp && tb === rtb && pb === rpb) run++;
    else {
      bandRunCount(rt, rp, k, rtb, rpb, run, inter, union);
      rt = t;
      rp = p;
      rtb = tb;
      rpb = pb;
      run = 1;
    }
  }
  bandRunCount(rt, rp, k, rtb, rpb, run, inter, union);
  // Columns whose window leaves the image on the right are band in every row.
  if (produce) innerBandAllCount(truth, pred, oc + Math.max(0, width - dil), oc + width, k, inter, union);
}

/** Adds pixels [start, end), all in both bands, to the Boundary IoU counts, in runs of equal codes. */
function innerBandAllCount(truth: Uint16Array, pred: Uint16Array, start: number, end: number, k: number, inter: Uint32Array, union: Uint32Array): void {
  let rt = -1, rp = -1, run = 0;
  for (let i = start; i < end; i++) {
    const t = truth[i];
    const p = pred[i];
    if (t === rt && p === rp) run++;
    else {
      bandRunCount(rt, rp, k, 1, 1, run, inter, union);
      rt = t;
      rp = p;
      run = 1;
    }
  }
  bandRunCount(rt, rp, k, 1, 1, run, inter, union);
}

/** Adds the last `dil` rows (their windows leave the image, so all band) to the Boundary IoU counts. */
export function innerBandTail(
  truth: Uint16Array, pred: Uint16Array, width: number, height: number, dil: number, k: number,
  inter: Uint32Array, union: Uint32Array,
): void {
  innerBandAllCount(truth, pred, Math.max(0, height - dil) * width, width * height, k, inter, union);
}
