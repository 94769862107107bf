import {
  REVIEW_SCHEMA,
  reviewRecordFromStored,
  reviewRecordKey,
  reviewRecordNewer,
  reviewRecordToStored,
  reviewStoredVersion,
  type ReviewRecord,
} from '../core/review/reviewRecord.ts';

/**
 * Where review records live: a small key-value interface, so the same merge code runs
 * over IndexedDB in the browser (reviewBackendIdb) and over a Map in tests (reviewBackendMemory).
 */
export interface ReviewBackend {
  /** Returns every [key, value] whose key starts with `prefix`. */
  entries(prefix: string): Promise<[string, unknown][]>;
  get(key: string): Promise<unknown>;
  /**
   * Replaces the value at each key by `updater(old)`, all in one atomic transaction: no other write
   * lands in between, and either every value is written or none (a bulk change is one commit, not
   * one per record, so it lands before a reload that follows it closely).
   */
  updateMany(updates: readonly (readonly [key: string, updater: (old: unknown) => unknown])[]): Promise<void>;
  del(key: string): Promise<void>;
}

/** Returns the storage key prefix of one dataset's records (layout 2: one value per record). */
export function reviewStoragePrefix(datasetKey: string): string {
  return `hairline-review/${datasetKey}/`;
}

/** What writing records found: stored versions that were newer than ours (they stay), and problems. */
export interface ReviewPutOutcome {
  newer: ReviewRecord[];
  problems: string[];
}

/**
 * Writes records in one transaction, each update keeping whichever version is newer (stored or
 * ours), so two tabs writing at once never lose each other's edits. Returns the stored versions that won.
 */
export async function reviewStoragePut(backend: ReviewBackend, datasetKey: string, records: readonly ReviewRecord[]): Promise<ReviewPutOutcome> {
  const out: ReviewPutOutcome = { newer: [], problems: [] };
  const prefix = reviewStoragePrefix(datasetKey);
  if (records.length === 0) return out;
  await backend.updateMany(
    records.map((r) => {
      const key = prefix + reviewRecordKey(r);
      return [key, (old: unknown) => {
        if (old === undefined) return reviewRecordToStored(r);
        const version = reviewStoredVersion(old);
        if (version !== null && version > REVIEW_SCHEMA) {
          out.problems.push(`${reviewRecordKey(r)} was saved by a newer version of Hairline (schema ${version}) and was left as it is`);
          return old;
        }
        const stored = reviewRecordFromStored(old, key);
        if (stored.ok && !reviewRecordNewer(r, stored.value)) {
          if (stored.value.updatedAt !== r.updatedAt || stored.value.writer !== r.writer) out.newer.push(stored.value);
          return old;
        }
        return reviewRecordToStored(r);
      }] as const;
    }),
  );
  return out;
}

/** Returns the records stored under the given record keys (missing or unreadable ones left out). */
export async function reviewStorageGet(backend: ReviewBackend, datasetKey: string, recordKeys: readonly string[]): Promise<ReviewRecord[]> {
  const prefix = reviewStoragePrefix(datasetKey);
  const values = await Promise.all(recordKeys.map((k) => backend.get(prefix + k)));
  const out: ReviewRecord[] = [];
  values.forEach((v, i) => {
    if (v === undefined) return;
    const r = reviewRecordFromStored(v, recordKeys[i]);
    if (r.ok) out.push(r.value);
  });
  return out;
}

/**
 * Returns every record of a dataset; unreadable or newer-schema records are left untouched and
 * reported in `problems`.
 */
export async function reviewStorageLoad(backend: ReviewBackend, datasetKey: string): Promise<{ records: ReviewRecord[]; problems: string[] }> {
  const problems: string[] = [];
  const prefix = reviewStoragePrefix(datasetKey);
  const records: ReviewRecord[] = [];
  let newerSchema = 0;
  for (const [key, value] of await backend.entries(prefix)) {
    const version = reviewStoredVersion(value);
    if (version !== null && version > REVIEW_SCHEMA) {
      newerSchema++;
      continue;
    }
    const r = reviewRecordFromStored(value, key.slice(prefix.length));
    if (r.ok) records.push(r.value);
    else problems.push(r.error);
  }
  if (newerSchema === 1) problems.push('1 saved record is from a newer version of Hairline and was left as it is');
  else if (newerSchema > 1) problems.push(`${newerSchema} saved records are from a newer version of Hairline and were left as they are`);
  return { records, problems };
}

/** Returns a backend over a Map (values structured-cloned in and out, as IndexedDB does); for tests and for running without IndexedDB. */
export function reviewBackendMemory(map: Map<string, unknown> = new Map()): ReviewBackend {
  const tick = () => new Promise<void>((r) => setTimeout(r, 0));
  return {
    async entries(prefix) {
      await tick();
      return [...map].filter(([k]) => k.startsWith(prefix)).map(([k, v]) => [k, structuredClone(v)]);
    },
    async get(key) {
      await tick();
      return map.has(key) ? structuredClone(map.get(key)) : undefined;
    },
    async updateMany(updates) {
      await tick();
      // One synchronous read-modify-write of every key: nothing else can run in between, and an
      // updater that throws leaves every value as it was.
      const next = updates.map(([key, updater]) => [key, structuredClone(updater(map.has(key) ? structuredClone(map.get(key)) : undefined))] as const);
      for (const [key, value] of next) map.set(key, value);
    },
    async del(key) {
      await tick();
      map.delete(key);
    },
  };
}
