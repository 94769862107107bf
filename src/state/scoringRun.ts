import { shallow } from 'zustand/vanilla/shallow';
import type { ClassTable } from '../core/classTable.ts';
import type { Result } from '../core/result.ts';
import { scoringTableBuild } from '../core/scoringTable.ts';
import type { FrameJobResult } from '../core/frameJob.ts';
import type { ScoreSettings } from '../core/metrics/settings.ts';
import { sequencePlaces, type SequencePlace } from '../core/temporal/sequences.ts';
import type { FrameFiles } from '../data/pairing.ts';
import type { DatasetSource } from '../data/sources/source.ts';
import { JobCancelled } from '../workers/pool.ts';
import type { ScorePool } from '../workers/scorePool.ts';
import { fileBlobOf, type FileBlob } from '../workers/blobFiles.ts';
import { SCORE_COMMANDS, type FrameScoreRequest } from '../workers/scoreJobs.ts';
import type { LoadedDataset } from './datasetSlice.ts';
import { frameColumnsHas } from './frameColumns.ts';
import type { AppStore } from './store.ts';

/**
 * Returns the table frames are scored with, or why the settings' void id cannot be used with the
 * dataset's table (the rule of scoringTableBuild, the same as the command line's).
 */
export function scoringTableResult(dataset: LoadedDataset, settings: ScoreSettings): Result<ClassTable> {
  return scoringTableBuild(dataset.table, settings.ignore);
}

/**
 * Returns the table to show frames with: the scoring table, or, while the void id is refused, the
 * dataset's own table (scoring then fails every frame with the refusal).
 */
export function scoringTableOf(dataset: LoadedDataset, settings: ScoreSettings): ClassTable {
  const r = scoringTableResult(dataset, settings);
  return r.ok ? r.value : dataset.table!;
}

/** Returns the frame's file in `folder` as the workers take it (null when the frame has none); a failed read travels with it. */
export function frameBlobOf(source: DatasetSource, folder: string, path: string | null): Promise<FileBlob | null> {
  return path === null ? Promise.resolve(null) : fileBlobOf(`${folder}/${path}`, () => source.read(folder, path));
}

/**
 * Returns the worker request for one frame, reading its files from the source: with each run's
 * predictions at the frame's neighbours in its sequence (`place`, for flicker) and its instance map.
 */
export async function frameScoreRequest(
  dataset: LoadedDataset, frame: FrameFiles, table: ClassTable, settings: ScoreSettings, place: SequencePlace,
): Promise<FrameScoreRequest> {
  const { source, pairing } = dataset;
  const predAt = (run: string, i: number | null) => (i === null ? Promise.resolve(null) : frameBlobOf(source, `predictions/${run}`, pairing.frames[i].predictions[run]));
  const neighbours = await Promise.all(pairing.runs.map(async (run) => ({ run, prev: await predAt(run, place.prev), next: await predAt(run, place.next) })));
  const instances = await frameBlobOf(source, 'instances', frame.instance ?? null);
  const truth = (await frameBlobOf(source, 'truth', frame.truth))!;
  const preds = await Promise.all(pairing.runs.map(async (run) => ({ run, file: await frameBlobOf(source, `predictions/${run}`, frame.predictions[run]) })));
  const photo = await frameBlobOf(source, 'images', frame.image);
  const confidence = await Promise.all(
    Object.entries(frame.confidence).map(async ([run, path]) => ({ run, file: await frameBlobOf(source, `confidence/${run}`, path) })),
  );
  return { name: frame.name, truth, preds, photo, confidence, neighbours, instances, table, settings };
}

function failedResult(frame: FrameFiles, runs: string[], error: string): FrameJobResult {
  return { name: frame.name, width: 0, height: 0, error, runs: runs.map((run) => ({ run, stats: null, error })) };
}

/**
 * Keeps the store's scores in step with its dataset and settings: on every change it cancels the
 * pass in flight and scores every frame again in the pool, the frame on screen first, with at most
 * two jobs per worker in flight so reading files never runs far ahead of scoring. Returns a stop function.
 */
