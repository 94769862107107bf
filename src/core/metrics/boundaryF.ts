import { diskBitsAny, diskHalfWidths } from './diskBits.ts';

/** Reusable buffers for boundaryFCounts; they grow to the largest frame and class count seen. */
export interface BoundaryFWork {
  slot: Int32Array;
  bitsT: Uint32Array; bitsP: Uint32Array;
  halfR2: number; half: Int32Array;
}

/** Returns empty Boundary F buffers (they are sized on first use). */
export function boundaryFWorkCreate(): BoundaryFWork {
  const none = new Int32Array(0);
  return { slot: none, bitsT: new Uint32Array(0), bitsP: new Uint32Array(0), halfR2: -1, half: none };
}

/** Per-class Boundary F counts of one frame (pixels): matched and total boundary pixels of P and of G. */
export interface BoundaryFCounts { predMatched: Uint32Array; predTotal: Uint32Array; truthMatched: Uint32Array; truthTotal: Uint32Array }

function workFit(work: BoundaryFWork, k: number, planes: number): void {
  if (work.slot.length < k) work.slot = new Int32Array(k);
  if (work.bitsT.length < planes) {
    work.bitsT = new Uint32Array(planes);
    work.bitsP = new Uint32Array(planes);
  }
}

/**
 * Adds one frame's Boundary F counts (Csurka, Larlus, Perronnin, BMVC 2013; METRICS.md) to `out`.
 * `listT` holds the nT pixels of ∂G (each in ∂G of its truth class), `listP` the nP pixels of ∂P
 * (each in ∂P of its predicted class; void truth already left out). A boundary pixel is matched when one of the other side's
 * same-class boundary pixels lies within squared distance `r2` (pixels², from squaredDistanceLimit).
 * Each side's boundary pixels go into one bit plane per class, and each query scans the disk's
 * rows in those bits. `truthDist2` (squared distance to the truth boundary, exact up to r2, or null)
 * answers precision for a ∂P_c pixel whose truth is also c: its nearest truth-boundary pixel lies in
 * ∂G_c, because the open disk up to it holds no boundary pixel, so it has one value, c.
 * Hot loops: flat typed arrays, no allocation per pixel.
 */
export function boundaryFCounts(
  truth: Uint16Array, pred: Uint16Array, listT: Int32Array, nT: number, listP: Int32Array, nP: number,
  truthDist2: Uint16Array | null, width: number, height: number, k: number, r2: number,
  work: BoundaryFWork, out: BoundaryFCounts,
): void {
  const wordsPerRow = (width + 31) >> 5;
  const plane = wordsPerRow * height;
  workFit(work, k, 0);
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
  workFit(work, k, slots * plane);
  const { bitsT, bitsP } = work;
  bitsSet(bitsT, listT, nT, truth, slot, plane, width, wordsPerRow);
  bitsSet(bitsP, listP, nP, pred, slot, plane, width, wordsPerRow);
  if (work.halfR2 !== r2) {
    work.half = diskHalfWidths(r2);
    work.halfR2 = r2;
  }
  const half = work.half;
  for (let j = 0; j < nP; j++) {
    const i = listP[j];
    const c = pred[i];
    if (out.truthTotal[c] === 0) continue;
    let hit: boolean;
    if (truthDist2 !== null && truth[i] === c) hit = truthDist2[i] <= r2;
    else {
      const y = (i / width) | 0;
      hit = diskBitsAny(bitsT, slot[c] * plane, wordsPerRow, width, height, i - y * width, y, half);
    }
    if (hit) out.predMatched[c]++;
  }
  for (let j = 0; j < nT; j++) {
    const i = listT[j];
    const c = truth[i];
    if (out.predTotal[c] === 0) continue;
    const y = (i / width) | 0;
    if (diskBitsAny(bitsP, slot[c] * plane, wordsPerRow, width, height, i - y * width, y, half)) out.truthMatched[c]++;
  }
  bitsClear(bitsT, listT, nT, truth, slot, plane, width, wordsPerRow);
  bitsClear(bitsP, listP, nP, pred, slot, plane, width, wordsPerRow);
}

function bitsSet(
  bits: Uint32Array, list: Int32Array, count: number, codes: Uint16Array, slot: Int32Array,
  plane: number, width: number, wordsPerRow: number,
): void {
  for (let j = 0; j < count; j++) {
    const i = list[j];
    const y = (i / width) | 0;
    const x = i - y * width;
    bits[slot[codes[i]] * plane + y * wordsPerRow + (x >> 5)] |= 1 << (x & 31);
  }
}

/** Zeroes only the words that were set, so the planes are clean for the next frame at no full-fill cost. */
function bitsClear(
  bits: Uint32Array, list: Int32Array, count: number, codes: Uint16Array, slot: Int32Array,
  plane: number, width: number, wordsPerRow: number,
): void {
  for (let j = 0; j < count; j++) {
    const i = list[j];
    const y = (i / width) | 0;
    bits[slot[codes[i]] * plane + y * wordsPerRow + ((i - y * width) >> 5)] = 0;
  }
}
