/** Returns the half-widths of the pixel disk of squared radius r2: out[dy] = max dx with dx² + dy² ≤ r2 (pixels). */
export function diskHalfWidths(r2: number): Int32Array {
  const r = Math.floor(Math.sqrt(r2));
  const out = new Int32Array(r + 1);
  for (let dy = 0; dy <= r; dy++) {
    let h = Math.floor(Math.sqrt(r2 - dy * dy));
    while (h * h > r2 - dy * dy) h--;
    while ((h + 1) * (h + 1) <= r2 - dy * dy) h++;
    out[dy] = h;
  }
  return out;
}

/**
 * Returns true when a bit is set within the disk of half-widths `half` around pixel (x, y) of one
 * bit plane (`base` = its first word, `wordsPerRow` 32-bit words per image row, bit x&31 of word
 * x>>5). Rows are tried nearest first, so a close match ends the search after one or two rows.
 * Hot loop: flat typed arrays, no allocation.
 */
export function diskBitsAny(
  bits: Uint32Array, base: number, wordsPerRow: number, width: number, height: number,
  x: number, y: number, half: Int32Array,
): boolean {
  const r = half.length - 1;
  const rows = 2 * r + 1;
  for (let step = 0; step < rows; step++) {
    const dy = step & 1 ? (step + 1) >> 1 : -(step >> 1);
    const yy = y + dy;
    if (yy < 0 || yy >= height) continue;
    const h = half[dy < 0 ? -dy : dy];
    const a = x - h < 0 ? 0 : x - h;
    const b = x + h >= width ? width - 1 : x + h;
    const row = base + yy * wordsPerRow;
    const wa = row + (a >> 5);
    const wb = row + (b >> 5);
    const lowMask = -1 << (a & 31); // bits a&31 .. 31
    const highMask = -1 >>> (31 - (b & 31)); // bits 0 .. b&31
    if (wa === wb) {
      if (bits[wa] & lowMask & highMask) return true;
      continue;
    }
    if (bits[wa] & lowMask) return true;
    for (let w = wa + 1; w < wb; w++) if (bits[w] !== 0) return true;
    if (bits[wb] & highMask) return true;
  }
  return false;
}
