import { shallow } from 'zustand/vanilla/shallow';
import { compositePaletteFromTable } from '../core/composite/compositePalette.ts';
import type { LayerSettings } from '../core/composite/layerSettings.ts';
import { layerSettingsSel, scoringTableSel } from '../state/selectors.ts';
import type { AppStore } from '../state/store.ts';
import type { FrameCompositeRequest } from '../workers/viewJobs.ts';
import type { Viewer } from './viewer.ts';

/** The part of a viewer the binding drives (a test can hand in a stand-in). */
export type BindableViewer = Pick<
  Viewer,
  'mode' | 'frameSet' | 'aroundSet' | 'prefetch' | 'paletteSet' | 'layersSet' | 'compositeSet' | 'gridSet' | 'viewFit' | 'viewGet' | 'viewSet' | 'onViewChange'
>;

export interface ViewerBindOptions {
  /** Colours a frame off the main thread, for a viewer without WebGL (the view worker's frameComposite). */
  compose(request: FrameCompositeRequest): Promise<Uint8Array>;
  /** Told why the viewer refused the frame on screen (over its size limit), or null when it took it. */
  onRefused(message: string | null): void;
  /** The canvas size in device pixels, for zooming onto a focused box. */
  canvasSize(): { width: number; height: number };
  /** How long the view must rest after panning or zooming before the store hears of it, ms. */
  settleMs?: number;
}

/**
 * Returns true when two layer settings draw the same picture because the only difference is the band
 * width while the band layer is off (the band slider then updates numbers without a redraw).
 */
export function layersLookAlike(a: LayerSettings, b: LayerSettings): boolean {
  if (a === b) return true;
  if (a.band.on || b.band.on) return false;
  const { band: ba, highlight: ha, ...ra } = a;
  const { band: bb, highlight: hb, ...rb } = b;
  if (ba.opacity !== bb.opacity || ba.side !== bb.side) return false;
  if (ha.on !== hb.on || ha.opacity !== hb.opacity || ha.side !== hb.side || ha.thickness !== hb.thickness || ha.boxes !== hb.boxes) return false;
  const keys = Object.keys(ra) as (keyof typeof ra)[];
  return keys.every((k) => ra[k] === rb[k]);
}

/** Returns the view that shows `box` (image pixels, end-exclusive) three times over, centred, in a canvas of `size` device pixels. */
export function viewOfBox(
  box: readonly [number, number, number, number],
  size: { width: number; height: number },
  frame: { width: number; height: number },
): { cx: number; cy: number; scale: number } {
  const [x0, y0, x1, y1] = box;
  // Context: the box takes about a third of the canvas each way, and at least FOCUS_CONTEXT image
  // pixels show around a tiny one; never further out than the whole frame fitted, never past FOCUS_MAX_SCALE.
  const bw = Math.max(FOCUS_CONTEXT, (x1 - x0) * 3), bh = Math.max(FOCUS_CONTEXT, (y1 - y0) * 3);
  const fit = Math.min(size.width / frame.width, size.height / frame.height);
  const scale = Math.max(fit, Math.min(FOCUS_MAX_SCALE, size.width / bw, size.height / bh));
  // Keep as much of the frame on the canvas as the zoom allows: the centre moves in from the edges.
  const centre = (c: number, canvas: number, extent: number) => {
    const half = canvas / (2 * scale);
    return half * 2 >= extent ? extent / 2 : Math.max(half, Math.min(extent - half, c));
  };
  return { cx: centre((x0 + x1) / 2, size.width, frame.width), cy: centre((y0 + y1) / 2, size.height, frame.height), scale };
}

/** Wait after the neighbours are decoded before uploading them, ms: lets the frame on screen paint first. */
const PREFETCH_AFTER_MS = 100;

/** Image pixels shown at least around a focused box, and the closest a focus zooms (screen px per image px). */
const FOCUS_CONTEXT = 64;
const FOCUS_MAX_SCALE = 8;

/**
 * Wires a viewer to the store without React: each store value the viewer shows is passed to it when
 * that value changes (the viewer redraws at most once per animation frame), and the view the user
 * pans to goes back to the store once it rests. Without WebGL the same layers are coloured by
 * `compose` and shown as an image. Returns a stop function.
 */
