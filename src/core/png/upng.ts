import UPNG from 'upng-js';

/**
 * Typed access to the parts of upng-js 2.1.0 that its published types leave out (the CRC, the
 * scanline unfilter, the RGBA expansion and the encoder's "no palette" flag). The version is pinned
 * in package.json; test/core/png checks these against pngjs, so a change in upng-js shows up there.
 */
interface UpngInternals {
  crc: { crc(buf: Uint8Array, offset: number, length: number): number };
  decode: {
    _filterZero(data: Uint8Array, out: { ctype: number; depth: number }, off: number, w: number, h: number): Uint8Array;
  };
  toRGBA8: {
    decodeImage(
      data: Uint8Array,
      w: number,
      h: number,
      out: { ctype: number; depth: number; tabs: { PLTE?: ArrayLike<number>; tRNS?: number | ArrayLike<number> } },
    ): Uint8Array;
  };
  encode(bufs: ArrayBuffer[], w: number, h: number, cnum: number, dels: number[] | undefined, forbidPlte: boolean): ArrayBuffer;
}

const upng = UPNG as unknown as UpngInternals;

/** Returns the CRC-32 (ISO 3309, as PNG chunks use) of `length` bytes from `offset`, as an unsigned 32-bit integer. */
export function upngCrc(buf: Uint8Array, offset: number, length: number): number {
  return upng.crc.crc(buf, offset, length) >>> 0;
}

/**
 * Unfilters `h` scanlines of `w` pixels in place, starting at byte `off`; the filter-type bytes are
 * squeezed out so row y ends up at `off + y * bytesPerRow`. Returns the same buffer.
 */
export function upngUnfilter(data: Uint8Array, colorType: number, bitDepth: number, off: number, w: number, h: number): Uint8Array {
  return upng.decode._filterZero(data, { ctype: colorType, depth: bitDepth }, off, w, h);
}

/** Returns RGBA8 pixels (w*h*4) from unfiltered, packed 8/16-bit data of any colour type, applying PLTE and tRNS. */
export function upngToRgba8(
  data: Uint8Array,
  w: number,
  h: number,
  colorType: number,
  bitDepth: number,
  tabs: { PLTE?: ArrayLike<number>; tRNS?: number | ArrayLike<number> },
): Uint8Array {
  return upng.toRGBA8.decodeImage(data, w, h, { ctype: colorType, depth: bitDepth, tabs });
}

/** Returns a PNG file encoded losslessly from RGBA8 pixels: RGB when every alpha is 255, RGBA otherwise. */
export function upngEncodeRgbaNoPalette(rgba: ArrayBuffer, w: number, h: number): ArrayBuffer {
  return upng.encode([rgba], w, h, 0, undefined, true);
}
