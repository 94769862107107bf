import { MARK_KEYS, type CompositePalette } from './compositePalette.ts';
import { aroundOf, type CompositeFrame } from './compositeFrame.ts';
import { BAND_WIDTH_MAX } from '../metrics/bandHistogram.ts';
import {
  DISAGREE_MODES,
  HIGHLIGHT_BOXES_MAX,
  LAYER_KEYS,
  type CurtainSide,
  type LayerBase,
  type LayerKey,
  type LayerSettings,
} from './layerSettings.ts';

/** Curtain sides a layer shows on, as bits: 1 = columns left of the curtain, 2 = columns right of it. */
export const SIDE_LEFT = 1;
export const SIDE_RIGHT = 2;

/**
 * Layer settings resolved against one frame into flat integers: exactly what the CPU loop reads and
 * the fragment shader receives as uniforms, so both paths decide every switch the same way.
 */
export interface CompositeParams {
  /** Per layer in LAYER_KEYS order, 4 ints: side bits (0 = not drawn), opacity 0..255, extra, extra2. */
  layers: Int32Array;
  /** on (0/1), class id, dim amount 0..255, has run A (0/1). */
  solo: Int32Array;
  /** First column right of the curtain. */
  curtainX: number;
  ignore: number;
  /** Per mark in MARK_KEYS order, 4 ints: r, g, b, 0. */
  marks: Int32Array;
  /** Per highlight box, 4 ints: x0, y0, x1, y1 (x1, y1 exclusive), HIGHLIGHT_BOXES_MAX boxes. */
  boxes: Int32Array;
  /** The runs the frame has for A and B (null when not chosen or not in the frame). */
  runA: string | null;
  runB: string | null;
}

/** Offsets into `CompositeParams.layers` (4 ints per layer). */
export const LAYER_INDEX = Object.fromEntries(LAYER_KEYS.map((k, i) => [k, i * 4])) as Record<LayerKey, number>;

function int(v: number, lo: number, hi: number): number {
  const r = Math.round(Number.isFinite(v) ? v : lo);
  return r < lo ? lo : r > hi ? hi : r;
}

function sideBits(layer: LayerBase, curtainOn: boolean, available: boolean): number {
  if (!layer.on || !available || int(layer.opacity, 0, 255) === 0) return 0;
  const side: CurtainSide = curtainOn ? layer.side : 'both';
  return side === 'left' ? SIDE_LEFT : side === 'right' ? SIDE_RIGHT : SIDE_LEFT | SIDE_RIGHT;
}

/** Returns `layers` resolved for `frame` and `palette`; out-of-range numbers are rounded and clamped, not rejected. */
export function compositeParams(frame: CompositeFrame, layers: LayerSettings, palette: CompositePalette): CompositeParams {
  const runA = layers.runA !== null && Object.hasOwn(frame.preds, layers.runA) ? layers.runA : null;
  const runB = layers.runB !== null && Object.hasOwn(frame.preds, layers.runB) ? layers.runB : null;
  const curtainOn = layers.curtain.on;
  const boxes = new Int32Array(HIGHLIGHT_BOXES_MAX * 4);
  let boxCount = 0;
  for (const b of layers.highlight.boxes) {
    if (boxCount === HIGHLIGHT_BOXES_MAX) break;
    const w = Math.round(b.width), h = Math.round(b.height);
    if (!(w >= 1 && h >= 1)) continue;
    // Clamped far outside any frame so corner sums stay well inside 32-bit integers.
    const x0 = int(b.x, -1e6, 1e6), y0 = int(b.y, -1e6, 1e6);
    boxes.set([x0, y0, x0 + Math.min(w, 2e6), y0 + Math.min(h, 2e6)], boxCount++ * 4);
  }
  const available: Record<LayerKey, boolean> = {
    photo: frame.photo !== null,
    truth: true,
    pred: runA !== null,
    band: frame.bandBins !== null,
    disagree: runA !== null,
    compare: runA !== null && runB !== null,
    void: true,
    flicker: runA !== null && aroundOf(frame, runA) !== null,
    highlight: boxCount > 0,
  };
  const out = new Int32Array(LAYER_KEYS.length * 4);
  for (const key of LAYER_KEYS) {
    const o = LAYER_INDEX[key];
    out[o] = sideBits(layers[key], curtainOn, available[key]);
    out[o + 1] = int(layers[key].opacity, 0, 255);
  }
  out[LAYER_INDEX.band + 2] = int(layers.band.width, 0, BAND_WIDTH_MAX);
  out[LAYER_INDEX.disagree + 2] = Math.max(0, DISAGREE_MODES.indexOf(layers.disagree.mode));
  out[LAYER_INDEX.void + 2] = int(layers.void.period, 2, 64) & ~1;
  out[LAYER_INDEX.highlight + 2] = int(layers.highlight.thickness, 1, 16);
  out[LAYER_INDEX.highlight + 3] = boxCount;
  const solo = Int32Array.of(layers.solo.on ? 1 : 0, int(layers.solo.classId, 0, 65535), int(layers.solo.dim, 0, 255), runA !== null ? 1 : 0);
  const marks = new Int32Array(MARK_KEYS.length * 4);
  MARK_KEYS.forEach((k, i) => {
    const rgb = palette.marks[k];
    marks.set([(rgb >> 16) & 255, (rgb >> 8) & 255, rgb & 255, 0], i * 4);
  });
  const curtainX = curtainOn ? int(layers.curtain.x, -1, FRAME_X_LIMIT) : 0;
  return { layers: out, solo, curtainX, ignore: palette.ignore, marks, boxes, runA, runB };
}

/** Curtain positions beyond this are all "right of every column". */
const FRAME_X_LIMIT = 1 << 20;
