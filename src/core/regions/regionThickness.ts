import { DISTANCE_LIMIT_MAX, distanceSquaredCapped, distanceWorkCreate, type DistanceWork } from '../metrics/distanceCapped.ts';
import type { ComponentStats } from './componentStats.ts';
import type { RunTable } from './runLabel.ts';

/** Window buffers for one region's distance transform; they grow to the largest window seen. */
export interface ThicknessWork {
  marks: Uint8Array;
  dist2: Uint16Array;
  distance: DistanceWork;
}

/** Returns empty thickness buffers. */
export function thicknessWorkCreate(): ThicknessWork {
  return { marks: new Uint8Array(0), dist2: new Uint16Array(0), distance: distanceWorkCreate(0) };
}

/**
 * Returns the thickness of component `c` (pixels): the largest Euclidean distance between the centre
 * of one of its pixels and the centre of the nearest pixel not in it, pixels beyond the image border
 * counting as "not in it" (so a one-pixel line is 1 thick, a 5×5 square 3). Exact up to
 * DISTANCE_LIMIT_MAX (254) pixels, where it is capped. Costs one capped distance transform
 * (Felzenszwalb & Huttenlocher 2012) over the region's bbox grown by one pixel.
 * Hot loop: flat typed arrays; the window is filled from the region's runs.
 */
export function regionThickness(t: RunTable, s: ComponentStats, c: number, work: ThicknessWork): number {
  const bx = s.x0[c] - 1, by = s.y0[c] - 1;
  const w = s.x1[c] - s.x0[c] + 2, h = s.y1[c] - s.y0[c] + 2;
  const n = w * h;
  if (work.marks.length < n) {
    work.marks = new Uint8Array(n);
    work.dist2 = new Uint16Array(n);
  }
  if (work.distance.below.length < w) work.distance = distanceWorkCreate(w);
  const { marks, dist2 } = work;
  marks.fill(1, 0, n);
  for (let j = s.runStart[c], end = s.runStart[c + 1]; j < end; j++) {
    const r = s.order[j];
    const o = (t.y[r] - by) * w - bx;
    marks.fill(0, o + t.x0[r], o + t.x1[r]);
  }
  // The farthest any pixel can be from the window's outer ring bounds the transform's reach.
  const limit = Math.min(DISTANCE_LIMIT_MAX, Math.ceil(Math.min(w, h) / 2) + 1);
  distanceSquaredCapped(marks, w, h, limit, dist2, work.distance);
  let best = 0;
  for (let j = s.runStart[c], end = s.runStart[c + 1]; j < end; j++) {
    const r = s.order[j];
    const o = (t.y[r] - by) * w - bx;
    for (let i = o + t.x0[r], e = o + t.x1[r]; i < e; i++) if (dist2[i] > best) best = dist2[i];
  }
  return best > limit * limit ? limit : Math.sqrt(best);
}
