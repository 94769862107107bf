/**
 * The frame viewer: a plain object mounted into any HTMLElement (no React here).
 *
 *   const v = await viewerCreate(container, { tileSize?, grid? });
 *   v.mode                      'webgl' (WebGL2 through pixi.js) or 'none' (no WebGL2: see below); v.info says why
 *   v.paletteSet(palette)       colours: compositePaletteFromTable(table, marks?) from src/core/composite
 *   v.frameSet(frame)           CompositeFrame | null → Result<{ width, height, tiles }>; refuses > 8192 px
 *   v.layersSet(layers)         LayerSettings: switches, opacities, runs, solo, curtain, band width, boxes
 *   v.viewFit() / v.viewOneToOne() / v.zoomBy(factor, cssX?, cssY?) / v.viewGet() / v.viewSet(view)
 *   v.gridSet(on)               pixel grid (shown from GRID_MIN_SCALE device px per image px)
 *   v.onPointer(cb)             cb({ x, y } integer image pixel under the pointer, or null); returns unsubscribe
 *   v.onViewChange(cb)          cb(ViewState) after every pan/zoom/fit; returns unsubscribe
 *   v.pixelsRead(rect?)         Result<Uint8Array>: the image drawn at 1:1 (RGBA, top row first), for tests
 *   v.compositeSet(rgba)        mode 'none' only: the frameComposite output to show (made in a worker)
 *   v.renderNow()               draw at once instead of on the next animation frame
 *   v.destroy()
 *
 * Units: a ViewState is { cx, cy } the image point at the viewport centre (image pixels) and `scale`
 * in DEVICE pixels per image pixel, so viewOneToOne() shows one image pixel per device pixel. zoomBy's
 * position is in CSS pixels from the container's top-left (as pointer events give it); without one
 * it zooms about the centre. Every setter only schedules a redraw; at most one happens per animation
 * frame. Stepping to a frame of the same size keeps the view; a new size fits it.
 *
 * Without WebGL2 (or when pixi could only offer another renderer, where the composite shader would
 * draw nothing), mode is 'none': the viewer still pans, zooms, reads out and draws the grid, and
 * shows whatever RGBA composite compositeSet() is given, which the host computes with frameComposite
 * (the same bytes the shader makes).
 */
import { classTableGenerated } from '../core/classTable.ts';
import { compositeFrameCheck, type CompositeFrame } from '../core/composite/compositeFrame.ts';
import { compositePaletteFromTable, MARK_COLORS, type CompositePalette } from '../core/composite/compositePalette.ts';
import { compositeParams } from '../core/composite/compositeParams.ts';
import { layerSettingsDefault, type LayerSettings, type PixelBox } from '../core/composite/layerSettings.ts';
import { fail, ok, type Result } from '../core/result.ts';
import { CpuStage } from './cpuStage.ts';
import { glStageCreate, type GlInfo } from './glStageCreate.ts';
import type { GlStage } from './glStage.ts';
import { overlayDraw } from './overlay.ts';
import { viewInputAttach } from './viewInput.ts';
import {
  scaleMin,
  viewClamped,
  viewFitted,
  viewPanned,
  viewScreenToImage,
  viewZoomedAt,
  type ViewState,
} from './viewTransform.ts';

export type ViewerMode = 'webgl' | 'none';
export type PointerReadout = { x: number; y: number } | null;

export interface ViewerOptions {
  /** Largest tile side in pixels; the GPU's MAX_TEXTURE_SIZE when not given or larger. */
  tileSize?: number;
  /** Start with the pixel grid on (default true). */
  grid?: boolean;
}

export interface ViewerInfo extends GlInfo {
  mode: ViewerMode;
  /** Why the mode is 'none', else null. */
  reason: string | null;
}

export interface Viewer {
  readonly mode: ViewerMode;
  readonly info: ViewerInfo;
  frameSet(frame: CompositeFrame | null): Result<{ width: number; height: number; tiles: number }>;
  paletteSet(palette: CompositePalette): void;
  layersSet(layers: LayerSettings): void;
  compositeSet(rgba: Uint8Array | null): Result<void>;
  viewFit(): void;
  viewOneToOne(): void;
  zoomBy(factor: number, cssX?: number, cssY?: number): void;
  viewGet(): ViewState;
  viewSet(view: ViewState): void;
  gridSet(on: boolean): void;
  onPointer(cb: (p: PointerReadout) => void): () => void;
  onViewChange(cb: (v: ViewState) => void): () => void;
  pixelsRead(rect?: PixelBox): Result<Uint8Array>;
  renderNow(): void;
  destroy(): void;
}

const BACKGROUND = '#14161a';

