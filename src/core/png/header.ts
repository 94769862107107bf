import { fail, ok, type Result } from '../result.ts';
import { upngCrc } from './upng.ts';

/** The IHDR fields of a PNG (ISO/IEC 15948 §11.2.2). */
export interface PngHeader {
  width: number;
  height: number;
  bitDepth: number;
  colorType: number;
  interlace: 0 | 1;
}

/** PNG colour types (ISO/IEC 15948 §6.1). */
export const PngColorType = { gray: 0, rgb: 2, palette: 3, grayAlpha: 4, rgba: 6 } as const;

const SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
const DEPTHS: Record<number, number[]> = { 0: [1, 2, 4, 8, 16], 2: [8, 16], 3: [1, 2, 4, 8], 4: [8, 16], 6: [8, 16] };
const CHANNELS: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 };
const NAMES: Record<number, string> = { 0: 'grayscale', 2: 'RGB', 3: 'palette', 4: 'grayscale+alpha', 6: 'RGBA' };
/** Bytes before the first chunk after IHDR: signature, IHDR length, type, 13 data bytes, CRC. */
export const PNG_IHDR_END = 33;

/** Returns bits per pixel for a valid colour type and bit depth. */
export function pngBitsPerPixel(h: Pick<PngHeader, 'colorType' | 'bitDepth'>): number {
  return CHANNELS[h.colorType] * h.bitDepth;
}

/** Returns a user-facing name like "16-bit RGB" for a header's colour type and depth. */
export function pngFormatName(h: Pick<PngHeader, 'colorType' | 'bitDepth'>): string {
  return `${h.bitDepth}-bit ${NAMES[h.colorType] ?? `colour type ${h.colorType}`}`;
}

/** Returns a hint for files that are some other image format, or '' (magic numbers from memory). */
function otherFormatHint(b: Uint8Array): string {
  if (b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff) return ' (it looks like a JPEG)';
  if (b[0] === 0x47 && b[1] === 0x49 && b[2] === 0x46) return ' (it looks like a GIF)';
  if (b[0] === 0x52 && b[1] === 0x49 && b[2] === 0x46 && b[3] === 0x46) return ' (it looks like a WebP or other RIFF file)';
  if (b[0] === 0x42 && b[1] === 0x4d) return ' (it looks like a BMP)';
  if (b[0] === 0x89 && b[1] === 0x50 && b[2] === 0x4e && b[3] === 0x47) return ' (its line-ending bytes were changed, e.g. by a text-mode transfer)';
  return '';
}

/** Reads signature and IHDR without inflating anything; returns the header or what is wrong with the file. */
export function pngHeaderRead(bytes: Uint8Array, file: string): Result<PngHeader> {
  if (bytes.length === 0) return fail(file, 'is empty (0 bytes), not a PNG file');
  for (let i = 0; i < 8; i++) {
    if (bytes[i] !== SIGNATURE[i]) {
      if (i === bytes.length) break;
      return fail(file, `is not a PNG file: it does not start with the PNG signature${otherFormatHint(bytes)}`);
    }
  }
  if (bytes.length < PNG_IHDR_END) {
    return fail(file, `is truncated: ${bytes.length} bytes, too short to hold even the PNG header (IHDR)`);
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const length = view.getUint32(8);
  const type = String.fromCharCode(bytes[12], bytes[13], bytes[14], bytes[15]);
  if (type !== 'IHDR') return fail(file, `is damaged: its first chunk must be the IHDR header, found "${printable(type)}"`);
  if (length !== 13) return fail(file, `is damaged: its IHDR header has length ${length}, PNG requires 13`);
  if (view.getUint32(29) !== upngCrc(bytes, 12, 17)) return fail(file, 'is damaged: the IHDR header fails its CRC check');
  const width = view.getUint32(16);
  const height = view.getUint32(20);
  const bitDepth = bytes[24], colorType = bytes[25], compression = bytes[26], filter = bytes[27], interlace = bytes[28];
  if (width === 0 || height === 0) return fail(file, `has zero size (${width}×${height} pixels)`);
  if (width > 0x7fffffff || height > 0x7fffffff) return fail(file, `is damaged: its size ${width}×${height} exceeds the PNG limit of 2^31−1`);
  const depths = DEPTHS[colorType];
  if (!depths) return fail(file, `is damaged: colour type ${colorType} does not exist in PNG`);
  if (!depths.includes(bitDepth)) {
    return fail(file, `is damaged: bit depth ${bitDepth} is not allowed for ${NAMES[colorType]} PNGs (allowed: ${depths.join(', ')})`);
  }
  if (compression !== 0) return fail(file, `is damaged: compression method ${compression} is unknown (PNG has only 0)`);
  if (filter !== 0) return fail(file, `is damaged: filter method ${filter} is unknown (PNG has only 0)`);
  if (interlace !== 0 && interlace !== 1) return fail(file, `is damaged: interlace method ${interlace} is unknown (PNG has 0 and 1)`);
  return ok({ width, height, bitDepth, colorType, interlace });
}

/** Returns a chunk type safe to show: letters kept, other bytes as \xNN. */
export function printable(type: string): string {
  return type.replace(/[^A-Za-z0-9]/g, (c) => `\\x${c.charCodeAt(0).toString(16).padStart(2, '0')}`);
}
