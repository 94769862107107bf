import type { LabelIds } from '../labelMap.ts';

/**
 * The objects of one frame's ground truth (src/docs/metrics.md "Objects"): 8-connected components of
 * one class (void is no object), each with its area, how many of its pixels the prediction gives its
 * class, and its bounding box. Columns, one entry per object, in the order of each object's first
 * pixel in row-major order.
 */
export interface TruthObjects extends TruthObjectLabels {
  /** Pixels of the object predicted as its class. */
  hits: Uint32Array;
}

/** The objects of a ground truth alone, shared by every run scored against it. */
export interface TruthObjectLabels {
  count: number;
  /** Per pixel: its object's number, or -1 for void and ids that are no class. */
  objectOf: Int32Array;
  /** Class index (position in the ascending class ids). */
  classIndex: Uint16Array;
  /** Pixels of the object. */
  area: Uint32Array;
  /** Bounding box, inclusive pixel coordinates. */
  x0: Uint16Array;
  y0: Uint16Array;
  x1: Uint16Array;
  y1: Uint16Array;
}

function find(parent: Int32Array, i: number): number {
  while (parent[i] !== i) {
    parent[i] = parent[parent[i]];
    i = parent[i];
  }
  return i;
}

function union(parent: Int32Array, a: number, b: number): void {
  const ra = find(parent, a), rb = find(parent, b);
  if (ra < rb) parent[rb] = ra;
  else if (rb < ra) parent[ra] = rb;
}

/**
 * Returns the objects of `truth`: 8-connected runs of pixels of one class. `codes` maps an id to its
 * class index (0..k-1), or to k and above for void and ids that are no class.
 * Hot loop: flat typed arrays, one union-find pass and one labelling pass, no allocation per pixel.
 */
export function truthObjectLabels(truth: LabelIds, width: number, height: number, codes: Uint16Array, k: number): TruthObjectLabels {
  const n = width * height;
  const parent = new Int32Array(n).fill(-1);
  for (let y = 0; y < height; y++) {
    const row = y * width;
    for (let x = 0; x < width; x++) {
      const i = row + x;
      const c = codes[truth[i]];
      if (c >= k) continue;
      parent[i] = i;
      if (x > 0 && parent[i - 1] >= 0 && codes[truth[i - 1]] === c) union(parent, i, i - 1);
      if (y > 0) {
        const up = i - width;
        if (x > 0 && parent[up - 1] >= 0 && codes[truth[up - 1]] === c) union(parent, i, up - 1);
        if (parent[up] >= 0 && codes[truth[up]] === c) union(parent, i, up);
        if (x + 1 < width && parent[up + 1] >= 0 && codes[truth[up + 1]] === c) union(parent, i, up + 1);
      }
    }
  }
  // Every parent index is at most its child's (a root is the smallest index of its component), so in
  // row-major order a pixel's parent is already numbered: objects are numbered in the order of their
  // first pixel, and the parent array is overwritten with the numbers in one pass.
  const objectOf = parent;
  let count = 0;
  for (let i = 0; i < n; i++) {
    const p = parent[i];
    if (p < 0) continue;
    objectOf[i] = p === i ? count++ : objectOf[p];
  }
  const out: TruthObjectLabels = {
    count, objectOf,
    classIndex: new Uint16Array(count), area: new Uint32Array(count),
    x0: new Uint16Array(count).fill(65535), y0: new Uint16Array(count).fill(65535), x1: new Uint16Array(count), y1: new Uint16Array(count),
  };
  for (let y = 0; y < height; y++) {
    const row = y * width;
    for (let x = 0; x < width; x++) {
      const i = row + x;
      const o = objectOf[i];
      if (o < 0) continue;
      out.classIndex[o] = codes[truth[i]];
      out.area[o]++;
      if (x < out.x0[o]) out.x0[o] = x;
      if (x > out.x1[o]) out.x1[o] = x;
      if (y < out.y0[o]) out.y0[o] = y;
      out.y1[o] = y;
    }
  }
  return out;
}

/**
 * Returns the objects with, per object, the pixels `pred` gives its class: a pixel is a hit when
 * `codes[pred] === codes[truth]`, so a prediction id outside the table is never a hit.
 * Hot loop: one pass, no allocation per pixel.
 */
export function truthObjectsHit(labels: TruthObjectLabels, truth: LabelIds, pred: LabelIds, codes: Uint16Array): TruthObjects {
  const hits = new Uint32Array(labels.count);
  const objectOf = labels.objectOf;
  for (let i = 0; i < objectOf.length; i++) {
    const o = objectOf[i];
    if (o >= 0 && codes[pred[i]] === codes[truth[i]]) hits[o]++;
  }
  return { ...labels, hits };
}

/** Returns the objects of `truth` with their hits by `pred` (one run; see truthObjectLabels and truthObjectsHit). */
export function truthObjectsOf(
  truth: LabelIds, pred: LabelIds, width: number, height: number, codes: Uint16Array, k: number,
): TruthObjects {
  return truthObjectsHit(truthObjectLabels(truth, width, height, codes, k), truth, pred, codes);
}
