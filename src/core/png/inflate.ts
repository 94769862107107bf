import { Inflate, unzlibSync } from 'fflate';
import { countText } from '../countText.ts';
import { fail, ok, type Result } from '../result.ts';
import { adler32 } from './adler32.ts';

/** Most bytes one byte of deflate data can inflate to: a 258-byte copy coded in 2 bits (RFC 1951 §3.2.5). */
const DEFLATE_RATIO_MAX = 1032;
/** Output past the image's end still inflated to reach the stream's end and check its checksum; more is cut off. */
const EXCESS_MAX = 1 << 16;

/**
 * Returns how many compressed bytes to hand the inflater at a time: 1/64 of the image's bytes, 256 B
 * to 16 KB. Each step inflates to at most 1032 × its size, so a stream that holds far more than the
 * header promises (a deflate bomb) costs at most EXCESS_MAX + 17 MB of work and buffer past the image's
 * end. Small images get small steps since their first inflate runs before the JIT has warmed up
 * (measured: 8 MB of bomb output in one step took 400 ms cold, 30 ms warm).
 */
function inflateStep(expected: number): number {
  return Math.min(16384, Math.max(256, expected >> 6));
}

/**
 * fflate 0.8.3 (pinned in package.json) keeps a stream's progress in `s`: `f` is set once the final
 * block has started and `l` holds the open block's code table (cleared at each block's end). Its public
 * API cannot tell "the stream has ended" from "more input is needed"; the fuzz tests in test/core/png
 * fail if this reading goes wrong.
 */
function inflateEnded(inflater: Inflate): boolean {
  const s = (inflater as unknown as { s: { f?: number; l?: unknown } }).s;
  return !!s.f && !s.l;
}

/** Returns an error for a zlib header (RFC 1950 §2.2) that is not deflate, has a bad check or needs a preset dictionary. */
function zlibHeaderCheck(cmf: number, flg: number, file: string): Result<void> {
  if ((cmf & 15) !== 8 || cmf >> 4 > 7 || ((cmf << 8) | flg) % 31 !== 0) {
    return fail(file, 'is damaged: its compressed image data cannot be decompressed (invalid zlib data)');
  }
  if (flg & 32) return fail(file, 'is damaged: its compressed image data cannot be decompressed (invalid zlib data: need dictionary)');
  return ok(undefined);
}

/** Returns the last four bytes of the stream split over `parts` as a big-endian integer (where zlib keeps its Adler-32). */
function streamTail32(parts: Uint8Array[]): number {
  const tail: number[] = [];
  for (let p = parts.length - 1; p >= 0 && tail.length < 4; p--) {
    for (let i = parts[p].length - 1; i >= 0 && tail.length < 4; i--) tail.unshift(parts[p][i]);
  }
  return tail.reduce((v, byte) => v * 256 + byte, 0);
}

/**
 * A platform's own inflate of one whole zlib stream (node:zlib in the command line's threads, the
 * browser's DecompressionStream output in its workers): returns at most `maxBytes` bytes of output,
 * or null when the stream is broken or holds more. The answer is only used after the same checks as
 * fflate's (exact length, Adler-32 against the stream's own), so a platform inflate can make reading
 * faster but never change what is read; anything it refuses goes to the stepped inflate for the error.
 */
export type PlatformInflate = (zlib: Uint8Array, maxBytes: number) => Uint8Array | null;

let platformInflate: PlatformInflate | null = null;

/** Makes `inflate` (null: none) the first try of every whole-stream inflate in this thread. */
export function pngPlatformInflateUse(inflate: PlatformInflate | null): void {
  platformInflate = inflate;
}

/**
 * Returns the image data from one whole-stream inflate (the platform's, else fflate's) when that is
 * both safe and right, else null.
 * Safe: the stream cannot inflate to more than 9 × `expected` + 32 MB (1032 bytes per compressed
 * byte at most), so even a bomb costs a bounded amount of work, and the buffer is never larger than
 * the image. Right: it inflated to exactly `expected` bytes matching the stream's own checksum.
 * Almost every real label map is read this way (a 2048×1024 one is 30–60 KB), 1.3–1.6 times as fast
 * as the stepped inflate with fflate (measured, inflate alone, on 2048×1024 gray and RGB maps);
 * anything else (excess, short or broken data) goes to the stepped inflate, whose answer is returned,
 * so both paths give the same result.
 */
