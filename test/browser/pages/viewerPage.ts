// Test page for the viewer: builds seeded random frames in the page, draws them with the WebGL viewer
// and compares the read-back pixels with frameComposite's bytes. Driven by test/browser/viewer.test.ts.
import type { ClassTable } from '../../../src/core/classTable.ts';
import { compositePaletteFromTable } from '../../../src/core/composite/compositePalette.ts';
import { frameComposite } from '../../../src/core/composite/frameComposite.ts';
import { layerSettingsDefault, LAYER_KEYS, type LayerSettings } from '../../../src/core/composite/layerSettings.ts';
import { viewerCreate, type Viewer } from '../../../src/view/viewer.ts';
import { frameRandom } from '../../core/composite/randomFrame.ts';
import { layersRandom } from '../../core/composite/randomLayers.ts';

export interface FrameSpec {
  seed: number;
  width: number;
  height: number;
  wide?: boolean;
  runs?: number;
  photo?: boolean;
  bins?: boolean;
}

export interface CheckResult {
  tiles: number;
  settings: number;
  differingBytes: number;
  firstDifference: string | null;
}

let viewer: Viewer | null = null;

// Counts texture uploads, to show that layer changes never upload ids again.
let uploads = 0;
for (const name of ['texImage2D', 'texSubImage2D'] as const) {
  const proto = WebGL2RenderingContext.prototype as unknown as Record<string, (...a: unknown[]) => unknown>;
  const orig = proto[name];
  proto[name] = function (this: unknown, ...args: unknown[]) {
    uploads++;
    return orig.apply(this, args);
  };
}

/** Returns the renderer string behind the masked one (SwiftShader in headless Chromium), if the browser tells. */
function unmaskedRenderer(): string | null {
  const gl = document.createElement('canvas').getContext('webgl2');
  const ext = gl?.getExtension('WEBGL_debug_renderer_info');
  return gl && ext ? String(gl.getParameter(ext.UNMASKED_RENDERER_WEBGL)) : null;
}

async function setup(opts: { tileSize?: number; width?: number; height?: number } = {}) {
  viewer?.destroy();
  const host = document.getElementById('host')!;
  host.style.width = `${opts.width ?? 640}px`;
  host.style.height = `${opts.height ?? 400}px`;
  viewer = await viewerCreate(host, { tileSize: opts.tileSize });
  const gl = document.createElement('canvas').getContext('webgl2');
  return { ...viewer.info, glVersion: gl ? String(gl.getParameter(gl.VERSION)) : null, unmasked: unmaskedRenderer() };
}

function build(spec: FrameSpec) {
  const r = frameRandom(spec.seed, spec.width, spec.height, spec);
  return { ...r, palette: compositePaletteFromTable(r.table) };
}

/** Draws `spec` with every layer-settings seed and counts bytes that differ from frameComposite. */
function check(spec: FrameSpec, layerSeeds: number[], extra: LayerSettings[] = []): CheckResult {
  const v = viewer!;
  const { frame, table, palette } = build(spec);
  const set = v.frameSet(frame);
  if (!set.ok) throw new Error(set.error);
  v.paletteSet(palette);
  const runs = Object.keys(frame.preds);
  const ids = table.classes.map((c) => c.id);
  const all = [...extra, ...layerSeeds.map((s) => layersRandom(s, spec.width, spec.height, runs, ids))];
  let differing = 0;
  let first: string | null = null;
  for (let k = 0; k < all.length; k++) {
    v.layersSet(all[k]);
    const got = v.pixelsRead();
    if (!got.ok) throw new Error(got.error);
    const want = frameComposite(frame, all[k], palette);
    if (!want.ok) throw new Error(want.error);
    for (let i = 0; i < want.value.length; i++) {
      if (got.value[i] !== want.value[i]) {
        differing++;
        if (first === null) {
          const p = i >> 2;
          first = `settings #${k}, pixel (${p % spec.width}, ${Math.floor(p / spec.width)}) channel ${i & 3}: gpu ${got.value[i]} cpu ${want.value[i]}; ${JSON.stringify(all[k])}`;
        }
      }
    }
  }
  // A part of the frame read back alone matches the same part composed alone.
  const rect = { x: 3, y: 2, width: spec.width - 7, height: spec.height - 5 };
  const part = v.pixelsRead(rect);
  const partWant = frameComposite(frame, all[all.length - 1], palette, { rect });
  if (!part.ok || !partWant.ok) throw new Error('part read failed');
  for (let i = 0; i < partWant.value.length; i++) {
    if (part.value[i] !== partWant.value[i]) {
      differing++;
      first ??= `part ${JSON.stringify(rect)}, byte ${i}: gpu ${part.value[i]} cpu ${partWant.value[i]}`;
    }
  }
  return { tiles: set.value.tiles, settings: all.length, differingBytes: differing, firstDifference: first };
}

