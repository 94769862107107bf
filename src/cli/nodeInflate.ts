// node:zlib as the PNG reader's whole-stream inflate in this thread (src/core/png/inflate.ts): zlib's
// own C inflate, its output capped at what the image needs plus one byte. Importing this module
// installs it; every answer still passes the reader's length and Adler-32 checks.
import { inflateSync } from 'node:zlib';
import { pngPlatformInflateUse, type PlatformInflate } from '../core/png/inflate.ts';

/** Returns the inflated bytes of a whole zlib stream (at most `maxBytes`), or null when zlib refuses it or it holds more. */
export const nodeInflate: PlatformInflate = (zlib, maxBytes) => {
  try {
    // One output chunk as large as the image (up to 8 MB) saves zlib's chunk gathering and copy.
    const out = inflateSync(zlib, { maxOutputLength: maxBytes, chunkSize: Math.min(Math.max(maxBytes, 64), 8 << 20) });
    return new Uint8Array(out.buffer, out.byteOffset, out.length);
  } catch {
    return null;
  }
};

pngPlatformInflateUse(nodeInflate);