function inflateWhole(data: Uint8Array, expected: number): Uint8Array | null {
  if (DEFLATE_RATIO_MAX * data.length > 9 * expected + (32 << 20) || data.length <= 6) return null;
  let out: Uint8Array | null = null;
  // One byte of room past the image: filling it means the stream holds more than the image.
  if (platformInflate) out = platformInflate(data, expected + 1);
  if (!out) {
    try {
      out = unzlibSync(data, { out: new Uint8Array(expected + 1) });
    } catch {
      return null;
    }
  }
  if (out.length !== expected) return null;
  const n = data.length;
  const stored = ((data[n - 4] << 24) | (data[n - 3] << 16) | (data[n - 2] << 8) | data[n - 1]) >>> 0;
  return adler32(out) === stored ? out : null;
}

/**
 * Inflates the zlib stream split over `parts` into a buffer of exactly `expected` bytes; returns it,
 * or an error when the stream is corrupt, stops early, holds fewer bytes than the image needs or fails
 * its Adler-32 checksum. The checksum matters although every chunk has a CRC: a CRC proves the bytes
 * arrived as written, not that they are a sound stream (fflate decodes some broken streams without
 * complaint). A stream too short to possibly hold `expected` bytes is refused before allocating; one
 * holding more than EXCESS_MAX past the image is cut off there, the image kept, its checksum unchecked.
 * `wholeFirst: false` skips the one-call fast path (tests use it to check both paths agree).
 */
export function pngInflate(parts: Uint8Array[], totalLength: number, expected: number, file: string, wholeFirst = true): Result<Uint8Array> {
  if (totalLength < 2) return fail(file, 'is truncated or damaged: its compressed image data stops before the image is complete');
  const flat = parts.flatMap((p) => Array.from(p.subarray(0, 2))).slice(0, 2);
  const header = zlibHeaderCheck(flat[0], flat[1], file);
  if (!header.ok) return header;
  if (expected > DEFLATE_RATIO_MAX * totalLength) {
    return fail(file, `is damaged: its ${countText(totalLength)} bytes of compressed image data cannot hold the ${countText(expected)} bytes the image needs`);
  }
  if (wholeFirst) {
    const whole = inflateWhole(parts.length === 1 ? parts[0] : concat(parts, totalLength), expected);
    if (whole) return ok(whole);
  }
  return inflateStepped(parts, expected, file);
}

function concat(parts: Uint8Array[], totalLength: number): Uint8Array {
  const data = new Uint8Array(totalLength);
  let off = 0;
  for (const p of parts) {
    data.set(p, off);
    off += p.length;
  }
  return data;
}

/** Returns the image data inflated a step at a time (see inflateStep), stopping soon after the image's end. */
function inflateStepped(parts: Uint8Array[], expected: number, file: string): Result<Uint8Array> {
  const out = new Uint8Array(expected);
  let produced = 0, checksum = 1;
  const inflater = new Inflate((chunk) => {
    const n = Math.min(chunk.length, expected - produced);
    if (n > 0) out.set(n === chunk.length ? chunk : chunk.subarray(0, n), produced);
    produced += chunk.length;
    checksum = adler32(chunk, checksum);
  });
  try {
    const step = inflateStep(expected);
    let skip = 2; // the zlib header, checked by the caller
    for (const part of parts) {
      for (let off = Math.min(skip, part.length); off < part.length && !inflateEnded(inflater); off += step) {
        inflater.push(part.subarray(off, off + step), false);
        if (produced > expected + EXCESS_MAX) return ok(out);
      }
      skip = Math.max(0, skip - part.length);
    }
  } catch (e) {
    return fail(file, `is damaged: its compressed image data cannot be decompressed (${(e as Error).message || String(e)})`);
  }
  if (!inflateEnded(inflater)) {
    const where = produced >= expected ? 'its end' : 'the image is complete';
    return fail(file, `is truncated or damaged: its compressed image data stops before ${where}`);
  }
  if (produced < expected) {
    return fail(file, `is damaged: its image data holds ${countText(produced)} bytes, the image needs ${countText(expected)}`);
  }
  if (checksum !== streamTail32(parts)) {
    return fail(file, 'is damaged: its image data fails its checksum (Adler-32), so its pixels cannot be trusted');
  }
  return ok(out);
}
