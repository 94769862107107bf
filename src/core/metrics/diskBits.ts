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

/** Image rows per row of a coarse plane (each coarse word is the OR of this many plane words). */
export const COARSE_SHIFT = 3;
export const COARSE_ROWS = 1 << COARSE_SHIFT;

/**
 * Returns true when a bit is set in the disk rows tried at steps [from, to) around pixel (x, y)
 * of one bit plane (`base` = its first word, `wordsPerRow` 32-bit words per image row, bit x&31 of
 * word x>>5). Step 0 is row y, then y+1, y−1, y+2, … so a close match ends the search early;
 * `half` holds the disk's half-widths (diskHalfWidths) and steps run to 2·r+1.
 * Hot loop: flat typed arrays, no allocation.
 */
export function diskBitsAny(
  bits: Uint32Array, base: number, wordsPerRow: number, width: number, height: number,
  x: number, y: number, half: Int32Array, from: number, to: number,
): boolean {
  for (let step = from; step < to; step++) {
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

/**
 * Returns false when the coarse plane (row c holds the OR of plane rows 8c..8c+7) has no bit in
 * the square [x−r, x+r] × [y−r, y+r]: then the disk inside it has none either. Cheap rejection for
 * pixels with no same-class boundary anywhere near.
 */
export function coarseSquareAny(
  coarse: Uint32Array, base: number, wordsPerRow: number, width: number, height: number, x: number, y: number, r: number,
): boolean {
  const ya = (y - r < 0 ? 0 : y - r) >> COARSE_SHIFT, yb = (y + r >= height ? height - 1 : y + r) >> COARSE_SHIFT;
  const wa = (x - r < 0 ? 0 : x - r) >> 5, wb = (x + r >= width ? width - 1 : x + r) >> 5;
  for (let cy = ya; cy <= yb; cy++) {
    const row = base + cy * wordsPerRow;
    for (let w = wa; w <= wb; w++) if (coarse[row + w] !== 0) return true;
  }
  return false;
}
