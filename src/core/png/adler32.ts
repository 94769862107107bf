/** Bytes summed between reductions: the most for which `b` stays below 2^31, so both sums stay small integers (a multiple of 4). */
const ADLER_RUN = 3800;

/**
 * Returns the Adler-32 checksum (RFC 1950 §8.2) of `data` continued from `prior` (the checksum of the
 * bytes before it; 1 for none), as an unsigned 32-bit integer.
 * Hot loop: flat typed arrays, the modulo taken once per run of 3,800 bytes instead of per byte, and
 * 4 bytes a step: a zero word leaves `a` as it is and adds 4a to `b` (filtered label-map rows are
 * mostly zeros), any other word adds its bytes one by one.
 */
export function adler32(data: Uint8Array, prior = 1): number {
  let a = prior & 0xffff, b = prior >>> 16;
  const n = data.length;
  // Bytes before the first 4-byte boundary, one by one (at most 3: the sums stay small).
  const pad = (4 - (data.byteOffset & 3)) & 3;
  const head = Math.min(n, pad);
  let i = 0;
  for (; i < head; i++) {
    a += data[i];
    b += a;
  }
  const words = n > pad ? new Uint32Array(data.buffer, data.byteOffset + pad, (n - pad) >> 2) : new Uint32Array(0);
  const wordsEnd = head + (words.length << 2);
  while (i < wordsEnd) {
    const end = Math.min(i + ADLER_RUN, wordsEnd);
    for (let w = (i - head) >> 2, wEnd = (end - head) >> 2; w < wEnd; w++, i += 4) {
      if (words[w] === 0) {
        b += 4 * a;
        continue;
      }
      a += data[i]; b += a; a += data[i + 1]; b += a; a += data[i + 2]; b += a; a += data[i + 3]; b += a;
    }
    a %= 65521;
    b %= 65521;
  }
  for (; i < n; i++) {
    a += data[i];
    b += a;
  }
  a %= 65521;
  b %= 65521;
  return ((b << 16) | a) >>> 0;
}
