import { reviewRecordKey, type ReviewRecord } from '../core/review/reviewRecord.ts';
import type { ReviewChannel } from './reviewChannel.ts';
import { reviewStorageGet, reviewStorageLoad, reviewStoragePut, type ReviewBackend } from './reviewStorage.ts';
import type { AppStore } from './store.ts';

/** Storage and (optionally) the channel to other tabs that reviewKeep works with. */
export interface ReviewKeepOptions {
  backend: ReviewBackend;
  channel?: ReviewChannel | null;
}

/** A promise per settled step, so a caller (or a test) can wait until every write has landed. */
export interface ReviewKeeper {
  stop(): void;
  /** Resolves once the load and every write started so far have finished. */
  idle(): Promise<void>;
}

function saveError(e: unknown): string {
  return `Flags could not be saved (${(e as Error)?.message ?? String(e)}); they stay on screen and are saved with the next change. Export them as JSON to keep a copy.`;
}

/**
 * Keeps the review slice persistent: loads the saved records when a dataset opens (by its fingerprint),
 * writes every changed record at once in its own last-write-wins update, tells other tabs, and merges
 * what other tabs wrote. Returns the keeper (stop, idle).
 */
export function reviewKeep(store: AppStore, options: ReviewKeepOptions): ReviewKeeper {
  const { backend, channel } = options;
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

  function write(): void {
    const s = store.getState();
    if (key === null || s.reviewDatasetKey !== key || s.reviewStatus === 'loading') return;
    const changed: ReviewRecord[] = [];
    for (const [k, r] of Object.entries(s.reviewRecords)) {
      if (stored.get(k) === r) continue;
      stored.set(k, r);
      changed.push(r);
    }
    if (changed.length === 0) return;
    const datasetKey = key;
    const gen = generation;
    void track(
      reviewStoragePut(backend, datasetKey, changed).then(
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

  return {
    stop() {
      unsubscribe();
      generation++;
      channel?.close();
    },
    async idle() {
      while (inflight.size) await Promise.allSettled([...inflight]);
    },
  };
}
