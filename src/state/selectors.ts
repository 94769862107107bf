import { layerSettingsOf, type LayerSettings, type PixelBox } from '../core/composite/layerSettings.ts';
import type { AppState } from './store.ts';

type Sel<T> = (s: AppState) => T;

/**
 * Returns a selector that computes `combine` of its inputs and returns the previous answer while
 * every input is the same value (`Object.is`) as last time, so a derived object keeps its identity
 * until something it is made from changes (React and store subscribers compare by identity).
 */
export function selectorOf<I extends readonly unknown[], R>(inputs: { [K in keyof I]: Sel<I[K]> }, combine: (...args: I) => R): Sel<R> {
  let last: { args: I; value: R } | null = null;
  return (s) => {
    const args = inputs.map((f) => f(s)) as unknown as I;
    if (last && args.every((a, i) => Object.is(a, last!.args[i]))) return last.value;
    last = { args, value: combine(...args) };
    return last.value;
  };
}

const NO_BOXES: PixelBox[] = [];

/** Returns the outline boxes: the focused box, if any (image pixels). */
export const highlightBoxesSel: Sel<PixelBox[]> = selectorOf([(s: AppState) => s.focusBox], (b) =>
  b ? [{ x: b[0], y: b[1], width: b[2] - b[0], height: b[3] - b[1] }] : NO_BOXES,
);

/** Returns what the compositor draws: the layer looks with run A, run B, the band width and the focus outline put in. */
export const layerSettingsSel: Sel<LayerSettings> = selectorOf(
  [(s: AppState) => s.layers, (s: AppState) => s.runA, (s: AppState) => s.runB, (s: AppState) => s.bandWidth, highlightBoxesSel],
  (looks, runA, runB, bandWidth, boxes) => layerSettingsOf(looks, { runA, runB, bandWidth, boxes }),
);
