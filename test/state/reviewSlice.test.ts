import { afterEach, describe, expect, it, vi } from 'vitest';
import type { DatasetSource } from '../../src/data/sources/source.ts';
import { datasetFromSource, datasetInstall } from '../../src/state/datasetLoad.ts';
import { REVIEW_HISTORY_MAX } from '../../src/state/reviewHistory.ts';
import { verdictOf } from '../../src/state/reviewSlice.ts';
import { appStoreCreate, type AppStore } from '../../src/state/store.ts';

afterEach(() => vi.useRealTimers());

function storeWith(frames: string[]): AppStore {
  const source: DatasetSource = {
    kind: 'folder', title: 'tiny yard', classesText: null,
    listing: { images: [], truth: frames.map((f) => `${f}.png`), predictions: {} },
    read: async () => new Blob([]),
  };
  const store = appStoreCreate();
  datasetInstall(store, datasetFromSource(source));
  return store;
}

describe('review slice: flags and verdicts with undo/redo', () => {
  it('adds, edits and deletes flags; each change stamps a later time; the flag list stays oldest first', () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(1000);
    const store = storeWith(['a', 'b']);
    const s = () => store.getState();
    const f1 = s().flagAdd({ frame: 'b', kind: 'rect', bbox: [1, 2, 3, 4], reason: 'label-mistake', note: 'n' });
    const f2 = s().flagAdd({ frame: 'a', kind: 'frame', bbox: null, reason: 'my tag', run: null });
    expect(f1.ok && f2.ok).toBe(true);
    if (!f1.ok || !f2.ok) return;
    expect(f1.value.createdAt).toBe(1000);
    expect(s().reviewFlags.map((f) => f.id)).toEqual([f1.value.id, f2.value.id].sort((x, y) => (x < y ? -1 : 1)));
    // Same clock reading: the edit still gets a later time than the version it replaces.
    const e = s().flagEdit(f1.value.id, { reason: 'unsure', note: 'changed' });
    expect(e.ok && [e.value.reason, e.value.note, e.value.updatedAt, e.value.createdAt]).toEqual(['unsure', 'changed', 1001, 1000]);
    expect(s().flagsDelete([f2.value.id, 'no-such-id'])).toBe(1);
    expect(s().reviewFlags.map((f) => f.id)).toEqual([f1.value.id]);
    // The tombstone stays in the records, so an older copy cannot bring the flag back.
    expect(s().reviewRecords[`flag/${f2.value.id}`]).toMatchObject({ flag: null, updatedAt: 1001 });
  });

  it('refuses bad input with a message and changes nothing', () => {
    const store = storeWith(['a']);
    const s = store.getState();
    const r1 = s.flagAdd({ frame: 'zz', kind: 'frame', bbox: null, reason: 'unsure' });
    expect(!r1.ok && r1.error).toBe('frame "zz" is not in this dataset');
    const r2 = s.flagAdd({ frame: 'a', kind: 'rect', bbox: [5, 5, 5, 6], reason: 'unsure' });
    expect(!r2.ok && r2.error).toMatch(/flag \(id ".*"\): "bbox" \[5, 5, 5, 6\] is empty/);
    const r3 = s.flagEdit('nope', { note: 'x' });
    expect(!r3.ok && r3.error).toBe('no flag with id "nope"');
    expect(store.getState().reviewFlags).toEqual([]);
    expect(store.getState().reviewUndoStack).toEqual([]);
  });

  it('undo and redo walk the history back and forth, a delete is undone, and redo is cleared by a new change', () => {
    const store = storeWith(['a']);
    const s = () => store.getState();
    const f = s().flagAdd({ frame: 'a', kind: 'rect', bbox: [0, 0, 2, 2], reason: 'unsure', note: 'first' });
    if (!f.ok) throw new Error(f.error);
    s().flagEdit(f.value.id, { note: 'second' });
    s().flagsDelete([f.value.id]);
    expect(s().reviewFlags).toEqual([]);
    expect(s().reviewUndo()).toEqual({ label: 'delete flag', applied: 1, skipped: 0 });
    expect(s().reviewFlags.map((x) => x.note)).toEqual(['second']);
    s().reviewUndo();
    expect(s().reviewFlags.map((x) => x.note)).toEqual(['first']);
    s().reviewUndo();
    expect(s().reviewFlags).toEqual([]);
    expect(s().reviewUndo()).toBeNull();
    s().reviewRedo();
    s().reviewRedo();
    expect(s().reviewFlags.map((x) => x.note)).toEqual(['second']);
    // Restored versions are new writes: each later than the one before it.
    const t = s().reviewFlags[0].updatedAt;
    expect(t).toBeGreaterThan(f.value.updatedAt);
    s().flagEdit(f.value.id, { note: 'third' });
    expect(s().reviewRedo()).toBeNull();
  });

  it('undo leaves a record alone when someone else changed it since', () => {
    const store = storeWith(['a']);
    const s = () => store.getState();
    const f = s().flagAdd({ frame: 'a', kind: 'frame', bbox: null, reason: 'unsure' });
    if (!f.ok) throw new Error(f.error);
    const remote = { type: 'flag' as const, id: f.value.id, updatedAt: f.value.updatedAt + 50, writer: 'other-tab', flag: { ...f.value, note: 'from the other tab', updatedAt: f.value.updatedAt + 50 } };
    expect(s().reviewMerge([remote])).toEqual([remote]);
    expect(s().reviewUndo()).toEqual({ label: 'add flag', applied: 0, skipped: 1 });
    expect(s().reviewFlags.map((x) => x.note)).toEqual(['from the other tab']);
  });

  it('history is bounded', () => {
    const store = storeWith(['a']);
    for (let i = 0; i < REVIEW_HISTORY_MAX + 15; i++) store.getState().flagAdd({ frame: 'a', kind: 'frame', bbox: null, reason: 'unsure' });
    expect(store.getState().reviewUndoStack.length).toBe(REVIEW_HISTORY_MAX);
    let n = 0;
    while (store.getState().reviewUndo()) n++;
    expect(n).toBe(REVIEW_HISTORY_MAX);
    expect(store.getState().reviewFlags.length).toBe(15);
  });

  it('verdicts set, change and clear by suspect key, undoably', () => {
    const store = storeWith(['a']);
    const s = () => store.getState();
    const ref = { frame: 'a', run: 'r', bbox: [1, 1, 5, 5] as const, truthClass: 1, predictedClass: 2 };
    expect(s().verdictSet(ref, 'label-mistake').ok).toBe(true);
    expect(verdictOf(s(), { ...ref, bbox: [1, 1, 5, 5] })?.verdict).toBe('label-mistake');
    s().verdictSet(ref, 'model-error');
    s().verdictSet(ref, null);
    expect(verdictOf(s(), ref)).toBeNull();
    s().reviewUndo();
    expect(verdictOf(s(), ref)?.verdict).toBe('model-error');
    const bad = s().verdictSet({ ...ref, bbox: [3, 3, 1, 1] }, 'unsure');
    expect(!bad.ok && bad.error).toMatch(/verdict: "bbox"/);
  });

  it('export then import into a fresh store gives the same flags; importing again adds nothing; import is one undo step', () => {
    const a = storeWith(['a', 'b']);
    a.getState().flagAdd({ frame: 'a', kind: 'rect', bbox: [0, 0, 9, 9], reason: 'label-mistake', note: 'x' });
    a.getState().flagAdd({ frame: 'b', kind: 'frame', bbox: null, reason: 'unsure' });
    a.getState().verdictSet({ frame: 'b', run: null, bbox: [0, 0, 1, 1], truthClass: null, predictedClass: 3 }, 'unsure');
    const text = a.getState().flagsExportText();
    const b = storeWith(['a', 'b']);
    const r = b.getState().flagsImport(text, 'flags.json');
    expect(r.ok && [r.value.added.length, r.value.updated.length, r.value.skipped.length, r.value.verdictsAdded]).toEqual([2, 0, 0, 1]);
    expect(b.getState().reviewFlags).toEqual(a.getState().reviewFlags);
    expect(b.getState().reviewVerdicts).toEqual(a.getState().reviewVerdicts);
    const again = b.getState().flagsImport(text, 'flags.json');
    expect(again.ok && [again.value.added.length, again.value.skipped.length]).toEqual([0, 2]);
    b.getState().reviewUndo();
    expect(b.getState().reviewFlags).toEqual([]);
    const bad = b.getState().flagsImport('{', 'broken.json');
    expect(!bad.ok && bad.error).toMatch(/^broken\.json: is not valid JSON/);
  });

  it('a hostile flags file cannot bring a deleted flag back or break save JSON (times 1970..2200, at most a day ahead)', () => {
    const store = storeWith(['a']);
    const s = () => store.getState();
    const f = s().flagAdd({ frame: 'a', kind: 'frame', bbox: null, reason: 'unsure', note: 'keep out' });
    if (!f.ok) throw new Error(f.error);
    const saved = s().flagsExportText();
    expect(s().flagsDelete([f.value.id])).toBe(1);
    const json = JSON.parse(saved);
    for (const updatedAt of [1e300, Date.now() + 2 * 86_400_000, -5]) {
      json.flags[0].updatedAt = updatedAt;
      const r = s().flagsImport(JSON.stringify(json), 'hostile.json');
      expect(r.ok).toBe(false);
      expect(s().reviewFlags).toEqual([]);
    }
    // The copy saved before the delete is older than the delete: skipped.
    const r = s().flagsImport(saved, 'old.json');
    expect(r.ok && r.value.skipped).toEqual([{ id: f.value.id, reason: 'deleted here after this version was saved' }]);
    expect(s().reviewFlags).toEqual([]);
    expect(() => JSON.parse(s().flagsExportText())).not.toThrow();
  });
});
