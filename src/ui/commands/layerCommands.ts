import { DISAGREE_MODES, type DisagreeMode, type LayerBase, type LayerKey } from '../../core/composite/layerSettings.ts';
import { BAND_WIDTH_MAX } from '../../core/metrics/bandHistogram.ts';
import { hasFrames } from './frameCommands.ts';
import { cmd, commandTable, type CommandContext } from './registry.ts';

/** A change to one layer: its switch and/or its opacity (0..255). */
export interface LayerChange {
  layer: LayerKey;
  on?: boolean;
  opacity?: number;
}

function layerSet({ store }: CommandContext, { layer, on, opacity }: LayerChange): void {
  const cur: LayerBase = store.getState().layers[layer];
  const next = { ...cur, on: on ?? cur.on, opacity: opacity === undefined ? cur.opacity : Math.max(0, Math.min(255, Math.round(opacity))) };
  store.getState().layersSet({ [layer]: next });
}

/** Puts the curtain on or off, or moves it; putting it on shows truth left and prediction right of it, at mid-frame unless placed. */
function curtainSet({ store }: CommandContext, change: { on?: boolean; x?: number }): void {
  const s = store.getState();
  const { curtain, truth, pred } = s.layers;
  const on = change.on ?? curtain.on;
  const width = s.shown?.width ?? s.results[s.frameIndex]?.width ?? 0;
  const x = Math.max(0, Math.round(change.x ?? (curtain.x > 0 ? curtain.x : width / 2)));
  const opening = on && !curtain.on;
  const closing = !on && curtain.on;
  // Opening shows truth and prediction; closing puts their switches back as they were, so the
  // curtain leaves no layer on that it turned on.
  const back = closing ? s.curtainRestore : null;
  if (opening) s.curtainRestoreSet({ truth: truth.on, pred: pred.on });
  if (closing) s.curtainRestoreSet(null);
  s.layersSet({
    curtain: { on, x },
    ...(opening ? { truth: { ...truth, on: true }, pred: { ...pred, on: true } } : {}),
    ...(back ? { truth: { ...truth, on: back.truth }, pred: { ...pred, on: back.pred } } : {}),
  });
}

/** Sets the band width every band number and the band layer use, clamped to 0..BAND_WIDTH_MAX px. */
function bandWidthSet({ store }: CommandContext, width: number): void {
  store.getState().bandWidthSet(Math.max(0, Math.min(BAND_WIDTH_MAX, Math.round(width))));
}

/** Sets run B (null for none); the fixed / broke layer follows: on with a run to compare, off without. */
function runBSet({ store }: CommandContext, run: string | null): void {
  const s = store.getState();
  s.runsSet({ runB: run });
  // Choosing a run only makes fixed / broke available (7): switching it on here would paint over the
  // disagreement layer and hide what "colour by" shows. Choosing none switches it off.
  if (run === null) s.layersSet({ compare: { ...s.layers.compare, on: false } });
}

function layerToggle(key: LayerKey, label: string, keys: string[]) {
  return cmd({
    label, group: 'Layers', keys, enabled: hasFrames,
    run: (ctx) => layerSet(ctx, { layer: key, on: !ctx.store.getState().layers[key].on }),
  });
}

const hasRuns = (n: number) => ({ store }: CommandContext) => (store.getState().dataset?.pairing.runs.length ?? 0) >= n;

