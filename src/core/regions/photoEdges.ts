/**
 * Writes the 8-bit luma of an RGBA photo into `out`: (77 R + 150 G + 29 B + 128) >> 8, the ITU-R
 * BT.601 weights 0.299, 0.587, 0.114 in 8-bit fixed point. Alpha is ignored.
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
export function photoLuma(rgba: Uint8Array, pixels: number, out: Uint8Array): void {
  for (let i = 0, o = 0; i < pixels; i++, o += 4) out[i] = (77 * rgba[o] + 150 * rgba[o + 1] + 29 * rgba[o + 2] + 128) >> 8;
}

/** Gradient value meaning "not computed yet" (real values are at most 180). */
export const GRADIENT_UNKNOWN = 255;

/**
 * Returns the Sobel gradient magnitude of `luma` at pixel i = y·width + x, divided by 8 and rounded
 * so it reads as luma levels per pixel (a straight step of s levels reads s/2 on both pixels beside
 * it, a ramp of g levels per pixel reads g; at most 180), computing it on first use and keeping it in
 * `grad` (which starts filled with GRADIENT_UNKNOWN): only pixels near region outlines are ever
 * needed. Pixels beyond the border repeat the border.
 */
export function gradientAt(luma: Uint8Array, grad: Uint8Array, width: number, height: number, x: number, y: number): number {
  const i = y * width + x;
  const known = grad[i];
  if (known !== GRADIENT_UNKNOWN) return known;
  const xl = x > 0 ? x - 1 : 0, xr = x < width - 1 ? x + 1 : x;
  const ru = (y > 0 ? y - 1 : 0) * width, rc = y * width, rd = (y < height - 1 ? y + 1 : y) * width;
  const gx = luma[ru + xr] + 2 * luma[rc + xr] + luma[rd + xr] - luma[ru + xl] - 2 * luma[rc + xl] - luma[rd + xl];
  const gy = luma[rd + xl] + 2 * luma[rd + x] + luma[rd + xr] - luma[ru + xl] - 2 * luma[ru + x] - luma[ru + xr];
  const v = (Math.sqrt(gx * gx + gy * gy) * 0.125 + 0.5) | 0;
  grad[i] = v;
  return v;
}

/** Returns the largest gradient (levels per pixel, gradientAt) within chessboard distance `r` of (x, y), clipped to the image. */
export function gradientNear(luma: Uint8Array, grad: Uint8Array, width: number, height: number, x: number, y: number, r: number): number {
  const x0 = x > r ? x - r : 0, x1 = x + r < width ? x + r : width - 1;
  const y0 = y > r ? y - r : 0, y1 = y + r < height ? y + r : height - 1;
  let best = 0;
  for (let yy = y0; yy <= y1; yy++) {
    for (let xx = x0; xx <= x1; xx++) {
      const g = gradientAt(luma, grad, width, height, xx, yy);
      if (g > best) best = g;
    }
  }
  return best;
}
