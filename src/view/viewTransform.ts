// Pan and zoom as plain numbers, shared by the WebGL and the fallback drawing and by pointer input.
// Screen quantities here are DEVICE pixels of the viewport (CSS pixels × devicePixelRatio), so scale 1
// means one image pixel per device pixel: the true 1:1.

/** Where the view looks: image point (cx, cy) at the viewport centre, `scale` device pixels per image pixel. */
export interface ViewState {
  cx: number;
  cy: number;
  scale: number;
}

/** Largest zoom, device pixels per image pixel. */
export const SCALE_MAX = 256;

/** Returns the smallest zoom allowed for an image in a viewport: a quarter of the fit or 1:1, whichever is smaller. */
export function scaleMin(imgW: number, imgH: number, vpW: number, vpH: number): number {
  return Math.min(1, viewFitted(imgW, imgH, vpW, vpH).scale) / 4;
}

/** Returns the view showing the whole image centred in the viewport (never enlarged past SCALE_MAX). */
export function viewFitted(imgW: number, imgH: number, vpW: number, vpH: number): ViewState {
  const scale = Math.min(SCALE_MAX, Math.max(1e-6, Math.min(vpW / imgW, vpH / imgH)));
  return { cx: imgW / 2, cy: imgH / 2, scale };
}

/**
 * Returns the device-pixel position of image point (0, 0), rounded to whole device pixels so that at
 * whole-number scales every image pixel covers whole device pixels (crisp edges, exact 1:1 readback).
 */
export function viewOrigin(view: ViewState, vpW: number, vpH: number): { ox: number; oy: number } {
  return { ox: Math.round(vpW / 2 - view.cx * view.scale), oy: Math.round(vpH / 2 - view.cy * view.scale) };
}

/** Returns the image point (fractional image pixels) under device pixel position (sx, sy). */
export function viewScreenToImage(view: ViewState, sx: number, sy: number, vpW: number, vpH: number): { x: number; y: number } {
  const { ox, oy } = viewOrigin(view, vpW, vpH);
  return { x: (sx - ox) / view.scale, y: (sy - oy) / view.scale };
}

/** Returns the view zoomed by `factor` keeping the image point under (sx, sy) in place, scale clamped to [lo, SCALE_MAX]. */
export function viewZoomedAt(view: ViewState, factor: number, sx: number, sy: number, vpW: number, vpH: number, lo: number): ViewState {
  const scale = Math.min(SCALE_MAX, Math.max(lo, view.scale * factor));
  // Unrounded origin, so repeated zooms at one point do not drift by the rounding.
  const px = view.cx + (sx - vpW / 2) / view.scale;
  const py = view.cy + (sy - vpH / 2) / view.scale;
  return { cx: px - (sx - vpW / 2) / scale, cy: py - (sy - vpH / 2) / scale, scale };
}

/** Returns the view moved by (dx, dy) device pixels of drag: the image follows the pointer. */
export function viewPanned(view: ViewState, dx: number, dy: number): ViewState {
  return { cx: view.cx - dx / view.scale, cy: view.cy - dy / view.scale, scale: view.scale };
}

/** Returns the view with its centre kept within the image, so the image can never be lost off screen. */
export function viewClamped(view: ViewState, imgW: number, imgH: number): ViewState {
  return { cx: Math.min(imgW, Math.max(0, view.cx)), cy: Math.min(imgH, Math.max(0, view.cy)), scale: view.scale };
}
