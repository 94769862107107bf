/**
 * Connected components (8-connected) over horizontal runs. A run is a maximal stretch of one row
 * whose pixels share a key: one code (`a`) for segments, or a pair of codes (`a`, `b`) for regions
 * of disagreement. Runs of the row above with the same key that touch a run (columns overlapping or
 * diagonal) are joined with a union-find, so labelling is one linear pass over the pixels plus work
 * proportional to the number of runs. Components are numbered in raster order of their first pixel,
 * which makes every id reproducible from the maps alone.
 */

/** Which runs are kept: every run (segments of one map), or only pairs worth a region. */
export const RUN_KEEP = {
  /** Every run; the key is `a` alone. */
  all: 0,
  /** Runs keyed by (a, b) where a < k and b ≠ a (disagreement), or a = k and b < k (a class over void). */
  pairs: 1,
} as const;
export type RunKeep = (typeof RUN_KEEP)[keyof typeof RUN_KEEP];

/** Runs of a frame with their component ids; arrays grow and are reused across frames. */
export interface RunTable {
  count: number;
  /** Number of components. */
  components: number;
  width: number;
  height: number;
  /** First run of row y is rowStart[y]; row y's runs end at rowStart[y + 1]. */
  rowStart: Int32Array;
  x0: Int32Array;
  /** End column, exclusive. */
  x1: Int32Array;
  y: Int32Array;
  a: Uint16Array;
  b: Uint16Array;
  /** Component id of each run (after labelling). */
  comp: Int32Array;
  /** Union-find parents while labelling. */
  parent: Int32Array;
  /** Pixels of each run where `match[i] === a[i]` (when a match map is given and a < k: a class), else 0. */
  same: Int32Array;
}

/** Returns an empty run table (it grows on first use). */
export function runTableCreate(): RunTable {
  return {
    count: 0, components: 0, width: 0, height: 0, rowStart: new Int32Array(1),
    x0: new Int32Array(0), x1: new Int32Array(0), y: new Int32Array(0), a: new Uint16Array(0), b: new Uint16Array(0),
    comp: new Int32Array(0), parent: new Int32Array(0), same: new Int32Array(0),
  };
}

function runTableGrow(t: RunTable, need: number): void {
  if (need <= t.x0.length) return;
  const size = Math.max(need, t.x0.length * 2, 1024);
  const grow = <T extends Int32Array | Uint16Array>(old: T, make: (n: number) => T): T => {
    const next = make(size);
    next.set(old.subarray(0, t.count));
    return next;
  };
  t.x0 = grow(t.x0, (n) => new Int32Array(n));
  t.x1 = grow(t.x1, (n) => new Int32Array(n));
  t.y = grow(t.y, (n) => new Int32Array(n));
  t.a = grow(t.a, (n) => new Uint16Array(n));
  t.b = grow(t.b, (n) => new Uint16Array(n));
  t.comp = grow(t.comp, (n) => new Int32Array(n));
  t.parent = grow(t.parent, (n) => new Int32Array(n));
  t.same = grow(t.same, (n) => new Int32Array(n));
}

/** Returns the root of run r, halving the path on the way (union-find). */
function root(parent: Int32Array, r: number): number {
  while (parent[r] !== r) {
    parent[r] = parent[parent[r]];
    r = parent[r];
  }
  return r;
}

/**
 * Fills `t` with the runs of the width × height code maps and labels their 8-connected components.
 * `b` null: key is `a` alone, every run kept (segments). With `b` (values 0..k, k = "not a class"):
 * key is (a, b), runs kept as RUN_KEEP.pairs says. `match`, when given, counts per run the pixels where it equals
 * `a` (e.g. truth codes over prediction segments: the pixels a predicted segment gets right).
 * Hot loop: flat typed arrays, no allocation or closure per pixel; the run arrays grow by doubling.
 */
export function runsLabel(
  a: Uint16Array, b: Uint16Array | null, match: Uint16Array | null, width: number, height: number, k: number, keep: RunKeep, t: RunTable,
): void {
  t.count = 0;
  t.width = width;
  t.height = height;
  if (t.rowStart.length < height + 1) t.rowStart = new Int32Array(height + 1);
  const rowStart = t.rowStart;
  // Pairs mode keeps no run where a and b agree: such pixels are skipped two at a time (32-bit words).
  const skip = keep === RUN_KEEP.pairs && b !== null;
  const A2 = skip ? wordsOf(a) : null, B2 = skip && b !== null ? wordsOf(b) : null;
  const A = b === null ? wordsOf(a) : null, M = match !== null ? wordsOf(match) : null;
  for (let y = 0; y < height; y++) {
    rowStart[y] = t.count;
    const o = y * width;
    let x = 0;
    while (x < width) {
      if (skip) {
        x = agreeingSkip(a, b!, A2, B2, o, x, width);
        if (x >= width) break;
      }
      const ka = a[o + x];
      const kb = b === null ? 0 : b[o + x];
      let e = x + 1;
      if (b === null) {
        e = sameRunEnd(a, A, o, e, width, ka);
      } else {
        while (e < width && a[o + e] === ka && b[o + e] === kb) e++;
      }
      const kept = keep === RUN_KEEP.all || (ka < k ? kb !== ka : ka === k && kb < k);
      if (kept) {
        if (t.count === t.x0.length) runTableGrow(t, t.count + 1);
        const r = t.count++;
        t.x0[r] = x;
        t.x1[r] = e;
        t.y[r] = y;
        t.a[r] = ka;
        t.b[r] = kb;
        let same = 0;
        if (match !== null && ka < k) same = matchCount(match, M, o + x, o + e, ka);
        t.same[r] = same;
      }
      x = e;
    }
  }
  rowStart[height] = t.count;
  runsJoin(t);
}

