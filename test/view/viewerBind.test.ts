import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { DecodedFrame } from '../../src/core/decodedFrame.ts';
import type { LayerSettings } from '../../src/core/composite/layerSettings.ts';
import { layerSettingsSel } from '../../src/state/selectors.ts';
import { appStoreCreate, type AppStore } from '../../src/state/store.ts';
import type { ViewState } from '../../src/view/viewTransform.ts';
import { viewerBind, viewOfBox, type BindableViewer } from '../../src/view/viewerBind.ts';
import type { FrameCompositeRequest } from '../../src/workers/viewJobs.ts';

/** A stand-in viewer that records what the binding tells it. */
function fakeViewer(mode: 'webgl' | 'none' = 'webgl', refuse: string | null = null) {
  const calls: string[] = [];
  const layers: LayerSettings[] = [];
  const views: ViewState[] = [];
  const composites: (Uint8Array | null)[] = [];
  let view: ViewState = { cx: 0, cy: 0, scale: 1 };
  let onView: ((v: ViewState) => void) | null = null;
  const viewer: BindableViewer = {
    mode,
    frameSet: (f) => {
      // The binding hands on the store's decoded frame itself.
      const d = f as DecodedFrame | null;
      calls.push(`frame ${d?.name ?? null}`);
      return refuse && d ? { ok: false, error: refuse } : { ok: true, value: { width: d?.width ?? 0, height: d?.height ?? 0, tiles: 1 } };
    },
    aroundSet: (a) => void calls.push(`around ${a === null ? null : Object.keys(a.prev).join(',')}`),
    prefetch: (fs) => void calls.push(`prefetch ${fs.length}`),
    paletteSet: () => void calls.push('palette'),
    layersSet: (l) => void (calls.push('layers'), layers.push(l)),
    compositeSet: (rgba) => (composites.push(rgba), { ok: true, value: undefined }),
    gridSet: (on) => void calls.push(`grid ${on}`),
    viewFit: () => void calls.push('fit'),
    viewGet: () => view,
    viewSet: (v) => void (calls.push('view'), views.push(v), (view = v)),
    onViewChange: (cb) => ((onView = cb), () => (onView = null)),
  };
  return { viewer, calls, layers, views, composites, pan: (v: ViewState) => onView?.(v) };
}

function storeWithFrames(n: number): AppStore {
  const store = appStoreCreate();
  const frames = Array.from({ length: n }, (_, i) => ({ name: `f${i}`, image: null, truth: `f${i}.png`, predictions: {}, confidence: {} }));
  store.setState({ dataset: { key: 'k', title: 't', source: { kind: 'demo' } as never, pairing: { frames, runs: ['r1', 'r2'], unpaired: [] }, table: null, tableError: null } });
  store.getState().runsSet({ runA: 'r1' });
  return store;
}

function frame(name: string, width = 40, height = 20): DecodedFrame {
  const map = { width, height, ids: new Uint8Array(width * height), encoding: { kind: 'gray', bitDepth: 8 } };
  return { name, width, height, truth: map, preds: { r1: map }, photo: null, bandBins: null, notes: [] } as unknown as DecodedFrame;
}

const noCompose = () => Promise.reject(new Error('not used with WebGL'));
const size = () => ({ width: 800, height: 600 });

