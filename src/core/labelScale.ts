import type { LabelMap } from './labelMap.ts';
import { fail, ok, type Result } from './result.ts';

/** Largest whole factor a prediction is scaled up by (a model run at 1/2, 1/4 or 1/8 size is common practice). */
const FACTOR_MAX = 16;

/** Returns k when the truth is exactly k times the prediction's width and height (2 ≤ k ≤ 16), else 0. */
export function labelScaleFactor(truthW: number, truthH: number, predW: number, predH: number): number {
  if (predW <= 0 || predH <= 0 || truthW % predW !== 0 || truthH % predH !== 0) return 0;
  const k = truthW / predW;
  return k >= 2 && k <= FACTOR_MAX && truthH / predH === k ? k : 0;
}

/**
 * Returns the map scaled up k times by nearest neighbour (each pixel repeated k × k times), the usual
 * way to bring a prediction made at a lower resolution to the label's size.
 * Hot loop: one source row expanded once and copied k times, no allocation per pixel.
 */
export function labelMapUpscale<M extends LabelMap>(map: M, k: number): M {
  const { width, height, ids } = map;
  const w = width * k;
  const out = ids instanceof Uint16Array ? new Uint16Array(w * height * k) : new Uint8Array(w * height * k);
  for (let y = 0; y < height; y++) {
    const row = y * width;
    const o = y * k * w;
    for (let x = 0; x < width; x++) out.fill(ids[row + x], o + x * k, o + x * k + k);
    for (let r = 1; r < k; r++) out.copyWithin(o + r * w, o, o + w);
  }
  return { ...map, width: w, height: height * k, ids: out };
}

/**
 * Returns a prediction brought to the truth's size: as it is when sizes match, scaled up by nearest
 * neighbour when the truth is a whole multiple k of it (`factor` says k), else the sizes-differ error
 * naming both files.
 */
export function predictionFit<M extends LabelMap>(truth: { file: string; width: number; height: number }, pred: { file: string; map: M }): Result<{ map: M; factor: number }> {
  const { map } = pred;
  if (map.width === truth.width && map.height === truth.height) return ok({ map, factor: 1 });
  const k = labelScaleFactor(truth.width, truth.height, map.width, map.height);
  if (k) {
    const up = labelMapUpscale(map, k);
    // A map read through an id map keeps its stored ids beside the class ids; both are scaled alike.
    const stored = (map as { stored?: LabelMap['ids'] }).stored;
    if (stored) Object.assign(up, { stored: labelMapUpscale({ width: map.width, height: map.height, ids: stored }, k).ids });
    return ok({ map: up, factor: k });
  }
  return fail(
    pred.file,
    `is ${map.width}×${map.height} pixels but ${truth.file} is ${truth.width}×${truth.height}; a prediction must have the label's size or a whole fraction of it (1/2, 1/3, …, same in both directions)`,
  );
}

/** A photo's pixels with the name used in messages. */
interface PhotoIn {
  file: string;
  width: number;
  height: number;
  rgba: Uint8Array;
}

/**
 * Returns a photo brought to the label's size, and what was done to it (null when nothing was):
 * - the same size: as it is;
 * - k times the label's size (2 ≤ k ≤ 16, both directions; photos kept at full resolution beside labels
 *   made smaller is common practice): each k × k block averaged, rounded to nearest;
 * - 1/k of the label's size: each pixel repeated k × k times (nearest neighbour);
 * - anything else: the sizes-differ error naming both files.
 * Hot loops: per block row, channel sums in one Uint32Array; no allocation per pixel.
 */
export function photoFit(truth: { file: string; width: number; height: number }, photo: PhotoIn): Result<{ rgba: Uint8Array; note: string | null }> {
  const { width: tw, height: th } = truth;
  const { width: pw, height: ph, rgba } = photo;
  if (pw === tw && ph === th) return ok({ rgba, note: null });
  const down = labelScaleFactor(pw, ph, tw, th);
  if (down) {
    const out = new Uint8Array(tw * th * 4);
    const sums = new Uint32Array(tw * 4);
    const half = (down * down) >> 1;
    const area = down * down;
    for (let y = 0; y < th; y++) {
      sums.fill(0);
      for (let r = 0; r < down; r++) {
        const src = (y * down + r) * pw * 4;
        for (let x = 0, i = src; x < pw; x++, i += 4) {
          const s = ((x / down) | 0) * 4;
          sums[s] += rgba[i];
          sums[s + 1] += rgba[i + 1];
          sums[s + 2] += rgba[i + 2];
          sums[s + 3] += rgba[i + 3];
        }
      }
      const o = y * tw * 4;
      for (let j = 0; j < tw * 4; j++) out[o + j] = ((sums[j] + half) / area) | 0;
    }
    return ok({ rgba: out, note: `${photo.file}: averaged down ×${down} to the label's size` });
  }
  const up = labelScaleFactor(tw, th, pw, ph);
  if (up) {
    // Whole pixels as 32-bit words (the byte order does not matter: they are only copied).
    const words = rgba.byteOffset % 4 === 0 ? new Uint32Array(rgba.buffer, rgba.byteOffset, pw * ph) : new Uint32Array(rgba.slice().buffer);
    const big = new Uint32Array(tw * th);
    for (let y = 0; y < ph; y++) {
      const o = y * up * tw;
      for (let x = 0; x < pw; x++) big.fill(words[y * pw + x], o + x * up, o + x * up + up);
      for (let r = 1; r < up; r++) big.copyWithin(o + r * tw, o, o + tw);
    }
    return ok({ rgba: new Uint8Array(big.buffer), note: `${photo.file}: scaled up ×${up} to the label's size by nearest neighbour` });
  }
  return fail(
    photo.file,
    `is ${pw}×${ph} pixels but ${truth.file} is ${tw}×${th}; a photo must have the label's size, a whole multiple or a whole fraction of it (same in both directions)`,
  );
}
