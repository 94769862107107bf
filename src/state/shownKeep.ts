import type { ViewPool } from '../workers/scorePool.ts';
import { frameCacheCreate, type FrameCache } from './frameCache.ts';
import type { LoadedDataset } from './datasetSlice.ts';
import { scoringTableOf } from './scoringRun.ts';
import type { AppStore } from './store.ts';

/** Neighbours decoded ahead of the cursor, nearest first (forward is the usual direction of review). */
const PREFETCH = [1, -1, 2];

/**
 * Keeps `shown` in step with the frame index: decodes the wanted frame in the view pool (cache first),
 * prefetches its neighbours, and drops answers for frames the user has already moved past.
 * Returns a stop function.
 */
export function shownKeep(store: AppStore, pool: ViewPool): () => void {
  let cache: FrameCache | null = null;
  let cacheFor: LoadedDataset | null = null;
  let cacheIgnore = -1;
  let wanted = -1;

  function update(): void {
    const { dataset, frameIndex, settings } = store.getState();
    if (!dataset || dataset.pairing.frames.length === 0) {
      cache = null;
      cacheFor = null;
      if (store.getState().shown) store.getState().shownSet(-1, null, null);
      return;
    }
    if (dataset !== cacheFor || settings.ignore !== cacheIgnore) {
      cache = frameCacheCreate(dataset, scoringTableOf(dataset, settings), pool);
      cacheFor = dataset;
      cacheIgnore = settings.ignore;
      wanted = -1;
    }
    if (frameIndex === wanted) return;
    wanted = frameIndex;
    const c = cache!;
    const index = frameIndex;
    c.get(index).then(
      (frame) => {
        if (cache !== c || wanted !== index) return;
        store.getState().shownSet(index, frame.ok ? frame.value : null, frame.ok ? null : frame.error);
        for (const d of PREFETCH) c.prefetch(index + d);
      },
      (e: Error) => {
        if (cache !== c || wanted !== index) return;
        store.getState().shownSet(index, null, e.message);
      },
    );
  }

  const unsubscribe = store.subscribe((s, prev) => {
    if (s.dataset !== prev.dataset || s.frameIndex !== prev.frameIndex || s.settings.ignore !== prev.settings.ignore) update();
  });
  update();
  return unsubscribe;
}
