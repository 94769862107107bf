// RGB photo PNGs for the demo. The shared rgbaToPng tries every filter and compresses hard (about a
// second per 1024×512 noisy photo here); the demo writes 48+ photos at a time, so it uses the Up
// filter and a fast deflate, with the same chunk writer. Photos are lossless either way.
import { zlibSync } from 'fflate';
import { ihdrBytes, pngFromChunks } from '../../core/png/chunkWrite.ts';
import { pngRowsFilter } from '../../core/png/filterRows.ts';

/** A zlib (RFC 1950) compressor: returns the compressed stream of `data`. */
export type Deflate = (data: Uint8Array) => Uint8Array;

/** Returns the zlib stream of `data` at fflate's fastest level (pure JS: browser, worker, Node). */
export const deflateFast: Deflate = (data) => zlibSync(data, { level: 1 });

/** Returns the PNG file bytes (8-bit RGB, colour type 2) of `rgb` (length width*height*3). */
export function photoRgbToPng(width: number, height: number, rgb: Uint8Array, deflate: Deflate = deflateFast): Uint8Array {
  if (rgb.length !== width * height * 3) throw new RangeError(`photoRgbToPng: ${rgb.length} bytes for ${width}×${height} RGB`);
  const filtered = pngRowsFilter(rgb, height, width * 3, 3);
  return pngFromChunks([
    { type: 'IHDR', data: ihdrBytes(width, height, 8, 2, 0) },
    { type: 'IDAT', data: deflate(filtered) },
    { type: 'IEND', data: new Uint8Array(0) },
  ]);
}
