// Test page for review persistence: one app store with the real IndexedDB backend (idb-keyval) and
// the real BroadcastChannel, as a tab of the app has them. Driven by test/browser/review.test.ts,
// which opens it in two pages of one browser context (two tabs sharing one IndexedDB).
import type { DatasetSource } from '../../../src/data/sources/source.ts';
import { datasetFromSource, datasetInstall } from '../../../src/state/datasetLoad.ts';
import { reviewBackendIdb } from '../../../src/state/reviewBackendIdb.ts';
import { reviewChannelOpen } from '../../../src/state/reviewChannel.ts';
import { reviewKeep } from '../../../src/state/reviewKeep.ts';
import { appStoreCreate } from '../../../src/state/store.ts';

const frames = ['a', 'b', 'c'];
const source: DatasetSource = {
  kind: 'folder', title: 'review test yard', classesText: null, read: async () => new Blob([]),
  listing: { images: [], truth: frames.map((f) => `${f}.png`), predictions: {} },
};
const backend = reviewBackendIdb();
const store = appStoreCreate();
const keeper = reviewKeep(store, { backend, channel: reviewChannelOpen(), page: window });
datasetInstall(store, datasetFromSource(source));
const key = store.getState().dataset!.key;

const byNote = (note: string) => store.getState().reviewFlags.find((f) => f.note === note);

(window as unknown as { hl: Record<string, (...a: never[]) => unknown> }).hl = {
  ready: async () => {
    await keeper.idle();
    return store.getState().reviewStatus;
  },
  add: (frame: string, note: string) => store.getState().flagAdd({ frame, kind: 'rect', bbox: [1, 1, 9, 9], reason: 'unsure', note }).ok,
  edit: (note: string, next: string) => store.getState().flagEdit(byNote(note)!.id, { note: next }).ok,
  remove: (note: string) => store.getState().flagsDelete([byNote(note)!.id]),
  notes: () => store.getState().reviewFlags.map((f) => f.note).sort(),
  error: () => store.getState().reviewError,
  idle: () => keeper.idle(),
  count: () => store.getState().reviewFlags.length,
  pending: () => keeper.pending(),
  /** Imports a flags file of `n` new flags (made here, as another machine would save them). */
  importMany: (n: number, tag: string) => {
    const t = new Date().toISOString();
    const flags = Array.from({ length: n }, (_, i) => ({
      id: `${tag}-${i}`, frame: frames[i % frames.length], kind: 'rect', bbox: [1, 1, 9, 9], reason: 'unsure', note: `${tag} ${i}`, run: null, createdAt: t, updatedAt: t,
    }));
    const text = JSON.stringify({ format: 'hairline-flags', version: 2, dataset: { key, title: 'review test yard', frames: frames.length }, exportedAt: t, flags, verdicts: [] });
    const r = store.getState().flagsImport(text, 'bulk.json');
    return r.ok ? r.value.added.length : r.error;
  },
  addMany: (n: number, tag: string) => {
    let made = 0;
    for (let i = 0; i < n; i++) made += store.getState().flagAdd({ frame: frames[i % frames.length], kind: 'frame', bbox: null, reason: 'unsure', note: `${tag} ${i}` }).ok ? 1 : 0;
    return made;
  },
};
document.title = 'review test page ready';
