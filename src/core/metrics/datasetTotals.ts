import { CLASSES_MAX } from '../classTable.ts';
import { fail, ok, type Result } from '../result.ts';
import { BAND_BINS } from './bandHistogram.ts';
import type { FrameStats } from './frameScore.ts';
import { boundaryFOfClass, frameBoundaryF } from './frameSummary.ts';
import { iouFamily } from './iouFamily.ts';

/**
 * Dataset sums of frame counts (pixels), over a fixed class list. Float64 so sums pass 2^32; every
 * dataset score is computed from these sums (VOC convention), except the two per-frame means
 * src/docs/metrics.md defines (frame-mean IoU, dataset BF), kept as running sums.
 */
export interface DatasetTotals {
  classIds: number[];
  frames: number;
  confusion: Float64Array;
  band: Float64Array;
  biouInter: Float64Array;
  biouUnion: Float64Array;
  frameMeanIoUSum: number;
  frameMeanIoUCount: number;
  frameBFSum: number;
  frameBFCount: number;
  /** Per class: sum and count over frames of that frame's BF for the class (per-image averaging). */
  bfClassSum: Float64Array;
  bfClassCount: Float64Array;
}

/** Returns empty totals over `classIds` (ascending table ids). */
export function datasetTotalsCreate(classIds: readonly number[]): DatasetTotals {
  const k = classIds.length;
  return {
    classIds: [...classIds],
    frames: 0,
    confusion: new Float64Array(k * (k + 1)),
    band: new Float64Array(BAND_BINS * k * (k + 1)),
    biouInter: new Float64Array(k),
    biouUnion: new Float64Array(k),
    frameMeanIoUSum: 0,
    frameMeanIoUCount: 0,
    frameBFSum: 0,
    frameBFCount: 0,
    bfClassSum: new Float64Array(k),
    bfClassCount: new Float64Array(k),
  };
}

/**
 * Adds one frame's counts into `totals`. The frame may score a different class list (a generated
 * table scores the ids present in each frame): its rows and columns are mapped by id, and its
 * "invalid" column stays invalid. Ids the totals do not know are a programming error.
 */
export function datasetTotalsAdd(totals: DatasetTotals, stats: FrameStats): void {
  const K = totals.classIds.length;
  const k = stats.classIds.length;
  const index = new Map(totals.classIds.map((id, i) => [id, i]));
  const map = new Int32Array(k + 1);
  for (let c = 0; c < k; c++) {
    const at = index.get(stats.classIds[c]);
    if (at === undefined) throw new Error(`class id ${stats.classIds[c]} is not in the dataset's class list`);
    map[c] = at;
  }
  map[k] = K;
  const S = K * (K + 1);
  const s = k * (k + 1);
  for (let b = 0; b < BAND_BINS; b++) {
    for (let g = 0; g < k; g++) {
      const src = b * s + g * (k + 1);
      const dst = b * S + map[g] * (K + 1);
      for (let p = 0; p <= k; p++) {
        const v = stats.band[src + p];
        if (v) totals.band[dst + map[p]] += v;
      }
    }
  }
  for (let g = 0; g < k; g++) {
    for (let p = 0; p <= k; p++) totals.confusion[map[g] * (K + 1) + map[p]] += stats.confusion[g * (k + 1) + p];
    totals.biouInter[map[g]] += stats.biouInter[g];
    totals.biouUnion[map[g]] += stats.biouUnion[g];
    const f = boundaryFOfClass(stats, g);
    if (f !== null) {
      totals.bfClassSum[map[g]] += f;
      totals.bfClassCount[map[g]]++;
    }
  }
  const meanIoU = iouFamily(stats.confusion, k).meanIoU;
  const bf = frameBoundaryF(stats);
  totals.frames++;
  if (meanIoU !== null) {
    totals.frameMeanIoUSum += meanIoU;
    totals.frameMeanIoUCount++;
  }
  if (bf !== null) {
    totals.frameBFSum += bf;
    totals.frameBFCount++;
  }
}

/**
 * Adds the totals `from` into `into` (shards scored apart, e.g. on other threads or machines), or
 * returns why they cannot be merged: sums only mean something over the same class list.
 */
export function datasetTotalsMerge(into: DatasetTotals, from: DatasetTotals): Result<DatasetTotals> {
  if (into.classIds.join(',') !== from.classIds.join(',')) {
    return fail('', `cannot merge totals over classes [${from.classIds.join(', ')}] into totals over [${into.classIds.join(', ')}]`);
  }
  const arrays = ['confusion', 'band', 'biouInter', 'biouUnion', 'bfClassSum', 'bfClassCount'] as const;
  for (const key of arrays) {
    const a = into[key], b = from[key];
    for (let i = 0; i < a.length; i++) a[i] += b[i];
  }
  into.frames += from.frames;
  into.frameMeanIoUSum += from.frameMeanIoUSum;
  into.frameMeanIoUCount += from.frameMeanIoUCount;
  into.frameBFSum += from.frameBFSum;
  into.frameBFCount += from.frameBFCount;
  return ok(into);
}

/**
 * Returns totals over the ascending union of `totals.classIds` and `extraIds` holding the same sums
 * (rows and columns moved by id), for a dataset without a class table whose ids appear as frames
 * arrive; `totals` itself when no id is new. Fails, allocating nothing, when the union would pass
 * CLASSES_MAX (memory grows with the square of the class count).
 */
export function datasetTotalsWiden(totals: DatasetTotals, extraIds: readonly number[]): Result<DatasetTotals> {
  const known = new Set(totals.classIds);
  if (extraIds.every((id) => known.has(id))) return ok(totals);
  const ids = [...new Set([...totals.classIds, ...extraIds])].sort((a, b) => a - b);
  if (ids.length > CLASSES_MAX) {
    return fail('', `the dataset holds more than ${CLASSES_MAX} distinct ids (this frame would bring it to ${ids.length}) and has no classes.json; at most ${CLASSES_MAX} classes are scored (give a classes.json naming the classes)`);
  }
  const out = datasetTotalsCreate(ids);
  const K = ids.length, k = totals.classIds.length;
  const pos = new Map(ids.map((id, i) => [id, i]));
  const map = new Int32Array(k + 1);
  for (let c = 0; c < k; c++) map[c] = pos.get(totals.classIds[c])!;
  map[k] = K;
  for (let b = 0; b < BAND_BINS; b++) {
    for (let g = 0; g < k; g++) {
      for (let p = 0; p <= k; p++) out.band[b * K * (K + 1) + map[g] * (K + 1) + map[p]] = totals.band[b * k * (k + 1) + g * (k + 1) + p];
    }
  }
  for (let g = 0; g < k; g++) {
    for (let p = 0; p <= k; p++) out.confusion[map[g] * (K + 1) + map[p]] = totals.confusion[g * (k + 1) + p];
    out.biouInter[map[g]] = totals.biouInter[g];
    out.biouUnion[map[g]] = totals.biouUnion[g];
    out.bfClassSum[map[g]] = totals.bfClassSum[g];
    out.bfClassCount[map[g]] = totals.bfClassCount[g];
  }
  out.frames = totals.frames;
  out.frameMeanIoUSum = totals.frameMeanIoUSum;
  out.frameMeanIoUCount = totals.frameMeanIoUCount;
  out.frameBFSum = totals.frameBFSum;
  out.frameBFCount = totals.frameBFCount;
  return ok(out);
}
