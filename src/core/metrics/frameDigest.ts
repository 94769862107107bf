import { BAND_WIDTH_MAX } from './bandHistogram.ts';
import type { FrameStats } from './frameScore.ts';
import { frameSummaryOf, type FrameCounts, type FrameSummary } from './frameSummary.ts';

/**
 * A frame's counts as a long-lived list keeps them: everything but the band histogram, which is
 * reduced to what per-frame band scores need — per width w = 0..64 and class, the cumulative true
 * positives, ground-truth pixels and predicted pixels in Band(w). About a fifth of the histogram's
 * size at 12 classes, so 10 000 frames stay within a flat budget; the full histogram goes into the
 * dataset totals when the frame arrives.
 */
export interface FrameDigest extends FrameCounts {
  /** (BAND_WIDTH_MAX + 1) × K × 3: [tp, truth, pred] per width and class. */
  bandClass: Uint32Array;
}

/** Returns the digest of a frame's stats (the stats are not changed). */
export function frameDigestOf(stats: FrameStats): FrameDigest {
  const k = stats.classIds.length;
  const stride = k * (k + 1);
  const out = new Uint32Array((BAND_WIDTH_MAX + 1) * k * 3);
  const acc = new Float64Array(k * 3);
  for (let b = 0; b <= BAND_WIDTH_MAX; b++) {
    const base = b * stride;
    for (let g = 0; g < k; g++) {
      const row = base + g * (k + 1);
      acc[g * 3] += stats.band[row + g];
      for (let p = 0; p <= k; p++) {
        const v = stats.band[row + p];
        acc[g * 3 + 1] += v;
        if (p < k) acc[p * 3 + 2] += v;
      }
    }
    out.set(acc, b * k * 3);
  }
  const { band: _band, ...counts } = stats;
  void _band;
  return { ...counts, bandClass: out };
}

/** Returns per-class IoU in Band(w) and the band's mean IoU and pixel accuracy (ratios 0..1, null if undefined). */
export function digestBandScores(d: FrameDigest, w: number): { iou: (number | null)[]; meanIoU: number | null; pixelAccuracy: number | null } {
  const k = d.classIds.length;
  const at = Math.max(0, Math.min(BAND_WIDTH_MAX, Math.round(w))) * k * 3;
  const iou: (number | null)[] = [];
  let sum = 0, n = 0, tpAll = 0, truthAll = 0;
  for (let c = 0; c < k; c++) {
    const tp = d.bandClass[at + c * 3], truth = d.bandClass[at + c * 3 + 1], pred = d.bandClass[at + c * 3 + 2];
    const union = truth + pred - tp;
    const v = union > 0 ? tp / union : null;
    iou.push(v);
    if (v !== null) {
      sum += v;
      n++;
    }
    tpAll += tp;
    truthAll += truth;
  }
  return { iou, meanIoU: n ? sum / n : null, pixelAccuracy: truthAll ? tpAll / truthAll : null };
}

/** Returns the frame summary (as frameSummary) from a digest. */
export function digestSummary(d: FrameDigest, bandWidth: number): FrameSummary {
  return frameSummaryOf(d, digestBandScores(d, bandWidth).meanIoU);
}

/** Returns the frame's band curve: mean IoU and pixel accuracy in Band(w) for w = 0..64. */
export function digestCurve(d: FrameDigest): { width: number; meanIoU: number | null; pixelAccuracy: number | null }[] {
  return Array.from({ length: BAND_WIDTH_MAX + 1 }, (_, width) => {
    const s = digestBandScores(d, width);
    return { width, meanIoU: s.meanIoU, pixelAccuracy: s.pixelAccuracy };
  });
}
