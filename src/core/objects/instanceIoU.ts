import type { LabelIds } from '../labelMap.ts';

/**
 * Instance-weighted IoU (src/docs/metrics.md "Instance-weighted IoU"; Cordts et al., "The Cityscapes
 * Dataset for Semantic Urban Scene Understanding", CVPR 2016, §3.2). An instance is the set of pixels
 * of one class sharing one non-zero instance id. Its true positives (pixels predicted as its class) and
 * false negatives (the rest of it) are weighted by the class's mean instance size over its own size.
 * With `S_c` the sum of tp_i / size_i over the n_c instances of class c and `mean_c` their mean size,
 * iTP_c = mean_c · S_c and iFN_c = mean_c · (n_c − S_c), so three sums per class make it additive.
 */
export interface InstanceCounts {
  k: number;
  /** Per class index: instances, their pixels, and the sum of their recalls. */
  instances: Float64Array;
  pixels: Float64Array;
  recallSum: Float64Array;
}

/** Returns zeroed counts for `k` classes. */
export function instanceCountsCreate(k: number): InstanceCounts {
  return { k, instances: new Float64Array(k), pixels: new Float64Array(k), recallSum: new Float64Array(k) };
}

/**
 * Adds one frame's instances to `out`. `codes` maps an id to its class index (0..k-1), or to k and
 * above for void and ids that are no class; pixels with instance id 0 or a truth that is no class
 * belong to no instance. Returns `out`.
 */
export function instanceCountsAdd(
  truth: LabelIds, pred: LabelIds, instances: LabelIds, codes: Uint16Array, k: number, out: InstanceCounts,
): InstanceCounts {
  const slot = new Map<number, number>();
  const size: number[] = [], hits: number[] = [], cls: number[] = [];
  for (let i = 0; i < truth.length; i++) {
    const inst = instances[i];
    if (inst === 0) continue;
    const c = codes[truth[i]];
    if (c >= k) continue;
    const key = inst * k + c;
    let s = slot.get(key);
    if (s === undefined) {
      s = size.length;
      slot.set(key, s);
      size.push(0);
      hits.push(0);
      cls.push(c);
    }
    size[s]++;
    if (codes[pred[i]] === c) hits[s]++;
  }
  for (let s = 0; s < size.length; s++) {
    out.instances[cls[s]]++;
    out.pixels[cls[s]] += size[s];
    out.recallSum[cls[s]] += hits[s] / size[s];
  }
  return out;
}

/** Adds counts `b` into `a` and returns `a`. */
export function instanceCountsMerge(a: InstanceCounts, b: InstanceCounts): InstanceCounts {
  for (let c = 0; c < a.k; c++) {
    a.instances[c] += b.instances[c];
    a.pixels[c] += b.pixels[c];
    a.recallSum[c] += b.recallSum[c];
  }
  return a;
}

/**
 * Returns iIoU per class index (null for a class without instances or with an empty union) and their
 * mean over the defined classes. `falsePositives[c]` is the unweighted count of non-void pixels of
 * other classes predicted as c (from the summed confusion matrix), as in the source.
 */
export function instanceIoU(counts: InstanceCounts, falsePositives: ArrayLike<number>): { perClass: (number | null)[]; mean: number | null } {
  const perClass: (number | null)[] = [];
  let sum = 0, n = 0;
  for (let c = 0; c < counts.k; c++) {
    const nc = counts.instances[c];
    if (nc === 0) {
      perClass.push(null);
      continue;
    }
    const mean = counts.pixels[c] / nc;
    const tp = mean * counts.recallSum[c];
    const fn = mean * (nc - counts.recallSum[c]);
    const denom = tp + falsePositives[c] + fn;
    const v = denom > 0 ? tp / denom : null;
    perClass.push(v);
    if (v !== null) {
      sum += v;
      n++;
    }
  }
  return { perClass, mean: n > 0 ? sum / n : null };
}
