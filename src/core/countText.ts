/** Returns a non-negative integer with thousands separators, e.g. 1204 → "1,204" (fixed format, not locale-dependent). */
export function countText(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

/** Returns "1 pixel" or "1,204 pixels". */
export function pixelCountText(n: number): string {
  return n === 1 ? '1 pixel' : `${countText(n)} pixels`;
}
