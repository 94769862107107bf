import { browserPortCreate } from './browserPort.ts';
import { workerPoolCreate, type WorkerPool } from './pool.ts';

/** Returns a pool of scoring workers, one per logical core (`navigator.hardwareConcurrency`). */
export function scorePoolCreate(size = Math.max(1, navigator.hardwareConcurrency || 2)): WorkerPool {
  return workerPoolCreate(
    () => browserPortCreate(() => new Worker(new URL('./score.worker.ts', import.meta.url), { type: 'module', name: 'hairline-score' })),
    size,
  );
}

/** Returns a pool of view workers that decode frames for the viewer (small: frames are decoded a few at a time). */
export function viewPoolCreate(size = 2): WorkerPool {
  return workerPoolCreate(
    () => browserPortCreate(() => new Worker(new URL('./view.worker.ts', import.meta.url), { type: 'module', name: 'hairline-view' })),
    size,
  );
}
