import type { PixelBox } from '../core/composite/layerSettings.ts';

/** Returns the image split into row-major tiles of at most `size`×`size` pixels (one tile when it fits). */
export function tilesOf(width: number, height: number, size: number): PixelBox[] {
  const tiles: PixelBox[] = [];
  for (let y = 0; y < height; y += size) {
    for (let x = 0; x < width; x += size) {
      tiles.push({ x, y, width: Math.min(size, width - x), height: Math.min(size, height - y) });
    }
  }
  return tiles;
}

/**
 * Returns the bytes of `rect` out of a row-major array of `bpp` bytes per pixel and `width` pixels per
 * row, with each row padded to a multiple of 4 bytes: WebGL's default UNPACK_ALIGNMENT, which pixi
 * leaves as it is. Returns the source itself (no copy) when it already has that layout.
 */
export function tileBytes(src: Uint8Array, width: number, bpp: number, rect: PixelBox): Uint8Array {
  const rowBytes = rect.width * bpp;
  const stride = (rowBytes + 3) & ~3;
  if (rect.x === 0 && rect.y === 0 && rect.width === width && stride === rowBytes && src.length === rowBytes * rect.height) return src;
  const out = new Uint8Array(stride * rect.height);
  for (let y = 0; y < rect.height; y++) {
    const from = ((rect.y + y) * width + rect.x) * bpp;
    out.set(src.subarray(from, from + rowBytes), y * stride);
  }
  return out;
}
