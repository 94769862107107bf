// RGB photo PNGs for the demo. The shared rgbaToPng tries every filter and compresses hard (about a
// second per 1024×512 noisy photo here); the demo writes 48+ photos at a time, so it uses the Up
// filter and Huffman-only deflate (measured on a demo photo: 36 ms and 909 KB, against 155 ms and
// 934 KB for fflate's fastest level), with the same chunk writer. Photos are lossless either way.
import { ihdrBytes, pngFromChunks } from '../core/png/chunkWrite.ts';
import type { ZlibCompress } from '../core/png/encode.ts';
import { pngRowsFilter } from '../core/png/filterRows.ts';
import { zlibHuffmanOnly } from './zlibHuffman.ts';

/** Returns the PNG file bytes (8-bit RGB, colour type 2) of `rgb` (length width*height*3). */
export function photoRgbToPng(width: number, height: number, rgb: Uint8Array, compress: ZlibCompress = zlibHuffmanOnly): Uint8Array {
  if (rgb.length !== width * height * 3) throw new RangeError(`photoRgbToPng: ${rgb.length} bytes for ${width}×${height} RGB`);
  const filtered = pngRowsFilter(rgb, height, width * 3, 3);
  return pngFromChunks([
    { type: 'IHDR', data: ihdrBytes(width, height, 8, 2, 0) },
    { type: 'IDAT', data: compress(filtered) },
    { type: 'IEND', data: new Uint8Array(0) },
  ]);
}
