import type { LabelIds } from '../labelMap.ts';

/**
 * The objects of one frame's ground truth (src/docs/metrics.md "Objects"): 8-connected components of
 * one class (void is no object), each with its area, how many of its pixels the prediction gives its
 * class, and its bounding box. Columns, one entry per object, in the order of each object's first
 * pixel in row-major order.
 */
export interface TruthObjects {
  count: number;
  /** Class index (position in the ascending class ids). */
  classIndex: Uint16Array;
  /** Pixels of the object. */
  area: Uint32Array;
  /** Pixels of the object predicted as its class. */
  hits: Uint32Array;
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
 * class index (0..k-1), or to k and above for void and ids that are no class. A pixel counts as a hit
 * when `codes[pred] === codes[truth]`, so a prediction id outside the table is never a hit.
 * Hot loop: flat typed arrays, one union-find pass and one labelling pass, no allocation per pixel.
 */
export function truthObjectsOf(
  truth: LabelIds, pred: LabelIds, width: number, height: number, codes: Uint16Array, k: number,
): TruthObjects {
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
  // Roots are the smallest index of their component, so a component's root is met before its other
  // pixels: objects are numbered in the order of their first pixel.
  const objectOf = new Int32Array(n);
  let count = 0;
  for (let i = 0; i < n; i++) {
    if (parent[i] < 0) continue;
    const r = find(parent, i);
    objectOf[i] = r === i ? count++ : objectOf[r];
  }
  const out: TruthObjects = {
    count,
    classIndex: new Uint16Array(count), area: new Uint32Array(count), hits: new Uint32Array(count),
    x0: new Uint16Array(count).fill(65535), y0: new Uint16Array(count).fill(65535), x1: new Uint16Array(count), y1: new Uint16Array(count),
  };
  for (let y = 0; y < height; y++) {
    const row = y * width;
    for (let x = 0; x < width; x++) {
      const i = row + x;
      if (parent[i] < 0) continue;
      const o = objectOf[i];
      const c = codes[truth[i]];
      out.classIndex[o] = c;
      out.area[o]++;
      if (codes[pred[i]] === c) out.hits[o]++;
      if (x < out.x0[o]) out.x0[o] = x;
      if (x > out.x1[o]) out.x1[o] = x;
      if (y < out.y0[o]) out.y0[o] = y;
      out.y1[o] = y;
    }
  }
  return out;
}
