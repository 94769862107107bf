import type { TruthObjects } from './truthObjects.ts';

/**
 * Object recall by object size (src/docs/metrics.md "Objects"). Bins of area in pixels:
 * [1,16), [16,64), [64,256), [256,1024), [1024,4096), [4096,∞). Counts are additive over frames,
 * shards and merges: objects, summed recall and objects detected (recall ≥ 0.5) per bin and class.
 */
export const OBJECT_SIZE_EDGES = [1, 16, 64, 256, 1024, 4096] as const;
export const OBJECT_SIZE_BINS = OBJECT_SIZE_EDGES.length;
/** An object counts as detected when at least this share of its pixels is predicted as its class. */
export const OBJECT_DETECTED_RECALL = 0.5;
/** Objects smaller than this many pixels are "small" (a frame's small-object recall). */
export const SMALL_OBJECT_AREA = 1024;

/** Additive object counts: index `c * OBJECT_SIZE_BINS + bin` for class index c. */
export interface ObjectSizeCounts {
  k: number;
  objects: Uint32Array;
  /** Sum of the objects' recalls (ratios 0..1). */
  recallSum: Float64Array;
  detected: Uint32Array;
}

/** One size bin of the report: `maxArea` is exclusive and null for the last bin; ratios 0..1 or null. */
export interface ObjectSizeBin {
  minArea: number;
  maxArea: number | null;
  objects: number;
  meanRecall: number | null;
  detected: number | null;
}

/** Returns the size bin (0..OBJECT_SIZE_BINS-1) of an object of `area` pixels (area ≥ 1). */
export function objectSizeBin(area: number): number {
  let b = 0;
  while (b + 1 < OBJECT_SIZE_BINS && area >= OBJECT_SIZE_EDGES[b + 1]) b++;
  return b;
}

/** Returns zeroed counts for `k` classes. */
export function objectSizeCountsCreate(k: number): ObjectSizeCounts {
  const cells = k * OBJECT_SIZE_BINS;
  return { k, objects: new Uint32Array(cells), recallSum: new Float64Array(cells), detected: new Uint32Array(cells) };
}

/** Adds a frame's objects to `out` and returns it. */
export function objectSizeCountsAdd(out: ObjectSizeCounts, objects: TruthObjects): ObjectSizeCounts {
  for (let o = 0; o < objects.count; o++) {
    const cell = objects.classIndex[o] * OBJECT_SIZE_BINS + objectSizeBin(objects.area[o]);
    const recall = objects.hits[o] / objects.area[o];
    out.objects[cell]++;
    out.recallSum[cell] += recall;
    if (recall >= OBJECT_DETECTED_RECALL) out.detected[cell]++;
  }
  return out;
}

/** Adds counts `b` into `a` (same class count) and returns `a`. */
export function objectSizeCountsMerge(a: ObjectSizeCounts, b: ObjectSizeCounts): ObjectSizeCounts {
  for (let i = 0; i < a.objects.length; i++) {
    a.objects[i] += b.objects[i];
    a.recallSum[i] += b.recallSum[i];
    a.detected[i] += b.detected[i];
  }
  return a;
}

/** Returns the report's bins for class index `c`, or summed over all classes when `c` is null. */
export function objectSizeBins(counts: ObjectSizeCounts, c: number | null): ObjectSizeBin[] {
  const out: ObjectSizeBin[] = [];
  for (let b = 0; b < OBJECT_SIZE_BINS; b++) {
    let objects = 0, recallSum = 0, detected = 0;
    for (let cls = c ?? 0; cls < (c === null ? counts.k : c + 1); cls++) {
      const cell = cls * OBJECT_SIZE_BINS + b;
      objects += counts.objects[cell];
      recallSum += counts.recallSum[cell];
      detected += counts.detected[cell];
    }
    out.push({
      minArea: OBJECT_SIZE_EDGES[b],
      maxArea: b + 1 < OBJECT_SIZE_BINS ? OBJECT_SIZE_EDGES[b + 1] : null,
      objects,
      meanRecall: objects > 0 ? recallSum / objects : null,
      detected: objects > 0 ? detected / objects : null,
    });
  }
  return out;
}

/** Returns the mean recall (0..1) of the objects smaller than SMALL_OBJECT_AREA, or null when there are none. */
export function smallObjectRecall(objects: TruthObjects): number | null {
  let n = 0, sum = 0;
  for (let o = 0; o < objects.count; o++) {
    if (objects.area[o] >= SMALL_OBJECT_AREA) continue;
    n++;
    sum += objects.hits[o] / objects.area[o];
  }
  return n > 0 ? sum / n : null;
}
