/**
 * Returns one id per pixel from packed gray or palette rows (1/2/4/8-bit → Uint8Array, 16-bit
 * big-endian → Uint16Array); the sample value itself is the id, never rescaled.
 * Hot loop: flat typed arrays, row offsets hoisted, no allocation per pixel.
 */
export function idsFromPackedRows(
  rows: Uint8Array,
  width: number,
  height: number,
  bytesPerRow: number,
  bitDepth: number,
): Uint8Array | Uint16Array {
  // bytesPerRow === width: rows are the ids (kept when they are exactly the image, as pngUnfilter returns them)
  if (bitDepth === 8) return rows.length === width * height ? rows : rows.slice(0, width * height);
  if (bitDepth === 16) {
    const ids = new Uint16Array(width * height);
    for (let i = 0, o = 0; i < ids.length; i++, o += 2) ids[i] = (rows[o] << 8) | rows[o + 1];
    return ids;
  }
  const ids = new Uint8Array(width * height);
  const mask = (1 << bitDepth) - 1;
  const perByte = 8 / bitDepth;
  for (let y = 0; y < height; y++) {
    const src = y * bytesPerRow, dst = y * width;
    for (let x = 0; x < width; x++) {
      // High bits first (ISO/IEC 15948 §7.2): pixel x of a byte sits at shift 8 - depth·(1 + x mod perByte).
      const shift = 8 - bitDepth * (1 + (x % perByte));
      ids[dst + x] = (rows[src + ((x * bitDepth) >> 3)] >> shift) & mask;
    }
  }
  return ids;
}
