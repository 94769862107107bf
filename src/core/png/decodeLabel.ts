import { classTableColorIndex, classTableMaxId, rgb24ToColor, type ClassTable } from '../classTable.ts';
import { countText, pixelCountText } from '../countText.ts';
import type { LabelMap } from '../labelMap.ts';
import { fail, ok, type Result } from '../result.ts';
import { colorLookupBuild, type ColorLookup } from './colorLookup.ts';
import { PngColorType, pngFormatName, pngHeaderRead, type PngHeader } from './header.ts';
import { PNG_MAX_PIXELS_DEFAULT, pngPixelsRead, pngSizeCheck } from './pixelsRead.ts';
import { rgbRowsToIds } from './rgbIds.ts';
import { idsFromPackedRows } from './unpackIds.ts';

/** How the label PNG stored its ids. */
export type LabelSourceEncoding =
  | { kind: 'gray'; bitDepth: 1 | 2 | 4 | 8 | 16 }
  | { kind: 'palette'; bitDepth: 1 | 2 | 4 | 8; colors: Uint8Array }
  | { kind: 'rgb' }; // colour-coded RGB or RGBA, mapped to ids through the class table

/** A decoded label map and how its file stored the ids. */
export interface DecodedLabelMap extends LabelMap {
  encoding: LabelSourceEncoding;
}

/** Options of labelMapFromPng; `table` is needed for colour-coded maps, `maxPixels` defaults to 100 million. */
export interface LabelDecodeOptions {
  file: string;
  table?: ClassTable;
  maxPixels?: number;
}

const lookups = new WeakMap<ClassTable, ColorLookup>();

function tableLookup(table: ClassTable): ColorLookup {
  let lookup = lookups.get(table);
  if (!lookup) {
    lookup = colorLookupBuild(classTableColorIndex(table));
    lookups.set(table, lookup);
  }
  return lookup;
}

/** Returns an error for colour types and depths that cannot hold label ids, before anything is inflated. */
function labelFormatCheck(h: PngHeader, table: ClassTable | undefined, file: string): Result<void> {
  const name = pngFormatName(h);
  if (h.colorType === PngColorType.grayAlpha) {
    return fail(file, `is a ${name} PNG, which is unsupported for label maps; save ids as 8- or 16-bit grayscale without alpha, or as a palette PNG (index = id)`);
  }
  const colour = h.colorType === PngColorType.rgb || h.colorType === PngColorType.rgba;
  if (colour && h.bitDepth === 16) {
    return fail(file, `is a ${name} PNG, which is unsupported for label maps; save colour-coded label maps as 8-bit RGB, or ids as 8/16-bit grayscale`);
  }
  if (colour && (!table || table.generated)) {
    return fail(file, `is a colour-coded (${name}) label map; colour-coded label maps need classes.json listing each class's colour (and "ignoreColor" for void)`);
  }
  return ok(undefined);
}

/** Returns the message for colours missing from the table: the most common first, up to 3 named. */
function unknownColorsMessage(unknown: Map<number, number>, table: ClassTable, file: string): Result<never> {
  const list = [...unknown].sort((a, b) => b[1] - a[1] || a[0] - b[0]);
  const hint = table.ignoreColor ? '' : ' (if one of them means void, set "ignoreColor" in classes.json)';
  if (list.length === 1) {
    const verb = list[0][1] === 1 ? 'has' : 'have';
    return fail(file, `${pixelCountText(list[0][1])} ${verb} colour ${rgb24ToColor(list[0][0])}, which is not in classes.json${hint}`);
  }
  const total = list.reduce((s, [, n]) => s + n, 0);
  const named = list.slice(0, 3).map(([rgb, n]) => `${rgb24ToColor(rgb)} (${pixelCountText(n)})`);
  const more = list.length > 3 ? ` and ${countText(list.length - 3)} more` : '';
  return fail(file, `${pixelCountText(total)} have ${countText(list.length)} colours that are not in classes.json: ${named.join(', ')}${more}${hint}`);
}

/**
 * Decodes a label PNG byte-exactly into ids (Uint8Array for ≤8-bit, Uint16Array for 16-bit or when
 * table ids exceed 255); returns the map with its source encoding, or a message naming the file and problem.
 */
export function labelMapFromPng(bytes: Uint8Array, options: LabelDecodeOptions): Result<DecodedLabelMap> {
  const { file, table } = options;
  const maxPixels = options.maxPixels ?? PNG_MAX_PIXELS_DEFAULT;
  try {
    const header = pngHeaderRead(bytes, file);
    if (!header.ok) return header;
    const sized = pngSizeCheck(header.value, maxPixels, file);
    if (!sized.ok) return sized;
    const format = labelFormatCheck(header.value, table, file);
    if (!format.ok) return format;
    const read = pngPixelsRead(bytes, file, maxPixels);
    if (!read.ok) return read;
    const { rows, bytesPerRow, plte } = read.value;
    const { width, height, colorType, bitDepth } = read.value.header;
    if (colorType === PngColorType.gray || colorType === PngColorType.palette) {
      const ids = idsFromPackedRows(rows, width, height, bytesPerRow, bitDepth);
      const encoding: LabelSourceEncoding =
        colorType === PngColorType.gray
          ? { kind: 'gray', bitDepth: bitDepth as 1 | 2 | 4 | 8 | 16 }
          : { kind: 'palette', bitDepth: bitDepth as 1 | 2 | 4 | 8, colors: plte!.slice() };
      return ok({ width, height, ids, encoding });
    }
    const t = table!;
    const maxId = Math.max(classTableMaxId(t), t.ignoreColor ? t.ignore : 0);
    const ids = maxId > 255 ? new Uint16Array(width * height) : new Uint8Array(width * height);
    const channels = colorType === PngColorType.rgba ? 4 : 3;
    const { unknown } = rgbRowsToIds(rows, width * height, channels, tableLookup(t), ids);
    if (unknown.size > 0) return unknownColorsMessage(unknown, t, file);
    return ok({ width, height, ids, encoding: { kind: 'rgb' } });
  } catch (e) {
    // Every known problem is answered above; this is the last line that keeps a decoder bug per frame.
    return fail(file, `could not be decoded (${(e as Error)?.message ?? String(e)})`);
  }
}