export function scoringKeep(store: AppStore, pool: ScorePool): () => void {
  let generation = store.getState().scoring.generation;

  // Finished frames reach the store in batches (at most every 60 ms): a long dataset then costs a
  // few hundred store updates, not one per frame.
  let pending: { index: number; result: FrameJobResult }[] = [];
  let pendingGen = -1;
  let flushTimer: ReturnType<typeof setTimeout> | null = null;
  const flush = () => {
    flushTimer = null;
    const batch = pending;
    pending = [];
    if (batch.length && pendingGen === generation) store.getState().scoringFramesDone(pendingGen, batch);
  };
  const deliver = (gen: number, index: number, result: FrameJobResult) => {
    if (gen !== pendingGen) {
      pending = [];
      pendingGen = gen;
    }
    pending.push({ index, result });
    flushTimer ??= setTimeout(flush, 60);
  };

  /** Scores frame `index` in the pool and delivers it (a failure as a failed frame) unless pass `gen` is over. */
  let placesOf: { dataset: LoadedDataset; places: ReturnType<typeof sequencePlaces> } | null = null;
  const scoreOne = async (gen: number, dataset: LoadedDataset, table: ClassTable, settings: ScoreSettings, index: number): Promise<void> => {
    const frame = dataset.pairing.frames[index];
    if (placesOf?.dataset !== dataset) placesOf = { dataset, places: sequencePlaces(dataset.pairing.frames.map((f) => f.name)) };
    let result: FrameJobResult;
    try {
      const req = await frameScoreRequest(dataset, frame, table, settings, placesOf.places[index]);
      if (gen !== generation) return;
      result = await pool.run(SCORE_COMMANDS.frameScore, req);
    } catch (e) {
      if (e instanceof JobCancelled || gen !== generation) return;
      result = failedResult(frame, dataset.pairing.runs, `${frame.name}: ${(e as Error).message}`);
    }
    if (gen === generation) deliver(gen, index, result);
  };

  // With a results folder open only the frame on screen is scored (to check it against its stored
  // row); one job at a time, the latest frame asked for next.
  let liveBusy = false;
  let liveWanted = -1;
  const live = (gen: number, index: number, run: (index: number) => Promise<void>) => {
    liveWanted = index;
    if (liveBusy) return;
    const next = async (): Promise<void> => {
      while (gen === generation && liveWanted >= 0) {
        const i = liveWanted;
        liveWanted = -1;
        if (store.getState().results[i] || (pendingGen === gen && pending.some((p) => p.index === i))) continue;
        await run(i);
      }
    };
    liveBusy = true;
    void next().finally(() => (liveBusy = false));
  };

  // Frames of the current pass not yet handed to a worker, the next first.
  let waiting: number[] = [];

  function restart(): void {
    const { dataset, settings, frameIndex, stored, storedLoading } = store.getState();
    pool.cancelAll();
    generation++;
    waiting = [];
    const gen = generation;
    const frames = dataset?.pairing.frames ?? [];
    const built = dataset ? scoringTableResult(dataset, settings) : null;
    const table = built?.ok ? built.value : null;
    store.getState().scoringStart(gen, frames.length, table && !table.generated ? table.classes.map((c) => c.id) : null);
    // While a results folder opens nothing is scored: its tables are about to give every score.
    if (!dataset || !built || frames.length === 0 || storedLoading) return;
    // A refused void id fails every frame with the refusal, as the command line refuses to start.
    if (!built.ok) return frames.forEach((f, i) => deliver(gen, i, failedResult(f, dataset.pairing.runs, built.error)));
    const runOne = (index: number) => scoreOne(gen, dataset, built.value, settings, index);
    if (stored) {
      liveBusy = false;
      return live(gen, Math.min(frameIndex, frames.length - 1), runOne);
    }
    waiting = scoreOrder(frames.map((_, i) => i), Math.min(frameIndex, frames.length - 1));
    const window = Math.max(1, pool.size * 2);

    const lane = async (): Promise<void> => {
      while (gen === generation && waiting.length > 0) await runOne(waiting.shift()!);
    };
    for (let i = 0; i < window; i++) void lane();
  }

  const unsubscribe = store.subscribe((s) => [s.dataset, s.settings, s.stored, s.storedLoading] as const, restart, { equalityFn: shallow });
  const unsubscribeFrame = store.subscribe((s) => s.frameIndex, (index) => {
    // Frames not started yet go in order of their distance from the frame now on screen.
    waiting = scoreOrder(waiting, index);
    const { dataset, stored, settings, columns, results } = store.getState();
    // With a results folder the frame on screen is scored live; without one, a frame already scored
    // whose full result was let go (scoresSlice DETAIL_KEEP) is scored again to show it.
    const wanted = stored || (frameColumnsHas(columns, index) && !results[index]);
    const built = dataset && wanted ? scoringTableResult(dataset, settings) : null;
    if (!dataset || !built?.ok || index >= dataset.pairing.frames.length) return;
    const gen = generation;
    live(gen, index, (i) => scoreOne(gen, dataset, built.value, settings, i));
  });
  if (store.getState().dataset) restart();
  return () => {
    unsubscribe();
    unsubscribeFrame();
    generation++;
    pool.cancelAll();
  };
}

/**
 * Returns `indices` in scoring order around frame `at`: `at` first, then its neighbours by distance
 * (the next frame before the previous one at the same distance), so the frame on screen and the ones
 * a reviewer steps to next are scored first.
 */
export function scoreOrder(indices: readonly number[], at: number): number[] {
  const key = (i: number) => 2 * Math.abs(i - at) - (i > at ? 1 : 0);
  return [...indices].sort((a, b) => key(a) - key(b));
}
