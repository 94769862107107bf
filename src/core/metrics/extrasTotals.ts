import type { RunExtras } from '../frameExtras.ts';
import { instanceIoU, instanceCountsCreate } from '../objects/instanceIoU.ts';
import { objectTotalsAdd, objectTotalsCreate, objectTotalsMerge, objectTotalsReport, type ObjectClassBins, type ObjectTotals } from '../objects/objectTotals.ts';
import { OBJECT_SIZE_BINS, type ObjectSizeBin } from '../objects/objectsBySize.ts';
import { exactOf, exactValue } from '../results/exactSum.ts';
import { flipBackRate } from '../temporal/flipBack.ts';
import { flickerTotalsAdd, flickerTotalsCreate, flickerTotalsMerge, flickerTotalsReport, type FlickerTotals } from '../temporal/flickerTotals.ts';

/** One run's dataset sums of objects, flicker and instances (src/core/frameExtras.ts), by class id; additive. */
export interface ExtrasTotals {
  objects: ObjectTotals;
  flicker: FlickerTotals;
  /** Class id → instances, their pixels and their summed recall (exact sum terms); empty without instance maps. */
  instances: Map<number, { instances: number; pixels: number; recallSum: bigint }>;
}

/** The report keys these totals add to a run's `dataset` block (src/docs/metrics.md). */
export interface ExtrasReport {
  flipBack: number | null;
  flipBackVoid: number | null;
  flipBackPerClass: { id: number; value: number | null }[];
  objectsBySize: ObjectSizeBin[];
  objectsBySizePerClass: ObjectClassBins[];
  smallObjectRecall: number | null;
  /** Present only when instance maps were given. */
  iIoU?: { mean: number | null; perClass: { id: number; value: number | null }[] };
}

/** The keys a frame's report line gains: flip-back rates and small-object recall (ratios 0..1 or null). */
export interface ExtrasFrameLine {
  flipBack: number | null;
  flipBackVoid: number | null;
  smallObjectRecall: number | null;
}

/** Returns empty totals. */
export function extrasTotalsCreate(): ExtrasTotals {
  return { objects: objectTotalsCreate(), flicker: flickerTotalsCreate(), instances: new Map() };
}

/** Adds one frame's extras of one run, scored on `classIds`, and returns the totals. */
export function extrasTotalsAdd(t: ExtrasTotals, e: RunExtras, classIds: readonly number[]): ExtrasTotals {
  objectTotalsAdd(t.objects, e.objects.counts, classIds);
  if (e.flicker) flickerTotalsAdd(t.flicker, e.flicker, classIds);
  if (e.instances) {
    classIds.forEach((id, c) => {
      if (e.instances!.instances[c] === 0) return;
      const s = t.instances.get(id) ?? { instances: 0, pixels: 0, recallSum: 0n };
      s.instances += e.instances!.instances[c];
      s.pixels += e.instances!.pixels[c];
      s.recallSum += exactOf(e.instances!.recallSum[c]);
      t.instances.set(id, s);
    });
  }
  return t;
}

/** Adds totals `b` into `a` and returns `a`. */
export function extrasTotalsMerge(a: ExtrasTotals, b: ExtrasTotals): ExtrasTotals {
  objectTotalsMerge(a.objects, b.objects);
  flickerTotalsMerge(a.flicker, b.flicker);
  for (const [id, v] of b.instances) {
    const s = a.instances.get(id) ?? { instances: 0, pixels: 0, recallSum: 0n };
    s.instances += v.instances;
    s.pixels += v.pixels;
    s.recallSum += v.recallSum;
    a.instances.set(id, s);
  }
  return a;
}

/** Returns a frame line's extra keys from one run's extras (all null when there are none). */
export function extrasFrameLine(e: RunExtras | null | undefined): ExtrasFrameLine {
  return {
    flipBack: e?.flicker ? flipBackRate(e.flicker.flips, e.flicker.pixels) : null,
    flipBackVoid: e?.flicker ? flipBackRate(e.flicker.flipsVoid, e.flicker.pixelsVoid) : null,
    smallObjectRecall: e?.objects.smallRecall ?? null,
  };
}

