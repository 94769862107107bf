// The additive sums of one run over a set of frames, kept so that sums of shards scored apart equal
// the sums of one pass over every frame, number for number: pixel counts are whole numbers in
// Float64, and the per-frame means (frame-mean IoU, dataset BF) are exact sums (exactSum.ts).
import { datasetTotalsAdd, datasetTotalsCreate, datasetTotalsMerge, datasetTotalsWiden, type DatasetTotals } from '../metrics/datasetTotals.ts';
import {
  extrasTotalsAdd, extrasTotalsCreate, extrasTotalsFromJson, extrasTotalsMerge, extrasTotalsReport, extrasTotalsToJson, type ExtrasTotals, type ExtrasTotalsJson,
} from '../metrics/extrasTotals.ts';
import type { FrameStats } from '../metrics/frameScore.ts';
import type { RunExtras } from '../frameExtras.ts';
import { boundaryFOfClass, frameBoundaryF } from '../metrics/frameSummary.ts';
import { iouFamily } from '../metrics/iouFamily.ts';
import { scoreReport, type ScoreReport } from '../metrics/report.ts';
import type { ScoreSettings } from '../metrics/settings.ts';
import { fail, ok, type Result } from '../result.ts';
import { exactOf, exactValue } from './exactSum.ts';

/** Sums of one run: the dataset totals and the exact sums behind its two per-frame means. */
export interface RunSums {
  totals: DatasetTotals;
  meanIoU: bigint;
  boundaryF: bigint;
  /** Per class of totals.classIds: exact sum of the frames' BF of that class. */
  bfClass: bigint[];
  /** Flicker, object and instance sums (src/core/metrics/extrasTotals.ts). */
  extras: ExtrasTotals;
}

/** The sums as summary.json stores them: arrays of numbers, exact sums as decimal strings of 2^-60 units. */
export interface RunSumsJson {
  classIds: number[];
  frames: number;
  confusion: number[];
  band: number[];
  biouInter: number[];
  biouUnion: number[];
  bfClassSum: number[];
  bfClassCount: number[];
  frameMeanIoU: { sum: string; count: number };
  frameBoundaryF: { sum: string; count: number };
  /** Exact bfClassSum, per class. */
  bfClassExact: string[];
  extras: ExtrasTotalsJson;
}

/** Returns empty sums over `classIds`. */
export function runSumsCreate(classIds: readonly number[]): RunSums {
  return { totals: datasetTotalsCreate(classIds), meanIoU: 0n, boundaryF: 0n, bfClass: classIds.map(() => 0n), extras: extrasTotalsCreate() };
}

/**
 * Adds one scored frame and its extras (flicker, objects, instances; absent for a result without
 * them); with `widen` (no class table) ids not seen before are added first (throws past the class limit).
 */
export function runSumsAdd(s: RunSums, stats: FrameStats, widen: boolean, extras?: RunExtras | null): void {
  if (widen) {
    const w = runSumsWiden(s, stats.classIds);
    if (!w.ok) throw new Error(w.error);
  }
  datasetTotalsAdd(s.totals, stats);
  const at = new Map(s.totals.classIds.map((id, i) => [id, i]));
  stats.classIds.forEach((id, c) => {
    const f = boundaryFOfClass(stats, c);
    if (f !== null) s.bfClass[at.get(id)!] += exactOf(f);
  });
  s.totals.bfClassSum.set(s.bfClass.map(exactValue));
  const m = iouFamily(stats.confusion, stats.classIds.length).meanIoU;
  const f = frameBoundaryF(stats);
  if (m !== null) s.meanIoU += exactOf(m);
  if (f !== null) s.boundaryF += exactOf(f);
  if (extras) extrasTotalsAdd(s.extras, extras, stats.classIds);
}

/** Widens the sums to the ascending union of their class ids and `ids` (a dataset without a class table). */
function runSumsWiden(s: RunSums, ids: readonly number[]): Result<true> {
  const old = s.totals.classIds;
  const wide = datasetTotalsWiden(s.totals, ids);
  if (!wide.ok) return wide;
  s.totals = wide.value;
  if (s.totals.classIds.length === old.length) return ok(true);
  const was = new Map(old.map((id, i) => [id, s.bfClass[i]]));
  s.bfClass = s.totals.classIds.map((id) => was.get(id) ?? 0n);
  return ok(true);
}

