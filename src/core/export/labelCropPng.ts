import { colorToRgb24, type ClassTable } from '../classTable.ts';
import type { LabelMap } from '../labelMap.ts';
import type { LabelSourceEncoding } from '../png/decodeLabel.ts';
import { labelMapToPng, type ZlibCompress } from '../png/encode.ts';
import { fail, ok, type Result } from '../result.ts';
import { rgbaToPngFast } from './rgbPng.ts';

/** Returns a short name of how a label PNG stores ids: gray1..gray16, palette1..palette8, rgb. */
export function labelEncodingName(e: LabelSourceEncoding): string {
  return e.kind === 'rgb' ? 'rgb' : `${e.kind}${e.bitDepth}`;
}

/**
 * Returns a label crop as a PNG in the encoding of its source file, with exactly its ids, and the name
 * of the encoding written:
 * - gray 8/16 stay gray 8/16; gray 1/2/4 are written as gray 8 with the same values (the id itself, not
 *   rescaled), since every reader then returns the id without unpacking bits;
 * - palette (any depth) is written as 8-bit palette with the source's colour table (index = id);
 * - colour-coded RGB is written as RGB with each class's colour (void as `ignoreColor`), so it stays colour-coded.
 */
export function labelCropToPng(crop: LabelMap, encoding: LabelSourceEncoding, table: ClassTable, compress?: ZlibCompress): Result<{ png: Uint8Array; written: string }> {
  try {
    if (encoding.kind === 'gray') {
      const depth = encoding.bitDepth === 16 ? 16 : 8;
      return ok({ png: labelMapToPng(crop, { kind: 'gray', bitDepth: depth }, compress), written: `gray${depth}` });
    }
    if (encoding.kind === 'palette') {
      return ok({ png: labelMapToPng(crop, { kind: 'palette', colors: encoding.colors }, compress), written: 'palette8' });
    }
    return rgbCrop(crop, table, compress);
  } catch (e) {
    return fail('', `could not be written as a label PNG (${(e as Error).message})`);
  }
}

/** Returns the crop colour-coded through the table. Hot loop: one look-up per pixel in a flat table. */
function rgbCrop(crop: LabelMap, table: ClassTable, compress?: ZlibCompress): Result<{ png: Uint8Array; written: string }> {
  const colour = new Int32Array(65536).fill(-1);
  for (const c of table.classes) colour[c.id] = colorToRgb24(c.color);
  if (table.ignoreColor) colour[table.ignore] = colorToRgb24(table.ignoreColor);
  const ids = crop.ids;
  const rgba = new Uint8Array(ids.length * 4);
  for (let i = 0, o = 0; i < ids.length; i++, o += 4) {
    const c = colour[ids[i]];
    if (c < 0) return fail('', `id ${ids[i]} has no colour in the class table, so it cannot be written colour-coded`);
    rgba[o] = c >> 16;
    rgba[o + 1] = (c >> 8) & 255;
    rgba[o + 2] = c & 255;
    rgba[o + 3] = 255;
  }
  return ok({ png: rgbaToPngFast(crop.width, crop.height, rgba, compress), written: 'rgb' });
}
