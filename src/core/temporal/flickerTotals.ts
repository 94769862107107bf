import { flipBackRate, type FlipBackCounts } from './flipBack.ts';

/** Dataset sums of flip-back counts (src/docs/metrics.md "Flicker"), per class by id; additive. */
export interface FlickerTotals {
  flips: number;
  pixels: number;
  flipsVoid: number;
  pixelsVoid: number;
  /** Class id → flips and pixels whose t-1 prediction is the class. */
  byClass: Map<number, { flips: number; pixels: number }>;
}

/** Returns empty totals. */
export function flickerTotalsCreate(): FlickerTotals {
  return { flips: 0, pixels: 0, flipsVoid: 0, pixelsVoid: 0, byClass: new Map() };
}

/** Adds one frame's counts, whose class index c is the id `classIds[c]`; returns the totals. */
export function flickerTotalsAdd(t: FlickerTotals, c: FlipBackCounts, classIds: readonly number[]): FlickerTotals {
  t.flips += c.flips;
  t.pixels += c.pixels;
  t.flipsVoid += c.flipsVoid;
  t.pixelsVoid += c.pixelsVoid;
  classIds.forEach((id, i) => {
    if (c.classPixels[i] === 0) return;
    const s = t.byClass.get(id) ?? { flips: 0, pixels: 0 };
    s.flips += c.classFlips[i];
    s.pixels += c.classPixels[i];
    t.byClass.set(id, s);
  });
  return t;
}

/** Adds totals `b` into `a` and returns `a`. */
export function flickerTotalsMerge(a: FlickerTotals, b: FlickerTotals): FlickerTotals {
  a.flips += b.flips;
  a.pixels += b.pixels;
  a.flipsVoid += b.flipsVoid;
  a.pixelsVoid += b.pixelsVoid;
  for (const [id, v] of b.byClass) {
    const s = a.byClass.get(id) ?? { flips: 0, pixels: 0 };
    s.flips += v.flips;
    s.pixels += v.pixels;
    a.byClass.set(id, s);
  }
  return a;
}

/** Returns the report's flicker scores (ratios 0..1 or null) over `classIds`. */
export function flickerTotalsReport(t: FlickerTotals, classIds: readonly number[]): {
  flipBack: number | null; flipBackVoid: number | null; flipBackPerClass: { id: number; value: number | null }[];
} {
  return {
    flipBack: flipBackRate(t.flips, t.pixels),
    flipBackVoid: flipBackRate(t.flipsVoid, t.pixelsVoid),
    flipBackPerClass: classIds.map((id) => {
      const s = t.byClass.get(id);
      return { id, value: s ? flipBackRate(s.flips, s.pixels) : null };
    }),
  };
}
