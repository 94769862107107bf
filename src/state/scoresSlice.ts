import type { StateCreator } from 'zustand/vanilla';
import type { FrameJobResult, FrameRunResult } from '../core/frameJob.ts';
import { dictCreate, dictFrom } from '../core/dict.ts';
import { datasetTotalsAdd, datasetTotalsCreate, datasetTotalsWiden, type DatasetTotals } from '../core/metrics/datasetTotals.ts';
import { extrasTotalsAdd, extrasTotalsCreate, type ExtrasTotals } from '../core/metrics/extrasTotals.ts';
import { frameDigestOf, type FrameDigest } from '../core/metrics/frameDigest.ts';
import { censusKeep } from '../core/report/reportCensus.ts';
import { SUSPECT_DEFAULTS } from '../core/suspects/suspectSettings.ts';
import { confusionFramesAdd, type ConfusionFrames } from './confusionFrames.ts';
import { frameColumnsAdd, frameColumnsCreate, frameColumnsHas, type FrameColumns } from './frameColumns.ts';
import { queueEvidenceAdd, queueEvidenceCreate, type QueueEvidence } from './queueEvidence.ts';
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
  /**
   * Per frame index: the frame's full result (digests, regions, extras) for the DETAIL_KEEP frames
   * that landed last and the frame on screen; undefined for the others (their scores are in `columns`,
   * the queue's evidence in `queueEvidence`). The array is replaced (not mutated) on every change.
   */
  results: (StoredFrame | undefined)[];
  /** Frames whose detail `results` holds, oldest first. */
  detailOrder: number[];
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
  /** The likely-label-mistake queue's evidence (mutated in place, as totals). */
  queueEvidence: QueueEvidence;
  /** Per run: the frames with the most pixels in each confusion cell (mutated in place, as totals). */
  confusionFrames: ConfusionFrames;
  /** How each run's ids line up with the truth's over the frames scored so far (the report's id-space warnings). */
  census: ReturnType<typeof censusKeep>;
  scoringStart(generation: number, total: number, classIds: number[] | null): void;
  /** Takes finished frames of pass `generation` (frames of an older pass are dropped). */
  scoringFramesDone(generation: number, done: { index: number; result: FrameJobResult }[]): void;
}

/** Frames whose full result the store keeps besides the frame on screen (the last to land). */
export const DETAIL_KEEP = 256;

function failures(r: { error: string | null; runs: { error: string | null }[] }): number {
  if (r.error) return 1;
  return r.runs.filter((x) => x.error).length;
}

/** Returns the scores slice: per-frame digests of the current pass, running dataset totals, progress. */
export const scoresSlice: StateCreator<AppState, [], [], ScoresSlice> = (set, get) => ({
  scoring: { generation: 0, total: 0, done: 0, failed: 0, startedAt: 0, finishedAt: null },
  results: [],
  detailOrder: [],
  resultsVersion: 0,
  totals: dictCreate(),
  totalsClassIds: null,
  extrasTotals: dictCreate(),
  columns: frameColumnsCreate(0, []),
  queueEvidence: queueEvidenceCreate(0, SUSPECT_DEFAULTS),
  confusionFrames: new Map(),
  census: censusKeep([]),
  scoringStart: (generation, total, classIds) =>
    set({
      scoring: { generation, total, done: 0, failed: 0, startedAt: Date.now(), finishedAt: total === 0 ? Date.now() : null },
      results: new Array(total),
      resultsVersion: get().resultsVersion + 1,
      totals: dictCreate(),
      totalsClassIds: classIds,
      extrasTotals: dictCreate(),
      columns: frameColumnsCreate(total, get().dataset?.pairing.runs ?? []),
      queueEvidence: queueEvidenceCreate(total, SUSPECT_DEFAULTS),
      confusionFrames: new Map(),
      census: censusKeep(get().dataset?.pairing.runs ?? []),
      detailOrder: [],
    }),
  scoringFramesDone: (generation, batch) => {
    const { scoring, results, totals, totalsClassIds, extrasTotals, columns, queueEvidence, confusionFrames, census, frameIndex } = get();
    if (generation !== scoring.generation) return;
    const next = results.slice();
    const order = get().detailOrder.slice();
    const nextTotals = dictFrom(totals);
    let done = scoring.done;
    let failed = scoring.failed;
    for (const { index, result } of batch) {
      if (index < 0 || index >= next.length || next[index]) continue;
      // A frame scored again only to show it (its detail was let go) adds nothing to the sums.
      const again = frameColumnsHas(columns, index);
      const runs: StoredRun[] = result.runs.map((r) => {
        if (!r.stats || result.error || r.error) return { ...r, stats: null };
        if (again) return { ...r, stats: frameDigestOf(r.stats) };
        let t = nextTotals[r.run] ?? datasetTotalsCreate(totalsClassIds ?? []);
        if (totalsClassIds === null) {
          const wide = datasetTotalsWiden(t, r.stats.classIds);
          if (!wide.ok) return { ...r, stats: null, error: `${result.name}: ${wide.error}` };
          t = wide.value;
        }
        datasetTotalsAdd(t, r.stats);
        nextTotals[r.run] = t;
        if (r.extras) extrasTotalsAdd((extrasTotals[r.run] ??= extrasTotalsCreate()), r.extras, r.stats.classIds);
        confusionFramesAdd(confusionFrames, r.run, index, r.stats);
        return { ...r, stats: frameDigestOf(r.stats) };
      });
      next[index] = { ...result, runs };
      order.push(index);
      if (again) continue;
      frameColumnsAdd(columns, index, result.error, runs);
      queueEvidenceAdd(queueEvidence, index, result);
      if (!result.error) census.add(result);
      done++;
      failed += failures(result);
    }
    // Only the last DETAIL_KEEP frames and the frame on screen keep their full result.
    while (order.length > DETAIL_KEEP) {
      const old = order.shift()!;
      if (old === frameIndex) order.push(old);
      else next[old] = undefined;
    }
    set({
      results: next,
      detailOrder: order,
      resultsVersion: get().resultsVersion + 1,
      totals: nextTotals,
      scoring: { ...scoring, done, failed, finishedAt: done === scoring.total ? Date.now() : null },
    });
  },
});
