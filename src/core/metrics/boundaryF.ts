import { coarseSquareAny, COARSE_ROWS, COARSE_SHIFT, diskBitsAny, diskHalfWidths } from './diskBits.ts';
import type { EdgeScan } from './edgeRows.ts';

/** Reusable buffers for boundaryFCounts; they grow to the largest frame and class count seen. */
export interface BoundaryFWork {
  slot: Int32Array;
  /** Per class present: one bit per pixel of its boundary pixels, and the coarse OR of every 8 rows. */
  bitsT: Uint32Array; bitsP: Uint32Array;
  coarseT: Uint32Array; coarseP: Uint32Array;
  halfR2: number; half: Int32Array;
}

/** Returns empty Boundary F buffers (they are sized on first use). */
export function boundaryFWorkCreate(): BoundaryFWork {
  const none = new Int32Array(0);
  const empty = new Uint32Array(0);
  return { slot: none, bitsT: empty, bitsP: empty, coarseT: empty, coarseP: empty, halfR2: -1, half: none };
}

/** Per-class Boundary F counts of one frame (pixels): matched and total boundary pixels of P and of G. */
export interface BoundaryFCounts { predMatched: Uint32Array; predTotal: Uint32Array; truthMatched: Uint32Array; truthTotal: Uint32Array }

function workFit(work: BoundaryFWork, k: number, planes: number, coarse: number): void {
  if (work.slot.length < k) work.slot = new Int32Array(k);
  if (work.bitsT.length < planes) {
    work.bitsT = new Uint32Array(planes);
    work.bitsP = new Uint32Array(planes);
  }
  if (work.coarseT.length < coarse) {
    work.coarseT = new Uint32Array(coarse);
    work.coarseP = new Uint32Array(coarse);
  }
}

/** Disk rows tried before the coarse test: |dy| ≤ 3 finds most matches of a boundary a few pixels off. */
const NEAR_STEPS = 7;

/**
 * Returns true when the plane at `slot` holds a bit within the disk around (x, y): near rows first,
 * then, unless the coarse plane rules the whole square out, the remaining rows.
 */
function diskHit(
  bits: Uint32Array, coarse: Uint32Array, slot: number, plane: number, coarsePlane: number,
  wordsPerRow: number, width: number, height: number, x: number, y: number, half: Int32Array,
): boolean {
  const steps = 2 * half.length - 1;
  const near = steps < NEAR_STEPS ? steps : NEAR_STEPS;
  if (diskBitsAny(bits, slot * plane, wordsPerRow, width, height, x, y, half, 0, near)) return true;
  if (near === steps) return false;
  if (!coarseSquareAny(coarse, slot * coarsePlane, wordsPerRow, width, height, x, y, half.length - 1)) return false;
  return diskBitsAny(bits, slot * plane, wordsPerRow, width, height, x, y, half, near, steps);
}

/**
 * Adds one frame's Boundary F counts (Csurka, Larlus, Perronnin, BMVC 2013; src/docs/metrics.md) to `out`.
 * `scan.listT` holds the pixels of ∂G (each in ∂G of its truth class), `scan.listP` those of ∂P
 * (each in ∂P of its predicted class; void truth already left out), both row by row. A boundary
 * pixel is matched when one of the other side's same-class boundary pixels lies within squared
 * distance `r2` (pixels², from squaredDistanceLimit). Each side's boundary pixels go into one bit
 * plane per class present, and each query scans the disk's rows in those bits, nearest rows first,
 * with a coarse plane (OR of 8 rows) to dismiss pixels that have no match anywhere near.
 * `truthDist2` (squared distance to the truth boundary, exact up to r2, or null) answers precision
 * for a ∂P_c pixel whose truth is also c: its nearest truth-boundary pixel lies in ∂G_c, because
 * the open disk up to it holds no boundary pixel, so it has one value, c.
 * Hot loops: flat typed arrays, no allocation or division per pixel.
 */
export function boundaryFCounts(
  truth: Uint16Array, pred: Uint16Array, scan: EdgeScan, truthDist2: Uint16Array | null,
  width: number, height: number, k: number, r2: number, work: BoundaryFWork, out: BoundaryFCounts,
): void {
  const wordsPerRow = (width + 31) >> 5;
  const plane = wordsPerRow * height;
  const coarsePlane = wordsPerRow * Math.ceil(height / COARSE_ROWS);
  const { listT, listP, rowT, rowP, nT, nP } = scan;
  workFit(work, k, 0, 0);
  const slot = work.slot;
  slot.fill(-1, 0, k);
  let slots = 0;
  for (let j = 0; j < nT; j++) {
    const c = truth[listT[j]];
    if (slot[c] < 0) slot[c] = slots++;
    out.truthTotal[c]++;
  }
  for (let j = 0; j < nP; j++) {
    const c = pred[listP[j]];
    if (slot[c] < 0) slot[c] = slots++;
    out.predTotal[c]++;
  }
  workFit(work, k, slots * plane, slots * coarsePlane);
  const { bitsT, bitsP, coarseT, coarseP } = work;
  if (work.halfR2 !== r2) {
    work.half = diskHalfWidths(r2);
    work.halfR2 = r2;
  }
  const half = work.half;
  bitsWrite(bitsT, coarseT, listT, rowT, height, truth, slot, plane, coarsePlane, width, wordsPerRow);
  bitsWrite(bitsP, coarseP, listP, rowP, height, pred, slot, plane, coarsePlane, width, wordsPerRow);
  for (let y = 0; y < height; y++) {
    const o = y * width;
    for (let j = rowP[y], end = rowP[y + 1]; j < end; j++) {
      const i = listP[j];
      const c = pred[i];
      if (out.truthTotal[c] === 0) continue;
      const hit = truthDist2 !== null && truth[i] === c
        ? truthDist2[i] <= r2
        : diskHit(bitsT, coarseT, slot[c], plane, coarsePlane, wordsPerRow, width, height, i - o, y, half);
      if (hit) out.predMatched[c]++;
    }
    for (let j = rowT[y], end = rowT[y + 1]; j < end; j++) {
      const i = listT[j];
      const c = truth[i];
      if (out.predTotal[c] === 0) continue;
      if (diskHit(bitsP, coarseP, slot[c], plane, coarsePlane, wordsPerRow, width, height, i - o, y, half)) out.truthMatched[c]++;
    }
  }
  // Leave the planes clean for the next frame (a native fill of the used planes beats scattered writes).
  bitsT.fill(0, 0, slots * plane);
  bitsP.fill(0, 0, slots * plane);
  coarseT.fill(0, 0, slots * coarsePlane);
  coarseP.fill(0, 0, slots * coarsePlane);
}

/** Sets the bits of the listed pixels in their class planes and coarse planes. */
function bitsWrite(
  bits: Uint32Array, coarse: Uint32Array, list: Int32Array, rows: Int32Array, height: number, codes: Uint16Array,
  slot: Int32Array, plane: number, coarsePlane: number, width: number, wordsPerRow: number,
): void {
  for (let y = 0; y < height; y++) {
    const o = y * width;
    const rowWord = y * wordsPerRow;
    const coarseWord = (y >> COARSE_SHIFT) * wordsPerRow;
    for (let j = rows[y], end = rows[y + 1]; j < end; j++) {
      const i = list[j];
      const x = i - o;
      const s = slot[codes[i]];
      const bit = 1 << (x & 31);
      bits[s * plane + rowWord + (x >> 5)] |= bit;
      coarse[s * coarsePlane + coarseWord + (x >> 5)] |= bit;
    }
  }
}
