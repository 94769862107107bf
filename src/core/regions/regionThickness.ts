import { DISTANCE_LIMIT_MAX, distanceSquaredCapped, distanceWorkCreate, type DistanceWork } from '../metrics/distanceCapped.ts';
import type { ComponentStats } from './componentStats.ts';
import type { RunTable } from './runLabel.ts';

/** Buffers for thickness: a window for compact regions, a row index for sprawling ones; they grow and are reused. */
export interface ThicknessWork {
  marks: Uint8Array;
  dist2: Uint16Array;
  distance: DistanceWork;
  /** Per bbox row of the current region: the first of its runs (index into the component's run list). */
  rowFirst: Int32Array;
}

/** Returns empty thickness buffers. */
export function thicknessWorkCreate(): ThicknessWork {
  return { marks: new Uint8Array(0), dist2: new Uint16Array(0), distance: distanceWorkCreate(0), rowFirst: new Int32Array(0) };
}

/** Regions filling less than this share of their bbox window take the sparse path. */
const COMPACT_SHARE = 0.125;

/**
 * Returns the thickness of component `c` (pixels): the largest Euclidean distance between the centre
 * of one of its pixels and the centre of the nearest pixel not in it, pixels beyond the image border
 * counting as "not in it" (so a one-pixel line is 1 thick, a 5×5 square 3). Exact up to
 * DISTANCE_LIMIT_MAX (254) pixels, where it is capped. Compact regions take one capped distance
 * transform (Felzenszwalb & Huttenlocher 2012) over the bbox grown by one pixel; sprawling ones (thin
 * slivers along long boundaries, whose bbox is mostly empty) the same separable minimum taken over
 * their own pixels only (see thicknessByRuns).
 */
export function regionThickness(t: RunTable, s: ComponentStats, c: number, work: ThicknessWork): number {
  const w = s.x1[c] - s.x0[c] + 2, h = s.y1[c] - s.y0[c] + 2;
  const d2 = s.area[c] >= COMPACT_SHARE * w * h ? thicknessByWindow(t, s, c, work) : thicknessByRuns(t, s, c, work);
  return d2 > DISTANCE_LIMIT_MAX * DISTANCE_LIMIT_MAX ? DISTANCE_LIMIT_MAX : Math.sqrt(d2);
}

/** Returns the largest squared distance (pixels²) over the region by a distance transform of its bbox window (DISTANCE_LIMIT_MAX² + 1 when capped). */
export function thicknessByWindow(t: RunTable, s: ComponentStats, c: number, work: ThicknessWork): number {
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
  // No pixel is farther than half the window's smaller side from its outer ring.
  const limit = Math.min(DISTANCE_LIMIT_MAX, Math.ceil(Math.min(w, h) / 2) + 1);
  distanceSquaredCapped(marks, w, h, limit, dist2, work.distance);
  let best = 0;
  // Hot loop: flat typed arrays over the region's runs.
  for (let j = s.runStart[c], end = s.runStart[c + 1]; j < end; j++) {
    const r = s.order[j];
    const o = (t.y[r] - by) * w - bx;
    for (let i = o + t.x0[r], e = o + t.x1[r]; i < e; i++) if (dist2[i] > best) best = dist2[i];
  }
  return best > limit * limit ? DISTANCE_LIMIT_MAX * DISTANCE_LIMIT_MAX + 1 : best;
}

/**
 * Returns the largest squared distance (pixels²) over the region from its own runs: for a pixel
 * (x, y), d² = min over rows y' of (y − y')² + h(y', x)², where h(y', x) is the distance along row y'
 * from column x to the nearest pixel not in the region (0 when (x, y') is not in it): the separable
 * form of the Euclidean distance transform (Felzenszwalb & Huttenlocher 2012). Rows are visited
 * outwards only while (y − y')² can still lower d², and a pixel whose own row already bounds d² by
 * the largest found so far is skipped, so thin regions cost little more than their area.
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
export function thicknessByRuns(t: RunTable, s: ComponentStats, c: number, work: ThicknessWork): number {
  const y0 = s.y0[c], rows = s.y1[c] - y0;
  const first = s.runStart[c], end = s.runStart[c + 1];
  if (work.rowFirst.length < rows + 1) work.rowFirst = new Int32Array(rows + 1);
  const rowFirst = work.rowFirst;
  // Runs of a component are in raster order: index them by row.
  for (let i = 0, j = first; i <= rows; i++) {
    while (j < end && t.y[s.order[j]] - y0 < i) j++;
    rowFirst[i] = j;
  }
  const order = s.order, rx0 = t.x0, rx1 = t.x1;
  /** Distance along bbox row i from column x to the nearest pixel outside the region (0 if outside). */
  const along = (i: number, x: number): number => {
    if (i < 0 || i >= rows) return 0;
    for (let j = rowFirst[i], e = rowFirst[i + 1]; j < e; j++) {
      const r = order[j];
      if (x < rx0[r]) return 0;
      if (x < rx1[r]) {
        const a = x - rx0[r] + 1, b = rx1[r] - x;
        return a < b ? a : b;
      }
    }
    return 0;
  };
  let best = 0;
  for (let j = first; j < end; j++) {
    const r = order[j];
    const i = t.y[r] - y0;
    for (let x = rx0[r]; x < rx1[r]; x++) {
      const own = Math.min(x - rx0[r] + 1, rx1[r] - x);
      let d2 = own * own;
      if (d2 <= best) continue;
      for (let dy = 1; dy * dy < d2; dy++) {
        const up = along(i - dy, x), down = along(i + dy, x);
        const v = dy * dy + (up < down ? up * up : down * down);
        if (v < d2) d2 = v;
      }
      if (d2 > best) best = d2;
    }
  }
  return best;
}
