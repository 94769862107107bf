// Screen-space marks drawn on a 2-D canvas over the image, in both drawing modes: the pixel grid at
// high zoom and the curtain line. Lines are whole device pixels wide at whole device-pixel positions,
// so they stay crisp at any zoom.
import { viewOrigin, type ViewState } from './viewTransform.ts';

/** Zoom from which the pixel grid shows, device pixels per image pixel. */
export const GRID_MIN_SCALE = 8;

export interface OverlayState {
  view: ViewState;
  imgW: number;
  imgH: number;
  grid: boolean;
  /** Image column where the right side of the curtain starts, or null when the curtain is off. */
  curtainX: number | null;
}

/** Clears `ctx` (device-pixel sized) and draws the grid and curtain line for `s`. */
export function overlayDraw(ctx: CanvasRenderingContext2D, s: OverlayState): void {
  const W = ctx.canvas.width, H = ctx.canvas.height;
  ctx.setTransform(1, 0, 0, 1, 0, 0);
  ctx.clearRect(0, 0, W, H);
  if (s.imgW === 0) return;
  const { ox, oy } = viewOrigin(s.view, W, H);
  const k = s.view.scale;
  const left = Math.max(0, ox), top = Math.max(0, oy);
  const right = Math.min(W, ox + s.imgW * k), bottom = Math.min(H, oy + s.imgH * k);
  if (s.grid && k >= GRID_MIN_SCALE && right > left && bottom > top) {
    // Dark line with a light neighbour: readable over bright and dark pixels alike.
    const x0 = Math.max(0, Math.floor((left - ox) / k)), x1 = Math.min(s.imgW, Math.ceil((right - ox) / k));
    const y0 = Math.max(0, Math.floor((top - oy) / k)), y1 = Math.min(s.imgH, Math.ceil((bottom - oy) / k));
    ctx.fillStyle = 'rgba(0, 0, 0, 0.45)';
    for (let x = x0; x <= x1; x++) ctx.fillRect(Math.round(ox + x * k), top, 1, bottom - top);
    for (let y = y0; y <= y1; y++) ctx.fillRect(left, Math.round(oy + y * k), right - left, 1);
    ctx.fillStyle = 'rgba(255, 255, 255, 0.18)';
    for (let x = x0; x <= x1; x++) ctx.fillRect(Math.round(ox + x * k) + 1, top, 1, bottom - top);
    for (let y = y0; y <= y1; y++) ctx.fillRect(left, Math.round(oy + y * k) + 1, right - left, 1);
  }
  if (s.curtainX !== null && bottom > top) {
    const x = Math.round(ox + Math.min(s.imgW, Math.max(0, s.curtainX)) * k);
    if (x >= 0 && x <= W) {
      ctx.fillStyle = 'rgba(8, 9, 12, 0.8)';
      ctx.fillRect(x - 2, top, 4, bottom - top);
      ctx.fillStyle = '#f4f1e8';
      ctx.fillRect(x - 1, top, 2, bottom - top);
    }
  }
}
