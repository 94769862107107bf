import { unzlibSync } from 'fflate';
import { countText } from '../countText.ts';
import { fail, ok, type Result } from '../result.ts';

/**
 * Inflates the zlib stream split over `parts` into a buffer of exactly `expected` bytes; returns it,
 * or an error when the stream is corrupt or holds fewer bytes than the image needs. Output past
 * `expected` is dropped, so a file can never make this allocate more than its header promised.
 * The Adler-32 checksum is not verified: every chunk's CRC already covers the same bytes.
 */
export function pngInflate(parts: Uint8Array[], totalLength: number, expected: number, file: string): Result<Uint8Array> {
  let data: Uint8Array;
  if (parts.length === 1) data = parts[0];
  else {
    data = new Uint8Array(totalLength);
    let off = 0;
    for (const p of parts) {
      data.set(p, off);
      off += p.length;
    }
  }
  let out: Uint8Array;
  try {
    out = unzlibSync(data, { out: new Uint8Array(expected) });
  } catch (e) {
    const why = (e as Error).message || String(e);
    if (/unexpected EOF/i.test(why)) {
      return fail(file, 'is truncated or damaged: its compressed image data stops before the image is complete');
    }
    return fail(file, `is damaged: its compressed image data cannot be decompressed (${why})`);
  }
  if (out.length < expected) {
    return fail(file, `is damaged: its image data holds ${countText(out.length)} bytes, the image needs ${countText(expected)}`);
  }
  return ok(out);
}