/** Adds `from` into `into`; with `widen` the class lists are joined first, otherwise they must be equal. */
export function runSumsMerge(into: RunSums, from: RunSums, widen: boolean): Result<RunSums> {
  if (widen) {
    const a = runSumsWiden(into, from.totals.classIds);
    if (!a.ok) return a;
    const b = runSumsWiden(from, into.totals.classIds);
    if (!b.ok) return b;
  }
  const merged = datasetTotalsMerge(into.totals, from.totals);
  if (!merged.ok) return merged;
  const bfClass = into.bfClass.map((v, i) => v + from.bfClass[i]);
  merged.value.bfClassSum.set(bfClass.map(exactValue));
  return ok({ totals: merged.value, meanIoU: into.meanIoU + from.meanIoU, boundaryF: into.boundaryF + from.boundaryF, bfClass, extras: extrasTotalsMerge(into.extras, from.extras) });
}

/** Returns the report's `dataset` block of these sums (src/docs/metrics.md "What the scorer prints"). */
export function runSumsDataset(s: RunSums, settings: ScoreSettings): ScoreReport['dataset'] {
  const t = { ...s.totals, frameMeanIoUSum: exactValue(s.meanIoU), frameBFSum: exactValue(s.boundaryF) };
  const dataset = scoreReport([], settings, t, []).dataset;
  return Object.assign(dataset, extrasTotalsReport(s.extras, t.classIds, dataset.perClass.map((c) => c.fp)));
}

/** Returns the sums as JSON data. */
export function runSumsToJson(s: RunSums): RunSumsJson {
  const t = s.totals;
  return {
    classIds: [...t.classIds], frames: t.frames, confusion: Array.from(t.confusion), band: Array.from(t.band),
    biouInter: Array.from(t.biouInter), biouUnion: Array.from(t.biouUnion), bfClassSum: Array.from(t.bfClassSum), bfClassCount: Array.from(t.bfClassCount),
    frameMeanIoU: { sum: s.meanIoU.toString(), count: t.frameMeanIoUCount },
    frameBoundaryF: { sum: s.boundaryF.toString(), count: t.frameBFCount },
    bfClassExact: s.bfClass.map((v) => v.toString()),
    extras: extrasTotalsToJson(s.extras),
  };
}

/** Returns sums read back from JSON data, or what is wrong with it (`where` names the file). */
export function runSumsFromJson(j: RunSumsJson, where: string): Result<RunSums> {
  try {
    const totals = datasetTotalsCreate(j.classIds);
    const arrays = ['confusion', 'band', 'biouInter', 'biouUnion', 'bfClassSum', 'bfClassCount'] as const;
    for (const key of arrays) {
      if (!Array.isArray(j[key]) || j[key].length !== totals[key].length) {
        return fail(where, `sums "${key}" hold ${Array.isArray(j[key]) ? j[key].length : 'no'} numbers, expected ${totals[key].length}`);
      }
      totals[key].set(j[key]);
    }
    totals.frames = j.frames;
    totals.frameMeanIoUCount = j.frameMeanIoU.count;
    totals.frameBFCount = j.frameBoundaryF.count;
    const meanIoU = BigInt(j.frameMeanIoU.sum), boundaryF = BigInt(j.frameBoundaryF.sum);
    totals.frameMeanIoUSum = exactValue(meanIoU);
    totals.frameBFSum = exactValue(boundaryF);
    if (!Array.isArray(j.bfClassExact) || j.bfClassExact.length !== j.classIds.length) return fail(where, 'sums "bfClassExact" missing or of the wrong length');
    const bfClass = j.bfClassExact.map((v) => BigInt(v));
    if (!j.extras) return fail(where, 'sums "extras" missing (a results folder written before flicker and object scores; score it again)');
    return ok({ totals, meanIoU, boundaryF, bfClass, extras: extrasTotalsFromJson(j.extras) });
  } catch (e) {
    return fail(where, `unreadable sums (${(e as Error).message})`);
  }
}
