import type { ViewPool } from '../workers/scorePool.ts';
import { shallow } from 'zustand/vanilla/shallow';
import type { DecodedFrame } from '../core/decodedFrame.ts';
import type { Result } from '../core/result.ts';
import { sequencePlaces, type SequencePlace } from '../core/temporal/sequences.ts';
import { frameCacheCreate, type FrameCache } from './frameCache.ts';
import { scoringTableSel } from './selectors.ts';
import type { AppStore } from './store.ts';

/** Neighbours decoded ahead of the cursor, nearest first (forward is the usual direction of review). */
const PREFETCH = [1, -1, 2];
/** Neighbours whose textures the viewer uploads ahead: the frames → and ← show. */
const NEARBY = [1, -1];

/**
 * Keeps `shown` in step with the frame index: decodes the wanted frame in the view pool (cache first),
 * prefetches its neighbours, and drops answers for frames the user has already moved past.
 * Returns a stop function.
 */
export function shownKeep(store: AppStore, pool: ViewPool): () => void {
  let cache: FrameCache | null = null;
  let places: SequencePlace[] = [];
  let wanted = -1;

  // A new dataset or void id decodes with a new table, so the cache starts over.
  function cacheRenew(): void {
    const s = store.getState();
    const table = scoringTableSel(s);
    cache = s.dataset && table && s.dataset.pairing.frames.length > 0 ? frameCacheCreate(s.dataset, table, pool) : null;
    places = s.dataset ? sequencePlaces(s.dataset.pairing.frames.map((f) => f.name)) : [];
    wanted = -1;
    update();
  }

  function update(): void {
    const { frameIndex } = store.getState();
    if (!cache) {
      if (store.getState().shown) store.getState().shownSet(-1, null, null);
      return;
    }
    if (frameIndex === wanted) return;
    wanted = frameIndex;
    const c = cache!;
    const index = frameIndex;
    c.get(index).then(
      (frame) => {
        if (cache !== c || wanted !== index) return;
        store.getState().shownSet(index, frame.ok ? frame.value : null, frame.ok ? null : frame.error);
        if (frame.ok) aroundFetch(c, index);
        for (const d of PREFETCH) c.prefetch(index + d);
        if (frame.ok) nearbyFetch(c, index);
      },
      (e: Error) => {
        if (cache !== c || wanted !== index) return;
        store.getState().shownSet(index, null, e.message);
      },
    );
  }

  // The neighbours in the sequence (the same frames the scorer's flicker reads), for the flicker layer.
  function aroundFetch(c: FrameCache, index: number): void {
    const place = places[index];
    if (!place || place.prev === null || place.next === null) return;
    const preds = (r: Result<DecodedFrame>) => (r.ok ? r.value.preds : {});
    void Promise.all([c.get(place.prev), c.get(place.next)]).then(
      ([prev, next]) => {
        if (cache === c && wanted === index) store.getState().shownAroundSet(index, { prev: preds(prev), next: preds(next) });
      },
      () => {},
    );
  }

  // The frames a key press shows next, handed on once decoded so the viewer can upload them ahead.
  function nearbyFetch(c: FrameCache, index: number): void {
    const n = store.getState().dataset?.pairing.frames.length ?? 0;
    const near = NEARBY.map((d) => index + d).filter((i) => i >= 0 && i < n);
    void Promise.all(near.map((i) => c.get(i))).then(
      (frames) => {
        if (cache === c && wanted === index) store.getState().shownNearbySet(index, frames.flatMap((f) => (f.ok ? [f.value] : [])));
      },
      () => {},
    );
  }

  const stops = [
    store.subscribe((s) => [s.dataset, s.settings.ignore] as const, cacheRenew, { equalityFn: shallow }),
    store.subscribe((s) => s.frameIndex, update),
  ];
  cacheRenew();
  return () => stops.forEach((stop) => stop());
}
