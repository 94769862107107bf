/**
 * What the forward scan leaves for the later passes: column distances to the truth boundary from
 * above, and the Boundary F edge pixels of both maps as pixel indices in row-major order.
 */
export interface EdgeScan {
  /** Per pixel: rows up to the nearest truth-boundary pixel at or above it, capped at `far`. */
  fwd: Uint8Array;
  /** Truth-boundary pixels of a class (∂G of their truth class). */
  listT: Int32Array;
  /** Prediction-boundary pixels of a class whose truth is a class (∂P of their predicted class). */
  listP: Int32Array;
  nT: number;
  nP: number;
}

/**
 * Scans row `y` of both code maps: a pixel is a boundary pixel of its map when a 4-neighbour inside
 * the image has another code (METRICS.md; void is a value, the border is no boundary). Writes the
 * truth map's forward column distance (0 on its boundary, capped at `far` ≤ 255) and appends Boundary F
 * edge pixels to the lists. Codes below `k` are classes. Rows above and below must hold codes.
 * Hot loop: flat typed arrays, codes compared by XOR so no booleans, no allocation per pixel;
 * border pixels take a separate checked path so the interior loop has no bounds tests.
 */
export function edgeRowScan(
  truth: Uint16Array, pred: Uint16Array, width: number, height: number, y: number, k: number, far: number, scan: EdgeScan,
): void {
  const o = y * width;
  if (y === 0 || y === height - 1 || width < 3) {
    for (let x = 0; x < width; x++) edgePixelChecked(truth, pred, width, height, x, y, k, far, scan);
    return;
  }
  edgePixelChecked(truth, pred, width, height, 0, y, k, far, scan);
  const { fwd, listT, listP } = scan;
  let nT = scan.nT;
  let nP = scan.nP;
  for (let i = o + 1, end = o + width - 1; i < end; i++) {
    const t = truth[i];
    const te = (t ^ truth[i - 1]) | (t ^ truth[i + 1]) | (t ^ truth[i - width]) | (t ^ truth[i + width]);
    if (te !== 0) {
      fwd[i] = 0;
      if (t < k) listT[nT++] = i;
    } else {
      const up = fwd[i - width] + 1;
      fwd[i] = up < far ? up : far;
    }
    const p = pred[i];
    const pe = (p ^ pred[i - 1]) | (p ^ pred[i + 1]) | (p ^ pred[i - width]) | (p ^ pred[i + width]);
    if (pe !== 0 && p < k && t < k) listP[nP++] = i;
  }
  scan.nT = nT;
  scan.nP = nP;
  edgePixelChecked(truth, pred, width, height, width - 1, y, k, far, scan);
}

function edgeAt(codes: Uint16Array, width: number, height: number, x: number, y: number): boolean {
  const i = y * width + x;
  const c = codes[i];
  return (
    (x > 0 && codes[i - 1] !== c) ||
    (x + 1 < width && codes[i + 1] !== c) ||
    (y > 0 && codes[i - width] !== c) ||
    (y + 1 < height && codes[i + width] !== c)
  );
}

function edgePixelChecked(
  truth: Uint16Array, pred: Uint16Array, width: number, height: number, x: number, y: number, k: number, far: number, scan: EdgeScan,
): void {
  const i = y * width + x;
  const t = truth[i];
  if (edgeAt(truth, width, height, x, y)) {
    scan.fwd[i] = 0;
    if (t < k) scan.listT[scan.nT++] = i;
  } else {
    const up = y > 0 ? scan.fwd[i - width] + 1 : far;
    scan.fwd[i] = up < far ? up : far;
  }
  if (pred[i] < k && t < k && edgeAt(pred, width, height, x, y)) scan.listP[scan.nP++] = i;
}
