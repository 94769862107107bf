import type { LabelIds } from './labelMap.ts';

/**
 * Run ends over label maps, four pixels a step where that is possible: 8-bit ids whose buffer starts
 * on a 4-byte boundary are also read as 32-bit words, and a word equal to its id repeated 4 times is
 * 4 more pixels of the run. Label maps are mostly long runs of one id, so a run's end is found with
 * about a quarter of the compares. The answers are the pixel-by-pixel ones.
 */

/** Returns a 32-bit view of 8-bit `ids` starting on a 4-byte boundary, else null (then runs go pixel by pixel). */
export function idWords(ids: LabelIds): Uint32Array | null {
  return ids instanceof Uint8Array && ids.byteOffset % 4 === 0 ? new Uint32Array(ids.buffer, ids.byteOffset, ids.length >> 2) : null;
}

/**
 * Returns the first index from `j` on (below `n`) where ids[i] ≠ v, or n.
 * Hot loop: flat typed arrays, four pixels per compare on whole words.
 */
export function idRunEnd(ids: LabelIds, words: Uint32Array | null, j: number, n: number, v: number): number {
  if (words !== null) {
    const w = (v * 0x01010101) >>> 0;
    while (j < n && (j & 3) !== 0 && ids[j] === v) j++;
    if ((j & 3) === 0) while (j + 4 <= n && words[j >> 2] === w) j += 4;
  }
  while (j < n && ids[j] === v) j++;
  return j;
}

/**
 * Returns the first index from `j` on (below `n`) where t[i] ≠ a or p[i] ≠ b, or n.
 * Hot loop: flat typed arrays, four pixels per compare on whole words.
 */
export function idPairRunEnd(
  t: LabelIds, tw: Uint32Array | null, p: LabelIds, pw: Uint32Array | null, j: number, n: number, a: number, b: number,
): number {
  if (tw !== null && pw !== null) {
    const wa = (a * 0x01010101) >>> 0, wb = (b * 0x01010101) >>> 0;
    while (j < n && (j & 3) !== 0 && t[j] === a && p[j] === b) j++;
    if ((j & 3) === 0) while (j + 4 <= n && tw[j >> 2] === wa && pw[j >> 2] === wb) j += 4;
  }
  while (j < n && t[j] === a && p[j] === b) j++;
  return j;
}
