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
  /** Class index (position in the ascending class ids). */
  classIndex: Uint16Array;
  /** Pixels of the object. */
  area: Uint32Array;
  /** Bounding box, inclusive pixel coordinates. */
  x0: Uint16Array;
  y0: Uint16Array;
  x1: Uint16Array;
  y1: Uint16Array;
  /** Row runs of one class: pixel index of the first pixel, one past the last, and the run's object. */
  runs: number;
  runStart: Int32Array;
  runEnd: Int32Array;
  runObject: Int32Array;
}

function find(parent: Int32Array, i: number): number {
  while (parent[i] !== i) {
    parent[i] = parent[parent[i]];
    i = parent[i];
  }
  return i;
}

/**
 * Returns the objects of `truth`: 8-connected sets of pixels of one class. `codes` maps an id to its
 * class index (0..k-1), or to k and above for void and ids that are no class.
 * Hot loop, run-based: each row is cut into runs of one class, a run joins the runs of the row above
 * of its class that touch it or its corners (union-find over runs, not pixels), no allocation per pixel.
 */
export function truthObjectLabels(truth: LabelIds, width: number, height: number, codes: Uint16Array, k: number): TruthObjectLabels {
  let cap = Math.max(16, width);
  let runStart = new Int32Array(cap), runEnd = new Int32Array(cap), runCode = new Uint16Array(cap), parent = new Int32Array(cap);
  let runs = 0;
  let prevBegin = 0, prevEnd = 0;
  for (let y = 0; y < height; y++) {
    const row = y * width;
    const begin = runs;
    let x = 0;
    while (x < width) {
      const c = codes[truth[row + x]];
      let e = x + 1;
      while (e < width && codes[truth[row + e]] === c) e++;
      if (c < k) {
        if (runs === cap) {
          cap *= 2;
          const grow = <T extends Int32Array | Uint16Array>(a: T): T => { const b = new (a.constructor as new (n: number) => T)(cap); b.set(a); return b; };
          runStart = grow(runStart); runEnd = grow(runEnd); runCode = grow(runCode); parent = grow(parent);
        }
        runStart[runs] = row + x;
        runEnd[runs] = row + e;
        runCode[runs] = c;
        parent[runs] = runs;
        runs++;
      }
      x = e;
    }
    // Join with the row above: runs of the same class overlapping [x - 1, e + 1) in x.
    let p = prevBegin;
    for (let r = begin; r < runs; r++) {
      const s = runStart[r] - row, e = runEnd[r] - row;
      while (p < prevEnd && runEnd[p] - row + width < s) p++; // ends left of s - 1 + 1 (diagonal reach)
      for (let q = p; q < prevEnd && runStart[q] - row + width <= e; q++) {
        if (runCode[q] !== runCode[r]) continue;
        const a = find(parent, r), b = find(parent, q);
        if (a < b) parent[b] = a;
        else if (b < a) parent[a] = b;
      }
    }
    prevBegin = begin;
    prevEnd = runs;
  }
  // A root is the smallest run index of its object and every parent index is at most its child's,
  // so in run order a run's parent is already numbered: objects are numbered by their first pixel.
  const runObject = parent;
  let count = 0;
  for (let r = 0; r < runs; r++) {
    const q = parent[r];
    runObject[r] = q === r ? count++ : runObject[q];
  }
  const out: TruthObjectLabels = {
    count, classIndex: new Uint16Array(count), area: new Uint32Array(count),
    x0: new Uint16Array(count).fill(65535), y0: new Uint16Array(count).fill(65535), x1: new Uint16Array(count), y1: new Uint16Array(count),
    runs, runStart, runEnd, runObject,
  };
  for (let r = 0; r < runs; r++) {
    const o = runObject[r];
    const y = Math.floor(runStart[r] / width);
    const xs = runStart[r] - y * width, xe = runEnd[r] - 1 - y * width;
    out.classIndex[o] = runCode[r];
    out.area[o] += runEnd[r] - runStart[r];
    if (xs < out.x0[o]) out.x0[o] = xs;
    if (xe > out.x1[o]) out.x1[o] = xe;
    if (y < out.y0[o]) out.y0[o] = y;
    out.y1[o] = y;
  }
  return out;
}

/**
 * Returns the objects with, per object, the pixels `pred` gives its class: a pixel is a hit when
 * `codes[pred] === codes[truth]`, so a prediction id outside the table is never a hit.
 * Hot loop: one pass, no allocation per pixel.
 */
export function truthObjectsHit(labels: TruthObjectLabels, pred: LabelIds, codes: Uint16Array): TruthObjects {
  const hits = new Uint32Array(labels.count);
  const { runStart, runEnd, runObject, classIndex } = labels;
  for (let r = 0; r < labels.runs; r++) {
    const c = classIndex[runObject[r]];
    let h = 0;
    for (let i = runStart[r], e = runEnd[r]; i < e; i++) if (codes[pred[i]] === c) h++;
    hits[runObject[r]] += h;
  }
  return { ...labels, hits };
}

/** Returns the objects of `truth` with their hits by `pred` (one run; see truthObjectLabels and truthObjectsHit). */
export function truthObjectsOf(
  truth: LabelIds, pred: LabelIds, width: number, height: number, codes: Uint16Array, k: number,
): TruthObjects {
  return truthObjectsHit(truthObjectLabels(truth, width, height, codes, k), pred, codes);
}
