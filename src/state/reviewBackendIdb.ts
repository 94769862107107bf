import { createStore, del, get, promisifyRequest } from 'idb-keyval';
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
    updateMany: (updates) =>
      store('readwrite', (s) =>
        // Every get and put is issued from request callbacks of this one transaction (a promise chain
        // in between would let it close); it commits once all are issued, or aborts on any error.
        new Promise<void>((resolve, reject) => {
          const tx = s.transaction;
          let left = updates.length;
          if (left === 0) return resolve();
          const done = promisifyRequest(tx).then(() => undefined);
          for (const [key, updater] of updates) {
            const req = s.get(key);
            req.onsuccess = () => {
              try {
                s.put(updater(req.result), key);
              } catch (e) {
                tx.abort();
                return reject(e);
              }
              if (--left === 0) {
                // Commit now rather than when the event loop comes back: a page being closed gets its writes in.
                tx.commit?.();
                resolve(done);
              }
            };
          }
          done.catch(reject);
        }),
      ),
    del: (key) => del(key, store),
  };
}
