import { useEffect, useRef, useState } from 'react';
import { compositePaletteFromTable } from '../core/composite/compositePalette.ts';
import type { LayerSettings } from '../core/composite/layerSettings.ts';
import type { AppStore } from '../state/store.ts';
import { scoringTableOf } from '../state/scoringRun.ts';
import { layerSettingsSel } from '../state/selectors.ts';
import type { Viewer } from '../view/viewer.ts';
import { viewerCreate } from '../view/viewer.ts';
import type { ViewPool } from '../workers/scorePool.ts';
import { VIEW_COMMANDS } from '../workers/viewJobs.ts';
import { BoxDraw } from './BoxDraw.tsx';
import { Readout } from './Readout.tsx';
import { useApp, useAppStore } from './storeContext.tsx';

const NO_NOTES: string[] = [];

/**
 * Returns true when two layer settings draw the same picture because the only difference is the band
 * width while the band layer is off (the band slider then updates numbers without a redraw).
 */
function layersLookAlike(a: LayerSettings, b: LayerSettings): boolean {
  if (a.band.on || b.band.on) return false;
  const { band: ba, highlight: ha, ...ra } = a;
  const { band: bb, highlight: hb, ...rb } = b;
  if (ba.opacity !== bb.opacity || ba.side !== bb.side) return false;
  if (ha.on !== hb.on || ha.opacity !== hb.opacity || ha.side !== hb.side || ha.thickness !== hb.thickness || ha.boxes !== hb.boxes) return false;
  const keys = Object.keys(ra) as (keyof typeof ra)[];
  return keys.every((k) => ra[k] === rb[k]);
}

/**
 * Wires a viewer to the store without React re-renders: each store change the viewer cares about is
 * passed straight to it (it redraws at most once per animation frame). Without WebGL the same layers
 * are coloured by frameComposite in a view worker and shown as an image.
 */
function viewerBind(store: AppStore, viewer: Viewer, pool: ViewPool, onRefused: (message: string | null) => void, viewerHost: () => HTMLElement): () => void {
  let composing = 0;
  let focusedSeq = -1;
  let drawn: LayerSettings | null = null;
  const recompose = () => {
    if (viewer.mode !== 'none') return;
    const s = store.getState();
    if (!s.shown || !s.dataset) return viewer.compositeSet(null);
    const ticket = ++composing;
    const palette = compositePaletteFromTable(scoringTableOf(s.dataset, s.settings));
    // Copies (not transfers): the decoded frame stays with the cache for the next redraw.
    void pool.run(VIEW_COMMANDS.frameComposite, { frame: s.shown, layers: layerSettingsSel(s), palette }).then(
      (rgba) => ticket === composing && viewer.compositeSet(rgba),
      () => {},
    );
  };
  const apply = (s: ReturnType<AppStore['getState']>, prev: ReturnType<AppStore['getState']> | null) => {
    if (!prev || s.dataset !== prev.dataset || s.settings.ignore !== prev.settings.ignore) {
      if (s.dataset) viewer.paletteSet(compositePaletteFromTable(scoringTableOf(s.dataset, s.settings)));
    }
    if (!prev || s.shown !== prev.shown) {
      // The viewer refuses frames it cannot show (over 8192 px on a side); say so instead of a blank.
      const r = viewer.frameSet(s.shown);
      onRefused(r.ok ? null : r.error);
    }
    const layers = layerSettingsSel(s);
    const layersChanged = layers !== drawn;
    if (!drawn || (layersChanged && !layersLookAlike(layers, drawn))) viewer.layersSet(layers);
    drawn = layers;
    if (!prev || s.pixelGrid !== prev.pixelGrid) viewer.gridSet(s.pixelGrid);
    if (!prev || s.place !== prev.place) {
      if (s.place === null) viewer.viewFit();
      else {
        const v = viewer.viewGet();
        if (v.cx !== s.place.cx || v.cy !== s.place.cy || v.scale !== s.place.scale) viewer.viewSet(s.place);
      }
    }
    // Centre and zoom on a focused box once its frame is the one drawn.
    if (s.focusBox && s.shown && s.shownIndex === s.frameIndex && (!prev || s.focusSeq !== prev.focusSeq || s.shown !== prev.shown) && focusedSeq !== s.focusSeq) {
      focusedSeq = s.focusSeq;
      const host = viewerHost();
      const dpr = window.devicePixelRatio || 1;
      const [x0, y0, x1, y1] = s.focusBox;
      const bw = Math.max(8, x1 - x0), bh = Math.max(8, y1 - y0);
      const scale = Math.max(0.05, Math.min(16, (host.clientWidth * dpr) / (bw * 3), (host.clientHeight * dpr) / (bh * 3)));
      viewer.viewSet({ cx: (x0 + x1) / 2, cy: (y0 + y1) / 2, scale });
    }
    if (viewer.mode === 'none' && (!prev || s.shown !== prev.shown || layersChanged || s.dataset !== prev.dataset)) recompose();
  };
  apply(store.getState(), null);
  const unsub = store.subscribe((s, prev) => apply(s, prev));
  let timer = 0;
  const unView = viewer.onViewChange((v) => {
    clearTimeout(timer);
    // The URL and the store follow the view a moment after panning or zooming stops.
    timer = window.setTimeout(() => store.getState().placeSet({ cx: v.cx, cy: v.cy, scale: v.scale }), 150);
  });
  return () => {
    unsub();
    unView();
    clearTimeout(timer);
  };
}

/** The centre pane: the viewer, a readout under the cursor, and a note when a frame could not be shown. */
export function ViewerPane({ pool, onViewer }: { pool: ViewPool; onViewer: (v: Viewer | null) => void }) {
  const store = useAppStore();
  const host = useRef<HTMLDivElement>(null);
  const [viewer, setViewer] = useState<Viewer | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const [refused, setRefused] = useState<string | null>(null);
  const shownError = useApp((s) => s.shownError);
  const notes = useApp((s) => s.shown?.notes ?? NO_NOTES);
  const loading = useApp((s) => s.dataset !== null && s.shownIndex !== s.frameIndex && s.shownError === null);

  useEffect(() => {
    let made: Viewer | null = null;
    let unbind = () => {};
    let cancelled = false;
    viewerCreate(host.current!, { grid: true }).then(
      (v) => {
        if (cancelled) return v.destroy();
        made = v;
        unbind = viewerBind(store, v, pool, setRefused, () => host.current!);
        setViewer(v);
        onViewer(v);
        (window as unknown as { hairlineViewer?: Viewer }).hairlineViewer = v;
      },
      (e: Error) => setFailure(`The viewer could not start: ${e.message}`),
    );
    return () => {
      cancelled = true;
      unbind();
      made?.destroy();
      onViewer(null);
    };
  }, [store, pool, onViewer]);

  return (
    <div className="viewer-pane">
      <div className="viewer-host" ref={host} data-mode={viewer?.mode ?? 'starting'} />
      {failure && <div className="viewer-note bad">{failure}</div>}
      {refused && <div className="viewer-note bad" role="alert">{refused}</div>}
      {shownError && <div className="viewer-note bad" role="alert">{shownError}</div>}
      {!shownError && notes.length > 0 && <div className="viewer-note">{notes.join(' · ')}</div>}
      {loading && <div className="viewer-loading">decoding…</div>}
      {viewer && <Readout viewer={viewer} />}
      {viewer && host.current && <BoxDraw host={host.current} viewer={viewer} />}
    </div>
  );
}
