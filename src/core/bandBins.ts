import type { LabelMap } from './labelMap.ts';
import { BAND_BINS, BAND_WIDTH_MAX } from './metrics/bandHistogram.ts';
import { distanceSquaredCapped, distanceWorkCreate } from './metrics/distanceCapped.ts';
import { edgeMark } from './metrics/edgeMark.ts';

/**
 * Returns per pixel min(ceil(d), 65) with d the Euclidean distance (pixels) to the nearest
 * ground-truth boundary pixel (src/docs/metrics.md; void counts as a value), so `bins[i] ≤ w` means the pixel
 * is in Band(w). Uses the same boundary marking and capped transform as the scorer.
 */
export function truthBandBins(truth: LabelMap): Uint8Array {
  const { width, height } = truth;
  const n = width * height;
  const codes = truth.ids instanceof Uint16Array ? truth.ids : Uint16Array.from(truth.ids);
  const edges = new Uint8Array(n);
  edgeMark(codes, width, height, edges);
  const dist2 = new Uint16Array(n);
  distanceSquaredCapped(edges, width, height, BAND_WIDTH_MAX, dist2, distanceWorkCreate(width));
  const lut = new Uint8Array(BAND_WIDTH_MAX * BAND_WIDTH_MAX + 2);
  for (let s = 0; s < lut.length; s++) lut[s] = Math.min(Math.ceil(Math.sqrt(s)), BAND_BINS - 1);
  const bins = new Uint8Array(n);
  // Hot loop: one table look-up per pixel.
  for (let i = 0; i < n; i++) bins[i] = lut[dist2[i]];
  return bins;
}