/**
 * Returns the dataset keys over `classIds`. `falsePositives[c]` is class c's unweighted false
 * positives from the summed confusion (the report's perClass fp), which iIoU takes as they are.
 */
export function extrasTotalsReport(t: ExtrasTotals, classIds: readonly number[], falsePositives: ArrayLike<number>): ExtrasReport {
  const out: ExtrasReport = { ...flickerTotalsReport(t.flicker, classIds), ...objectTotalsReport(t.objects, classIds) };
  if (t.instances.size > 0) {
    const counts = instanceCountsCreate(classIds.length);
    classIds.forEach((id, c) => {
      const s = t.instances.get(id);
      if (!s) return;
      counts.instances[c] = s.instances;
      counts.pixels[c] = s.pixels;
      counts.recallSum[c] = exactValue(s.recallSum);
    });
    const r = instanceIoU(counts, falsePositives);
    out.iIoU = { mean: r.mean, perClass: classIds.map((id, c) => ({ id, value: r.perClass[c] })) };
  }
  return out;
}

/** The totals as summary.json stores them, by ascending class id; exact sums as decimal strings of 2^-60 units. */
export interface ExtrasTotalsJson {
  /** [class id, objects per bin, exact recall sum per bin, detected per bin]. */
  objects: [number, number[], string[], number[]][];
  flicker: { flips: number; pixels: number; flipsVoid: number; pixelsVoid: number; byClass: [number, number, number][] };
  /** [class id, instances, pixels, exact recall sum]. */
  instances: [number, number, number, string][];
}

const byId = <V>(m: Map<number, V>) => [...m].sort((a, b) => a[0] - b[0]);

/** Returns the totals as JSON data (the same whatever order frames were added in). */
export function extrasTotalsToJson(t: ExtrasTotals): ExtrasTotalsJson {
  const f = t.flicker;
  return {
    objects: byId(t.objects.byClass).map(([id, s]) => [id, Array.from(s.objects), s.recallSum.map(String), Array.from(s.detected)]),
    flicker: { flips: f.flips, pixels: f.pixels, flipsVoid: f.flipsVoid, pixelsVoid: f.pixelsVoid, byClass: byId(f.byClass).map(([id, s]) => [id, s.flips, s.pixels]) },
    instances: byId(t.instances).map(([id, s]) => [id, s.instances, s.pixels, s.recallSum.toString()]),
  };
}

/** Returns totals read back from JSON data; throws on malformed data (the caller names the file). */
export function extrasTotalsFromJson(j: ExtrasTotalsJson): ExtrasTotals {
  const t = extrasTotalsCreate();
  for (const [id, objects, recallSum, detected] of j.objects) {
    if (objects.length !== OBJECT_SIZE_BINS || recallSum.length !== OBJECT_SIZE_BINS || detected.length !== OBJECT_SIZE_BINS) {
      throw new Error(`extras: class ${id} has object counts of ${objects.length}, ${recallSum.length}, ${detected.length} bins, expected ${OBJECT_SIZE_BINS}`);
    }
    t.objects.byClass.set(id, { objects: Float64Array.from(objects), recallSum: recallSum.map((v) => BigInt(v)), detected: Float64Array.from(detected) });
  }
  const f = j.flicker;
  Object.assign(t.flicker, { flips: f.flips, pixels: f.pixels, flipsVoid: f.flipsVoid, pixelsVoid: f.pixelsVoid });
  for (const [id, flips, pixels] of f.byClass) t.flicker.byClass.set(id, { flips, pixels });
  for (const [id, instances, pixels, recallSum] of j.instances) t.instances.set(id, { instances, pixels, recallSum: BigInt(recallSum) });
  return t;
}
