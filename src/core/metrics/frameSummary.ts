import { BAND_BINS } from './bandHistogram.ts';
import type { FrameStats } from './frameScore.ts';

/** The per-frame numbers lists and timelines show; null where METRICS.md leaves a score undefined. */
export interface FrameSummary {
  meanIoU: number | null;
  pixelAccuracy: number | null;
  /** Mean IoU over valid pixels of Band(w). */
  bandIoU: number | null;
  boundaryIoU: number | null;
  boundaryF: number | null;
  /** Valid pixels (truth not void) where the prediction differs from the truth. */
  errorPixels: number;
  validPixels: number;
}

/**
 * Returns mean IoU (ratio 0..1, null if no class is defined) of a K × (K+1) confusion, counting the
 * invalid column as false negatives only (METRICS.md). `band`/`binEnd` restrict to bins < binEnd.
 */
function meanIoUOf(m: ArrayLike<number>, k: number, offset: number, bins: number, stride: number): { miou: number | null; correct: number; total: number } {
  let sum = 0;
  let defined = 0;
  let correct = 0;
  let total = 0;
  for (let c = 0; c < k; c++) {
    let tp = 0, row = 0, col = 0;
    for (let b = 0; b < bins; b++) {
      const base = offset + b * stride;
      tp += m[base + c * (k + 1) + c];
      for (let p = 0; p <= k; p++) row += m[base + c * (k + 1) + p];
      for (let g = 0; g < k; g++) col += m[base + g * (k + 1) + c];
    }
    correct += tp;
    total += row;
    const union = row + col - tp;
    if (union > 0) {
      sum += tp / union;
      defined++;
    }
  }
  return { miou: defined ? sum / defined : null, correct, total };
}

/**
 * Returns the Boundary F-score of class index `c` on one frame (Csurka et al., BMVC 2013):
 * F = 2PR/(P+R); 0 when one side has boundary pixels and the other none; null when neither has any.
 */
export function boundaryFOfClass(stats: FrameStats, c: number): number | null {
  const pt = stats.bfPredTotal[c], gt = stats.bfTruthTotal[c];
  if (pt === 0 && gt === 0) return null;
  const precision = pt ? stats.bfPredMatched[c] / pt : 0;
  const recall = gt ? stats.bfTruthMatched[c] / gt : 0;
  return precision + recall > 0 ? (2 * precision * recall) / (precision + recall) : 0;
}

/** Returns the frame's summary with the band at width `bandWidth` (0..64 pixels). */
export function frameSummary(stats: FrameStats, bandWidth: number): FrameSummary {
  const k = stats.classIds.length;
  const stride = k * (k + 1);
  const all = meanIoUOf(stats.confusion, k, 0, 1, stride);
  const w = Math.max(0, Math.min(BAND_BINS - 2, Math.round(bandWidth)));
  const band = meanIoUOf(stats.band, k, 0, w + 1, stride);
  let biouSum = 0, biouN = 0, bfSum = 0, bfN = 0;
  for (let c = 0; c < k; c++) {
    if (stats.biouUnion[c] > 0) {
      biouSum += stats.biouInter[c] / stats.biouUnion[c];
      biouN++;
    }
    const f = boundaryFOfClass(stats, c);
    if (f === null) continue;
    bfSum += f;
    bfN++;
  }
  return {
    meanIoU: all.miou,
    pixelAccuracy: all.total ? all.correct / all.total : null,
    bandIoU: band.miou,
    boundaryIoU: biouN ? biouSum / biouN : null,
    boundaryF: bfN ? bfSum / bfN : null,
    errorPixels: all.total - all.correct,
    validPixels: all.total,
  };
}
