import { reviewRecordKey, type ReviewRecord } from '../core/review/reviewRecord.ts';
import type { ReviewChannel } from './reviewChannel.ts';
import { reviewStorageGet, reviewStorageLoad, reviewStoragePut, type ReviewBackend } from './reviewStorage.ts';
import type { AppStore } from './store.ts';

/** The page's life-cycle events reviewKeep listens to (the window in the app; none in tests). */
export interface ReviewPageEvents {
  addEventListener(type: 'pagehide' | 'visibilitychange' | 'beforeunload', listener: (e: Event) => void): void;
  removeEventListener(type: 'pagehide' | 'visibilitychange' | 'beforeunload', listener: (e: Event) => void): void;
}

/** Storage, (optionally) the channel to other tabs, and the page whose closing flushes the writes. */
export interface ReviewKeepOptions {
  backend: ReviewBackend;
  channel?: ReviewChannel | null;
  page?: ReviewPageEvents | null;
}

/** A promise per settled step, so a caller (or a test) can wait until every write has landed. */
export interface ReviewKeeper {
  stop(): void;
  /** Resolves once the load and every write started so far have finished. */
  idle(): Promise<void>;
  /** Returns whether changes are waiting to be written or being written. */
  pending(): boolean;
}

function saveError(e: unknown): string {
  return `Flags could not be saved (${(e as Error)?.message ?? String(e)}); they stay on screen and are saved with the next change. Export them as JSON to keep a copy.`;
}

/**
 * Keeps the review slice persistent: loads the saved records when a dataset opens (by its fingerprint),
 * writes changed records in last-write-wins updates, tells other tabs, and merges what other tabs
 * wrote. Changes made together (an import, a bulk delete, many edits in one task) go in one
 * transaction; while one is being written, further changes gather for the next, so a burst of edits
 * costs two commits, not one per record. When the page is hidden or closed the gathered changes are
 * written at once, and while any are unwritten the page asks before unloading. Returns the keeper.
 */
export function reviewKeep(store: AppStore, options: ReviewKeepOptions): ReviewKeeper {
  const { backend, channel, page } = options;
  /** Per record key: the record storage is known to hold (the same object as in the store). */
  const stored = new Map<string, ReviewRecord>();
  let key: string | null = null;
  let generation = 0;
  const inflight = new Set<Promise<unknown>>();
  const track = <T>(p: Promise<T>): Promise<T> => {
    inflight.add(p);
    void p.finally(() => inflight.delete(p)).catch(() => {});
    return p;
  };

  const merge = (records: ReviewRecord[]) => {
    for (const r of records) stored.set(reviewRecordKey(r), r);
    store.getState().reviewMerge(records);
  };

  function open(datasetKey: string | null): void {
    generation++;
    const gen = generation;
    key = datasetKey;
    stored.clear();
    store.getState().reviewOpen(datasetKey);
    if (datasetKey === null) return;
    void track(
      reviewStorageLoad(backend, datasetKey).then(
        ({ records, problems }) => {
          if (gen !== generation) return;
          merge(records);
          store.getState().reviewStatusSet('ready', problems.length ? `Some saved review data was not loaded: ${problems.join('; ')}` : null);
          write(); // edits made while loading, or records the load did not hold
        },
        (e) => gen === generation && store.getState().reviewStatusSet('ready', `Saved flags could not be read (${(e as Error)?.message ?? e}); new flags are still saved.`),
      ),
    );
  }

  /** Changes seen but not yet handed to storage, and whether a transaction is being written. */
  let dirty = false;
  let writing = false;
  let scheduled = false;

  /** Notes a change; it is written in the next task's transaction, together with any made meanwhile. */
  function write(): void {
    dirty = true;
    if (scheduled || writing) return;
    scheduled = true;
    queueMicrotask(() => {
      scheduled = false;
      flush();
    });
  }

  function flush(): void {
    if (!dirty || writing) return;
    const s = store.getState();
    if (key === null || s.reviewDatasetKey !== key || s.reviewStatus === 'loading') return;
    dirty = false;
    const changed: ReviewRecord[] = [];
    for (const [k, r] of Object.entries(s.reviewRecords)) {
      if (stored.get(k) === r) continue;
      stored.set(k, r);
      changed.push(r);
    }
    if (changed.length === 0) return;
    const datasetKey = key;
    const gen = generation;
    writing = true;
    const settle = () => {
      writing = false;
      if (dirty) flush();
    };
    void track(
      reviewStoragePut(backend, datasetKey, changed).finally(settle).then(
        ({ newer, problems }) => {
          if (gen !== generation) return;
          if (newer.length) merge(newer);
          if (problems.length) store.getState().reviewStatusSet(store.getState().reviewStatus, problems.join('; '));
          else if (store.getState().reviewError?.startsWith('Flags could not be saved')) store.getState().reviewStatusSet(store.getState().reviewStatus, null);
          channel?.post({ datasetKey, keys: changed.map(reviewRecordKey), writer: s.reviewWriter });
        },
        (e) => {
          if (gen !== generation) return;
          // Forget them as stored so the next change writes them again.
          for (const r of changed) if (stored.get(reviewRecordKey(r)) === r) stored.delete(reviewRecordKey(r));
          store.getState().reviewStatusSet(store.getState().reviewStatus, saveError(e));
        },
      ),
    );
  }

  channel?.listen((m) => {
    if (m.datasetKey !== key || m.writer === store.getState().reviewWriter) return;
    const gen = generation;
    void track(reviewStorageGet(backend, m.datasetKey, m.keys).then((records) => gen === generation && merge(records)));
  });

  const unsubscribe = store.subscribe((s, prev) => {
    const datasetKey = s.dataset?.key ?? null;
    if (datasetKey !== key) return open(datasetKey);
    if (s.reviewRecords !== prev.reviewRecords || s.reviewStatus !== prev.reviewStatus) write();
  });
  open(store.getState().dataset?.key ?? null);

  const pending = () => dirty || writing || inflight.size > 0;
  // Hidden or closing: hand gathered changes to storage now, not in a later task that may never run.
  const onHide = (e: Event) => {
    if (e.type === 'pagehide' || (e.target as Document | null)?.visibilityState !== 'visible') flush();
  };
  // Closing with writes unfinished: the browser asks the user to stay (it shows its own words).
  const onBeforeUnload = (e: Event) => {
    flush();
    if (!pending()) return;
    e.preventDefault();
    (e as unknown as { returnValue: string }).returnValue = '';
  };
  page?.addEventListener('pagehide', onHide);
  page?.addEventListener('visibilitychange', onHide);
  page?.addEventListener('beforeunload', onBeforeUnload);

  return {
    stop() {
      unsubscribe();
      generation++;
      channel?.close();
      page?.removeEventListener('pagehide', onHide);
      page?.removeEventListener('visibilitychange', onHide);
      page?.removeEventListener('beforeunload', onBeforeUnload);
    },
    async idle() {
      for (;;) {
        if (inflight.size) await Promise.allSettled([...inflight]);
        else if (scheduled) await new Promise<void>((r) => setTimeout(r, 0));
        else return;
      }
    },
    pending,
  };
}
