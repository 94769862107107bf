import { shallow } from 'zustand/vanilla/shallow';
import { LAYER_KEYS, type LayerKey, type LayerLooks } from '../core/composite/layerSettings.ts';
import { BAND_WIDTH_MAX } from '../core/metrics/bandHistogram.ts';
import type { AppState, AppStore } from './store.ts';
import type { ViewPlace } from './viewSlice.ts';

/** The part of the view a link carries: which dataset and frame, runs, layers, band width, zoom. */
export interface UrlView {
  dataset: string | null;
  frame: string | null;
  runA: string | null;
  runB: string | null;
  /** Per layer: on/off and opacity. */
  layers: Partial<Record<LayerKey, { on: boolean; opacity: number }>>;
  bandWidth: number | null;
  place: ViewPlace | null;
  solo: number | null;
  curtain: number | null;
}

const SHORT: Record<LayerKey, string> = { photo: 'ph', truth: 'gt', pred: 'pr', band: 'bd', disagree: 'df', compare: 'cm', void: 'vd', flicker: 'fl', highlight: 'hl' };

/** Returns the hash fragment (without '#') describing the state's view. */
export function urlViewEncode(s: AppState): string {
  const p = new URLSearchParams();
  if (s.dataset) p.set('ds', s.dataset.source.kind === 'demo' ? 'demo' : s.dataset.source.kind === 'served' ? 'served' : 'folder');
  const frame = s.dataset?.pairing.frames[s.frameIndex]?.name;
  if (frame) p.set('f', frame);
  if (s.runA) p.set('a', s.runA);
  if (s.runB) p.set('b', s.runB);
  p.set('l', LAYER_KEYS.filter((k) => k !== 'highlight').map((k) => `${SHORT[k]}${s.layers[k].on ? 'y' : 'n'}${s.layers[k].opacity}`).join('.'));
  p.set('w', String(s.bandWidth));
  if (s.layers.solo.on) p.set('solo', String(s.layers.solo.classId));
  if (s.layers.curtain.on) p.set('cur', String(s.layers.curtain.x));
  if (s.place) p.set('z', `${s.place.cx.toFixed(1)},${s.place.cy.toFixed(1)},${+s.place.scale.toPrecision(4)}`);
  return p.toString();
}

/** Returns what a hash fragment says about the view; unknown or malformed parts are ignored. */
export function urlViewDecode(hash: string): UrlView {
  const p = new URLSearchParams(hash.replace(/^#/, ''));
  const num = (v: string | null) => (v !== null && v.trim() !== '' && Number.isFinite(Number(v)) ? Number(v) : null);
  const layers: UrlView['layers'] = {};
  for (const part of (p.get('l') ?? '').split('.')) {
    // y/n, not +/-: a '+' in a query string reads back as a space.
    const m = /^([a-z]{2})([yn])(\d{1,3})$/.exec(part);
    if (!m) continue;
    const key = (Object.keys(SHORT) as LayerKey[]).find((k) => SHORT[k] === m[1]);
    if (key) layers[key] = { on: m[2] === 'y', opacity: Math.min(255, Number(m[3])) };
  }
  let place: ViewPlace | null = null;
  const z = (p.get('z') ?? '').split(',').map(Number);
  if (z.length === 3 && z.every(Number.isFinite) && z[2] > 0) place = { cx: z[0], cy: z[1], scale: z[2] };
  const w = num(p.get('w'));
  return {
    dataset: p.get('ds'),
    frame: p.get('f'),
    runA: p.get('a'),
    runB: p.get('b'),
    layers,
    bandWidth: w !== null && Number.isInteger(w) && w >= 0 && w <= BAND_WIDTH_MAX ? w : null,
    place,
    solo: num(p.get('solo')),
    curtain: num(p.get('cur')),
  };
}

/** Applies a decoded URL view to the store once its dataset is loaded (runs and frames checked against it). */
export function urlViewApply(store: AppStore, v: UrlView): void {
  const s = store.getState();
  if (!s.dataset) return;
  const runs = s.dataset.pairing.runs;
  const patch: Partial<LayerLooks> = {};
  for (const [k, l] of Object.entries(v.layers) as [LayerKey, { on: boolean; opacity: number }][]) {
    patch[k] = { ...s.layers[k], ...l } as never;
  }
  if (v.runA && runs.includes(v.runA)) s.runsSet({ runA: v.runA });
  if (v.runB && runs.includes(v.runB)) s.runsSet({ runB: v.runB });
  if (v.bandWidth !== null) s.bandWidthSet(v.bandWidth);
  if (v.solo !== null) patch.solo = { ...s.layers.solo, on: true, classId: v.solo };
  if (v.curtain !== null) patch.curtain = { on: true, x: v.curtain };
  s.layersSet(patch);
  const index = v.frame ? s.dataset.pairing.frames.findIndex((f) => f.name === v.frame) : -1;
  if (index >= 0) s.frameIndexSet(index);
  if (v.place) s.placeSet(v.place);
}

/** Keeps the URL hash in step with the view (replaceState, so Back is not flooded). Returns a stop function. */
export function urlViewKeep(store: AppStore): () => void {
  let timer = 0;
  let last = '';
  const write = () => {
    const s = store.getState();
    if (!s.dataset) return;
    const hash = urlViewEncode(s);
    if (hash === last) return;
    last = hash;
    history.replaceState(null, '', `${location.pathname}${location.search}#${hash}`);
  };
  const unsub = store.subscribe(
    (s) => [s.dataset, s.frameIndex, s.layers, s.runA, s.runB, s.bandWidth, s.place] as const,
    () => {
      clearTimeout(timer);
      timer = window.setTimeout(write, 120);
    },
    { equalityFn: shallow },
  );
  return () => {
    unsub();
    clearTimeout(timer);
  };
}
