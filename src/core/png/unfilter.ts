/**
 * Undoes PNG scanline filtering (ISO/IEC 15948 §9.2) of `height` rows of `bytesPerRow` bytes, each
 * preceded in `raw` (from `off`) by its filter-type byte, already checked to be 0..4. Returns the
 * packed rows in a new buffer of exactly `height × bytesPerRow` bytes (so 8-bit gray rows are the ids).
 * `bpp` is the bytes of one whole pixel (1 for depths below 8), the distance the filters look left.
 * Up rows (what label maps use almost everywhere) copy the row above and add only the non-zero
 * filtered bytes, found four at a time; the other filters are the plain loops of the standard.
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
export function pngUnfilter(raw: Uint8Array, off: number, height: number, bytesPerRow: number, bpp: number): Uint8Array {
  const n = bytesPerRow;
  const out = new Uint8Array(height * n);
  const words = raw.byteOffset % 4 === 0 ? new Uint32Array(raw.buffer, raw.byteOffset, raw.length >> 2) : null;
  for (let y = 0; y < height; y++) {
    const i = off + y * (n + 1) + 1, o = y * n, p = o - n;
    const type = raw[i - 1];
    if (type === 0 || (type === 2 && y === 0)) {
      out.set(raw.subarray(i, i + n), o);
    } else if (type === 2) {
      out.copyWithin(o, p, o);
      upAddNonZero(raw, words, i, n, out, o);
    } else if (type === 1) {
      for (let x = 0; x < bpp && x < n; x++) out[o + x] = raw[i + x];
      for (let x = bpp; x < n; x++) out[o + x] = raw[i + x] + out[o + x - bpp];
    } else if (type === 3) {
      if (y === 0) {
        for (let x = 0; x < bpp && x < n; x++) out[o + x] = raw[i + x];
        for (let x = bpp; x < n; x++) out[o + x] = raw[i + x] + (out[o + x - bpp] >> 1);
      } else {
        for (let x = 0; x < bpp && x < n; x++) out[o + x] = raw[i + x] + (out[p + x] >> 1);
        for (let x = bpp; x < n; x++) out[o + x] = raw[i + x] + ((out[o + x - bpp] + out[p + x]) >> 1);
      }
    } else if (type === 4) {
      paethRow(raw, i, n, bpp, out, o, y > 0 ? p : -1);
    } else {
      throw new Error(`unknown PNG filter type ${type}`); // unreachable: the caller checks the types first
    }
  }
  return out;
}

/** Adds the filtered bytes raw[i..i+n) to out[o..o+n), visiting only the 4-byte words of `raw` that are not zero. */
function upAddNonZero(raw: Uint8Array, words: Uint32Array | null, i: number, n: number, out: Uint8Array, o: number): void {
  const end = i + n;
  if (!words) {
    for (let j = i; j < end; j++) if (raw[j] !== 0) out[o + j - i] += raw[j];
    return;
  }
  let j = i;
  for (; j < end && (j & 3) !== 0; j++) out[o + j - i] += raw[j];
  const wEnd = Math.min(end >> 2, words.length);
  for (let w = j >> 2; w < wEnd; w++) {
    if (words[w] === 0) continue;
    for (let k = w << 2, d = o + k - i; k < (w << 2) + 4; k++, d++) out[d] += raw[k];
  }
  for (j = Math.max(j, wEnd << 2); j < end; j++) out[o + j - i] += raw[j];
}

/** Paeth row (§9.4): each byte plus whichever of left, above, upper-left is closest to left + above − upper-left. */
function paethRow(raw: Uint8Array, i: number, n: number, bpp: number, out: Uint8Array, o: number, p: number): void {
  for (let x = 0; x < n; x++) {
    const a = x >= bpp ? out[o + x - bpp] : 0;
    const b = p >= 0 ? out[p + x] : 0;
    const c = p >= 0 && x >= bpp ? out[p + x - bpp] : 0;
    const pa = Math.abs(b - c), pb = Math.abs(a - c), pc = Math.abs(a + b - 2 * c);
    out[o + x] = raw[i + x] + (pa <= pb && pa <= pc ? a : pb <= pc ? b : c);
  }
}