/** Returns settings with every layer on at full strength (the all-layers case). */
function everything(runs: string[], w: number, h: number): LayerSettings {
  const s = layerSettingsDefault();
  for (const k of LAYER_KEYS) s[k].on = true;
  s.runA = runs[0];
  s.runB = runs[1] ?? null;
  s.highlight.boxes = [{ x: Math.floor(w / 4), y: Math.floor(h / 4), width: Math.floor(w / 3), height: Math.floor(h / 3) }];
  return s;
}

/** Shows a frame with the given settings on screen (for screenshots); returns nothing. */
function show(spec: FrameSpec, layers: Partial<LayerSettings> | 'everything', view?: { cx: number; cy: number; scale: number }) {
  const v = viewer!;
  const { frame, palette } = build(spec);
  v.frameSet(frame);
  v.paletteSet(palette);
  const runs = Object.keys(frame.preds);
  const s = layers === 'everything' ? everything(runs, spec.width, spec.height) : { ...layerSettingsDefault(), runA: runs[0], runB: runs[1] ?? null, ...layers };
  v.layersSet(s);
  if (view) v.viewSet(view);
  else v.viewFit();
  v.renderNow();
}

/** Times `count` redraws, each after one layer toggle; returns milliseconds per redraw (gl.finish included). */
function redrawTime(spec: FrameSpec, count: number, only?: string[]): { median: number; all: number[]; backToBack: number } {
  const v = viewer!;
  const { frame, palette } = build(spec);
  v.frameSet(frame);
  v.paletteSet(palette);
  const runs = Object.keys(frame.preds);
  const s = everything(runs, spec.width, spec.height);
  if (only) for (const k of LAYER_KEYS) s[k].on = only.includes(k);
  v.layersSet(s);
  v.viewOneToOne();
  v.viewSet({ cx: spec.width / 2, cy: spec.height / 2, scale: 1 });
  v.renderNow();
  const canvas = document.querySelector('#host canvas') as HTMLCanvasElement;
  const gl = canvas.getContext('webgl2')!;
  const px = new Uint8Array(4);
  gl.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, px);
  const all: number[] = [];
  for (let i = 0; i < count; i++) {
    const t0 = performance.now();
    s.disagree = { ...s.disagree, on: !s.disagree.on };
    v.layersSet({ ...s });
    v.renderNow();
    gl.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, px); // waits for the GPU
    all.push(performance.now() - t0);
  }
  const sorted = [...all].sort((a, b) => a - b);
  // Back to back: `count` toggled redraws, then one wait for the GPU; the mean per redraw.
  const t0 = performance.now();
  for (let i = 0; i < count; i++) {
    s.disagree = { ...s.disagree, on: !s.disagree.on };
    v.layersSet({ ...s });
    v.renderNow();
  }
  gl.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, px);
  const backToBack = (performance.now() - t0) / count;
  return { median: sorted[Math.floor(sorted.length / 2)], all, backToBack };
}

/** Simulates pointer input at CSS (x, y) in the host and returns the readout it produced. */
function readoutAt(x: number, y: number): { x: number; y: number } | null {
  let got: { x: number; y: number } | null = null;
  const off = viewer!.onPointer((p) => (got = p));
  const el = document.querySelector('#host > div') as HTMLElement;
  const r = el.getBoundingClientRect();
  el.dispatchEvent(new PointerEvent('pointermove', { clientX: r.left + x, clientY: r.top + y, bubbles: true }));
  off();
  return got;
}

