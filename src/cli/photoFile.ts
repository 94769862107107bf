import jpeg from 'jpeg-js';
import { photoFromPng, type RgbaImage } from '../core/png/decodePhoto.ts';
import { PNG_MAX_PIXELS_DEFAULT } from '../core/png/pixelsRead.ts';
import { fail, ok, type Result } from '../core/result.ts';

/** Returns which photo format the bytes hold, by their magic numbers (PNG and JPEG signatures, RIFF…WEBP). */
function photoKind(b: Uint8Array): 'png' | 'jpeg' | 'webp' | null {
  if (b[0] === 0x89 && b[1] === 0x50 && b[2] === 0x4e && b[3] === 0x47) return 'png';
  if (b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff) return 'jpeg';
  if (b[0] === 0x52 && b[1] === 0x49 && b[2] === 0x46 && b[3] === 0x46 && b[8] === 0x57 && b[9] === 0x45 && b[10] === 0x42 && b[11] === 0x50) return 'webp';
  return null;
}

/**
 * Returns a photo file decoded headless into 8-bit RGBA: PNG by our decoder, JPEG by jpeg-js
 * (baseline and progressive). WebP has no decoder here and gets a message saying so; the browser
 * decodes it. Images over `maxPixels` are refused before their pixels are allocated.
 */
export function photoFromBytes(bytes: Uint8Array, options: { file: string; maxPixels?: number }): Result<RgbaImage> {
  const { file } = options;
  const maxPixels = options.maxPixels ?? PNG_MAX_PIXELS_DEFAULT;
  const kind = photoKind(bytes);
  if (kind === 'png') return photoFromPng(bytes, options);
  if (kind === 'webp') return fail(file, 'WebP photos are decoded in the browser only (no WebP decoder headless)');
  if (kind !== 'jpeg') return fail(file, 'is neither a PNG nor a JPEG photo');
  try {
    const img = jpeg.decode(bytes, { useTArray: true, formatAsRGBA: true, maxResolutionInMP: maxPixels / 1e6, maxMemoryUsageInMB: 4096 });
    return ok({ width: img.width, height: img.height, rgba: img.data });
  } catch (e) {
    return fail(file, `could not be decoded as JPEG (${(e as Error).message})`);
  }
}
