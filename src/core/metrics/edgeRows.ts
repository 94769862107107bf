import type { LabelIds } from '../labelMap.ts';

/**
 * What the forward scan leaves for the later passes: column distances to the truth boundary from
 * above, and the Boundary F edge pixels of both maps as pixel indices in row-major order, with the
 * index in each list where every row starts (so later passes never divide to find a row).
 */
export interface EdgeScan {
  /** Per pixel: rows up to the nearest truth-boundary pixel at or above it, capped at `far`. */
  fwd: Uint8Array;
  /** Truth-boundary pixels of a class (∂G of their truth class). */
  listT: Int32Array;
  /** Prediction-boundary pixels of a class whose truth is a class (∂P of their predicted class). */
  listP: Int32Array;
  /** rowT[y] = first index in listT of row y; rowT[height] = nT. Same for rowP. */
  rowT: Int32Array;
  rowP: Int32Array;
  nT: number;
  nP: number;
}

/** Returns an edge scan with room for `pixels` pixels and `height` rows. */
export function edgeScanCreate(pixels: number, height: number): EdgeScan {
  return {
    fwd: new Uint8Array(pixels), listT: new Int32Array(pixels), listP: new Int32Array(pixels),
    rowT: new Int32Array(height + 1), rowP: new Int32Array(height + 1), nT: 0, nP: 0,
  };
}

/**
 * Scans row `y` of both maps. First writes the codes of row y+1 (`table` maps raw ids to codes, see
 * codes.ts; row 0 must be coded before row 0 is scanned), so each row is read from the input once.
 * A pixel is a boundary pixel of its map when a 4-neighbour inside the image has another code
 * (src/docs/metrics.md; void is a value, the border is no boundary). Writes the truth map's forward column
 * distance (0 on its boundary, capped at `far` ≤ 255) and appends Boundary F edge pixels to the lists.
 * Hot loop: flat typed arrays, codes compared by XOR so no booleans, no allocation per pixel;
 * border pixels take a separate checked path so the interior loop has no bounds tests.
 */
export function edgeRowScan(
  truthIds: LabelIds, predIds: LabelIds, table: Uint16Array, truth: Uint16Array, pred: Uint16Array,
  width: number, height: number, y: number, k: number, far: number, scan: EdgeScan,
): void {
  const o = y * width;
  scan.rowT[y] = scan.nT;
  scan.rowP[y] = scan.nP;
  const last = y === height - 1;
  if (y === 0 || last || width < 3) {
    if (!last) {
      for (let i = o + width, end = o + 2 * width; i < end; i++) {
        truth[i] = table[truthIds[i]];
        pred[i] = table[predIds[i]];
      }
    }
    for (let x = 0; x < width; x++) edgePixelChecked(truth, pred, width, height, x, y, k, far, scan);
  } else {
    const b = o + width;
    truth[b] = table[truthIds[b]];
    pred[b] = table[predIds[b]];
    edgePixelChecked(truth, pred, width, height, 0, y, k, far, scan);
    const { fwd, listT, listP } = scan;
    let nT = scan.nT;
    let nP = scan.nP;
    for (let i = o + 1, end = o + width - 1; i < end; i++) {
      const down = i + width;
      const td = table[truthIds[down]];
      const pd = table[predIds[down]];
      truth[down] = td;
      pred[down] = pd;
      const t = truth[i];
      const te = (t ^ truth[i - 1]) | (t ^ truth[i + 1]) | (t ^ truth[i - width]) | (t ^ td);
      if (te !== 0) {
        fwd[i] = 0;
        if (t < k) listT[nT++] = i;
      } else {
        const up = fwd[i - width] + 1;
        fwd[i] = up < far ? up : far;
      }
      const p = pred[i];
      const pe = (p ^ pred[i - 1]) | (p ^ pred[i + 1]) | (p ^ pred[i - width]) | (p ^ pd);
      if (pe !== 0 && p < k && t < k) listP[nP++] = i;
    }
    scan.nT = nT;
    scan.nP = nP;
    const e = b + width - 1;
    truth[e] = table[truthIds[e]];
    pred[e] = table[predIds[e]];
    edgePixelChecked(truth, pred, width, height, width - 1, y, k, far, scan);
  }
  if (last) {
    scan.rowT[height] = scan.nT;
    scan.rowP[height] = scan.nP;
  }
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