/** Returns a viewer filling `container` (which should have a size; the viewer follows it as it resizes). */
export async function viewerCreate(container: HTMLElement, options: ViewerOptions = {}): Promise<Viewer> {
  const root = document.createElement('div');
  root.style.cssText = 'position:relative;width:100%;height:100%;overflow:hidden;touch-action:none;cursor:crosshair';
  const base = document.createElement('canvas');
  const over = document.createElement('canvas');
  for (const c of [base, over]) c.style.cssText = 'position:absolute;left:0;top:0;width:100%;height:100%;display:block';
  over.style.pointerEvents = 'none';
  root.append(base, over);
  container.appendChild(root);
  const made = await glStageCreate(base, { tileSize: options.tileSize, background: BACKGROUND });
  return new ViewerImpl(root, base, over, made, options.grid ?? true);
}

class ViewerImpl implements Viewer {
  readonly mode: ViewerMode;
  readonly info: ViewerInfo;
  private gl: GlStage | null = null;
  private cpu: CpuStage | null = null;
  private frame: CompositeFrame | null = null;
  private imgW = 0;
  private imgH = 0;
  private palette: CompositePalette | null = null;
  private layers: LayerSettings = layerSettingsDefault();
  private view: ViewState = { cx: 0, cy: 0, scale: 1 };
  private vpW = 1;
  private vpH = 1;
  private grid: boolean;
  private raf = 0;
  private hoverAt: { sx: number; sy: number } | null = null;
  private readout: PointerReadout = null;
  private readonly pointerCbs = new Set<(p: PointerReadout) => void>();
  private readonly viewCbs = new Set<(v: ViewState) => void>();
  private readonly overCtx: CanvasRenderingContext2D;
  private readonly resizeObs: ResizeObserver;
  private readonly inputDetach: () => void;

  constructor(
    private readonly root: HTMLElement,
    base: HTMLCanvasElement,
    private readonly over: HTMLCanvasElement,
    made: Result<{ stage: GlStage; info: GlInfo }> & { info?: GlInfo },
    grid: boolean,
  ) {
    this.grid = grid;
    this.overCtx = over.getContext('2d')!;
    if (made.ok) {
      this.gl = made.value.stage;
      this.mode = 'webgl';
      this.info = { ...made.value.info, mode: 'webgl', reason: null };
    } else {
      // A canvas that tried WebGL cannot give a 2-D context: use a fresh one.
      const fresh = document.createElement('canvas');
      fresh.style.cssText = base.style.cssText;
      base.replaceWith(fresh);
      this.cpu = new CpuStage(fresh, BACKGROUND);
      this.mode = 'none';
      this.info = { renderer: null, webglVersion: 0, maxTextureSize: 0, tileSize: 0, mode: 'none', reason: made.error };
    }
    this.resizeObs = new ResizeObserver(() => this.resize());
    this.resizeObs.observe(root);
    this.resize();
    this.inputDetach = viewInputAttach(root, {
      hover: (at) => {
        this.hoverAt = at;
        this.readoutUpdate();
      },
      pan: (dx, dy) => this.viewChange(viewPanned(this.view, dx, dy)),
      zoom: (f, sx, sy) => this.zoomAtDevice(f, sx, sy),
    });
  }

  private resize(): void {
    const dpr = window.devicePixelRatio || 1;
    const cssW = Math.max(1, this.root.clientWidth), cssH = Math.max(1, this.root.clientHeight);
    const w = Math.round(cssW * dpr), h = Math.round(cssH * dpr);
    if (w === this.vpW && h === this.vpH && this.gl?.renderer.resolution === dpr) return;
    const first = this.vpW === 1 && this.vpH === 1;
    this.vpW = w;
    this.vpH = h;
    if (this.gl) {
      this.gl.renderer.resolution = dpr;
      this.gl.renderer.resize(w / dpr, h / dpr);
    }
    this.cpu?.resize(w, h);
    this.over.width = w;
    this.over.height = h;
    if (first && this.imgW > 0) this.view = viewFitted(this.imgW, this.imgH, w, h);
    this.invalidate();
  }

  frameSet(frame: CompositeFrame | null): Result<{ width: number; height: number; tiles: number }> {
    if (frame) {
      const size = compositeFrameCheck(frame);
      if (!size.ok) return size;
    }
    const sameSize = frame !== null && frame.truth.width === this.imgW && frame.truth.height === this.imgH;
    this.frame = frame;
    this.imgW = frame?.truth.width ?? 0;
    this.imgH = frame?.truth.height ?? 0;
    const tiles = this.gl ? this.gl.frameSet(frame).length : frame ? 1 : 0;
    if (frame && !sameSize) this.viewChange(viewFitted(this.imgW, this.imgH, this.vpW, this.vpH));
    this.readoutUpdate();
    this.invalidate();
    return ok({ width: this.imgW, height: this.imgH, tiles });
  }

  paletteSet(palette: CompositePalette): void {
    this.palette = palette;
    this.invalidate();
  }

  layersSet(layers: LayerSettings): void {
    this.layers = layers;
    this.invalidate();
  }

  compositeSet(rgba: Uint8Array | null): Result<void> {
    if (!this.cpu) return fail('viewer', 'compositeSet is for mode "none"; in WebGL mode the viewer composes on the GPU');
    if (rgba && rgba.length !== this.imgW * this.imgH * 4) {
      return fail('viewer', `composite holds ${rgba.length} bytes; the ${this.imgW}×${this.imgH} frame needs ${this.imgW * this.imgH * 4}`);
    }
    this.cpu.compositeSet(rgba, this.imgW, this.imgH);
    this.invalidate();
    return ok(undefined);
  }