/** Layers, the band width and the runs they show. */
export const LAYER_COMMANDS = commandTable({
  'layer.photo': layerToggle('photo', 'Photo', ['1']),
  'layer.truth': layerToggle('truth', 'Ground truth', ['2']),
  'layer.pred': layerToggle('pred', 'Prediction (run A)', ['3']),
  'layer.disagree': layerToggle('disagree', 'Disagreement', ['4']),
  'layer.void': layerToggle('void', 'Void', ['5']),
  'layer.band': layerToggle('band', 'Boundary band', ['6']),
  'layer.compare': layerToggle('compare', 'Fixed / broke (A → B)', ['7']),
  'layer.flicker': layerToggle('flicker', 'Flicker: run A flips back at this frame', ['8']),
  'layer.set': cmd<LayerChange>({ label: 'Switch a layer or set its opacity', group: 'Layers', keys: [], enabled: () => true, run: layerSet }),
  'layer.colourBy': cmd<DisagreeMode>({
    label: 'Colour disagreement by kind, true or predicted class', group: 'Layers', keys: [], enabled: () => true,
    run: ({ store }, mode) => store.getState().layersSet({ disagree: { ...store.getState().layers.disagree, mode } }),
  }),
  /** Shows one class only (dims the rest), or every class again with null. */
  'layer.only': cmd<number | null>({
    label: 'Show one class only', group: 'Layers', keys: [], enabled: () => true,
    run: ({ store }, classId) => {
      const { solo } = store.getState().layers;
      store.getState().layersSet({ solo: { ...solo, on: classId !== null, classId: classId ?? solo.classId } });
    },
  }),
  'curtain.toggle': cmd({
    label: 'Curtain: truth left, prediction right', group: 'Layers', keys: ['C'], enabled: hasFrames,
    run: (ctx) => curtainSet(ctx, { on: !ctx.store.getState().layers.curtain.on }),
  }),
  'curtain.set': cmd<{ on?: boolean; x?: number }>({ label: 'Curtain on, off or moved', group: 'Layers', keys: [], enabled: hasFrames, run: curtainSet }),
  'band.wider': cmd({
    label: 'Band width +1 px', group: 'Layers', keys: [']'], enabled: hasFrames,
    run: (ctx) => bandWidthSet(ctx, ctx.store.getState().bandWidth + 1),
  }),
  'band.narrower': cmd({
    label: 'Band width −1 px', group: 'Layers', keys: ['['], enabled: hasFrames,
    run: (ctx) => bandWidthSet(ctx, ctx.store.getState().bandWidth - 1),
  }),
  'band.width': cmd<number>({ label: 'Set the band width', group: 'Layers', keys: [], enabled: () => true, run: bandWidthSet }),
  'layer.colourByNext': cmd({
    label: 'Colour disagreement by the next of: kind of error, true class, predicted class', group: 'Layers', keys: ['V'], enabled: hasFrames,
    run: ({ store }) => {
      const { disagree } = store.getState().layers;
      const mode = DISAGREE_MODES[(DISAGREE_MODES.indexOf(disagree.mode) + 1) % DISAGREE_MODES.length];
      store.getState().layersSet({ disagree: { ...disagree, mode } });
    },
  }),
  'run.next': cmd({
    label: 'Next run as A', group: 'Runs', keys: ['R'], enabled: hasRuns(2),
    run: ({ store }) => {
      const s = store.getState();
      const runs = s.dataset!.pairing.runs;
      const at = runs.indexOf(s.runA ?? '');
      s.runsSet({ runA: runs[(at + 1) % runs.length] });
    },
  }),
  'run.swap': cmd({
    label: 'Swap runs A and B', group: 'Runs', keys: ['X'], enabled: ({ store }) => store.getState().runB !== null,
    run: ({ store }) => {
      const { runA, runB } = store.getState();
      store.getState().runsSet({ runA: runB, runB: runA });
    },
  }),
  'run.a': cmd<string | null>({ label: 'Choose run A', group: 'Runs', keys: [], enabled: hasRuns(1), run: ({ store }, runA) => store.getState().runsSet({ runA }) }),
  'run.nextB': cmd({
    label: 'Compare with the next run (then none)', group: 'Runs', keys: ['Shift+R'], enabled: hasRuns(2),
    run: (ctx) => {
      const s = ctx.store.getState();
      const others = s.dataset!.pairing.runs.filter((r) => r !== s.runA);
      const at = s.runB === null ? -1 : others.indexOf(s.runB);
      runBSet(ctx, at + 1 < others.length ? others[at + 1] : null);
    },
  }),
  'run.b': cmd<string | null>({ label: 'Choose the run to compare with', group: 'Runs', keys: [], enabled: hasRuns(1), run: runBSet }),
});
