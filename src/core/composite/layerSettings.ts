/**
 * What the frame viewer draws, as a plain object: one entry per layer with its own switch and opacity
 * (integer 0..255, so blending is exact integer math on both the CPU and the GPU path), plus the
 * modes that act across layers (solo class, curtain). Layers compose bottom to top in LAYER_KEYS
 * order; the solo dimming falls between `void` and `highlight`.
 */

/** Layer names in compositing order, bottom first. */
export const LAYER_KEYS = ['photo', 'truth', 'pred', 'band', 'disagree', 'compare', 'void', 'highlight'] as const;
export type LayerKey = (typeof LAYER_KEYS)[number];

/** Which side of the curtain a layer shows on while the curtain is on (ignored while it is off). */
export const CURTAIN_SIDES = ['both', 'left', 'right'] as const;
export type CurtainSide = (typeof CURTAIN_SIDES)[number];

/** How disagreement pixels are coloured: by kind (wrong class / not a class), by truth class, by predicted class. */
export const DISAGREE_MODES = ['kind', 'truth', 'pred'] as const;
export type DisagreeMode = (typeof DISAGREE_MODES)[number];

/** Most highlight boxes drawn; the rest of a longer list is left out (the GPU holds them as uniforms). */
export const HIGHLIGHT_BOXES_MAX = 32;
/** Widest boundary band drawn, pixels (the band histogram answers widths 0..64). */
export const BAND_WIDTH_MAX = 64;

/** An axis-aligned box in image pixels: columns x..x+width-1, rows y..y+height-1. */
export interface PixelBox {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Switch, opacity (0..255) and curtain side shared by every layer. */
export interface LayerBase {
  on: boolean;
  opacity: number;
  side: CurtainSide;
}

export interface LayerSettings {
  /** The photo over the background colour. */
  photo: LayerBase;
  /** Ground-truth class colours (void pixels are left to the `void` layer). */
  truth: LayerBase;
  /** Class colours of run `runA`. */
  pred: LayerBase;
  /** Pixels whose band bin is ≤ `width` (distance to the nearest truth boundary ≤ width pixels). */
  band: LayerBase & { width: number };
  /** Valid pixels (truth ≠ ignore) where run `runA` differs from the truth. */
  disagree: LayerBase & { mode: DisagreeMode };
  /** Valid pixels that run `runB` fixed (A wrong, B right) or broke (A right, B wrong). */
  compare: LayerBase;
  /** Void pixels (truth = ignore) as diagonal stripes, `period` pixels per stripe pair (even, 2..64). */
  void: LayerBase & { period: number };
  /** Outlines drawn just outside each box, `thickness` pixels wide (1..16). */
  highlight: LayerBase & { boxes: PixelBox[]; thickness: number };
  /** The prediction run shown by `pred`, `disagree`, solo and as A in `compare`; null for none. */
  runA: string | null;
  /** The run compared against A in `compare`; null for none. */
  runB: string | null;
  /** Dims (by `dim` 0..255 toward the dim colour) every pixel where neither truth nor run A is `classId`. */
  solo: { on: boolean; classId: number; dim: number };
  /** Vertical split: columns x < `x` show the layers whose side is `left`, columns ≥ `x` those whose side is `right`. */
  curtain: { on: boolean; x: number };
}

/** Returns the settings a frame opens with: photo, disagreement and void on; truth left and prediction right of the curtain. */
export function layerSettingsDefault(): LayerSettings {
  return {
    photo: { on: true, opacity: 255, side: 'both' },
    truth: { on: false, opacity: 150, side: 'left' },
    pred: { on: false, opacity: 150, side: 'right' },
    band: { on: false, opacity: 110, side: 'both', width: 3 },
    disagree: { on: true, opacity: 220, side: 'both', mode: 'kind' },
    compare: { on: false, opacity: 230, side: 'both' },
    void: { on: true, opacity: 170, side: 'both', period: 8 },
    highlight: { on: true, opacity: 255, side: 'both', boxes: [], thickness: 2 },
    runA: null,
    runB: null,
    solo: { on: false, classId: 0, dim: 190 },
    curtain: { on: false, x: 0 },
  };
}