  viewFit(): void {
    if (this.imgW > 0) this.viewChange(viewFitted(this.imgW, this.imgH, this.vpW, this.vpH));
  }

  viewOneToOne(): void {
    this.viewChange({ ...this.view, scale: 1 });
  }

  zoomBy(factor: number, cssX?: number, cssY?: number): void {
    const dpr = window.devicePixelRatio || 1;
    this.zoomAtDevice(factor, cssX === undefined ? this.vpW / 2 : cssX * dpr, cssY === undefined ? this.vpH / 2 : cssY * dpr);
  }

  private zoomAtDevice(factor: number, sx: number, sy: number): void {
    if (!(factor > 0) || this.imgW === 0) return;
    const lo = scaleMin(this.imgW, this.imgH, this.vpW, this.vpH);
    this.viewChange(viewZoomedAt(this.view, factor, sx, sy, this.vpW, this.vpH, lo));
  }

  viewGet(): ViewState {
    return { ...this.view };
  }

  viewSet(view: ViewState): void {
    if (!(view.scale > 0) || !Number.isFinite(view.cx) || !Number.isFinite(view.cy)) return;
    this.viewChange(view);
  }

  private viewChange(next: ViewState): void {
    const lo = this.imgW > 0 ? scaleMin(this.imgW, this.imgH, this.vpW, this.vpH) : 0;
    const v = viewClamped({ ...next, scale: Math.max(lo, Math.min(256, next.scale)) }, this.imgW, this.imgH);
    this.view = v;
    for (const cb of this.viewCbs) cb({ ...v });
    this.readoutUpdate();
    this.invalidate();
  }

  gridSet(on: boolean): void {
    this.grid = on;
    this.invalidate();
  }

  onPointer(cb: (p: PointerReadout) => void): () => void {
    this.pointerCbs.add(cb);
    return () => this.pointerCbs.delete(cb);
  }

  onViewChange(cb: (v: ViewState) => void): () => void {
    this.viewCbs.add(cb);
    return () => this.viewCbs.delete(cb);
  }

  private readoutUpdate(): void {
    let next: PointerReadout = null;
    if (this.hoverAt && this.imgW > 0) {
      const p = viewScreenToImage(this.view, this.hoverAt.sx, this.hoverAt.sy, this.vpW, this.vpH);
      const x = Math.floor(p.x), y = Math.floor(p.y);
      if (x >= 0 && y >= 0 && x < this.imgW && y < this.imgH) next = { x, y };
    }
    if (next?.x === this.readout?.x && next?.y === this.readout?.y) return;
    this.readout = next;
    for (const cb of this.pointerCbs) cb(next);
  }

  pixelsRead(rect?: PixelBox): Result<Uint8Array> {
    if (!this.gl) return fail('viewer', 'no WebGL: read the frameComposite output instead');
    if (!this.frame) return fail('viewer', 'no frame to read back');
    const r = rect ?? { x: 0, y: 0, width: this.imgW, height: this.imgH };
    if (r.x < 0 || r.y < 0 || r.width < 1 || r.height < 1 || r.x + r.width > this.imgW || r.y + r.height > this.imgH) {
      return fail('viewer', `rectangle ${r.x},${r.y} ${r.width}×${r.height} is not inside the ${this.imgW}×${this.imgH} frame`);
    }
    this.uniformsApply();
    return this.gl.pixelsRead(r);
  }

  private uniformsApply(): boolean {
    if (!this.gl || !this.frame) return false;
    if (!this.palette) this.palette = compositePaletteFromTable(classTableGenerated(254), { ...MARK_COLORS });
    this.gl.paletteSet(this.palette);
    this.gl.paramsSet(compositeParams(this.frame, this.layers, this.palette));
    return true;
  }

  private invalidate(): void {
    if (this.raf === 0) this.raf = requestAnimationFrame(() => this.renderNow());
  }

  renderNow(): void {
    if (this.raf !== 0) cancelAnimationFrame(this.raf);
    this.raf = 0;
    if (this.gl) {
      this.uniformsApply();
      this.gl.draw(this.view, this.vpW, this.vpH);
    }
    this.cpu?.draw(this.view, this.vpW, this.vpH);
    const curtain = this.layers.curtain;
    overlayDraw(this.overCtx, {
      view: this.view,
      imgW: this.imgW,
      imgH: this.imgH,
      grid: this.grid,
      curtainX: curtain.on && this.imgW > 0 ? curtain.x : null,
    });
  }

  destroy(): void {
    if (this.raf !== 0) cancelAnimationFrame(this.raf);
    this.raf = 0;
    this.resizeObs.disconnect();
    this.inputDetach();
    this.gl?.destroy();
    this.gl = null;
    this.pointerCbs.clear();
    this.viewCbs.clear();
    this.root.remove();
  }
}
