import { extrasFrameLine, type ExtrasFrameLine } from '../core/metrics/extrasTotals.ts';
import { digestSummary } from '../core/metrics/frameDigest.ts';
import type { FrameSummary } from '../core/metrics/frameSummary.ts';
import type { StoredFrame } from './scoresSlice.ts';
import type { FrameScoreKey } from './viewSlice.ts';

/** One line of the frame list: the frame's scores for run A, or why it has none. */
export interface FrameRow {
  index: number;
  name: string;
  /** Still waiting to be scored. */
  pending: boolean;
  error: string | null;
  summary: FrameSummary | null;
  /** Flip-back rate (non-void truth) and small-object recall of run A (src/docs/metrics.md "Flicker", "Objects"), null where undefined; absent for rows read from a results folder. */
  extras?: ExtrasFrameLine | null;
}

/** Scores where a higher value is worse. */
const HIGHER_IS_WORSE: ReadonlySet<FrameScoreKey> = new Set(['errorPixels', 'flipBack']);

/** Returns whether a higher `key` is better (the frame list's sort and the timeline's colours). */
export function higherIsBetter(key: FrameScoreKey): boolean {
  return !HIGHER_IS_WORSE.has(key);
}

/** Returns the frame-list line of frame `index` for `run` at band width `w` (pending while `result` is missing). */
export function frameRowOf(index: number, name: string, result: StoredFrame | undefined, run: string | null, w: number): FrameRow {
  if (!result) return { index, name, pending: true, error: null, summary: null, extras: null };
  const runResult = run ? result.runs.find((x) => x.run === run) : undefined;
  const error = result.error ?? (run ? runResult?.error ?? null : 'no prediction run');
  const stats = runResult?.stats ?? null;
  const ok = !error && stats;
  return { index, name, pending: false, error, summary: ok ? digestSummary(stats, w) : null, extras: ok ? extrasFrameLine(runResult?.extras) : null };
}

/** Returns the value of `key` for a row (null when unscored or undefined). Higher is better except error pixels. */
export function rowValue(row: FrameRow, key: FrameScoreKey): number | null {
  if (key === 'flipBack' || key === 'smallObjectRecall') return row.extras?.[key] ?? null;
  if (!row.summary) return null;
  return row.summary[key];
}

/** Returns frame indices in list order: by `key`, worst first (or best first), unscored last. */
export function frameOrderOf(rows: readonly FrameRow[], key: FrameScoreKey, worstFirst: boolean): number[] {
  const lowerIsWorse = higherIsBetter(key);
  const sign = (worstFirst ? 1 : -1) * (lowerIsWorse ? 1 : -1);
  return rows
    .slice()
    .sort((a, b) => {
      const va = rowValue(a, key);
      const vb = rowValue(b, key);
      if (va === null || vb === null) {
        if (va === vb) return a.index - b.index;
        return va === null ? 1 : -1;
      }
      return (va - vb) * sign || a.index - b.index;
    })
    .map((r) => r.index);
}