/** Returns a 32-bit view (two codes a word) of `c` when it starts on a 4-byte boundary, else null. */
function wordsOf(c: Uint16Array): Uint32Array | null {
  return c.byteOffset % 4 === 0 ? new Uint32Array(c.buffer, c.byteOffset, c.length >> 1) : null;
}

/**
 * Returns the first column from x on (of the row starting at o) where a and b differ, or `width`.
 * Hot loop: two pixels per compare where the words line up (a run of agreement is never a region).
 */
function agreeingSkip(a: Uint16Array, b: Uint16Array, A2: Uint32Array | null, B2: Uint32Array | null, o: number, x: number, width: number): number {
  if (A2 !== null && B2 !== null) {
    for (let i = o + x; x < width; i = o + x) {
      if ((i & 1) === 0 && x + 1 < width && A2[i >> 1] === B2[i >> 1]) x += 2;
      else if (a[i] === b[i]) x++;
      else break;
    }
    return x;
  }
  while (x < width && a[o + x] === b[o + x]) x++;
  return x;
}

/**
 * Returns the end (exclusive) of the run of code `ka` from column e on, in the row starting at o.
 * Hot loop: two pixels per compare where the words line up.
 */
function sameRunEnd(a: Uint16Array, A: Uint32Array | null, o: number, e: number, width: number, ka: number): number {
  if (A === null) {
    while (e < width && a[o + e] === ka) e++;
    return e;
  }
  const pair = (ka | (ka << 16)) >>> 0;
  for (let i = o + e; e < width; i = o + e) {
    if ((i & 1) === 0 && e + 1 < width && A[i >> 1] === pair) e += 2;
    else if (a[i] === ka) e++;
    else break;
  }
  return e;
}

/** Returns how many of match[from..to) equal `ka`, two at a time where the words line up. */
function matchCount(match: Uint16Array, M: Uint32Array | null, from: number, to: number, ka: number): number {
  let same = 0, i = from;
  if (M !== null) {
    const pair = (ka | (ka << 16)) >>> 0;
    if (i & 1 && i < to) same += match[i++] === ka ? 1 : 0;
    for (; i + 1 < to; i += 2) {
      const w = M[i >> 1];
      if (w === pair) same += 2;
      else same += (match[i] === ka ? 1 : 0) + (match[i + 1] === ka ? 1 : 0);
    }
  }
  for (; i < to; i++) if (match[i] === ka) same++;
  return same;
}

/** Joins runs of neighbouring rows with equal keys that touch (8-connected), then numbers components. */
function runsJoin(t: RunTable): void {
  const { rowStart, x0, x1, a, b, comp, parent, height } = t;
  for (let r = 0; r < t.count; r++) parent[r] = r;
  for (let y = 1; y < height; y++) {
    let j = rowStart[y - 1];
    const prevEnd = rowStart[y];
    for (let r = rowStart[y], end = rowStart[y + 1]; r < end; r++) {
      // Runs of the row above that end left of this run's reach can touch no later run either.
      while (j < prevEnd && x1[j] < x0[r]) j++;
      for (let s = j; s < prevEnd && x0[s] <= x1[r]; s++) {
        if (a[s] !== a[r] || b[s] !== b[r]) continue;
        const rs = root(parent, s), rr = root(parent, r);
        // The smaller index stays the root, so a component's root is its first run in raster order.
        if (rs < rr) parent[rr] = rs;
        else if (rr < rs) parent[rs] = rr;
      }
    }
  }
  let next = 0;
  for (let r = 0; r < t.count; r++) {
    const p = root(parent, r);
    // Roots come first in raster order, so a root's id is assigned before any run that points to it.
    comp[r] = p === r ? next++ : comp[p];
  }
  t.components = next;
}

/** Returns the run of row y that covers column x in `t`, or -1 (binary search; rows are sorted). */
export function runAt(t: RunTable, x: number, y: number): number {
  let lo = t.rowStart[y], hi = t.rowStart[y + 1] - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (t.x1[mid] <= x) lo = mid + 1;
    else if (t.x0[mid] > x) hi = mid - 1;
    else return mid;
  }
  return -1;
}
