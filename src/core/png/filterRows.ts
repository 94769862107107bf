/**
 * Returns PNG filtered scanlines (a filter-type byte, then the filtered bytes, per row) for packed
 * rows of `bytesPerRow` bytes, choosing per row the filter whose output has the smallest sum of
 * absolute values taken as signed bytes — the heuristic ISO/IEC 15948 §12.8 suggests.
 * Hot loop: flat typed arrays, one scratch row per filter allocated once, nothing per pixel.
 */
export function pngRowsFilter(raw: Uint8Array, height: number, bytesPerRow: number, bytesPerPixel: number): Uint8Array {
  const bpl = bytesPerRow;
  const bpp = bytesPerPixel;
  const out = new Uint8Array(height * (bpl + 1));
  const scratch = [0, 1, 2, 3, 4].map(() => new Uint8Array(bpl));
  const zero = new Uint8Array(bpl);
  for (let y = 0; y < height; y++) {
    const cur = raw.subarray(y * bpl, (y + 1) * bpl);
    const up = y > 0 ? raw.subarray((y - 1) * bpl, y * bpl) : zero;
    let best = 0;
    let bestSum = Infinity;
    for (let t = 0; t < 5; t++) {
      const s = scratch[t];
      let sum = 0;
      for (let x = 0; x < bpl; x++) {
        const a = x >= bpp ? cur[x - bpp] : 0;
        const b = up[x];
        let pred = 0;
        if (t === 1) pred = a;
        else if (t === 2) pred = b;
        else if (t === 3) pred = (a + b) >> 1;
        else if (t === 4) {
          const c = x >= bpp ? up[x - bpp] : 0;
          const p = a + b - c;
          const pa = Math.abs(p - a), pb = Math.abs(p - b), pc = Math.abs(p - c);
          pred = pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
        }
        const v = (cur[x] - pred) & 255;
        s[x] = v;
        sum += v < 128 ? v : 256 - v;
      }
      if (sum < bestSum) {
        bestSum = sum;
        best = t;
      }
    }
    const o = y * (bpl + 1);
    out[o] = best;
    out.set(scratch[best], o + 1);
  }
  return out;
}
