// Two "tabs" are two app stores with their own keeper over one backing storage (the in-memory backend,
// structured-cloning values as IndexedDB does) and, where a test says so, Node's BroadcastChannel
// (the WHATWG HTML "Broadcasting to other browsing contexts" API; Node has it as a global).
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { DatasetSource } from '../../src/data/sources/source.ts';
import { datasetFromSource, datasetInstall } from '../../src/state/datasetLoad.ts';
import { reviewChannelOpen } from '../../src/state/reviewChannel.ts';
import { reviewKeep, type ReviewKeeper } from '../../src/state/reviewKeep.ts';
import { reviewBackendMemory, reviewStoragePrefix, type ReviewBackend } from '../../src/state/reviewStorage.ts';
import { appStoreCreate, type AppStore } from '../../src/state/store.ts';

const keepers: ReviewKeeper[] = [];
afterEach(() => {
  for (const k of keepers.splice(0)) k.stop();
  vi.useRealTimers();
});

function source(title: string, frames = ['a', 'b', 'c']): DatasetSource {
  return { kind: 'folder', title, classesText: null, listing: { images: [], truth: frames.map((f) => `${f}.png`), predictions: {} }, read: async () => new Blob([]) };
}

let channelSerial = 0;
/** Opens a tab: a store with `title` open and a keeper on `backend` (and a channel named `channel`, if given). */
async function tab(backend: ReviewBackend, title: string, channel: string | null): Promise<{ store: AppStore; keeper: ReviewKeeper }> {
  const store = appStoreCreate();
  const keeper = reviewKeep(store, { backend, channel: channel ? reviewChannelOpen(channel) : null });
  keepers.push(keeper);
  datasetInstall(store, datasetFromSource(source(title)));
  await keeper.idle();
  return { store, keeper };
}

async function until(check: () => boolean, what: string): Promise<void> {
  const start = Date.now();
  while (!check()) {
    if (Date.now() - start > 3000) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 5));
  }
}

const notes = (s: AppStore) => s.getState().reviewFlags.map((f) => f.note).sort();

