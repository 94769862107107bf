import { describe, expect, it } from 'vitest';
import { layerLooksDefault } from '../../src/core/composite/layerSettings.ts';
import { layerSettingsSel } from '../../src/state/selectors.ts';
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
