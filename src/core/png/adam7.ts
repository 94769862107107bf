/** Adam7 passes (ISO/IEC 15948 §8.2): starting column/row and column/row step of each of the 7 passes. */
export const ADAM7 = {
  x0: [0, 4, 0, 2, 0, 1, 0],
  y0: [0, 0, 4, 0, 2, 0, 1],
  dx: [8, 8, 4, 4, 2, 2, 1],
  dy: [8, 8, 8, 4, 4, 2, 2],
} as const;

/** Returns the width and height in pixels of Adam7 pass `p` (0..6) of a width×height image (either may be 0). */
export function adam7PassSize(p: number, width: number, height: number): { w: number; h: number } {
  const w = width > ADAM7.x0[p] ? Math.ceil((width - ADAM7.x0[p]) / ADAM7.dx[p]) : 0;
  const h = height > ADAM7.y0[p] ? Math.ceil((height - ADAM7.y0[p]) / ADAM7.dy[p]) : 0;
  return { w, h };
}

/** Returns the bytes of filtered image data (filter bytes included) PNG stores for this image, interlaced or not. */
export function pngRawSize(width: number, height: number, bitsPerPixel: number, interlace: 0 | 1): number {
  if (interlace === 0) return height * (1 + Math.ceil((width * bitsPerPixel) / 8));
  let size = 0;
  for (let p = 0; p < 7; p++) {
    const { w, h } = adam7PassSize(p, width, height);
    if (w > 0 && h > 0) size += h * (1 + Math.ceil((w * bitsPerPixel) / 8));
  }
  return size;
}

/**
 * Returns packed, non-interlaced rows (height × ceil(width·bits/8) bytes) from unfiltered Adam7 data,
 * where pass p's rows start at `passOffsets[p]` with their filter bytes already removed.
 * Hot loop: flat typed arrays, offsets hoisted per row, no allocation per pixel.
 */
export function adam7Deinterlace(
  data: Uint8Array,
  passOffsets: number[],
  width: number,
  height: number,
  bitsPerPixel: number,
): Uint8Array {
  const bpl = Math.ceil((width * bitsPerPixel) / 8);
  const out = new Uint8Array(height * bpl);
  const bytesPerPixel = bitsPerPixel >> 3;
  const mask = (1 << bitsPerPixel) - 1;
  for (let p = 0; p < 7; p++) {
    const { w, h } = adam7PassSize(p, width, height);
    if (w === 0 || h === 0) continue;
    const passBpl = Math.ceil((w * bitsPerPixel) / 8);
    const x0 = ADAM7.x0[p], dx = ADAM7.dx[p];
    for (let py = 0; py < h; py++) {
      const src = passOffsets[p] + py * passBpl;
      const dst = (ADAM7.y0[p] + py * ADAM7.dy[p]) * bpl;
      if (bitsPerPixel >= 8) {
        for (let px = 0, x = x0; px < w; px++, x += dx) {
          const s = src + px * bytesPerPixel, d = dst + x * bytesPerPixel;
          for (let k = 0; k < bytesPerPixel; k++) out[d + k] = data[s + k];
        }
      } else {
        // Sub-byte samples are packed high bits first (ISO/IEC 15948 §7.2).
        for (let px = 0, x = x0; px < w; px++, x += dx) {
          const sbit = px * bitsPerPixel, dbit = x * bitsPerPixel;
          const v = (data[src + (sbit >> 3)] >> (8 - bitsPerPixel - (sbit & 7))) & mask;
          out[dst + (dbit >> 3)] |= v << (8 - bitsPerPixel - (dbit & 7));
        }
      }
    }
  }
  return out;
}