describe('reviewKeep: flags persist per dataset fingerprint', () => {
  it('writes each change at once as its own record, and a reload shows the same flags', async () => {
    const map = new Map<string, unknown>();
    const backend = reviewBackendMemory(map);
    const { store, keeper } = await tab(backend, 'yard', null);
    expect(store.getState().reviewStatus).toBe('ready');
    const f = store.getState().flagAdd({ frame: 'a', kind: 'rect', bbox: [1, 1, 4, 4], reason: 'unsure', note: 'one' });
    store.getState().flagAdd({ frame: 'b', kind: 'frame', bbox: null, reason: 'label-mistake', note: 'two' });
    await keeper.idle();
    const prefix = reviewStoragePrefix(store.getState().dataset!.key);
    expect([...map.keys()].filter((k) => k.startsWith(prefix)).length).toBe(2);
    expect(map.get(`${prefix}flag/${f.ok && f.value.id}`)).toMatchObject({ v: 2, type: 'flag', flag: { note: 'one' } });
    store.getState().flagsDelete([f.ok ? f.value.id : '']);
    await keeper.idle();
    const reload = await tab(backend, 'yard', null);
    expect(notes(reload.store)).toEqual(['two']);
    const other = await tab(backend, 'another yard', null);
    expect(other.store.getState().reviewFlags).toEqual([]);
  });

  it('two tabs adding flags at the same time both keep both, live through the channel and after reload', async () => {
    const backend = reviewBackendMemory();
    const name = `review-test-${channelSerial++}`;
    const A = await tab(backend, 'yard', name);
    const B = await tab(backend, 'yard', name);
    A.store.getState().flagAdd({ frame: 'a', kind: 'frame', bbox: null, reason: 'unsure', note: 'from A' });
    B.store.getState().flagAdd({ frame: 'b', kind: 'frame', bbox: null, reason: 'unsure', note: 'from B' });
    await until(() => notes(A.store).length === 2 && notes(B.store).length === 2, 'both tabs to see both flags');
    expect(notes(A.store)).toEqual(['from A', 'from B']);
    expect(notes(B.store)).toEqual(['from A', 'from B']);
    await Promise.all([A.keeper.idle(), B.keeper.idle()]);
    expect(notes((await tab(backend, 'yard', null)).store)).toEqual(['from A', 'from B']);
  });

  it('the later edit of one flag wins in every tab; a tab with a slow clock never overwrites a newer edit', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(100);
    const backend = reviewBackendMemory();
    const name = `review-test-${channelSerial++}`;
    const A = await tab(backend, 'yard', name);
    const B = await tab(backend, 'yard', name);
    const f = A.store.getState().flagAdd({ frame: 'a', kind: 'rect', bbox: [0, 0, 5, 5], reason: 'unsure', note: 'v1' });
    if (!f.ok) throw new Error(f.error);
    await until(() => notes(B.store)[0] === 'v1', 'B to see the new flag');
    await A.keeper.idle();
    // A tab without a channel (no BroadcastChannel): it loads the flag once and hears of no later edit.
    const slow2 = await tab(backend, 'yard', null);
    expect(notes(slow2.store)).toEqual(['v1']);
    vi.setSystemTime(500);
    A.store.getState().flagEdit(f.value.id, { note: 'A at 500' });
    vi.setSystemTime(600);
    B.store.getState().flagEdit(f.value.id, { note: 'B at 600' });
    await until(() => notes(A.store)[0] === 'B at 600', 'A to take B\'s later edit');
    await Promise.all([A.keeper.idle(), B.keeper.idle()]);
    expect(notes(B.store)).toEqual(['B at 600']);
    // slow2 still holds v1 (stamped 100) and its clock reads 300: its edit is older than what is stored.
    vi.setSystemTime(300);
    slow2.store.getState().flagEdit(f.value.id, { note: 'slow at 300' });
    expect(notes(slow2.store)).toEqual(['slow at 300']);
    await slow2.keeper.idle();
    expect(notes(slow2.store)).toEqual(['B at 600']);
    expect(notes((await tab(backend, 'yard', null)).store)).toEqual(['B at 600']);
  });

  it('a delete (tombstone) beats an older edit from another tab, and an edit made after the delete brings the flag back', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(1000);
    const backend = reviewBackendMemory();
    const A = await tab(backend, 'yard', null);
    const f = A.store.getState().flagAdd({ frame: 'c', kind: 'frame', bbox: null, reason: 'unsure', note: 'x' });
    if (!f.ok) throw new Error(f.error);
    await A.keeper.idle();
    const B = await tab(backend, 'yard', null);
    vi.setSystemTime(2000);
    A.store.getState().flagsDelete([f.value.id]);
    await A.keeper.idle();
    vi.setSystemTime(1500);
    B.store.getState().flagEdit(f.value.id, { note: 'edited before the delete' });
    await B.keeper.idle();
    expect(B.store.getState().reviewFlags).toEqual([]);
    vi.setSystemTime(2500);
    const C = await tab(backend, 'yard', null);
    expect(C.store.getState().reviewFlags).toEqual([]);
    // Undo of the delete in A is a new write after the tombstone: the flag is back everywhere.
    A.store.getState().reviewUndo();
    await A.keeper.idle();
    expect(notes((await tab(backend, 'yard', null)).store)).toEqual(['x']);
  });

  it('edits made while saved flags are still loading are kept and saved', async () => {
    const map = new Map<string, unknown>();
    const backend = reviewBackendMemory(map);
    const first = await tab(backend, 'yard', null);
    first.store.getState().flagAdd({ frame: 'a', kind: 'frame', bbox: null, reason: 'unsure', note: 'saved earlier' });
    await first.keeper.idle();
    const store = appStoreCreate();
    const keeper = reviewKeep(store, { backend });
    keepers.push(keeper);
    datasetInstall(store, datasetFromSource(source('yard')));
    expect(store.getState().reviewStatus).toBe('loading');
    store.getState().flagAdd({ frame: 'b', kind: 'frame', bbox: null, reason: 'unsure', note: 'made while loading' });
    await keeper.idle();
    expect(notes(store)).toEqual(['made while loading', 'saved earlier']);
    expect(notes((await tab(backend, 'yard', null)).store)).toEqual(['made while loading', 'saved earlier']);
  });

  it('a failed write keeps the flags on screen, says so, and is written with the next change', async () => {
    const map = new Map<string, unknown>();
    const inner = reviewBackendMemory(map);
    let broken = false;
    const backend: ReviewBackend = { ...inner, updateMany: (u) => (broken ? Promise.reject(new Error('QuotaExceededError')) : inner.updateMany(u)) };
    const { store, keeper } = await tab(backend, 'yard', null);
    broken = true;
    store.getState().flagAdd({ frame: 'a', kind: 'frame', bbox: null, reason: 'unsure', note: 'kept' });
    await keeper.idle();
    expect(store.getState().reviewError).toMatch(/Flags could not be saved \(QuotaExceededError\); they stay on screen/);
    expect(notes(store)).toEqual(['kept']);
    broken = false;
    store.getState().flagAdd({ frame: 'b', kind: 'frame', bbox: null, reason: 'unsure', note: 'next' });
    await keeper.idle();
    expect(store.getState().reviewError).toBeNull();
    expect(notes((await tab(backend, 'yard', null)).store)).toEqual(['kept', 'next']);
  });
});

describe('reviewKeep: schema versions', () => {
  const key = datasetFromSource(source('yard')).key;

  it('leaves newer-schema records where they are, and says so', async () => {
    const map = new Map<string, unknown>();
    const future = { v: 3, type: 'flag', id: 'n', something: 'new' };
    map.set(`${reviewStoragePrefix(key)}flag/n`, future);
    const { store } = await tab(reviewBackendMemory(map), 'yard', null);
    expect(store.getState().reviewError).toMatch(/1 saved record is from a newer version of Hairline and was left as it is/);
    expect(map.get(`${reviewStoragePrefix(key)}flag/n`)).toEqual(future);
  });
});
