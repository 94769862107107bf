import type { ClassInfo } from '../core/classTable.ts';
import type { DatasetTotals } from '../core/metrics/datasetTotals.ts';
import { digestBandScores, digestCurve, type FrameDigest } from '../core/metrics/frameDigest.ts';
import { boundaryFOfClass } from '../core/metrics/frameSummary.ts';
import { BAND_WIDTH_MAX } from '../core/metrics/bandHistogram.ts';
import { bandConfusions, iouFamily } from '../core/metrics/iouFamily.ts';

/** One row of the per-class table, for the dataset or a frame (ratios 0..1, null where undefined). */
export interface ClassRow {
  id: number;
  name: string;
  color: string;
  iou: number | null;
  bandIoU: number | null;
  boundaryIoU: number | null;
  boundaryF: number | null;
  /** Share of valid ground-truth pixels that are this class. */
  share: number | null;
}

/** Headline numbers of a scope (dataset or frame). */
export interface ScopeScores {
  meanIoU: number | null;
  pixelAccuracy: number | null;
  meanAccuracy: number | null;
  fwIoU: number | null;
  bandIoU: number | null;
  bandAccuracy: number | null;
  boundaryIoU: number | null;
  boundaryF: number | null;
  /** Dataset only: mean of per-frame mean IoU. */
  frameMeanIoU: number | null;
  rows: ClassRow[];
  /** K × (K+1) confusion (dataset sums or frame counts). */
  confusion: ArrayLike<number>;
  classIds: number[];
  /** Band curve, widths 0..BAND_WIDTH_MAX. */
  curve: { width: number; meanIoU: number | null; pixelAccuracy: number | null }[];
}

interface Counts {
  classIds: number[];
  confusion: ArrayLike<number>;
  biouInter: ArrayLike<number>;
  biouUnion: ArrayLike<number>;
  bfOf(c: number): number | null;
  /** Per-class IoU, mean IoU and pixel accuracy inside Band(w). */
  bandAt(w: number): { iou: (number | null)[]; meanIoU: number | null; pixelAccuracy: number | null };
  curve(): ScopeScores['curve'];
}

function scopeOf(c: Counts, classes: Map<number, ClassInfo>, w: number, frameMeanIoU: number | null, boundaryFMean: number | null): ScopeScores {
  const k = c.classIds.length;
  const all = iouFamily(c.confusion, k);
  const curve = c.curve();
  const bandW = c.bandAt(w);
  let valid = 0;
  for (const p of all.perClass) valid += p.tp + p.fn;
  let biouSum = 0, biouN = 0;
  const rows: ClassRow[] = c.classIds.map((id, i) => {
    const info = classes.get(id);
    const biou = c.biouUnion[i] > 0 ? c.biouInter[i] / c.biouUnion[i] : null;
    if (biou !== null) {
      biouSum += biou;
      biouN++;
    }
    return {
      id,
      name: info?.name ?? String(id),
      color: info?.color ?? '#888888',
      iou: all.perClass[i].iou,
      bandIoU: bandW.iou[i],
      boundaryIoU: biou,
      boundaryF: c.bfOf(i),
      share: valid > 0 ? (all.perClass[i].tp + all.perClass[i].fn) / valid : null,
    };
  });
  return {
    meanIoU: all.meanIoU,
    pixelAccuracy: all.pixelAccuracy,
    meanAccuracy: all.meanAccuracy,
    fwIoU: all.fwIoU,
    bandIoU: bandW.meanIoU,
    bandAccuracy: bandW.pixelAccuracy,
    boundaryIoU: biouN ? biouSum / biouN : null,
    boundaryF: boundaryFMean,
    frameMeanIoU,
    rows,
    confusion: c.confusion,
    classIds: c.classIds,
    curve,
  };
}

/** Returns the dataset's scores from its totals (src/docs/metrics.md: sums over frames; BF and frame mIoU per-frame means). */
export function datasetScope(t: DatasetTotals, classes: Map<number, ClassInfo>, w: number): ScopeScores {
  const k = t.classIds.length;
  const confs = bandConfusions(t.band, k);
  const fams = confs.map((m) => iouFamily(m, k));
  return scopeOf(
    {
      ...t,
      bfOf: (c) => (t.bfClassCount[c] > 0 ? t.bfClassSum[c] / t.bfClassCount[c] : null),
      bandAt: (width) => {
        const f = fams[Math.max(0, Math.min(BAND_WIDTH_MAX, Math.round(width)))];
        return { iou: f.perClass.map((p) => p.iou), meanIoU: f.meanIoU, pixelAccuracy: f.pixelAccuracy };
      },
      curve: () => fams.map((f, width) => ({ width, meanIoU: f.meanIoU, pixelAccuracy: f.pixelAccuracy })),
    },
    classes,
    w,
    t.frameMeanIoUCount ? t.frameMeanIoUSum / t.frameMeanIoUCount : null,
    t.frameBFCount ? t.frameBFSum / t.frameBFCount : null,
  );
}

/** Returns one frame's scores from its counts. */
export function frameScope(s: FrameDigest, classes: Map<number, ClassInfo>, w: number): ScopeScores {
  let sum = 0, n = 0;
  for (let c = 0; c < s.classIds.length; c++) {
    const f = boundaryFOfClass(s, c);
    if (f !== null) {
      sum += f;
      n++;
    }
  }
  return scopeOf(
    { ...s, bfOf: (c) => boundaryFOfClass(s, c), bandAt: (width) => digestBandScores(s, width), curve: () => digestCurve(s) },
    classes,
    w,
    null,
    n ? sum / n : null,
  );
}
