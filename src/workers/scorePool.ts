import { browserPortCreate } from './browserPort.ts';
import { blobPngPixels } from './blobBounded.ts';
import { SCORE_PIXEL_BUDGET, workerPoolCreate, type WorkerPool } from './pool.ts';
import type { ScoreJobs } from './scoreJobs.ts';
import type { ViewJobs } from './viewJobs.ts';

/** A pool of scoring workers (score.worker.ts). */
export type ScorePool = WorkerPool<ScoreJobs>;

/** A pool of view workers (view.worker.ts). */
export type ViewPool = WorkerPool<ViewJobs>;

/**
 * Returns a pool of scoring workers, one per logical core (`navigator.hardwareConcurrency`), with a
 * watchdog deadline and a memory budget from each frame's size (its ground truth's PNG header).
 */
export function scorePoolCreate(size = Math.max(1, navigator.hardwareConcurrency || 2)): ScorePool {
  return workerPoolCreate<ScoreJobs>(
    () => browserPortCreate(() => new Worker(new URL('./score.worker.ts', import.meta.url), { type: 'module', name: 'hairline-score' })),
    size,
    {
      jobPixels: (_cmd, input) => {
        const truth = (input as Parameters<ScoreJobs['frameScore']>[0]).truth.blob;
        return truth ? blobPngPixels(truth) : null;
      },
      pixelBudget: SCORE_PIXEL_BUDGET,
    },
  );
}

/** Returns a pool of view workers that decode frames for the viewer (small: frames are decoded a few at a time). */
export function viewPoolCreate(size = 2): ViewPool {
  return workerPoolCreate<ViewJobs>(
    () => browserPortCreate(() => new Worker(new URL('./view.worker.ts', import.meta.url), { type: 'module', name: 'hairline-view' })),
    size,
  );
}
