/**
 * Plain reference of PNG scanline unfiltering, straight from ISO/IEC 15948 §9.2–9.4: every byte
 * from its filter's formula with left (a), above (b) and upper-left (c) read as 0 outside the image.
 * Returns height × bytesPerRow unfiltered bytes.
 */
export function unfilterPlain(raw: Uint8Array, off: number, height: number, bytesPerRow: number, bpp: number): number[] {
  const out: number[] = [];
  const at = (y: number, x: number) => (y < 0 || x < 0 ? 0 : out[y * bytesPerRow + x]);
  for (let y = 0; y < height; y++) {
    const type = raw[off + y * (bytesPerRow + 1)];
    for (let x = 0; x < bytesPerRow; x++) {
      const f = raw[off + y * (bytesPerRow + 1) + 1 + x];
      const a = at(y, x - bpp), b = at(y - 1, x), c = at(y - 1, x - bpp);
      let pred = 0;
      if (type === 1) pred = a;
      else if (type === 2) pred = b;
      else if (type === 3) pred = Math.floor((a + b) / 2);
      else if (type === 4) {
        const p = a + b - c, pa = Math.abs(p - a), pb = Math.abs(p - b), pc = Math.abs(p - c);
        pred = pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
      }
      out.push((f + pred) % 256);
    }
  }
  return out;
}
