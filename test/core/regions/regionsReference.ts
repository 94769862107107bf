// Plain reference for region extraction: a breadth-first flood fill per component over a per-pixel key,
// brute-force distances. Slow on purpose (no runs, no union-find, no distance transform), to check
// src/core/regions against.
import type { LabelMap } from '../../../src/core/labelMap.ts';

/** One component as the reference finds it. */
export interface RefComponent {
  /** Raster index of its first pixel. */
  first: number;
  pixels: number[];
  truthClass: number;
  /** Predicted class id, or null for "not a class". */
  predictedClass: number | null;
  isVoidSpill: boolean;
  bbox: [number, number, number, number];
  centroid: [number, number];
}

const NEIGHBOURS_8 = [[-1, -1], [0, -1], [1, -1], [-1, 0], [1, 0], [-1, 1], [0, 1], [1, 1]];

/** Returns the 8-connected components of pixels with equal key (key null = not in any), in raster order of first pixel. */
export function floodComponents(keys: (string | null)[], width: number, height: number): number[][] {
  const seen = new Uint8Array(width * height);
  const out: number[][] = [];
  for (let start = 0; start < keys.length; start++) {
    if (seen[start] || keys[start] === null) continue;
    const key = keys[start];
    const comp: number[] = [];
    const queue = [start];
    seen[start] = 1;
    while (queue.length) {
      const i = queue.shift()!;
      comp.push(i);
      const x = i % width, y = (i - x) / width;
      for (const [dx, dy] of NEIGHBOURS_8) {
        const nx = x + dx, ny = y + dy;
        if (nx < 0 || ny < 0 || nx >= width || ny >= height) continue;
        const j = ny * width + nx;
        if (!seen[j] && keys[j] === key) {
          seen[j] = 1;
          queue.push(j);
        }
      }
    }
    out.push(comp.sort((a, b) => a - b));
  }
  return out;
}

/** Returns the regions of disagreement and void spill of one run, by the plain definitions. */
export function refRegions(truth: LabelMap, pred: LabelMap, classIds: number[], ignore: number): RefComponent[] {
  const { width, height } = truth;
  const isClass = (id: number) => classIds.includes(id);
  const keys = Array.from(truth.ids, (g, i) => {
    const p = isClass(pred.ids[i]) ? pred.ids[i] : null;
    if (isClass(g) && p !== g) return `${g}/${p}`;
    if (g === ignore && p !== null) return `void/${p}`;
    return null;
  });
  return floodComponents(keys, width, height).map((pixels) => {
    const g = truth.ids[pixels[0]], p = isClass(pred.ids[pixels[0]]) ? pred.ids[pixels[0]] : null;
    const xs = pixels.map((i) => i % width), ys = pixels.map((i) => Math.floor(i / width));
    return {
      first: pixels[0], pixels, truthClass: g, predictedClass: p, isVoidSpill: g === ignore,
      bbox: [Math.min(...xs), Math.min(...ys), Math.max(...xs) + 1, Math.max(...ys) + 1],
      centroid: [xs.reduce((a, b) => a + b, 0) / xs.length + 0.5, ys.reduce((a, b) => a + b, 0) / ys.length + 0.5],
    };
  });
}

/** Returns the segments (8-connected same-value components) of a map; `clamp` merges every non-class value into one. */
export function refSegments(map: LabelMap, classIds: number[] | null): number[][] {
  const keys = Array.from(map.ids, (v) => (classIds && !classIds.includes(v) ? 'none' : String(v)));
  return floodComponents(keys, map.width, map.height);
}

/** Returns the src/docs/metrics.md truth boundary pixels: a 4-neighbour inside the image with another value. */
export function refBoundary(truth: LabelMap): number[] {
  const { width, height, ids } = truth;
  const out: number[] = [];
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const v = ids[y * width + x];
      const diff = (nx: number, ny: number) => nx >= 0 && ny >= 0 && nx < width && ny < height && ids[ny * width + nx] !== v;
      if (diff(x - 1, y) || diff(x + 1, y) || diff(x, y - 1) || diff(x, y + 1)) out.push(y * width + x);
    }
  }
  return out;
}

/** Returns the share of `pixels` within Euclidean distance w of a boundary pixel (brute force). */
export function refBandShare(pixels: number[], boundary: number[], width: number, w: number): number {
  let inside = 0;
  for (const i of pixels) {
    const x = i % width, y = (i - x) / width;
    if (boundary.some((b) => (b % width - x) ** 2 + (Math.floor(b / width) - y) ** 2 <= w * w)) inside++;
  }
  return inside / pixels.length;
}

/** Returns the largest distance from a pixel of the set to the nearest pixel not in it, the ring outside the image counting as "not in it". */
export function refThickness(pixels: number[], width: number, height: number): number {
  const inSet = new Set(pixels);
  const outside: [number, number][] = [];
  for (let y = -1; y <= height; y++) {
    for (let x = -1; x <= width; x++) {
      if (x < 0 || y < 0 || x >= width || y >= height || !inSet.has(y * width + x)) outside.push([x, y]);
    }
  }
  let best = 0;
  for (const i of pixels) {
    const x = i % width, y = (i - x) / width;
    let d = Infinity;
    for (const [ox, oy] of outside) d = Math.min(d, (ox - x) ** 2 + (oy - y) ** 2);
    best = Math.max(best, d);
  }
  return Math.sqrt(best);
}
