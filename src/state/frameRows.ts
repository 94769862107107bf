import { digestSummary } from '../core/metrics/frameDigest.ts';
import type { FrameSummary } from '../core/metrics/frameSummary.ts';
import type { StoredFrame } from './scoresSlice.ts';
import type { AppState } from './store.ts';
import type { FrameScoreKey } from './viewSlice.ts';

/** One line of the frame list: the frame's scores for run A, or why it has none. */
export interface FrameRow {
  index: number;
  name: string;
  /** Still waiting to be scored. */
  pending: boolean;
  error: string | null;
  summary: FrameSummary | null;
}

const cache = new WeakMap<StoredFrame, Map<string, FrameSummary | null>>();

/** Returns the summary of `run` on a scored frame at band width `w`, memoised per result. */
export function resultSummary(result: StoredFrame, run: string, w: number): FrameSummary | null {
  let byKey = cache.get(result);
  if (!byKey) cache.set(result, (byKey = new Map()));
  const key = `${run}\u0000${w}`;
  if (byKey.has(key)) return byKey.get(key)!;
  const stats = result.runs.find((r) => r.run === run)?.stats ?? null;
  const summary = stats ? digestSummary(stats, w) : null;
  byKey.set(key, summary);
  return summary;
}

/** Returns the run the frame list and timeline describe: run A, else the first run. */
export function shownRun(s: AppState): string | null {
  return s.runA ?? s.dataset?.pairing.runs[0] ?? null;
}

/** Returns a row per frame for run A at the current band width. */
export function frameRowsOf(s: AppState): FrameRow[] {
  const frames = s.dataset?.pairing.frames ?? [];
  const run = shownRun(s);
  const w = s.bandWidth;
  return frames.map((f, index) => {
    const r = s.results[index];
    if (!r) return { index, name: f.name, pending: true, error: null, summary: null };
    const runError = run ? r.runs.find((x) => x.run === run)?.error ?? null : 'no prediction run';
    const error = r.error ?? runError;
    return { index, name: f.name, pending: false, error, summary: error || !run ? null : resultSummary(r, run, w) };
  });
}

/** Returns the value of `key` for a row (null when unscored or undefined). Higher is better except error pixels. */
export function rowValue(row: FrameRow, key: FrameScoreKey): number | null {
  if (!row.summary) return null;
  return row.summary[key];
}

/** Returns frame indices in the frame list's order: by the chosen score, worst first (or best first), unscored last. */
export function frameOrder(s: AppState): number[] {
  const rows = frameRowsOf(s);
  const key = s.frameScore;
  const lowerIsWorse = key !== 'errorPixels';
  const sign = (s.sortWorstFirst ? 1 : -1) * (lowerIsWorse ? 1 : -1);
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
