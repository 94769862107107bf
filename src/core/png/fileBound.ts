import { countText } from '../countText.ts';
import { fail, ok, type Result } from '../result.ts';
import { pngRawSize } from './adam7.ts';
import { pngBitsPerPixel, pngFormatName, pngHeaderRead, PNG_IHDR_END, type PngHeader } from './header.ts';
import { pngSizeCheck } from './pixelsRead.ts';

/** Bytes a reader takes from the start of a file to check it with pngFileBound before reading it whole. */
export const PNG_HEAD_BYTES = PNG_IHDR_END;

/**
 * Room for chunks other than image data (text, ICC profiles, private chunks) and for image data split
 * into many small chunks (12 bytes each): 16 MiB, common practice for a generous limit, not a standard.
 */
const PNG_EXTRA_BYTES = 16 * 2 ** 20;
/** Largest file that is not a PNG a reader takes whole (a JPEG or WebP photo); common practice, 256 MiB. */
export const OTHER_FILE_BYTES_MAX = 256 * 2 ** 20;

/** Returns the pixel count a PNG's first bytes declare, or null when they are not a valid PNG header. */
export function pngHeadPixels(head: Uint8Array): number | null {
  const h = pngHeaderRead(head, '');
  return h.ok ? h.value.width * h.value.height : null;
}

/**
 * Returns the most bytes a PNG with this header can sensibly hold: its raw rows (filter bytes and
 * Adam7 passes included) stored without compression (deflate stored blocks add 5 bytes per 65,535),
 * the zlib and chunk framing, plus PNG_EXTRA_BYTES.
 */
export function pngBytesMax(h: PngHeader): number {
  const raw = pngRawSize(h.width, h.height, pngBitsPerPixel(h), h.interlace);
  return 8 + 25 + 12 + raw + Math.ceil(raw / 65535) * 5 + 6 + Math.ceil(raw / 8192) * 12 + PNG_EXTRA_BYTES;
}

function mb(n: number): string {
  return n >= 1e9 ? `${(n / 1e9).toFixed(1)} GB` : `${(n / 1e6).toFixed(1)} MB`;
}

/**
 * Returns whether a file of `size` bytes starting with `head` (its first PNG_HEAD_BYTES) may be read
 * whole, or the reason not to, phrased to follow "could not be read": a PNG larger than its own
 * header allows even uncompressed, or with more than `maxPixels` pixels; a large file that is not a
 * PNG or whose header is damaged. A small damaged file is read, and its decoder says what is wrong.
 * Checked before reading, so a huge or mislabelled file costs 33 bytes, not its size in memory.
 */
export function pngFileBound(head: Uint8Array, size: number, maxPixels: number): Result<void> {
  const isPng = head.length >= 4 && head[0] === 0x89 && head[1] === 0x50 && head[2] === 0x4e && head[3] === 0x47;
  const large = size > OTHER_FILE_BYTES_MAX;
  if (!isPng) return large ? fail('', `it is ${mb(size)} and not a PNG; files over ${mb(OTHER_FILE_BYTES_MAX)} that are not PNGs are not read`) : ok(undefined);
  const h = pngHeaderRead(head, '');
  if (!h.ok) return large ? fail('', `it is ${mb(size)} and its PNG header is damaged (${h.error})`) : ok(undefined);
  const sized = pngSizeCheck(h.value, maxPixels, '');
  if (!sized.ok) return fail('', `it ${sized.error}`);
  const most = pngBytesMax(h.value);
  if (size > most) {
    return fail(
      '',
      `it is ${mb(size)}, more than a ${countText(h.value.width)}×${countText(h.value.height)} ${pngFormatName(h.value)} PNG can hold ` +
        `(at most ${mb(most)} even uncompressed)`,
    );
  }
  return ok(undefined);
}
