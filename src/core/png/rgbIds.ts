import { colorSlot, type ColorLookup } from './colorLookup.ts';

/** What an RGB → id pass found: the colours not in the lookup, each with its pixel count. */
export interface RgbIdsResult {
  unknown: Map<number, number>;
}

/**
 * Writes into `ids` the id of each pixel's colour from packed 8-bit RGB (channels 3) or RGBA
 * (channels 4, alpha ignored) rows; unknown colours are counted in the result and their pixels get 0.
 * Hot loop: flat typed arrays, the hash probe inlined, the previous pixel's colour cached (runs of one
 * colour are the common case in label maps), no allocation per pixel.
 */
export function rgbRowsToIds(rows: Uint8Array, pixels: number, channels: 3 | 4, lookup: ColorLookup, ids: Uint8Array | Uint16Array): RgbIdsResult {
  const { keys, values, mask, shift } = lookup;
  const unknown = new Map<number, number>();
  let lastRgb = -1, lastId = -1, run = 0;
  for (let i = 0, o = 0; i < pixels; i++, o += channels) {
    const rgb = (rows[o] << 16) | (rows[o + 1] << 8) | rows[o + 2];
    if (rgb !== lastRgb) {
      if (lastId < 0 && run > 0) unknown.set(lastRgb, (unknown.get(lastRgb) ?? 0) + run);
      run = 0;
      lastRgb = rgb;
      let slot = colorSlot(rgb, shift);
      lastId = -1;
      for (;;) {
        const k = keys[slot];
        if (k === rgb + 1) {
          lastId = values[slot];
          break;
        }
        if (k === 0) break;
        slot = (slot + 1) & mask;
      }
    }
    if (lastId >= 0) ids[i] = lastId;
    else run++;
  }
  if (lastId < 0 && run > 0) unknown.set(lastRgb, (unknown.get(lastRgb) ?? 0) + run);
  return { unknown };
}
