import { fail, ok, type Result } from '../result.ts';
import { PngColorType } from './header.ts';
import { PNG_MAX_PIXELS_DEFAULT, pngPixelsRead, type PngPixels } from './pixelsRead.ts';
import { upngToRgba8 } from './upng.ts';
import { idsFromPackedRows } from './unpackIds.ts';

/** An 8-bit RGBA image, row-major, `rgba.length === width * height * 4`. */
export interface RgbaImage {
  width: number;
  height: number;
  rgba: Uint8Array;
}

/**
 * Returns RGBA8 from grayscale rows of any depth: samples scaled to 0..255 (16-bit keeps the high
 * byte), alpha 0 where the raw sample equals the tRNS value. Done here because upng-js reads
 * sub-byte gray as if rows were not byte-padded and skips a tRNS value of 0.
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
function grayToRgba8(px: PngPixels): Uint8Array {
  const { width, height, bitDepth } = px.header;
  const samples = idsFromPackedRows(px.rows, width, height, px.bytesPerRow, bitDepth);
  const transparent = px.trns && px.trns.length >= 2 ? (px.trns[0] << 8) | px.trns[1] : -1;
  const scale = bitDepth === 16 ? 1 / 256 : 255 / ((1 << bitDepth) - 1);
  const out = new Uint8Array(width * height * 4);
  for (let i = 0, o = 0; i < samples.length; i++, o += 4) {
    const s = samples[i];
    const v = bitDepth === 16 ? s >> 8 : Math.round(s * scale);
    out[o] = v;
    out[o + 1] = v;
    out[o + 2] = v;
    out[o + 3] = s === transparent ? 0 : 255;
  }
  return out;
}

/** Returns the tRNS table in the shape upng-js expects for this colour type (RGB: three 16-bit values). */
function upngTrns(px: PngPixels): number | ArrayLike<number> | undefined {
  const t = px.trns;
  if (!t) return undefined;
  if (px.header.colorType === PngColorType.palette) return t;
  if (px.header.colorType === PngColorType.rgb && t.length >= 6) {
    return [(t[0] << 8) | t[1], (t[2] << 8) | t[3], (t[4] << 8) | t[5]];
  }
  return undefined;
}

/** Decodes any PNG (Node/test use; the browser decodes photos with createImageBitmap) into 8-bit RGBA pixels. */
export function photoFromPng(bytes: Uint8Array, options: { file: string; maxPixels?: number }): Result<RgbaImage> {
  const { file } = options;
  try {
    const read = pngPixelsRead(bytes, file, options.maxPixels ?? PNG_MAX_PIXELS_DEFAULT);
    if (!read.ok) return read;
    const px = read.value;
    const { width, height, colorType, bitDepth } = px.header;
    const rgba =
      colorType === PngColorType.gray
        ? grayToRgba8(px)
        : upngToRgba8(px.rows, width, height, colorType, bitDepth, { PLTE: px.plte ?? undefined, tRNS: upngTrns(px) });
    return ok({ width, height, rgba });
  } catch (e) {
    return fail(file, `could not be decoded (${(e as Error)?.message ?? String(e)})`);
  }
}
