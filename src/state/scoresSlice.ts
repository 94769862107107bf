import type { StateCreator } from 'zustand/vanilla';
import type { FrameJobResult } from '../core/frameJob.ts';
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

export interface ScoresSlice {
  scoring: ScoringProgress;
  /** Per frame index: its result once scored. The array is replaced (not mutated) on every change. */
  results: (FrameJobResult | undefined)[];
  /** Bumped each time a result lands, so derived totals can be memoised on it. */
  resultsVersion: number;
  scoringStart(generation: number, total: number): void;
  scoringFrameDone(generation: number, index: number, result: FrameJobResult): void;
}

function failures(r: FrameJobResult): number {
  if (r.error) return 1;
  return r.runs.filter((x) => x.error).length;
}

/** Returns the scores slice: per-frame results of the current pass and its progress. */
export const scoresSlice: StateCreator<AppState, [], [], ScoresSlice> = (set, get) => ({
  scoring: { generation: 0, total: 0, done: 0, failed: 0, startedAt: 0, finishedAt: null },
  results: [],
  resultsVersion: 0,
  scoringStart: (generation, total) =>
    set({
      scoring: { generation, total, done: 0, failed: 0, startedAt: Date.now(), finishedAt: total === 0 ? Date.now() : null },
      results: new Array(total),
      resultsVersion: get().resultsVersion + 1,
    }),
  scoringFrameDone: (generation, index, result) => {
    const { scoring, results } = get();
    if (generation !== scoring.generation || index < 0 || index >= results.length) return;
    const next = results.slice();
    const had = next[index];
    next[index] = result;
    const done = scoring.done + (had ? 0 : 1);
    const failed = scoring.failed - (had ? failures(had) : 0) + failures(result);
    set({
      results: next,
      resultsVersion: get().resultsVersion + 1,
      scoring: { ...scoring, done, failed, finishedAt: done === scoring.total ? Date.now() : null },
    });
  },
});
