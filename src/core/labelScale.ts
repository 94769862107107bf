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
