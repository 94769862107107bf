// The frame list's and timeline's view of every frame's scores: read on demand from typed columns
// (the page's own scoring, or a results folder), so a dataset of 10^5 frames makes no object per frame.
import { frameColumnBand, frameColumnsHas, frameColumnValue, type FrameColumns } from './frameColumns.ts';
import type { FrameScoreKey } from './viewSlice.ts';

/** A score the table holds: the sortable ones and the flip-back rate over void truth (the timeline's flicker row). */
export type FrameValueKey = FrameScoreKey | 'flipBackVoid';

/** Every frame's scores for the shown run, read by frame index. */
export interface FrameTable {
  /** Frames in the dataset. */
  count: number;
  /** Band width (px) the `bandIoU` values are at. */
  bandWidth: number;
  name(index: number): string;
  /** Still waiting to be scored. */
  pending(index: number): boolean;
  /** Why the frame has no scores, or null. */
  error(index: number): string | null;
  /** The frame's score `key` (ratio 0..1, or pixels for errorPixels), null when undefined, failed or pending. */
  value(index: number, key: FrameValueKey): number | null;
}

/** An empty table (no dataset). */
export const FRAME_TABLE_EMPTY: FrameTable = { count: 0, bandWidth: 0, name: () => '', pending: () => true, error: () => null, value: () => null };

/** Scores where a higher value is worse. */
const HIGHER_IS_WORSE: ReadonlySet<FrameScoreKey> = new Set(['errorPixels', 'flipBack']);

/** Returns whether a higher `key` is better (the frame list's sort and the timeline's colours). */
export function higherIsBetter(key: FrameScoreKey): boolean {
  return !HIGHER_IS_WORSE.has(key);
}

/** Returns `key` of every frame as one column (NaN where the table has no value). */
export function frameTableColumn(table: FrameTable, key: FrameValueKey): Float64Array {
  const out = new Float64Array(table.count);
  for (let i = 0; i < table.count; i++) out[i] = table.value(i, key) ?? NaN;
  return out;
}

/** Returns frame indices in list order: by `key`, worst first (or best first), frames without a value last, ties in frame order. */
export function frameOrderOf(table: FrameTable, key: FrameScoreKey, worstFirst: boolean): number[] {
  const v = frameTableColumn(table, key);
  const sign = (worstFirst ? 1 : -1) * (higherIsBetter(key) ? 1 : -1);
  const order = Array.from({ length: table.count }, (_, i) => i);
  return order.sort((a, b) => {
    const va = v[a], vb = v[b];
    const na = Number.isNaN(va), nb = Number.isNaN(vb);
    if (na || nb) return na === nb ? a - b : na ? 1 : -1;
    return (va - vb) * sign || a - b;
  });
}

/** Returns the table of run `run` over the page's own columns (frames named by `names`; band values at width `w`). */
export function frameTableOfColumns(columns: FrameColumns, names: readonly string[], run: string | null, w: number): FrameTable {
  const col = run ? columns.runs[run] : undefined;
  const noRun = run ? `no scores for run ${run}` : 'no prediction run';
  return {
    count: names.length,
    bandWidth: w,
    name: (i) => names[i],
    pending: (i) => !frameColumnsHas(columns, i),
    error: (i) => (!frameColumnsHas(columns, i) ? null : col ? col.errors.get(i) ?? null : noRun),
    value: (i, key) => {
      if (!col || !frameColumnsHas(columns, i)) return null;
      return key === 'bandIoU' ? frameColumnBand(col, i, w) : frameColumnValue(col, i, key);
    },
  };
}
