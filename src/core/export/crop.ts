import type { LabelMap } from '../labelMap.ts';
import type { FlagBox } from '../review/flag.ts';

/** Returns the ids inside `box` (end-exclusive, inside the map) as a new map of the same id type. */
export function labelMapCrop(map: LabelMap, box: FlagBox): LabelMap {
  const [x0, y0, x1, y1] = box;
  const w = x1 - x0, h = y1 - y0;
  const ids = map.ids instanceof Uint16Array ? new Uint16Array(w * h) : new Uint8Array(w * h);
  for (let y = 0; y < h; y++) {
    const from = (y0 + y) * map.width + x0;
    ids.set(map.ids.subarray(from, from + w), y * w);
  }
  return { width: w, height: h, ids };
}

/** Returns the RGBA bytes inside `box` of a `width`-wide RGBA image. */
export function rgbaCrop(rgba: Uint8Array, width: number, box: FlagBox): Uint8Array {
  const [x0, y0, x1, y1] = box;
  const w = x1 - x0, h = y1 - y0;
  const out = new Uint8Array(w * h * 4);
  for (let y = 0; y < h; y++) {
    const from = ((y0 + y) * width + x0) * 4;
    out.set(rgba.subarray(from, from + w * 4), y * w * 4);
  }
  return out;
}
