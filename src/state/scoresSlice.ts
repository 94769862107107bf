import type { StateCreator } from 'zustand/vanilla';
import type { FrameJobResult, FrameRunResult } from '../core/frameJob.ts';
import { dictCreate, dictFrom } from '../core/dict.ts';
import { datasetTotalsAdd, datasetTotalsCreate, datasetTotalsWiden, type DatasetTotals } from '../core/metrics/datasetTotals.ts';
import { extrasTotalsAdd, extrasTotalsCreate, type ExtrasTotals } from '../core/metrics/extrasTotals.ts';
import { frameDigestOf, type FrameDigest } from '../core/metrics/frameDigest.ts';
import { frameColumnsAdd, frameColumnsCreate, type FrameColumns } from './frameColumns.ts';
import type { AppState } from './store.ts';

/** Progress of the scoring pass over the current dataset and settings. */
export interface ScoringProgress {
  /** Increments whenever the dataset or a setting changes; results of older passes are dropped. */
  generation: number;
  total: number;
  done: number;
  /** Frames whose ground truth failed, plus frame-run pairs that failed. */
  failed: number;
  startedAt: number;
  /** Time the pass finished (ms since epoch), or null while running. */
  finishedAt: number | null;
}

/** One run's outcome on a frame as the store keeps it: the compact digest instead of the full stats. */
export type StoredRun = Omit<FrameRunResult, 'stats'> & { stats: FrameDigest | null };
/** A scored frame as the store keeps it. */
export type StoredFrame = Omit<FrameJobResult, 'runs'> & { runs: StoredRun[] };

export interface ScoresSlice {
  scoring: ScoringProgress;
  /** Per frame index: its result once scored. The array is replaced (not mutated) on every change. */
  results: (StoredFrame | undefined)[];
  /** Bumped each time a result lands, so derived values can be memoised on it. */
  resultsVersion: number;
  /**
   * Per run: dataset sums over the frames scored so far in this pass (each frame added once, on
   * arrival). Mutated in place — large typed arrays are held by reference — with resultsVersion bumped.
   */
  totals: Record<string, DatasetTotals>;
  /** Class ids totals are kept over, or null when there is no class table (ids join as they appear). */
  totalsClassIds: number[] | null;
  /** Per run: flicker, object and instance sums over the frames scored so far (as totals, mutated in place). */
  extrasTotals: Record<string, ExtrasTotals>;
  /** Every frame's scores in compact typed columns (filled in place as frames land, resultsVersion bumped). */
  columns: FrameColumns;
  scoringStart(generation: number, total: number, classIds: number[] | null): void;
  /** Takes finished frames of pass `generation` (frames of an older pass are dropped). */
  scoringFramesDone(generation: number, done: { index: number; result: FrameJobResult }[]): void;
}

function failures(r: { error: string | null; runs: { error: string | null }[] }): number {
  if (r.error) return 1;
  return r.runs.filter((x) => x.error).length;
}

/** Returns the scores slice: per-frame digests of the current pass, running dataset totals, progress. */
export const scoresSlice: StateCreator<AppState, [], [], ScoresSlice> = (set, get) => ({
  scoring: { generation: 0, total: 0, done: 0, failed: 0, startedAt: 0, finishedAt: null },
  results: [],
  resultsVersion: 0,
  totals: dictCreate(),
  totalsClassIds: null,
  extrasTotals: dictCreate(),
  columns: frameColumnsCreate(0, []),
  scoringStart: (generation, total, classIds) =>
    set({
      scoring: { generation, total, done: 0, failed: 0, startedAt: Date.now(), finishedAt: total === 0 ? Date.now() : null },
      results: new Array(total),
      resultsVersion: get().resultsVersion + 1,
      totals: dictCreate(),
      totalsClassIds: classIds,
      extrasTotals: dictCreate(),
      columns: frameColumnsCreate(total, get().dataset?.pairing.runs ?? []),
    }),
  scoringFramesDone: (generation, batch) => {
    const { scoring, results, totals, totalsClassIds, extrasTotals, columns } = get();
    if (generation !== scoring.generation) return;
    const next = results.slice();
    const nextTotals = dictFrom(totals);
    let done = scoring.done;
    let failed = scoring.failed;
    for (const { index, result } of batch) {
      if (index < 0 || index >= next.length || next[index]) continue;
      const runs: StoredRun[] = result.runs.map((r) => {
        if (!r.stats || result.error || r.error) return { ...r, stats: null };
        let t = nextTotals[r.run] ?? datasetTotalsCreate(totalsClassIds ?? []);
        if (totalsClassIds === null) {
          const wide = datasetTotalsWiden(t, r.stats.classIds);
          if (!wide.ok) return { ...r, stats: null, error: `${result.name}: ${wide.error}` };
          t = wide.value;
        }
        datasetTotalsAdd(t, r.stats);
        nextTotals[r.run] = t;
        if (r.extras) extrasTotalsAdd((extrasTotals[r.run] ??= extrasTotalsCreate()), r.extras, r.stats.classIds);
        return { ...r, stats: frameDigestOf(r.stats) };
      });
      next[index] = { ...result, runs };
      frameColumnsAdd(columns, index, result.error, runs);
      done++;
      failed += failures(result);
    }
    set({
      results: next,
      resultsVersion: get().resultsVersion + 1,
      totals: nextTotals,
      scoring: { ...scoring, done, failed, finishedAt: done === scoring.total ? Date.now() : null },
    });
  },
});
