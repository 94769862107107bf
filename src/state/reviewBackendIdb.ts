import { createStore, del, get, promisifyRequest, update } from 'idb-keyval';
import type { ReviewBackend } from './reviewStorage.ts';

/** Returns the IndexedDB backend of review records (idb-keyval, a database of its own with one object store). */
export function reviewBackendIdb(dbName = 'hairline-review', storeName = 'records'): ReviewBackend {
  const store = createStore(dbName, storeName);
  return {
    entries: (prefix) =>
      store('readonly', async (s) => {
        // Keys are strings, so a prefix is a key range from the prefix up to its last possible extension.
        const range = IDBKeyRange.bound(prefix, prefix + '\uffff');
        const [keys, values] = await Promise.all([promisifyRequest(s.getAllKeys(range)), promisifyRequest(s.getAll(range))]);
        return keys.map((k, i): [string, unknown] => [String(k), values[i]]);
      }),
    get: (key) => get(key, store),
    update: (key, updater) => update(key, updater, store),
    del: (key) => del(key, store),
  };
}
