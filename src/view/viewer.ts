/**
 * The frame viewer: a plain object mounted into any HTMLElement (no React here).
 *
 *   const v = await viewerCreate(container, { tileSize?, grid? });
 *   v.mode                      'webgl' (WebGL2 through pixi.js) or 'none' (no WebGL2: see below); v.info says why
 *   v.paletteSet(palette)       colours: compositePaletteFromTable(table, marks?) from src/core/composite
 *   v.frameSet(frame)           CompositeFrame | null → Result<{ width, height, tiles }>; refuses > 8192 px
 *   v.aroundSet(around)         the run predictions at the frame's sequence neighbours (flicker layer), or null
 *   v.prefetch(frames, runs)    uploads these frames' textures (and those runs') now, so showing them uploads nothing
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
import { compositeFrameCheck, type CompositeFrame, type FrameAround } from '../core/composite/compositeFrame.ts';
import { compositePaletteFromTable, MARK_COLORS, type CompositePalette } from '../core/composite/compositePalette.ts';
import { compositeParams } from '../core/composite/compositeParams.ts';
import { layerSettingsDefault, type LayerSettings, type PixelBox } from '../core/composite/layerSettings.ts';
import { fail, ok, type Result } from '../core/result.ts';
import { CpuStage } from './cpuStage.ts';
import { glStageCreate, type GlInfo } from './glStageCreate.ts';
import type { GlStage } from './glStage.ts';
import { overlayDraw } from './overlay.ts';
import { viewInputAttach } from './viewInput.ts';
import { ViewControl, type PointerReadout } from './viewControl.ts';
import type { ViewState } from './viewTransform.ts';

export type ViewerMode = 'webgl' | 'none';
export type { PointerReadout } from './viewControl.ts';

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
  aroundSet(around: FrameAround | null): void;
  prefetch(frames: CompositeFrame[], runs: string[]): void;
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
  private palette: CompositePalette | null = null;
  private layers: LayerSettings = layerSettingsDefault();
  private grid: boolean;
  private raf = 0;
  private readonly ctl = new ViewControl(() => this.invalidate());
  private readonly overCtx: CanvasRenderingContext2D;
  private readonly resizeObs: ResizeObserver;
  private readonly inputDetach: () => void;

  constructor(
    private readonly root: HTMLElement,
    base: HTMLCanvasElement,
    private readonly over: HTMLCanvasElement,
    made: Result<{ stage: GlStage; info: GlInfo }>,
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
      hover: (at) => this.ctl.hover(at),
      pan: (dx, dy) => this.ctl.pan(dx, dy),
      zoom: (f, sx, sy) => this.ctl.zoomAt(f, sx, sy),
    });
  }

  private resize(): void {
    const dpr = window.devicePixelRatio || 1;
    const w = Math.round(Math.max(1, this.root.clientWidth) * dpr), h = Math.round(Math.max(1, this.root.clientHeight) * dpr);
    if (w === this.ctl.vpW && h === this.ctl.vpH && (!this.gl || this.gl.renderer.resolution === dpr)) return;
    if (this.gl) {
      this.gl.renderer.resolution = dpr;
      this.gl.renderer.resize(w / dpr, h / dpr);
    }
    this.cpu?.resize(w, h);
    this.over.width = w;
    this.over.height = h;
    this.ctl.viewportSet(w, h);
  }

  frameSet(frame: CompositeFrame | null): Result<{ width: number; height: number; tiles: number }> {
    if (frame) {
      const size = compositeFrameCheck(frame);
      if (!size.ok) return size;
    }
    this.frame = frame;
    const tiles = this.gl ? this.gl.frameSet(frame).length : frame ? 1 : 0;
    this.ctl.imageSet(frame?.truth.width ?? 0, frame?.truth.height ?? 0);
    this.invalidate();
    return ok({ width: this.ctl.imgW, height: this.ctl.imgH, tiles });
  }

  paletteSet(palette: CompositePalette): void {
    this.palette = palette;
    this.invalidate();
  }

  layersSet(layers: LayerSettings): void {
    this.layers = layers;
    this.invalidate();
  }

  prefetch(frames: CompositeFrame[], runs: string[]): void {
    if (!this.gl) return;
    for (const f of frames) if (compositeFrameCheck(f).ok) this.gl.prefetch(f, runs);
  }

  aroundSet(around: FrameAround | null): void {
    if (!this.frame) return;
    this.frame = { ...this.frame, around };
    this.gl?.aroundSet(around);
    this.invalidate();
  }

  compositeSet(rgba: Uint8Array | null): Result<void> {
    if (!this.cpu) return fail('viewer', 'compositeSet is for mode "none"; in WebGL mode the viewer composes on the GPU');
    const { imgW, imgH } = this.ctl;
    if (rgba && rgba.length !== imgW * imgH * 4) {
      return fail('viewer', `composite holds ${rgba.length} bytes; the ${imgW}×${imgH} frame needs ${imgW * imgH * 4}`);
    }
    this.cpu.compositeSet(rgba, imgW, imgH);
    this.invalidate();
    return ok(undefined);
  }

  viewFit(): void {
    this.ctl.fit();
  }

  viewOneToOne(): void {
    this.ctl.set({ ...this.ctl.view, scale: 1 });
  }

  zoomBy(factor: number, cssX?: number, cssY?: number): void {
    const dpr = window.devicePixelRatio || 1;
    this.ctl.zoomAt(factor, cssX === undefined ? this.ctl.vpW / 2 : cssX * dpr, cssY === undefined ? this.ctl.vpH / 2 : cssY * dpr);
  }

  viewGet(): ViewState {
    return { ...this.ctl.view };
  }

  viewSet(view: ViewState): void {
    this.ctl.set(view);
  }

  gridSet(on: boolean): void {
    this.grid = on;
    this.invalidate();
  }

  onPointer(cb: (p: PointerReadout) => void): () => void {
    return this.ctl.onPointer(cb);
  }

  onViewChange(cb: (v: ViewState) => void): () => void {
    return this.ctl.onViewChange(cb);
  }

  pixelsRead(rect?: PixelBox): Result<Uint8Array> {
    if (!this.gl) return fail('viewer', 'no WebGL: read the frameComposite output instead');
    if (!this.frame) return fail('viewer', 'no frame to read back');
    const { imgW, imgH } = this.ctl;
    const r = rect ?? { x: 0, y: 0, width: imgW, height: imgH };
    if (r.x < 0 || r.y < 0 || r.width < 1 || r.height < 1 || r.x + r.width > imgW || r.y + r.height > imgH) {
      return fail('viewer', `rectangle ${r.x},${r.y} ${r.width}×${r.height} is not inside the ${imgW}×${imgH} frame`);
    }
    this.uniformsApply();
    return this.gl.pixelsRead(r);
  }

  private uniformsApply(): void {
    if (!this.gl || !this.frame) return;
    if (!this.palette) this.palette = compositePaletteFromTable(classTableGenerated(254), { ...MARK_COLORS });
    this.gl.paletteSet(this.palette);
    this.gl.paramsSet(compositeParams(this.frame, this.layers, this.palette));
  }

  private invalidate(): void {
    if (this.raf === 0) this.raf = requestAnimationFrame(() => this.renderNow());
  }

  renderNow(): void {
    if (this.raf !== 0) cancelAnimationFrame(this.raf);
    this.raf = 0;
    const { view, vpW, vpH, imgW, imgH } = this.ctl;
    if (this.gl) {
      this.uniformsApply();
      this.gl.draw(view, vpW, vpH);
    }
    this.cpu?.draw(view, vpW, vpH);
    const curtain = this.layers.curtain;
    overlayDraw(this.overCtx, { view, imgW, imgH, grid: this.grid, curtainX: curtain.on && imgW > 0 ? curtain.x : null });
  }

  destroy(): void {
    if (this.raf !== 0) cancelAnimationFrame(this.raf);
    this.raf = 0;
    this.resizeObs.disconnect();
    this.inputDetach();
    this.gl?.destroy();
    this.gl = null;
    this.ctl.clear();
    this.root.remove();
  }
}
