// Drill-down by class: every frame's score for one class (IoU, band IoU at the chosen width, or
// Boundary IoU) for the frame list's order, the per-frame plots and the jump to the class's worst
// region. Read from the frames' digests the page keeps; a results folder has no per-class frame scores.
import { digestBandScores } from '../core/metrics/frameDigest.ts';
import type { FrameCounts } from '../core/metrics/frameSummary.ts';
import type { FrameColumns } from './frameColumns.ts';
import type { StoredFrame } from './scoresSlice.ts';

/** The per-class measures the frame list can sort by. */
export const CLASS_MEASURES = ['iou', 'band', 'biou'] as const;
export type ClassMeasure = (typeof CLASS_MEASURES)[number];

/** Names of the measures on screen. */
export const CLASS_MEASURE_NAMES: Record<ClassMeasure, string> = { iou: 'IoU', band: 'band IoU', biou: 'Boundary IoU' };

/** The frame list sorted by one class's measure (the view's `frameClass`). */
export interface FrameClassSort {
  classId: number;
  measure: ClassMeasure;
}

/** Returns class `c`'s IoU in a frame from its K × (K+1) confusion: tp / (tp + fp + fn), null when the class is in neither map. */
export function classIoU(d: Pick<FrameCounts, 'classIds' | 'confusion'>, c: number): number | null {
  const k = d.classIds.length;
  const m = d.confusion;
  const tp = m[c * (k + 1) + c];
  let truth = 0, pred = 0;
  for (let p = 0; p <= k; p++) truth += m[c * (k + 1) + p];
  for (let g = 0; g < k; g++) pred += m[g * (k + 1) + c];
  const union = truth + pred - tp;
  return union > 0 ? tp / union : null;
}

/**
 * Returns every frame's `measure` of class `classId` for run `run` (ratio 0..1; NaN where the frame is
 * not scored, failed, or the class is in neither map — or, for Boundary IoU, has no boundary).
 * Band IoU is at width `w` px. One pass over the frames, O(K) per frame (O(K²) for IoU's column sum).
 */
export function classFrameColumn(results: readonly (StoredFrame | undefined)[], count: number, run: string | null, classId: number, measure: ClassMeasure, w: number): Float64Array {
  const out = new Float64Array(count).fill(NaN);
  if (!run) return out;
  for (let i = 0; i < count; i++) {
    const d = results[i]?.runs.find((r) => r.run === run)?.stats;
    if (!d || results[i]!.error) continue;
    const c = d.classIds.indexOf(classId);
    if (c < 0) continue;
    let v: number | null;
    if (measure === 'iou') v = classIoU(d, c);
    else if (measure === 'band') v = digestBandScores(d, w).iou[c];
    else v = d.biouUnion[c] > 0 ? d.biouInter[c] / d.biouUnion[c] : null;
    if (v !== null) out[i] = v;
  }
  return out;
}

/**
 * Returns every frame's `measure` of class `classId` for run `run` as classFrameColumn, IoU and
 * Boundary IoU from the page's score columns (every scored frame); band IoU needs a frame's full
 * counts, which the store holds for its last DETAIL_KEEP frames and the frame on screen only.
 */
export function classFrameColumnOf(
  columns: FrameColumns, results: readonly (StoredFrame | undefined)[], count: number, run: string | null, classId: number, measure: ClassMeasure, w: number,
): Float64Array {
  const col = run ? columns.runs[run]?.classes.get(classId) : undefined;
  if (measure === 'band' || !col) return classFrameColumn(results, count, run, classId, measure, w);
  const src = measure === 'iou' ? col.iou : col.biou;
  const out = new Float64Array(count).fill(NaN);
  out.set(src.subarray(0, Math.min(count, src.length)));
  return out;
}

/** Returns frame indices ordered by `column`, lowest (worst) first unless `worstFirst` is false, frames without a value last, ties in frame order. */
export function classFrameOrder(column: Float64Array, worstFirst: boolean): number[] {
  const sign = worstFirst ? 1 : -1;
  return Array.from({ length: column.length }, (_, i) => i).sort((a, b) => {
    const va = column[a], vb = column[b];
    const na = Number.isNaN(va), nb = Number.isNaN(vb);
    if (na || nb) return na === nb ? a - b : na ? 1 : -1;
    return (va - vb) * sign || a - b;
  });
}

/** Returns the box of run `run`'s first listed (worst) error region on a frame that involves class `classId`, or null. */
export function classWorstRegion(frame: StoredFrame | undefined, run: string | null, classId: number): [number, number, number, number] | null {
  const regions = frame?.runs.find((r) => r.run === run)?.regions?.regions ?? [];
  const r = regions.find((x) => x.truthClass === classId || x.predictedClass === classId);
  return r ? r.bbox : null;
}

/** Returns `bins` equal bins over 0..1 with the count of finite values in each (1 lands in the last bin). */
export function histogramOf(values: Float64Array, bins: number): number[] {
  const out = new Array<number>(bins).fill(0);
  for (const v of values) if (Number.isFinite(v)) out[Math.min(bins - 1, Math.max(0, Math.floor(v * bins)))]++;
  return out;
}