/** Mode 'none': shows frameComposite's bytes through compositeSet and compares every image pixel on the canvas. */
function cpuCheck(spec: FrameSpec): { mode: string; reason: string | null; wrongLength: string | null; differing: number; scale: number } {
  const v = viewer!;
  const { frame, palette } = build(spec);
  v.frameSet(frame);
  v.paletteSet(palette);
  const layers = everything(Object.keys(frame.preds), spec.width, spec.height);
  v.layersSet(layers);
  const rgba = frameComposite(frame, layers, palette);
  if (!rgba.ok) throw new Error(rgba.error);
  const bad = v.compositeSet(new Uint8Array(8));
  const set = v.compositeSet(rgba.value);
  if (!set.ok) throw new Error(set.error);
  v.gridSet(false);
  v.renderNow();
  const canvas = document.querySelector('#host canvas') as HTMLCanvasElement;
  const img = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
  const view = v.viewGet();
  const ox = Math.round(canvas.width / 2 - view.cx * view.scale), oy = Math.round(canvas.height / 2 - view.cy * view.scale);
  let differing = 0;
  for (let y = 0; y < spec.height; y++) {
    for (let x = 0; x < spec.width; x++) {
      const sx = Math.floor(ox + (x + 0.5) * view.scale), sy = Math.floor(oy + (y + 0.5) * view.scale);
      for (let c = 0; c < 4; c++) if (img[(sy * canvas.width + sx) * 4 + c] !== rgba.value[(y * spec.width + x) * 4 + c]) differing++;
    }
  }
  return { mode: v.mode, reason: v.info.reason, wrongLength: bad.ok ? null : bad.error, differing, scale: view.scale };
}

function bytesOf(b64: string): Uint8Array {
  return Uint8Array.from(atob(b64), (c) => c.charCodeAt(0));
}

/** Shows a frame sent from Node as base64 parts (8-bit maps), with a class table, for screenshots. */
function showSent(
  sent: { width: number; height: number; photo: string; truth: string; preds: Record<string, string>; bins: string; table: ClassTable },
  layers: LayerSettings,
  view?: { cx: number; cy: number; scale: number },
) {
  const v = viewer!;
  const map = (b64: string) => ({ width: sent.width, height: sent.height, ids: bytesOf(b64) });
  const preds = Object.fromEntries(Object.entries(sent.preds).map(([k, b]) => [k, map(b)]));
  const r = v.frameSet({ photo: bytesOf(sent.photo), truth: map(sent.truth), preds, bandBins: bytesOf(sent.bins) });
  if (!r.ok) throw new Error(r.error);
  v.paletteSet(compositePaletteFromTable(sent.table));
  v.layersSet(layers);
  if (view) v.viewSet(view);
  else v.viewFit();
  v.renderNow();
}

Object.assign(window, {
  hl: {
    setup,
    check,
    show,
    redrawTime,
    readoutAt,
    everything: (spec: FrameSpec) => everything(Object.keys(build(spec).frame.preds), spec.width, spec.height),
    uploads: () => uploads,
    viewer: () => viewer,
    viewGet: () => viewer!.viewGet(),
    cpuCheck,
    showSent,
    viewSet: (view: { cx: number; cy: number; scale: number }) => viewer!.viewSet(view),
    /** Loads `spec` into the viewer without drawing. */
    load: (spec: FrameSpec) => {
      const { frame, palette } = build(spec);
      viewer!.frameSet(frame);
      viewer!.paletteSet(palette);
    },
    /** Draws the loaded frame on screen with `layers` (no readback); returns the upload count after. */
    drawWith: (layers: LayerSettings) => {
      viewer!.layersSet(layers);
      viewer!.renderNow();
      return uploads;
    },
    frameSetRaw: (width: number, height: number) => {
      const ids = new Uint8Array(width * height);
      return viewer!.frameSet({ truth: { width, height, ids }, preds: {}, photo: null, bandBins: null });
    },
  },
});
document.title = 'viewer test page ready';
