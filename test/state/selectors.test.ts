import { describe, expect, it } from 'vitest';
import { layerLooksDefault } from '../../src/core/composite/layerSettings.ts';
import type { StoredFrame } from '../../src/state/scoresSlice.ts';
import { classNameSel, frameOrderSel, frameRowsSel, layerSettingsSel, scoringTableSel, shownRunSel } from '../../src/state/selectors.ts';
import { appStoreCreate } from '../../src/state/store.ts';

function storeWithFrames(n: number, runs = ['r1', 'r2']) {
  const store = appStoreCreate();
  const frames = Array.from({ length: n }, (_, i) => ({ name: `f${i}`, image: null, truth: `f${i}.png`, predictions: {}, confidence: {} }));
  store.setState({ dataset: { key: 'k', title: 't', source: { kind: 'demo' } as never, pairing: { frames, runs, unpaired: [] }, table: null, tableError: null } });
  return store;
}

describe('layerSettingsSel: the compositor settings derived from state', () => {
  it('puts the runs, the band width and the focus outline into the layer looks', () => {
    const store = storeWithFrames(3);
    const s = store.getState();
    s.runsSet({ runA: 'r2', runB: 'r1' });
    s.bandWidthSet(9);
    s.focusOn(1, [10, 20, 30, 25]);
    const l = layerSettingsSel(store.getState());
    expect(l.runA).toBe('r2');
    expect(l.runB).toBe('r1');
    expect(l.band).toEqual({ ...layerLooksDefault().band, width: 9 });
    expect(l.highlight.boxes).toEqual([{ x: 10, y: 20, width: 20, height: 5 }]);
    expect(l.highlight.on).toBe(true);
    expect(l.photo).toBe(store.getState().layers.photo);
    // An outline belongs to its frame: moving on clears it.
    store.getState().frameIndexSet(2);
    expect(layerSettingsSel(store.getState()).highlight.boxes).toEqual([]);
  });

  it('keeps its answer while its inputs stay, and makes a new one when any of them changes', () => {
    const store = storeWithFrames(3);
    const a = layerSettingsSel(store.getState());
    store.getState().playRateSet(8);
    expect(layerSettingsSel(store.getState())).toBe(a);
    store.getState().bandWidthSet(5);
    const b = layerSettingsSel(store.getState());
    expect(b).not.toBe(a);
    expect(b.band.width).toBe(5);
    store.getState().layersSet({ truth: { ...store.getState().layers.truth, on: true } });
    expect(layerSettingsSel(store.getState()).truth.on).toBe(true);
  });
});

function failed(name: string, error: string | null, runError: string | null): StoredFrame {
  return { name, width: 4, height: 2, error, runs: [{ run: 'r1', stats: null, error: runError }, { run: 'r2', stats: null, error: null }] } as unknown as StoredFrame;
}

describe('frame rows and their order', () => {
  it('describe run A (else the first run); a frame whose result is unchanged keeps its row when others land', () => {
    const store = storeWithFrames(3);
    expect(shownRunSel(store.getState())).toBe('r1');
    const empty = frameRowsSel(store.getState());
    expect(empty.map((r) => r.pending)).toEqual([true, true, true]);
    store.setState({ results: [failed('f0', null, 'f0: r1 unreadable'), undefined, undefined] });
    const one = frameRowsSel(store.getState());
    expect(one[0]).toMatchObject({ pending: false, error: 'f0: r1 unreadable' });
    expect(one[1]).toBe(empty[1]);
    store.setState({ results: [store.getState().results[0], failed('f1', 'truth/f1.png: not a PNG', null), undefined] });
    const two = frameRowsSel(store.getState());
    expect(two[0]).toBe(one[0]);
    expect(two[1].error).toBe('truth/f1.png: not a PNG');
    expect(two[2]).toBe(one[2]);
    // Another run describes the frames afresh.
    store.getState().runsSet({ runA: 'r2' });
    const r2 = frameRowsSel(store.getState());
    expect(r2[0]).not.toBe(two[0]);
    expect(r2[0].error).toBeNull();
    // Unscored and failed frames sort after scored ones, in frame order.
    expect(frameOrderSel(store.getState())).toEqual([0, 1, 2]);
  });

  it('names classes from the scoring table, which follows the dataset and the void id', () => {
    const store = storeWithFrames(1);
    const table = scoringTableSel(store.getState());
    expect(scoringTableSel(store.getState())).toBe(table);
    const name = classNameSel(store.getState());
    expect(name(null)).toBe('not a class');
    store.getState().settingsSet({ ignore: 254 });
    expect(scoringTableSel(store.getState())).not.toBe(table);
    expect(scoringTableSel(store.getState())!.ignore).toBe(254);
  });
});
