// The viewer's pan/zoom state and pointer readout, apart from any drawing: it holds the view, the
// viewport and image sizes, and tells listeners when the view or the pixel under the pointer changes.
import {
  SCALE_MAX,
  scaleMin,
  viewClamped,
  viewFitted,
  viewPanned,
  viewScreenToImage,
  viewZoomedAt,
  type ViewState,
} from './viewTransform.ts';

/** The integer image pixel under the pointer, or null when the pointer is off the image. */
export type PointerReadout = { x: number; y: number } | null;

export class ViewControl {
  view: ViewState = { cx: 0, cy: 0, scale: 1 };
  /** Viewport size, device pixels. */
  vpW = 1;
  vpH = 1;
  imgW = 0;
  imgH = 0;
  private hoverAt: { sx: number; sy: number } | null = null;
  private readout: PointerReadout = null;
  private readonly pointerCbs = new Set<(p: PointerReadout) => void>();
  private readonly viewCbs = new Set<(v: ViewState) => void>();

  /** `changed` is called after every change that needs a redraw. */
  constructor(private readonly changed: () => void) {}

  /** Sets the image size; a size other than the current one fits the view to it (same size keeps the view). */
  imageSet(width: number, height: number): void {
    const same = width === this.imgW && height === this.imgH;
    this.imgW = width;
    this.imgH = height;
    if (width > 0 && !same) this.fit();
    this.readoutUpdate();
  }

  /** Sets the viewport size in device pixels; the first real size fits the image. */
  viewportSet(w: number, h: number): void {
    const first = this.vpW === 1 && this.vpH === 1;
    this.vpW = w;
    this.vpH = h;
    if (first && this.imgW > 0) this.fit();
    this.changed();
  }

  fit(): void {
    if (this.imgW > 0) this.set(viewFitted(this.imgW, this.imgH, this.vpW, this.vpH));
  }

  /** Zooms by `factor` about device pixel (sx, sy). */
  zoomAt(factor: number, sx: number, sy: number): void {
    if (!(factor > 0) || this.imgW === 0) return;
    this.set(viewZoomedAt(this.view, factor, sx, sy, this.vpW, this.vpH, this.scaleLow()));
  }

  /** Moves the view by a drag of (dx, dy) device pixels. */
  pan(dx: number, dy: number): void {
    this.set(viewPanned(this.view, dx, dy));
  }

  private scaleLow(): number {
    return this.imgW > 0 ? scaleMin(this.imgW, this.imgH, this.vpW, this.vpH) : 0;
  }

  /** Sets the view, its scale clamped to the allowed range and its centre kept on the image. */
  set(next: ViewState): void {
    if (!(next.scale > 0) || !Number.isFinite(next.cx) || !Number.isFinite(next.cy)) return;
    const scale = Math.max(this.scaleLow(), Math.min(SCALE_MAX, next.scale));
    this.view = viewClamped({ ...next, scale }, this.imgW, this.imgH);
    for (const cb of this.viewCbs) cb({ ...this.view });
    this.readoutUpdate();
    this.changed();
  }

  /** Records the pointer at device pixel (sx, sy), or off the element (null). */
  hover(at: { sx: number; sy: number } | null): void {
    this.hoverAt = at;
    this.readoutUpdate();
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

  clear(): void {
    this.pointerCbs.clear();
    this.viewCbs.clear();
  }
}
