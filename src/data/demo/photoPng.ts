// RGB photo PNGs for the demo. The shared rgbaToPng tries every filter and compresses hard (about a
// second per 1024×512 noisy photo here); the demo writes 48+ photos at a time, so it uses the Up
// filter and a fast deflate, with the same chunk writer. Photos are lossless either way.
import { zlibSync } from 'fflate';
import { ihdrBytes, pngFromChunks } from '../../core/png/chunkWrite.ts';
import type { ZlibCompress } from '../../core/png/encode.ts';
import { pngRowsFilter } from '../../core/png/filterRows.ts';

/** Returns the zlib stream of `data` at fflate's fastest level (pure JS: browser, worker, Node). */
export const zlibFast: ZlibCompress = (data) => zlibSync(data, { level: 1 });

/** Returns the PNG file bytes (8-bit RGB, colour type 2) of `rgb` (length width*height*3). */
export function photoRgbToPng(width: number, height: number, rgb: Uint8Array, compress: ZlibCompress = zlibFast): Uint8Array {
  if (rgb.length !== width * height * 3) throw new RangeError(`photoRgbToPng: ${rgb.length} bytes for ${width}×${height} RGB`);
  const filtered = pngRowsFilter(rgb, height, width * 3, 3);
  return pngFromChunks([
    { type: 'IHDR', data: ihdrBytes(width, height, 8, 2, 0) },
    { type: 'IDAT', data: compress(filtered) },
    { type: 'IEND', data: new Uint8Array(0) },
  ]);
}
