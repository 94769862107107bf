import { BAND_WIDTH_MAX } from './bandHistogram.ts';

/** Per-class counts and the IoU family of one confusion (ratios 0..1; null where undefined). */
export interface IoUFamily {
  perClass: { tp: number; fp: number; fn: number; iou: number | null; accuracy: number | null }[];
  pixelAccuracy: number | null;
  meanAccuracy: number | null;
  meanIoU: number | null;
  fwIoU: number | null;
}

/**
 * Returns the IoU family of a K × (K+1) confusion `m` starting at `offset` (Long, Shelhamer, Darrell,
 * FCN, CVPR 2015 §5): pixel accuracy Σn_ii/Σt_i, mean accuracy mean_i n_ii/t_i, mean IoU
 * mean_i n_ii/(t_i + Σ_j n_ji − n_ii), frequency-weighted IoU (Σt_k)⁻¹ Σ t_i·IoU_i. The invalid
 * column K adds to t_i (a false negative) and to no class's predictions. Means skip undefined classes.
 */
export function iouFamily(m: ArrayLike<number>, k: number, offset = 0): IoUFamily {
  const perClass: IoUFamily['perClass'] = [];
  let correct = 0, total = 0, accSum = 0, accN = 0, iouSum = 0, iouN = 0, fw = 0;
  for (let c = 0; c < k; c++) {
    let row = 0, col = 0;
    for (let p = 0; p <= k; p++) row += m[offset + c * (k + 1) + p];
    for (let g = 0; g < k; g++) col += m[offset + g * (k + 1) + c];
    const tp = m[offset + c * (k + 1) + c];
    const fn = row - tp;
    const fp = col - tp;
    const union = tp + fp + fn;
    const iou = union > 0 ? tp / union : null;
    const accuracy = row > 0 ? tp / row : null;
    perClass.push({ tp, fp, fn, iou, accuracy });
    correct += tp;
    total += row;
    if (accuracy !== null) {
      accSum += accuracy;
      accN++;
    }
    if (iou !== null) {
      iouSum += iou;
      iouN++;
      fw += row * iou;
    }
  }
  return {
    perClass,
    pixelAccuracy: total > 0 ? correct / total : null,
    meanAccuracy: accN ? accSum / accN : null,
    meanIoU: iouN ? iouSum / iouN : null,
    fwIoU: total > 0 ? fw / total : null,
  };
}

/**
 * Returns the confusion (K × (K+1), pixels) of Band(w) from a band histogram (BAND_BINS × K × (K+1)):
 * the sum of bins 0..w, i.e. the valid pixels with ceil(d) ≤ w, i.e. d ≤ w (src/docs/metrics.md). `w` is
 * clamped to 0..64.
 */
export function bandConfusionAt(band: ArrayLike<number>, k: number, w: number): Float64Array {
  const stride = k * (k + 1);
  const top = Math.max(0, Math.min(BAND_WIDTH_MAX, Math.floor(w)));
  const out = new Float64Array(stride);
  for (let b = 0; b <= top; b++) for (let i = 0; i < stride; i++) out[i] += band[b * stride + i];
  return out;
}

/** Returns the IoU family inside Band(w) (per-class band IoU in `perClass[c].iou`, ratios 0..1). */
export function bandScoresAt(band: ArrayLike<number>, k: number, w: number): IoUFamily {
  return iouFamily(bandConfusionAt(band, k, w), k);
}

/**
 * Returns the confusion of Band(w) for every width w = 0..64 from a band histogram (BAND_BINS × K ×
 * (K+1)): a running prefix sum over bins, so width w holds the pixels with ceil(d) ≤ w (src/docs/metrics.md).
 */
export function bandConfusions(band: ArrayLike<number>, k: number): Float64Array[] {
  const stride = k * (k + 1);
  const out: Float64Array[] = [];
  const acc = new Float64Array(stride);
  for (let b = 0; b <= BAND_WIDTH_MAX; b++) {
    for (let i = 0; i < stride; i++) acc[i] += band[b * stride + i];
    out.push(acc.slice());
  }
  return out;
}

/** Returns mean IoU and pixel accuracy (ratios 0..1, null where undefined) inside Band(w) for w = 0..64. */
export function bandCurve(band: ArrayLike<number>, k: number): { width: number; meanIoU: number | null; pixelAccuracy: number | null }[] {
  return bandConfusions(band, k).map((m, width) => {
    const f = iouFamily(m, k);
    return { width, meanIoU: f.meanIoU, pixelAccuracy: f.pixelAccuracy };
  });
}
