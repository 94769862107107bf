import { colorToRgb24, paletteColor, type ClassTable } from './classTable.ts';
import type { LabelMap } from './labelMap.ts';

/** Returns a 65536-entry RGBA look-up (packed 0xAABBGGRR, little-endian RGBA bytes) from id to colour. */
export function paletteLut(table: ClassTable, voidRgba = 0x00000000): Uint32Array {
  const lut = new Uint32Array(65536);
  for (let id = 0; id < 65536; id++) lut[id] = packRgba(paletteColor(id), 255);
  for (const c of table.classes) lut[c.id] = packRgba(colorToRgb24(c.color), 255);
  lut[table.ignore] = voidRgba;
  return lut;
}

function packRgba(rgb: number, a: number): number {
  return (((a & 255) << 24) | ((rgb & 255) << 16) | (((rgb >> 8) & 255) << 8) | ((rgb >> 16) & 255)) >>> 0;
}

/** Void's colour in previews of label maps when the class table names none (opaque dark gray, packed as paletteLut packs). */
export const PREVIEW_VOID_RGBA = 0xff202020;

/** Returns the look-up of a label map's colour preview: class colours, void in the table's ignoreColor or PREVIEW_VOID_RGBA. */
export function previewLut(table: ClassTable): Uint32Array {
  return paletteLut(table, table.ignoreColor ? packRgba(colorToRgb24(table.ignoreColor), 255) : PREVIEW_VOID_RGBA);
}

/** Returns RGBA bytes (w·h·4) colouring each id through `lut` (from `paletteLut`). */
export function labelMapColorize(map: LabelMap, lut: Uint32Array, out?: Uint8Array): Uint8Array {
  const n = map.width * map.height;
  const bytes = out ?? new Uint8Array(n * 4);
  // Hot loop: one look-up and one 32-bit store per pixel (RGBA byte order on little-endian hosts).
  const px = new Uint32Array(bytes.buffer, bytes.byteOffset, n);
  const ids = map.ids;
  for (let i = 0; i < n; i++) px[i] = lut[ids[i]];
  return bytes;
}
