import type { ClassTable } from '../core/classTable.ts';
import { labelMapColorize, previewLut } from '../core/colorize.ts';
import type { LabelMap } from '../core/labelMap.ts';

const PREVIEW_MAX = 320;

/** Returns a down-sampled (nearest id, long side ≤ 320 px) coloured preview of a label map. */
export function colorizeForPreview(map: LabelMap, table: ClassTable): ImageData {
  const scale = Math.min(1, PREVIEW_MAX / Math.max(map.width, map.height));
  const w = Math.max(1, Math.round(map.width * scale));
  const h = Math.max(1, Math.round(map.height * scale));
  const small = new (map.ids instanceof Uint16Array ? Uint16Array : Uint8Array)(w * h);
  for (let y = 0; y < h; y++) {
    const sy = Math.min(map.height - 1, Math.floor((y + 0.5) / scale));
    for (let x = 0; x < w; x++) small[y * w + x] = map.ids[sy * map.width + Math.min(map.width - 1, Math.floor((x + 0.5) / scale))];
  }
  const rgba = labelMapColorize({ width: w, height: h, ids: small }, previewLut(table));
  return new ImageData(new Uint8ClampedArray(rgba.buffer as ArrayBuffer), w, h);
}
