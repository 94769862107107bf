import type { RunTable } from './runLabel.ts';

/**
 * Per-component sums over a labelled run table, as flat arrays indexed by component id, plus the
 * runs grouped by component (counting sort, raster order kept within a component) so a region's
 * pixels can be walked without a per-pixel label map.
 */
export interface ComponentStats {
  count: number;
  area: Int32Array;
  x0: Int32Array;
  y0: Int32Array;
  /** Bbox ends, exclusive. */
  x1: Int32Array;
  y1: Int32Array;
  sumX: Float64Array;
  sumY: Float64Array;
  /** Sum of the runs' `same` counts. */
  same: Int32Array;
  /** Key of the component (every run of it has the same). */
  a: Uint16Array;
  b: Uint16Array;
  /** Runs of component c are order[runStart[c] .. runStart[c + 1]). */
  runStart: Int32Array;
  order: Int32Array;
}

/** Returns empty stats (arrays grow on first use). */
export function componentStatsCreate(): ComponentStats {
  return {
    count: 0, area: new Int32Array(0), x0: new Int32Array(0), y0: new Int32Array(0), x1: new Int32Array(0), y1: new Int32Array(0),
    sumX: new Float64Array(0), sumY: new Float64Array(0), same: new Int32Array(0), a: new Uint16Array(0), b: new Uint16Array(0),
    runStart: new Int32Array(1), order: new Int32Array(0),
  };
}

function fit(s: ComponentStats, components: number, runs: number): void {
  if (s.area.length < components) {
    const n = Math.max(components, s.area.length * 2, 256);
    s.area = new Int32Array(n);
    s.x0 = new Int32Array(n);
    s.y0 = new Int32Array(n);
    s.x1 = new Int32Array(n);
    s.y1 = new Int32Array(n);
    s.sumX = new Float64Array(n);
    s.sumY = new Float64Array(n);
    s.same = new Int32Array(n);
    s.a = new Uint16Array(n);
    s.b = new Uint16Array(n);
  }
  if (s.runStart.length < components + 1) s.runStart = new Int32Array(Math.max(components + 1, s.runStart.length * 2));
  if (s.order.length < runs) s.order = new Int32Array(Math.max(runs, s.order.length * 2, 1024));
}

/**
 * Fills `s` from the components of `t`: area (pixels), bbox, coordinate sums (pixel indices),
 * matching-pixel counts, keys and the runs of each component.
 * Hot loop: one pass over the runs, flat typed arrays; a run of length L adds L·(x0 + x1 − 1)/2 to sumX.
 */
export function componentStatsFill(t: RunTable, s: ComponentStats): void {
  const m = t.components;
  fit(s, m, t.count);
  s.count = m;
  s.area.fill(0, 0, m);
  s.x0.fill(0x7fffffff, 0, m);
  s.y0.fill(0x7fffffff, 0, m);
  s.x1.fill(-1, 0, m);
  s.y1.fill(-1, 0, m);
  s.sumX.fill(0, 0, m);
  s.sumY.fill(0, 0, m);
  s.same.fill(0, 0, m);
  s.runStart.fill(0, 0, m + 1);
  for (let r = 0; r < t.count; r++) {
    const c = t.comp[r];
    const len = t.x1[r] - t.x0[r];
    s.area[c] += len;
    if (t.x0[r] < s.x0[c]) s.x0[c] = t.x0[r];
    if (t.x1[r] > s.x1[c]) s.x1[c] = t.x1[r];
    if (t.y[r] < s.y0[c]) s.y0[c] = t.y[r];
    if (t.y[r] + 1 > s.y1[c]) s.y1[c] = t.y[r] + 1;
    s.sumX[c] += (len * (t.x0[r] + t.x1[r] - 1)) / 2;
    s.sumY[c] += len * t.y[r];
    s.same[c] += t.same[r];
    s.a[c] = t.a[r];
    s.b[c] = t.b[r];
    s.runStart[c + 1]++;
  }
  for (let c = 0; c < m; c++) s.runStart[c + 1] += s.runStart[c];
  // Counting sort of the runs by component: one cursor per component, allocated once per call.
  const cursor = s.runStart.slice(0, m);
  for (let r = 0; r < t.count; r++) s.order[cursor[t.comp[r]]++] = r;
}
