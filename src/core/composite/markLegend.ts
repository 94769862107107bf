import type { LayerKey } from './layerSettings.ts';
import type { MarkKey } from './compositePalette.ts';

/**
 * How a legend entry is drawn: a filled swatch, stripes or a checker of two marks, one mark in
 * horizontal bands or in diagonal stripes (full and half strength), an outline, or class colours.
 */
export type LegendLook = 'fill' | 'shade' | 'stripes' | 'checks' | 'bands' | 'slashes' | 'outline' | 'classes';

/** One line of the legend: the marks it shows (their colours from MARK_COLORS), how, and what they mean. */
export interface LegendEntry {
  marks: readonly MarkKey[];
  look: LegendLook;
  words: string;
  /** For the disagreement layer: the colouring mode the entry belongs to (the other modes use class colours). */
  mode?: 'kind' | 'truth' | 'pred';
}

/**
 * What every layer paints, by layer: the one description the on-screen legend reads. It is keyed by
 * LAYER_KEYS and names marks by MARK_KEYS, the shader's own tables, so a layer or mark added to
 * them must be described here (the type and test/core/composite/markLegend.test.ts see to it).
 */
export const MARK_LEGEND: Readonly<Record<LayerKey, readonly LegendEntry[]>> = {
  photo: [{ marks: ['background'], look: 'fill', words: 'no photo' }],
  truth: [{ marks: [], look: 'classes', words: 'ground truth in class colours' }],
  pred: [
    { marks: [], look: 'classes', words: 'prediction in class colours' },
    { marks: ['voidFill'], look: 'fill', words: 'predicted the void id' },
  ],
  band: [{ marks: ['band'], look: 'shade', words: 'boundary band' }],
  disagree: [
    { marks: ['wrong'], look: 'fill', words: 'predicted another class', mode: 'kind' },
    { marks: ['invalid'], look: 'bands', words: 'predicted an id that is not a class (banded)', mode: 'kind' },
    { marks: [], look: 'classes', words: 'disagreement in the true class colour', mode: 'truth' },
    { marks: [], look: 'classes', words: 'disagreement in the predicted class colour', mode: 'pred' },
    { marks: ['invalid'], look: 'bands', words: 'predicted an id that is not a class (banded)', mode: 'pred' },
  ],
  compare: [
    { marks: ['fixed'], look: 'fill', words: 'fixed: B right where A was wrong' },
    { marks: ['broke'], look: 'slashes', words: 'broke: B wrong where A was right (striped)' },
  ],
  void: [{ marks: ['hatchLight', 'hatchDark'], look: 'stripes', words: 'void in the ground truth' }],
  flicker: [
    { marks: ['flicker'], look: 'fill', words: 'flips back: run A before and after agree, this frame differs' },
    { marks: ['flicker', 'flickerLight'], look: 'checks', words: 'flips back where the ground truth is void' },
  ],
  highlight: [{ marks: ['highlight'], look: 'outline', words: 'selected region' }],
};

/** The mark that is no layer's own: what showing one class only dims the rest toward. */
export const LEGEND_SOLO: LegendEntry = { marks: ['dim'], look: 'fill', words: 'dimmed: not the class shown' };
