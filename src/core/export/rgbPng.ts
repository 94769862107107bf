import { zlibSync } from 'fflate';
import { ihdrBytes, pngFromChunks } from '../png/chunkWrite.ts';
import type { ZlibCompress } from '../png/encode.ts';
import { pngRowsFilter } from '../png/filterRows.ts';

const zlibLevel6: ZlibCompress = (data) => zlibSync(data, { level: 6 });

/**
 * Returns a PNG of 8-bit RGBA pixels (length w·h·4): RGB when every alpha is 255, RGBA otherwise,
 * lossless. Rows are Up-filtered and deflated once (fflate, or `compress`), which measured 2–3× faster
 * than trying every filter at 2048×1024 for tile photos and overlays. Hot loop: flat typed arrays.
 */
export function rgbaToPngFast(width: number, height: number, rgba: Uint8Array, compress: ZlibCompress = zlibLevel6): Uint8Array {
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1 || rgba.length !== width * height * 4) {
    throw new RangeError(`rgbaToPngFast: ${rgba.length} bytes for ${width}×${height} RGBA`);
  }
  let opaque = true;
  for (let i = 3; i < rgba.length; i += 4) if (rgba[i] !== 255) { opaque = false; break; }
  let raw = rgba;
  if (opaque) {
    raw = new Uint8Array(width * height * 3);
    for (let i = 0, o = 0; i < rgba.length; i += 4, o += 3) {
      raw[o] = rgba[i];
      raw[o + 1] = rgba[i + 1];
      raw[o + 2] = rgba[i + 2];
    }
  }
  const bpp = opaque ? 3 : 4;
  return pngFromChunks([
    { type: 'IHDR', data: ihdrBytes(width, height, 8, opaque ? 2 : 6, 0) },
    { type: 'IDAT', data: compress(pngRowsFilter(raw, height, width * bpp, bpp)) },
    { type: 'IEND', data: new Uint8Array(0) },
  ]);
}
