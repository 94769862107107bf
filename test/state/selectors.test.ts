import { describe, expect, it } from 'vitest';
import { layerLooksDefault } from '../../src/core/composite/layerSettings.ts';
import { classNameSel, frameOrderSel, frameTableSel, layerSettingsSel, scoringTableSel, shownRunSel } from '../../src/state/selectors.ts';
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

function failed(name: string, error: string | null, runError: string | null) {
  return { name, width: 4, height: 2, error, runs: [{ run: 'r1', stats: null, error: runError }, { run: 'r2', stats: null, error: null }] };
}

describe('the frame table and its order', () => {
  it('describes run A (else the first run): pending until a frame lands, then its error', () => {
    const store = storeWithFrames(3);
    expect(shownRunSel(store.getState())).toBe('r1');
    store.getState().scoringStart(1, 3, null);
    const empty = frameTableSel(store.getState());
    expect([0, 1, 2].map((i) => empty.pending(i))).toEqual([true, true, true]);
    store.getState().scoringFramesDone(1, [{ index: 0, result: failed('f0', null, 'f0: r1 unreadable') }]);
    const one = frameTableSel(store.getState());
    expect(one).not.toBe(empty);
    expect([one.pending(0), one.error(0)]).toEqual([false, 'f0: r1 unreadable']);
    expect(one.pending(1)).toBe(true);
    store.getState().scoringFramesDone(1, [{ index: 1, result: failed('f1', 'truth/f1.png: not a PNG', null) }]);
    const two = frameTableSel(store.getState());
    expect(two.error(1)).toBe('truth/f1.png: not a PNG');
    expect(frameTableSel(store.getState())).toBe(two);
    // Another run describes the frames afresh: r2 has neither stats nor an error on f0.
    store.getState().runsSet({ runA: 'r2' });
    const r2 = frameTableSel(store.getState());
    expect(r2.error(0)).toBe('no scores for run r2');
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
