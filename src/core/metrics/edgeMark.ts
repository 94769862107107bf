/**
 * Sets `out[i] = 1` where pixel i has a 4-neighbour inside the image with a different code, 0
 * elsewhere; returns the number of marked pixels. With truth codes (or raw truth ids) this is
 * src/docs/metrics.md's ground-truth boundary: void is a value like any other, the image border is no boundary.
 * Hot loop: flat typed arrays, row offsets hoisted, no allocation per pixel.
 */
export function edgeMark(codes: Uint8Array | Uint16Array, width: number, height: number, out: Uint8Array): number {
  const n = width * height;
  out.fill(0, 0, n);
  for (let y = 0; y < height; y++) {
    const o = y * width;
    for (let i = o, end = o + width - 1; i < end; i++) {
      if (codes[i] !== codes[i + 1]) {
        out[i] = 1;
        out[i + 1] = 1;
      }
    }
    if (y + 1 === height) break;
    for (let i = o, end = o + width; i < end; i++) {
      if (codes[i] !== codes[i + width]) {
        out[i] = 1;
        out[i + width] = 1;
      }
    }
  }
  let count = 0;
  for (let i = 0; i < n; i++) count += out[i];
  return count;
}
