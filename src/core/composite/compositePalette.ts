import { colorToRgb24, paletteColor, type ClassTable } from '../classTable.ts';

/** The fixed colours the overlays use, by name; index order is the order the GPU receives them in. */
export const MARK_KEYS = [
  'background', // under everything: no photo, or a photo at low opacity
  'wrong', // disagreement: predicted another class
  'invalid', // disagreement: predicted an id that is not a class (void included)
  'fixed', // comparison: A wrong, B right
  'broke', // comparison: A right, B wrong
  'band', // boundary band shading
  'hatchLight', // void stripes, first half of each period
  'hatchDark', // void stripes, second half
  'dim', // what solo mode dims toward
  'highlight', // box outlines
  'voidFill', // prediction layer where the run predicted the ignore id
  'flicker', // flicker: run A flips back at this frame (truth a class; the dark cells of the checker over void)
  'flickerLight', // flicker over void truth: the light cells of the checker
] as const;
export type MarkKey = (typeof MARK_KEYS)[number];
/** Offset of each mark's r, g, b in `CompositeParams.marks` (4 ints per mark). */
export const MARK_INDEX = Object.fromEntries(MARK_KEYS.map((k, i) => [k, i * 4])) as Record<MarkKey, number>;
/** 0xRRGGBB per mark. */
export type MarkColors = Record<MarkKey, number>;

/**
 * Our own choice of overlay colours, picked by search and held by test/core/composite/markColors.test.ts:
 * the error kinds (dark red vs khaki), fixed vs broke (blue vs vermilion), the band and the outline
 * stay apart under normal vision and simulated protanopia, deuteranopia and tritanopia, and apart
 * from the demo's class colours; so does the flicker's dark aubergine. The void hatch is a light/dark stripe pair, so it is told by its
 * pattern and stays visible over bright and dark photos alike.
 */
export const MARK_COLORS: Readonly<MarkColors> = {
  background: 0x1d2126,
  wrong: 0xaa0000,
  invalid: 0xaabb66,
  fixed: 0x0000ff,
  broke: 0xff3300,
  band: 0x4fb3ff,
  hatchLight: 0xeeeae0,
  hatchDark: 0x2a2630,
  dim: 0x07080a,
  highlight: 0xffffff,
  voidFill: 0x3b3844,
  flicker: 0x440033,
  flickerLight: 0xf0a8dc,
};

/** Id → colour for every 16-bit id, plus the marks: what both compositing paths colour with. */
export interface CompositePalette {
  /** The ground-truth void id. */
  ignore: number;
  /** 65536 × RGBA bytes: RGB the colour drawn for that id, A = 255 when the id is a class, 0 when not. */
  rgba: Uint8Array;
  marks: MarkColors;
}

/** Returns the palette for `table`: class colours, generated colours for ids outside it, `voidFill` for the ignore id. */
export function compositePaletteFromTable(table: ClassTable, marks: MarkColors = { ...MARK_COLORS }): CompositePalette {
  const rgba = new Uint8Array(65536 * 4);
  for (let id = 0; id < 65536; id++) rgbWrite(rgba, id, paletteColor(id), 0);
  for (const c of table.classes) rgbWrite(rgba, c.id, colorToRgb24(c.color), 255);
  rgbWrite(rgba, table.ignore, marks.voidFill, 0);
  return { ignore: table.ignore, rgba, marks };
}

function rgbWrite(rgba: Uint8Array, id: number, rgb: number, a: number): void {
  const o = id * 4;
  rgba[o] = (rgb >> 16) & 255;
  rgba[o + 1] = (rgb >> 8) & 255;
  rgba[o + 2] = rgb & 255;
  rgba[o + 3] = a;
}
