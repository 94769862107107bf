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
  encode: {
    compressPNG(
      bufs: ArrayBuffer[],
      w: number,
      h: number,
      cnum: number,
      forbidPlte: boolean,
    ): { ctype: number; depth: number; frames: { cimg: Uint8Array }[] };
  };
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

/**
 * Returns the zlib image data (filtered and deflated by upng-js, lossless: no quantising, no palette)
 * and colour type for RGBA8 pixels: colour type 2 (RGB) when every alpha is 255, 6 (RGBA) otherwise.
 * `UPNG.encode` itself is not used: it writes into a buffer of input size + 100 bytes and silently
 * cuts the file short when the pixels do not compress (measured with noise at 57×31 RGBA).
 */
export function upngCompressRgba(rgba: ArrayBuffer, w: number, h: number): { colorType: number; zlib: Uint8Array } {
  const out = upng.encode.compressPNG([rgba], w, h, 0, true);
  return { colorType: out.ctype, zlib: out.frames[0].cimg };
}