export function viewerBind(store: AppStore, viewer: BindableViewer, options: ViewerBindOptions): () => void {
  let composing = 0;
  const recompose = () => {
    if (viewer.mode !== 'none') return;
    const s = store.getState();
    const table = scoringTableSel(s);
    if (!s.shown || !table) return void viewer.compositeSet(null);
    const ticket = ++composing;
    // Copies (not transfers): the decoded frame stays with the cache for the next redraw.
    void options.compose({ frame: s.shownAround ? { ...s.shown, around: s.shownAround } : s.shown, layers: layerSettingsSel(s), palette: compositePaletteFromTable(table) }).then(
      (rgba) => ticket === composing && viewer.compositeSet(rgba),
      () => {},
    );
  };
  const paletteApply = () => {
    const table = scoringTableSel(store.getState());
    if (table) viewer.paletteSet(compositePaletteFromTable(table));
  };
  // The first frame drawn fits itself to the canvas; a place already in the store (a deep link's
  // zoom) is put back over that fit, once.
  let placeKept = false;
  const frameApply = () => {
    // The viewer refuses frames it cannot show (over 8192 px on a side); say so instead of a blank.
    const r = viewer.frameSet(store.getState().shown);
    options.onRefused(r.ok ? null : r.error);
    if (r.ok && store.getState().shownAround) viewer.aroundSet(store.getState().shownAround);
    if (r.ok && store.getState().shown && !placeKept) {
      if (store.getState().place === null) return void (placeKept = true);
      placeKept = true;
      placeApply();
    }
  };
  const placeApply = () => {
    const { place } = store.getState();
    if (place === null) return viewer.viewFit();
    const v = viewer.viewGet();
    if (v.cx !== place.cx || v.cy !== place.cy || v.scale !== place.scale) viewer.viewSet(place);
  };
  // Centre and zoom on a focused box once its frame is the one drawn, once per focus.
  let focusedSeq = -1;
  const focusApply = () => {
    const s = store.getState();
    if (!s.focusBox || !s.shown || s.shownIndex !== s.frameIndex || focusedSeq === s.focusSeq) return;
    focusedSeq = s.focusSeq;
    viewer.viewSet(viewOfBox(s.focusBox, options.canvasSize(), s.shown));
  };

  // The neighbours' textures go up after the frame on screen is painted, never before it.
  let prefetchTimer: ReturnType<typeof setTimeout> | undefined;
  const prefetchApply = () => {
    clearTimeout(prefetchTimer);
    prefetchTimer = setTimeout(() => {
      const s = store.getState();
      const runs = [s.runA, s.runB].filter((r): r is string => r !== null);
      if (s.shownNearby.length) viewer.prefetch(s.shownNearby, runs);
    }, PREFETCH_AFTER_MS);
  };

  paletteApply();
  frameApply();
  viewer.layersSet(layerSettingsSel(store.getState()));
  viewer.gridSet(store.getState().pixelGrid);
  placeApply();
  focusApply();
  recompose();

  const stops = [
    store.subscribe((s) => [s.dataset, s.settings.ignore] as const, paletteApply, { equalityFn: shallow }),
    store.subscribe((s) => s.shown, frameApply),
    store.subscribe((s) => s.shownAround, (a) => viewer.aroundSet(a)),
    store.subscribe((s) => s.shownNearby, prefetchApply),
    store.subscribe(layerSettingsSel, (l) => viewer.layersSet(l), { equalityFn: layersLookAlike }),
    store.subscribe((s) => s.pixelGrid, (on) => viewer.gridSet(on)),
    store.subscribe((s) => s.place, placeApply),
    store.subscribe((s) => [s.focusSeq, s.shown] as const, focusApply, { equalityFn: shallow }),
    store.subscribe((s) => [s.shown, s.shownAround, layerSettingsSel(s), scoringTableSel(s)] as const, recompose, { equalityFn: shallow }),
  ];
  let timer: ReturnType<typeof setTimeout> | undefined;
  stops.push(
    viewer.onViewChange((v) => {
      clearTimeout(timer);
      // The URL and the store follow the view a moment after panning or zooming stops.
      timer = setTimeout(() => store.getState().placeSet({ cx: v.cx, cy: v.cy, scale: v.scale }), options.settleMs ?? 150);
    }),
    () => clearTimeout(timer),
    () => clearTimeout(prefetchTimer),
  );
  return () => stops.forEach((stop) => stop());
}
