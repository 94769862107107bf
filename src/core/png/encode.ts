import { zlibSync } from 'fflate';
import type { LabelMap } from '../labelMap.ts';
import { ihdrBytes, pngFromChunks, type PngChunk } from './chunkWrite.ts';
import { pngRowsFilter } from './filterRows.ts';
import { upngCompressRgba } from './upng.ts';

/** How a label map is written: grayscale (value = id) or palette (index = id, `colors` flat r,g,b per index). */
export type LabelPngEncoding =
  | { kind: 'gray'; bitDepth: 8 | 16 }
  | { kind: 'palette'; colors: Uint8Array /* flat r,g,b per index, at most 256 entries */ };

function labelMapSizeCheck(map: LabelMap): void {
  const { width, height, ids } = map;
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) {
    throw new RangeError(`labelMapToPng: size ${width}×${height} is not a positive integer size`);
  }
  if (ids.length !== width * height) {
    throw new RangeError(`labelMapToPng: ${ids.length} ids for a ${width}×${height} map (expected ${width * height})`);
  }
}

/** Throws when an id is above `max`; labelMapToPng must never write a PNG whose ids differ from the map's. */
function labelIdsMaxCheck(ids: LabelMap['ids'], max: number, what: string): void {
  for (let i = 0; i < ids.length; i++) {
    if (ids[i] > max) throw new RangeError(`labelMapToPng: id ${ids[i]} at pixel ${i} does not fit ${what} (largest ${max})`);
  }
}

/** A zlib (RFC 1950) compressor: returns the compressed stream of `data`. */
export type ZlibCompress = (data: Uint8Array) => Uint8Array;

const zlibLevel6: ZlibCompress = (data) => zlibSync(data, { level: 6 });

/**
 * Encodes a label map as a PNG with exactly these ids (gray 8/16-bit, or 8-bit palette where index = id).
 * Returns the PNG file bytes. Throws a RangeError on a malformed map or an id the encoding cannot hold
 * (the maps come from our own code, not from user files). `compress` may swap in a faster zlib
 * (Node's native one) where many maps are written; the ids are the same either way.
 */
export function labelMapToPng(map: LabelMap, encoding: LabelPngEncoding, compress: ZlibCompress = zlibLevel6): Uint8Array {
  labelMapSizeCheck(map);
  const { width, height, ids } = map;
  const chunks: PngChunk[] = [];
  let raw: Uint8Array;
  let bytesPerPixel = 1;
  if (encoding.kind === 'gray' && encoding.bitDepth === 16) {
    raw = new Uint8Array(width * height * 2);
    for (let i = 0, o = 0; i < ids.length; i++, o += 2) {
      raw[o] = ids[i] >> 8; // PNG samples are big-endian (ISO/IEC 15948 §7.1)
      raw[o + 1] = ids[i] & 255;
    }
    bytesPerPixel = 2;
    chunks.push({ type: 'IHDR', data: ihdrBytes(width, height, 16, 0, 0) });
  } else if (encoding.kind === 'gray') {
    labelIdsMaxCheck(ids, 255, '8-bit grayscale');
    raw = ids instanceof Uint8Array ? ids : Uint8Array.from(ids);
    chunks.push({ type: 'IHDR', data: ihdrBytes(width, height, 8, 0, 0) });
  } else {
    const { colors } = encoding;
    const entries = colors.length / 3;
    if (!Number.isInteger(entries) || entries < 1 || entries > 256) {
      throw new RangeError(`labelMapToPng: palette has ${colors.length} bytes; expected 3 per entry, 1..256 entries`);
    }
    // An index past the palette's end is an error under ISO/IEC 15948 §11.2.3, so every id needs an entry.
    labelIdsMaxCheck(ids, entries - 1, `a palette of ${entries} colours`);
    raw = ids instanceof Uint8Array ? ids : Uint8Array.from(ids);
    chunks.push({ type: 'IHDR', data: ihdrBytes(width, height, 8, 3, 0) });
    chunks.push({ type: 'PLTE', data: colors });
  }
  const filtered = pngRowsFilter(raw, height, width * bytesPerPixel, bytesPerPixel);
  chunks.push({ type: 'IDAT', data: compress(filtered) });
  chunks.push({ type: 'IEND', data: new Uint8Array(0) });
  return pngFromChunks(chunks);
}

/** Encodes 8-bit RGBA pixels (length w*h*4) as an RGB PNG when every alpha is 255, RGBA otherwise; returns the file bytes. */
export function rgbaToPng(width: number, height: number, rgba: Uint8Array): Uint8Array {
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) {
    throw new RangeError(`rgbaToPng: size ${width}×${height} is not a positive integer size`);
  }
  if (rgba.length !== width * height * 4) {
    throw new RangeError(`rgbaToPng: ${rgba.length} bytes for ${width}×${height} RGBA (expected ${width * height * 4})`);
  }
  // upng-js reads the pixels as a whole ArrayBuffer (and as 32-bit words), so hand it an exact copy.
  const own = rgba.byteOffset === 0 && rgba.byteLength === rgba.buffer.byteLength && rgba.buffer instanceof ArrayBuffer;
  const buffer = own ? (rgba.buffer as ArrayBuffer) : rgba.slice().buffer;
  const { colorType, zlib } = upngCompressRgba(buffer, width, height);
  return pngFromChunks([
    { type: 'IHDR', data: ihdrBytes(width, height, 8, colorType, 0) },
    { type: 'IDAT', data: zlib },
    { type: 'IEND', data: new Uint8Array(0) },
  ]);
}
