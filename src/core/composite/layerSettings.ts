/**
 * What the frame viewer draws, as a plain object: one entry per layer with its own switch and opacity
 * (integer 0..255, so blending is exact integer math on both the CPU and the GPU path), plus the
 * modes that act across layers (solo class, curtain). Layers compose bottom to top in LAYER_KEYS
 * order; the solo dimming falls between `flicker` and `highlight`.
 *
 * `LayerLooks` is the part a user sets on the layers themselves; `LayerSettings` adds what the review
 * supplies (the runs, the band width, the boxes to outline) and is what the compositor reads. The app
 * keeps the two apart and joins them in one place (`layerSettingsOf`).
 */

/** Layer names in compositing order, bottom first. */
export const LAYER_KEYS = ['photo', 'truth', 'pred', 'band', 'disagree', 'compare', 'void', 'flicker', 'highlight'] as const;
export type LayerKey = (typeof LAYER_KEYS)[number];

/** Which side of the curtain a layer shows on while the curtain is on (ignored while it is off). */
export const CURTAIN_SIDES = ['both', 'left', 'right'] as const;
export type CurtainSide = (typeof CURTAIN_SIDES)[number];

/** How disagreement pixels are coloured: by kind (wrong class / not a class), by truth class, by predicted class. */
export const DISAGREE_MODES = ['kind', 'truth', 'pred'] as const;
export type DisagreeMode = (typeof DISAGREE_MODES)[number];

/** Most highlight boxes drawn; the rest of a longer list is left out (the GPU holds them as uniforms). */
export const HIGHLIGHT_BOXES_MAX = 32;

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

/** How each layer looks and the cross-layer modes: what a user sets on the layers themselves. */
export interface LayerLooks {
  /** The photo over the background colour. */
  photo: LayerBase;
  /** Ground-truth class colours (void pixels are left to the `void` layer). */
  truth: LayerBase;
  /** Class colours of run A. */
  pred: LayerBase;
  /** Pixels within the band width of the nearest truth boundary. */
  band: LayerBase;
  /** Valid pixels (truth ≠ ignore) where run A differs from the truth. */
  disagree: LayerBase & { mode: DisagreeMode };
  /** Valid pixels that run B fixed (A wrong, B right) or broke (A right, B wrong). */
  compare: LayerBase;
  /** Void pixels (truth = ignore) as diagonal stripes, `period` pixels per stripe pair (even, 2..64). */
  void: LayerBase & { period: number };
  /**
   * Pixels where run A flips back at this frame: its predictions at the previous and the next frame
   * of the sequence agree and this frame's differs (a fill where the truth is a class, a checker
   * where it is void or no class). Drawn nothing at a sequence end.
   */
  flicker: LayerBase;
  /** Outlines drawn just outside each box, `thickness` pixels wide (1..16). */
  highlight: LayerBase & { thickness: number };
  /** Dims (by `dim` 0..255 toward the dim colour) every pixel where neither truth nor run A is `classId`. */
  solo: { on: boolean; classId: number; dim: number };
  /** Vertical split: columns x < `x` show the layers whose side is `left`, columns ≥ `x` those whose side is `right`. */
  curtain: { on: boolean; x: number };
}

/** What the review supplies to the layers: which runs they show, the band width and the boxes to outline. */
export interface LayerInputs {
  /** The prediction run shown by `pred`, `disagree`, solo and as A in `compare`; null for none. */
  runA: string | null;
  /** The run compared against A in `compare`; null for none. */
  runB: string | null;
  /** Band width in pixels (0..BAND_WIDTH_MAX of core/metrics/bandHistogram.ts): the band layer shows pixels whose band bin is ≤ it. */
  bandWidth: number;
  /** Boxes the highlight layer outlines. */
  boxes: PixelBox[];
}

/** Everything the compositor reads: the looks with the review's inputs put in their layers. */
export interface LayerSettings extends Omit<LayerLooks, 'band' | 'highlight'> {
  band: LayerBase & { width: number };
  highlight: LayerBase & { boxes: PixelBox[]; thickness: number };
  runA: string | null;
  runB: string | null;
}

/** Returns the looks a frame opens with: photo, disagreement and void on; truth left and prediction right of the curtain. */
export function layerLooksDefault(): LayerLooks {
  return {
    photo: { on: true, opacity: 255, side: 'both' },
    truth: { on: false, opacity: 150, side: 'left' },
    pred: { on: false, opacity: 150, side: 'right' },
    band: { on: false, opacity: 110, side: 'both' },
    disagree: { on: true, opacity: 220, side: 'both', mode: 'kind' },
    compare: { on: false, opacity: 230, side: 'both' },
    void: { on: true, opacity: 170, side: 'both', period: 8 },
    flicker: { on: false, opacity: 230, side: 'both' },
    highlight: { on: true, opacity: 255, side: 'both', thickness: 2 },
    solo: { on: false, classId: 0, dim: 190 },
    curtain: { on: false, x: 0 },
  };
}

/** Returns the compositor's settings: `looks` with the runs, band width and boxes put in. */
export function layerSettingsOf(looks: LayerLooks, inputs: LayerInputs): LayerSettings {
  return {
    ...looks,
    band: { ...looks.band, width: inputs.bandWidth },
    highlight: { ...looks.highlight, boxes: inputs.boxes },
    runA: inputs.runA,
    runB: inputs.runB,
  };
}

/** Returns the settings a frame opens with: the default looks, no runs, band width 3, no boxes. */
export function layerSettingsDefault(): LayerSettings {
  return layerSettingsOf(layerLooksDefault(), { runA: null, runB: null, bandWidth: 3, boxes: [] });
}
