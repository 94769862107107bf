import { exactOf, exactValue } from '../results/exactSum.ts';
import {
  OBJECT_SIZE_BINS, objectSizeBins, objectSizeCountsCreate, SMALL_OBJECT_AREA, OBJECT_SIZE_EDGES,
  type ObjectSizeBin, type ObjectSizeCounts,
} from './objectsBySize.ts';

/**
 * Dataset sums of object counts by class id (src/docs/metrics.md "Objects"), for class lists that
 * may differ between frames (a generated table scores the ids present in each frame). Additive: two
 * totals merge by adding, and recall sums are exact sums (src/core/results/exactSum.ts), so the
 * totals do not depend on the order frames finish in, and shards and merges are exact.
 */
export interface ObjectTotals {
  /** Class id → counts over the size bins (index = bin); recallSum in exact sum terms. */
  byClass: Map<number, { objects: Float64Array; recallSum: bigint[]; detected: Float64Array }>;
}

/** One class's bins in the report. */
export interface ObjectClassBins {
  id: number;
  bins: ObjectSizeBin[];
}

/** Returns empty totals. */
export function objectTotalsCreate(): ObjectTotals {
  return { byClass: new Map() };
}

function slot(t: ObjectTotals, id: number) {
  let s = t.byClass.get(id);
  if (!s) {
    s = { objects: new Float64Array(OBJECT_SIZE_BINS), recallSum: new Array<bigint>(OBJECT_SIZE_BINS).fill(0n), detected: new Float64Array(OBJECT_SIZE_BINS) };
    t.byClass.set(id, s);
  }
  return s;
}

/** Adds a frame's counts, whose class index c is the id `classIds[c]`, and returns the totals. */
export function objectTotalsAdd(t: ObjectTotals, counts: ObjectSizeCounts, classIds: readonly number[]): ObjectTotals {
  for (let c = 0; c < counts.k; c++) {
    const base = c * OBJECT_SIZE_BINS;
    let any = false;
    for (let b = 0; b < OBJECT_SIZE_BINS; b++) any ||= counts.objects[base + b] > 0;
    if (!any) continue;
    const s = slot(t, classIds[c]);
    for (let b = 0; b < OBJECT_SIZE_BINS; b++) {
      s.objects[b] += counts.objects[base + b];
      s.recallSum[b] += exactOf(counts.recallSum[base + b]);
      s.detected[b] += counts.detected[base + b];
    }
  }
  return t;
}

/** Adds totals `b` into `a` and returns `a`. */
export function objectTotalsMerge(a: ObjectTotals, b: ObjectTotals): ObjectTotals {
  for (const [id, v] of b.byClass) {
    const s = slot(a, id);
    for (let i = 0; i < OBJECT_SIZE_BINS; i++) {
      s.objects[i] += v.objects[i];
      s.recallSum[i] += v.recallSum[i];
      s.detected[i] += v.detected[i];
    }
  }
  return a;
}

/** Returns the counts over `classIds` (ascending) as one ObjectSizeCounts (a class with no objects gives zeros). */
function countsOf(t: ObjectTotals, classIds: readonly number[]): ObjectSizeCounts {
  const out = objectSizeCountsCreate(classIds.length);
  classIds.forEach((id, c) => {
    const s = t.byClass.get(id);
    if (!s) return;
    for (let b = 0; b < OBJECT_SIZE_BINS; b++) {
      out.objects[c * OBJECT_SIZE_BINS + b] = s.objects[b];
      out.recallSum[c * OBJECT_SIZE_BINS + b] = exactValue(s.recallSum[b]);
      out.detected[c * OBJECT_SIZE_BINS + b] = s.detected[b];
    }
  });
  return out;
}

/** Returns the report's object scores over `classIds`: all classes together, per class, and small-object recall. */
export function objectTotalsReport(t: ObjectTotals, classIds: readonly number[]): {
  objectsBySize: ObjectSizeBin[]; objectsBySizePerClass: ObjectClassBins[]; smallObjectRecall: number | null;
} {
  const counts = countsOf(t, classIds);
  const all = objectSizeBins(counts, null);
  let n = 0, sum = 0;
  for (let b = 0; b < OBJECT_SIZE_BINS && OBJECT_SIZE_EDGES[b] < SMALL_OBJECT_AREA; b++) {
    n += all[b].objects;
    sum += (all[b].meanRecall ?? 0) * all[b].objects;
  }
  return {
    objectsBySize: all,
    objectsBySizePerClass: classIds.map((id, c) => ({ id, bins: objectSizeBins(counts, c) })),
    smallObjectRecall: n > 0 ? sum / n : null,
  };
}
