import { datasetTotalsAdd, datasetTotalsCreate, type DatasetTotals } from './datasetTotals.ts';
import type { FrameStats } from './frameScore.ts';
import type { FrameCounts } from './frameSummary.ts';
import { frameBoundaryF, frameBoundaryIoU } from './frameSummary.ts';
import { bandCurve, iouFamily } from './iouFamily.ts';
import type { ScoreSettings } from './settings.ts';
import type { ExtrasReport } from './extrasTotals.ts';

/** The scorer's JSON report, keys and meaning exactly as src/docs/metrics.md "What the scorer prints". */
export interface ScoreReport {
  classes: { id: number; name: string }[];
  settings: { ignore: number; biouDilationRatio: number; bfTolerance: number };
  dataset: {
    pixelAccuracy: number | null;
    meanAccuracy: number | null;
    meanIoU: number | null;
    fwIoU: number | null;
    frameMeanIoU: number | null;
    perClass: { id: number; iou: number | null; tp: number; fp: number; fn: number }[];
    band: { width: number; meanIoU: number | null; pixelAccuracy: number | null }[];
    boundaryIoU: { mean: number | null; perClass: { id: number; value: number | null }[] };
    boundaryF: { mean: number | null };
  } & Partial<ExtrasReport>;
  frames: ReportFrameLine[];
}

/** One frame's line in the report: scores (ratios 0..1) or, when it failed, null scores and the message. */
export interface ReportFrameLine {
  name: string;
  meanIoU: number | null;
  pixelAccuracy: number | null;
  boundaryIoU: number | null;
  boundaryF: number | null;
  error: string | null;
  /** Flicker and small-object recall (src/core/metrics/extrasTotals.ts), where the scorer computed them. */
  flipBack?: number | null;
  flipBackVoid?: number | null;
  smallObjectRecall?: number | null;
}

/** Returns a frame's report line from its counts, or a failed line carrying `error`. */
export function reportFrameLine(name: string, stats: FrameCounts | null, error: string | null = null): ReportFrameLine {
  if (!stats || error !== null) {
    return { name, meanIoU: null, pixelAccuracy: null, boundaryIoU: null, boundaryF: null, error: error ?? 'not scored' };
  }
  const f = iouFamily(stats.confusion, stats.classIds.length);
  return {
    name,
    meanIoU: f.meanIoU,
    pixelAccuracy: f.pixelAccuracy,
    boundaryIoU: frameBoundaryIoU(stats),
    boundaryF: frameBoundaryF(stats),
    error: null,
  };
}

/**
 * Returns the report object for dataset `totals` (sums over the frames that scored) and the frame
 * lines in the order given. Class names come from `classes` by id (the number when a class is not
 * listed). Dataset scores use the summed confusion (VOC convention); Boundary IoU sums intersections
 * and unions per class; frame-mean IoU and Boundary F are means over frames where they are defined.
 */
export function scoreReport(
  classes: readonly { id: number; name: string }[], settings: ScoreSettings, totals: DatasetTotals, frames: ReportFrameLine[],
): ScoreReport {
  const k = totals.classIds.length;
  const names = new Map(classes.map((c) => [c.id, c.name]));
  const all = iouFamily(totals.confusion, k);
  let biouSum = 0, biouN = 0;
  const biouPerClass = totals.classIds.map((id, c) => {
    const value = totals.biouUnion[c] > 0 ? totals.biouInter[c] / totals.biouUnion[c] : null;
    if (value !== null) {
      biouSum += value;
      biouN++;
    }
    return { id, value };
  });
  return {
    classes: totals.classIds.map((id) => ({ id, name: names.get(id) ?? String(id) })),
    settings: { ignore: settings.ignore, biouDilationRatio: settings.biouDilationRatio, bfTolerance: settings.bfTolerance },
    dataset: {
      pixelAccuracy: all.pixelAccuracy,
      meanAccuracy: all.meanAccuracy,
      meanIoU: all.meanIoU,
      fwIoU: all.fwIoU,
      frameMeanIoU: totals.frameMeanIoUCount ? totals.frameMeanIoUSum / totals.frameMeanIoUCount : null,
      perClass: totals.classIds.map((id, c) => {
        const p = all.perClass[c];
        return { id, iou: p.iou, tp: p.tp, fp: p.fp, fn: p.fn };
      }),
      band: bandCurve(totals.band, k),
      boundaryIoU: { mean: biouN ? biouSum / biouN : null, perClass: biouPerClass },
      boundaryF: { mean: totals.frameBFCount ? totals.frameBFSum / totals.frameBFCount : null },
    },
    frames: frames.map((f) => ({ ...f })),
  };
}

/** One scored (or failed) frame, as frameScore's caller holds it. */
export interface ReportFrameInput {
  name: string;
  stats: FrameStats | null;
  error: string | null;
}

/**
 * Returns the report over `frames` scored on the class ids `classIds`: frames with an error (or no
 * counts) get a failed line and are left out of every dataset sum; the others are summed in order.
 */
export function scoreReportOfFrames(
  classes: readonly { id: number; name: string }[], classIds: readonly number[], settings: ScoreSettings,
  frames: readonly ReportFrameInput[],
): ScoreReport {
  const totals = datasetTotalsCreate(classIds);
  const lines = frames.map((f) => {
    if (f.stats && f.error === null) datasetTotalsAdd(totals, f.stats);
    return reportFrameLine(f.name, f.stats, f.error);
  });
  return scoreReport(classes, settings, totals, lines);
}