describe('viewerBind: the store drives the viewer without React', () => {
  beforeEach(() => void vi.useFakeTimers());
  afterEach(() => void vi.useRealTimers());

  it('hands the viewer the palette, frame, derived layer settings, grid and a fitted view on binding', () => {
    const store = storeWithFrames(3);
    const v = fakeViewer();
    const stop = viewerBind(store, v.viewer, { compose: noCompose, onRefused: () => {}, canvasSize: size });
    expect(v.calls).toEqual(['palette', 'frame null', 'layers', 'grid false', 'fit']);
    expect(v.layers[0]).toBe(layerSettingsSel(store.getState()));
    expect(v.layers[0].runA).toBe('r1');
    stop();
  });

  it('passes on what changes and nothing else; the band width alone redraws only while the band layer is on', () => {
    const store = storeWithFrames(3);
    const v = fakeViewer();
    const stop = viewerBind(store, v.viewer, { compose: noCompose, onRefused: () => {}, canvasSize: size });
    v.calls.length = 0;
    store.getState().playRateSet(10);
    store.getState().bandWidthSet(7);
    expect(v.calls).toEqual([]);
    const s = store.getState();
    s.layersSet({ band: { ...s.layers.band, on: true } });
    expect(v.calls).toEqual(['layers']);
    expect(v.layers.at(-1)!.band).toMatchObject({ on: true, width: 7 });
    store.getState().bandWidthSet(9);
    expect(v.layers.at(-1)!.band.width).toBe(9);
    store.getState().runsSet({ runB: 'r2' });
    expect(v.layers.at(-1)!.runB).toBe('r2');
    store.getState().pixelGridSet(true);
    expect(v.calls.at(-1)).toBe('grid true');
    store.getState().shownSet(0, frame('f0'), null);
    expect(v.calls.at(-1)).toBe('frame f0');
    stop();
    const before = v.calls.length;
    store.getState().pixelGridSet(false);
    store.getState().bandWidthSet(2);
    expect(v.calls.length).toBe(before);
  });

  it('moves the view to the stored place and back to a fit; a pan reaches the store once the view rests', () => {
    const store = storeWithFrames(3);
    const v = fakeViewer();
    const stop = viewerBind(store, v.viewer, { compose: noCompose, onRefused: () => {}, canvasSize: size, settleMs: 100 });
    store.getState().placeSet({ cx: 5, cy: 6, scale: 2 });
    expect(v.views.at(-1)).toEqual({ cx: 5, cy: 6, scale: 2 });
    store.getState().placeSet(null);
    expect(v.calls.at(-1)).toBe('fit');
    v.pan({ cx: 1, cy: 1, scale: 3 });
    v.pan({ cx: 2, cy: 2, scale: 3 });
    vi.advanceTimersByTime(99);
    expect(store.getState().place).toBeNull();
    vi.advanceTimersByTime(1);
    expect(store.getState().place).toEqual({ cx: 2, cy: 2, scale: 3 });
    stop();
  });

  it('puts a place stored before the first frame (a deep link) back over the fit that frame makes, once', () => {
    const store = storeWithFrames(3);
    const v = fakeViewer();
    // As the real viewer does: a frame of a new size fits itself to the canvas.
    const frameSet = v.viewer.frameSet;
    v.viewer.frameSet = (f) => {
      const r = frameSet(f);
      if (f) v.viewer.viewSet({ cx: 50, cy: 25, scale: 0.5 });
      return r;
    };
    const stop = viewerBind(store, v.viewer, { compose: noCompose, onRefused: () => {}, canvasSize: size });
    store.getState().placeSet({ cx: 5, cy: 6, scale: 4 });
    store.getState().shownSet(0, frame('f0'), null);
    expect(v.views.at(-1)).toEqual({ cx: 5, cy: 6, scale: 4 });
    // Later frames keep their own fit (the binding does not hold the first place for ever).
    store.getState().shownSet(1, frame('f1'), null);
    expect(v.views.at(-1)).toEqual({ cx: 50, cy: 25, scale: 0.5 });
    stop();
  });

  it('frames a focused box with context, never past the fit and never past 8x, keeping the frame on the canvas', () => {
    const canvas = { width: 800, height: 600 };
    const big = { width: 2048, height: 1024 };
    // A 100×50 box: three times its size is 300×150 → 2.67× (within fit 0.39 .. 8).
    expect(viewOfBox([1000, 500, 1100, 550], canvas, big)).toEqual({ cx: 1050, cy: 525, scale: 800 / 300 });
    // A 2-pixel box: 64 px of context at most 8x, not 100x.
    expect(viewOfBox([1000, 500, 1002, 502], canvas, big).scale).toBe(8);
    // A box at the corner: the centre moves in so the canvas shows no space past the frame's edge.
    const corner = viewOfBox([0, 0, 100, 50], canvas, big);
    expect(corner.cx).toBeCloseTo(400 / corner.scale, 9);
    expect(corner.cy).toBeCloseTo(300 / corner.scale, 9);
    // A box as large as the frame: the frame fitted (0.390625×), centred.
    expect(viewOfBox([0, 0, 2048, 1024], canvas, big)).toEqual({ cx: 1024, cy: 512, scale: 800 / 2048 });
  });

  it('centres on a focused box once its frame is on screen, once per focus', () => {
    const store = storeWithFrames(3);
    const v = fakeViewer();
    const stop = viewerBind(store, v.viewer, { compose: noCompose, onRefused: () => {}, canvasSize: size });
    store.getState().focusOn(2, [10, 4, 20, 14]);
    expect(v.calls).not.toContain('view');
    store.getState().shownSet(2, frame('f2'), null);
    expect(v.views).toEqual([viewOfBox([10, 4, 20, 14], size(), { width: 40, height: 20 })]);
    // A 40×20 frame fits an 800×600 canvas at 20×: a focus never zooms out past that, so it shows the whole frame.
    expect(v.views[0]).toEqual({ cx: 20, cy: 10, scale: 20 });
    expect(v.layers.at(-1)!.highlight.boxes).toEqual([{ x: 10, y: 4, width: 10, height: 10 }]);
    store.getState().shownSet(2, frame('f2'), null);
    expect(v.views.length).toBe(1);
    stop();
  });

  it('says when the viewer refuses a frame', () => {
    const store = storeWithFrames(1);
    const v = fakeViewer('webgl', 'f0: 9000×20 is over the viewer limit');
    const refused: (string | null)[] = [];
    const stop = viewerBind(store, v.viewer, { compose: noCompose, onRefused: (m) => refused.push(m), canvasSize: size });
    store.getState().shownSet(0, frame('f0'), null);
    expect(refused).toEqual([null, 'f0: 9000×20 is over the viewer limit']);
    stop();
  });

  it('without WebGL composes off the main thread and shows only the latest answer', async () => {
    const store = storeWithFrames(2);
    const v = fakeViewer('none');
    const asked: FrameCompositeRequest[] = [];
    const answers: ((rgba: Uint8Array) => void)[] = [];
    const compose = (r: FrameCompositeRequest) => (asked.push(r), new Promise<Uint8Array>((resolve) => answers.push(resolve)));
    const stop = viewerBind(store, v.viewer, { compose, onRefused: () => {}, canvasSize: size });
    expect(v.composites).toEqual([null]);
    const f0 = frame('f0');
    store.getState().shownSet(0, f0, null);
    const s = store.getState();
    s.layersSet({ truth: { ...s.layers.truth, on: true } });
    expect(asked.length).toBe(2);
    expect(asked[1].layers).toBe(layerSettingsSel(store.getState()));
    expect(asked[1].frame).toBe(f0);
    answers[0](Uint8Array.of(1));
    answers[1](Uint8Array.of(2));
    await vi.runAllTimersAsync();
    expect(v.composites).toEqual([null, Uint8Array.of(2)]);
    stop();
  });
});
