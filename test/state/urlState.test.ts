import { describe, expect, it } from 'vitest';
import { layerLooksDefault } from '../../src/core/composite/layerSettings.ts';
import { urlViewDecode, urlViewEncode } from '../../src/state/urlState.ts';
import { appStoreCreate } from '../../src/state/store.ts';

describe('view state in the URL hash', () => {
  it('round-trips frame, runs, layers, band width, solo, curtain and zoom', () => {
    const store = appStoreCreate();
    const frames = ['a', 'b', 'c'].map((name) => ({ name, image: null, truth: `${name}.png`, predictions: {}, confidence: {} }));
    store.setState({
      dataset: { key: 'k', title: 't', source: { kind: 'demo' } as never, pairing: { frames, runs: ['r1', 'r2'], unpaired: [], ambiguous: [], groups: [], warnings: [] }, table: null, tableError: null },
      frameIndex: 2,
      place: { cx: 10.5, cy: 20.25, scale: 4 },
    });
    const d = layerLooksDefault();
    store.getState().runsSet({ runA: 'r2', runB: 'r1' });
    store.getState().bandWidthSet(17);
    store.getState().layersSet({
      truth: { ...d.truth, on: true, opacity: 77 }, band: { ...d.band, on: true },
      solo: { ...d.solo, on: true, classId: 3 }, curtain: { on: true, x: 44 },
    });
    const hash = urlViewEncode(store.getState());
    // Survives the browser's own URL handling (a '+' would read back as a space).
    const v = urlViewDecode(new URL(`http://h/#${hash}`).hash);
    expect(v).toMatchObject({ dataset: 'demo', frame: 'c', runA: 'r2', runB: 'r1', bandWidth: 17, solo: 3, curtain: 44, place: { cx: 10.5, cy: 20.3, scale: 4 } });
    expect(v.layers.truth).toEqual({ on: true, opacity: 77 });
    expect(v.layers.band).toEqual({ on: true, opacity: d.band.opacity });
    expect(v.layers.photo).toEqual({ on: true, opacity: 255 });
  });

  it('ignores malformed parts instead of failing', () => {
    const v = urlViewDecode('#l=zz9.phx5.gty999&w=99&z=1,2&f=x');
    expect(v.layers).toEqual({ truth: { on: true, opacity: 255 } });
    expect(v.bandWidth).toBeNull();
    expect(v.place).toBeNull();
    expect(v.frame).toBe('x');
  });
});
