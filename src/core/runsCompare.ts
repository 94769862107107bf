import type { LabelMap } from './labelMap.ts';

/** Pixels where run B differs in correctness from run A (valid ground truth only). */
export interface RunsCompareCounts {
  /** A wrong, B right. */
  fixed: number;
  /** A right, B wrong. */
  broke: number;
  /** Both wrong. */
  bothWrong: number;
  /** Valid pixels (ground truth not void). */
  valid: number;
}

/** Returns how run B changed run A's correctness on one frame. Hot loop: flat typed arrays only. */
export function runsCompareCounts(truth: LabelMap, a: LabelMap, b: LabelMap, ignore: number): RunsCompareCounts {
  const t = truth.ids, pa = a.ids, pb = b.ids;
  let fixed = 0, broke = 0, bothWrong = 0, valid = 0;
  for (let i = 0; i < t.length; i++) {
    const g = t[i];
    if (g === ignore) continue;
    valid++;
    const ar = pa[i] === g, br = pb[i] === g;
    if (ar !== br) {
      if (br) fixed++;
      else broke++;
    } else if (!ar) bothWrong++;
  }
  return { fixed, broke, bothWrong, valid };
}
