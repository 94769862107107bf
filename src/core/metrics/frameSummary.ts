import type { FrameStats } from './frameScore.ts';

/** The per-frame counts every score but the band needs (a frame's stats, or its compact digest). */
export type FrameCounts = Omit<FrameStats, 'band'>;
import { bandConfusionAt, iouFamily } from './iouFamily.ts';

/** The per-frame numbers lists and timelines show; null where src/docs/metrics.md leaves a score undefined. */
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
 * Returns the Boundary F-score (ratio 0..1) of class index `c` on one frame (Csurka et al., BMVC 2013):
 * F = 2PR/(P+R); 0 when one side has boundary pixels and the other none (src/docs/metrics.md), and 0 when
 * both have some but none matches, P = R = 0 (common practice: the limit of 2PR/(P+R)); null when
 * neither side has any.
 */
export function boundaryFOfClass(stats: FrameCounts, c: number): number | null {
  const pt = stats.bfPredTotal[c], gt = stats.bfTruthTotal[c];
  if (pt === 0 && gt === 0) return null;
  const precision = pt ? stats.bfPredMatched[c] / pt : 0;
  const recall = gt ? stats.bfTruthMatched[c] / gt : 0;
  return precision + recall > 0 ? (2 * precision * recall) / (precision + recall) : 0;
}

/** Returns the frame's Boundary IoU: mean over classes with a non-empty union (ratio 0..1), or null. */
export function frameBoundaryIoU(stats: FrameCounts): number | null {
  let sum = 0, n = 0;
  for (let c = 0; c < stats.classIds.length; c++) {
    if (stats.biouUnion[c] === 0) continue;
    sum += stats.biouInter[c] / stats.biouUnion[c];
    n++;
  }
  return n ? sum / n : null;
}

/** Returns the frame's Boundary F: mean over classes with a defined F (ratio 0..1), or null. */
export function frameBoundaryF(stats: FrameCounts): number | null {
  let sum = 0, n = 0;
  for (let c = 0; c < stats.classIds.length; c++) {
    const f = boundaryFOfClass(stats, c);
    if (f === null) continue;
    sum += f;
    n++;
  }
  return n ? sum / n : null;
}

/** Returns the summary of a frame's counts with the band's mean IoU already worked out (shared by stats and digests). */
export function frameSummaryOf(counts: FrameCounts, bandIoU: number | null): FrameSummary {
  const all = iouFamily(counts.confusion, counts.classIds.length);
  let valid = 0, correct = 0;
  for (const p of all.perClass) {
    valid += p.tp + p.fn;
    correct += p.tp;
  }
  return {
    meanIoU: all.meanIoU,
    pixelAccuracy: all.pixelAccuracy,
    bandIoU,
    boundaryIoU: frameBoundaryIoU(counts),
    boundaryF: frameBoundaryF(counts),
    errorPixels: valid - correct,
    validPixels: valid,
  };
}

/** Returns the frame's summary with the band at width `bandWidth` (0..64 pixels, rounded and clamped). */
export function frameSummary(stats: FrameStats, bandWidth: number): FrameSummary {
  const k = stats.classIds.length;
  return frameSummaryOf(stats, iouFamily(bandConfusionAt(stats.band, k, Math.round(bandWidth)), k).meanIoU);
}
