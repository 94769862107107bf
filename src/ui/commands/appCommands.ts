import type { LayerKey } from '../../core/composite/layerSettings.ts';
import { frameOrderSel } from '../../state/selectors.ts';
import { suspectsRankedSel } from '../../state/suspectsRanked.ts';
import { suspectKey, type SuspectVerdictKind } from '../../core/review/verdict.ts';
import type { Suspect } from '../../core/suspects/suspectQueue.ts';

/** The verdict identity of a queue item. */
function suspectRefOf(q: Suspect) {
  return { frame: q.frame, run: q.run, bbox: q.bbox, truthClass: q.truthClass, predictedClass: q.predictedClass };
}
import type { AppState } from '../../state/store.ts';
import type { Command, CommandContext } from './registry.ts';

const hasFrames = ({ store }: CommandContext) => (store.getState().dataset?.pairing.frames.length ?? 0) > 0;
const hasViewer = (ctx: CommandContext) => ctx.viewer !== null && hasFrames(ctx);
const frameCount = (s: AppState) => s.dataset?.pairing.frames.length ?? 0;

function layerToggle(key: LayerKey, label: string, keys: string[]): Command {
  return {
    id: `layer.${key}`,
    label,
    group: 'Layers',
    keys,
    enabled: hasFrames,
    run: ({ store }) => {
      const layers = store.getState().layers;
      store.getState().layersSet({ [key]: { ...layers[key], on: !layers[key].on } });
    },
  };
}

/** Moves along the frame list's current order (the order the user sorted by) by `step`. */
function frameStepInOrder(ctx: CommandContext, step: number): void {
  const s = ctx.store.getState();
  const order = frameOrderSel(s);
  const at = order.indexOf(s.frameIndex);
  const next = order[Math.max(0, Math.min(order.length - 1, (at < 0 ? -1 : at) + step))];
  if (next !== undefined) s.frameIndexSet(next);
}

/** Moves the queue selection by `step` (selecting the first item when none is selected). */
function queueStep(ctx: CommandContext, step: number): void {
  const s = ctx.store.getState();
  const queue = suspectsRankedSel(s);
  if (queue.length === 0) return;
  const keys = queue.map((q) => suspectKey(q));
  const at = s.queueSelected ? keys.indexOf(s.queueSelected) : -1;
  const next = at < 0 ? 0 : Math.max(0, Math.min(queue.length - 1, at + step));
  const q = queue[next];
  if (s.leftTab !== 'queue') s.leftTabSet('queue');
  s.queueSelect(keys[next], q.frameIndex, q.bbox);
}

function verdictCommand(v: SuspectVerdictKind, label: string, key: string): Command {
  return {
    id: `verdict.${v}`,
    label: `Judge the selected queue item: ${label} (again to clear)`,
    group: 'Likely label mistakes',
    keys: [key],
    enabled: ({ store }) => store.getState().queueSelected !== null,
    run: ({ store }) => {
      const s = store.getState();
      const q = suspectsRankedSel(s).find((x) => suspectKey(x) === s.queueSelected);
      if (!q) return;
      const ref = suspectRefOf(q);
      s.verdictSet(ref, s.reviewVerdicts[suspectKey(ref)]?.verdict === v ? null : v);
    },
  };
}

/** Opens the flag form for the selected queue item, else the focused region, else nothing. */
function flagSelected(ctx: CommandContext): void {
  const s = ctx.store.getState();
  const frame = s.dataset?.pairing.frames[s.frameIndex]?.name;
  if (!frame) return;
  const q = s.queueSelected ? suspectsRankedSel(s).find((x) => suspectKey(x) === s.queueSelected) : undefined;
  if (q && q.frameIndex === s.frameIndex) {
    s.flagDraftSet({
      frame, kind: 'region', bbox: q.bbox, reason: 'label-mistake', run: q.run,
      region: { kind: q.kind, truthClass: q.truthClass, predictedClass: q.predictedClass, score: q.score, reasons: q.reasons },
    });
    return;
  }
  if (s.focusBox) s.flagDraftSet({ frame, kind: 'region', bbox: s.focusBox, reason: 'label-mistake', run: s.runA });
}

/** Every command of the workspace, in the order the help overlay lists them. */
export const APP_COMMANDS: Command[] = [
  {
    id: 'frame.next', label: 'Next frame', group: 'Frames', keys: ['ArrowRight', 'J'], enabled: hasFrames,
    run: ({ store }) => store.getState().frameIndexSet(store.getState().frameIndex + 1),
  },
  {
    id: 'frame.prev', label: 'Previous frame', group: 'Frames', keys: ['ArrowLeft', 'K'], enabled: hasFrames,
    run: ({ store }) => store.getState().frameIndexSet(store.getState().frameIndex - 1),
  },
  {
    id: 'frame.first', label: 'First frame', group: 'Frames', keys: ['Home'], enabled: hasFrames,
    run: ({ store }) => store.getState().frameIndexSet(0),
  },
  {
    id: 'frame.last', label: 'Last frame', group: 'Frames', keys: ['End'], enabled: hasFrames,
    run: ({ store }) => store.getState().frameIndexSet(frameCount(store.getState()) - 1),
  },
  {
    id: 'frame.worse', label: 'Next in list order (worst first when sorted so)', group: 'Frames', keys: ['W'], enabled: hasFrames,
    run: (ctx) => frameStepInOrder(ctx, 1),
  },
  {
    id: 'frame.better', label: 'Previous in list order', group: 'Frames', keys: ['Shift+W'], enabled: hasFrames,
    run: (ctx) => frameStepInOrder(ctx, -1),
  },
  {
    id: 'play.toggle', label: 'Play / pause', group: 'Frames', keys: ['Space'], enabled: hasFrames,
    run: ({ store }) => store.getState().playingSet(!store.getState().playing),
  },
  layerToggle('photo', 'Photo', ['1']),
  layerToggle('truth', 'Ground truth', ['2']),
  layerToggle('pred', 'Prediction (run A)', ['3']),
  layerToggle('disagree', 'Disagreement', ['4']),
  layerToggle('void', 'Void', ['5']),
  layerToggle('band', 'Boundary band', ['6']),
  layerToggle('compare', 'Fixed / broke (A → B)', ['7']),
  {
    id: 'layer.curtain', label: 'Curtain: truth left, prediction right', group: 'Layers', keys: ['C'], enabled: hasFrames,
    run: ({ store }) => {
      const { layers, dataset, frameIndex, results } = store.getState();
      const width = results[frameIndex]?.width || 0;
      const x = layers.curtain.x > 0 ? layers.curtain.x : Math.round(width / 2);
      const on = !layers.curtain.on;
      store.getState().layersSet({
        curtain: { on, x },
        truth: { ...layers.truth, on: on ? true : layers.truth.on },
        pred: { ...layers.pred, on: on ? true : layers.pred.on },
      });
      void dataset;
    },
  },
  {
    id: 'band.wider', label: 'Band width +1 px', group: 'Layers', keys: [']'], enabled: hasFrames,
    run: ({ store }) => {
      store.getState().bandWidthSet(Math.min(64, store.getState().bandWidth + 1));
    },
  },
  {
    id: 'band.narrower', label: 'Band width −1 px', group: 'Layers', keys: ['['], enabled: hasFrames,
    run: ({ store }) => {
      store.getState().bandWidthSet(Math.max(0, store.getState().bandWidth - 1));
    },
  },
  {
    id: 'solo.off', label: 'Stop box drawing, or stop showing one class only', group: 'Layers', keys: ['Escape'],
    enabled: ({ store }) => store.getState().layers.solo.on || store.getState().boxDrawing,
    run: ({ store }) => {
      const s = store.getState();
      if (s.boxDrawing) return s.boxDrawingSet(false);
      s.layersSet({ solo: { ...s.layers.solo, on: false } });
    },
  },
  {
    id: 'run.next', label: 'Next run as A', group: 'Runs', keys: ['R'], enabled: ({ store }) => (store.getState().dataset?.pairing.runs.length ?? 0) > 1,
    run: ({ store }) => {
      const s = store.getState();
      const runs = s.dataset!.pairing.runs;
      const at = runs.indexOf(s.runA ?? '');
      s.runsSet({ runA: runs[(at + 1) % runs.length] });
    },
  },
  {
    id: 'run.swap', label: 'Swap runs A and B', group: 'Runs', keys: ['X'], enabled: ({ store }) => store.getState().runB !== null,
    run: ({ store }) => {
      const { runA, runB } = store.getState();
      store.getState().runsSet({ runA: runB, runB: runA });
    },
  },
  {
    id: 'queue.next', label: 'Next likely label mistake', group: 'Likely label mistakes', keys: ['Q'],
    enabled: ({ store }) => suspectsRankedSel(store.getState()).length > 0, run: (ctx) => queueStep(ctx, 1),
  },
  {
    id: 'queue.prev', label: 'Previous likely label mistake', group: 'Likely label mistakes', keys: ['Shift+Q'],
    enabled: ({ store }) => suspectsRankedSel(store.getState()).length > 0, run: (ctx) => queueStep(ctx, -1),
  },
  verdictCommand('label-mistake', 'label mistake', 'L'),
  verdictCommand('model-error', 'model error', 'E'),
  verdictCommand('unsure', 'unsure', 'U'),
  {
    id: 'flag.frame', label: 'Flag this frame', group: 'Flags', keys: ['M'], enabled: hasFrames,
    run: ({ store }) => {
      const s = store.getState();
      const frame = s.dataset!.pairing.frames[s.frameIndex].name;
      s.flagDraftSet({ frame, kind: 'frame', bbox: null, reason: 'label-mistake', run: s.runA });
    },
  },
  {
    id: 'flag.selected', label: 'Flag the selected region or queue item', group: 'Flags', keys: ['Shift+M'],
    enabled: ({ store }) => store.getState().focusBox !== null || store.getState().queueSelected !== null, run: flagSelected,
  },
  {
    id: 'flag.box', label: 'Draw a box on the picture to flag (or Shift+drag)', group: 'Flags', keys: ['B'], enabled: hasFrames,
    run: ({ store }) => store.getState().boxDrawingSet(!store.getState().boxDrawing),
  },
  {
    id: 'review.undo', label: 'Undo the last flag change', group: 'Flags', keys: ['Ctrl+Z'],
    enabled: ({ store }) => store.getState().reviewUndoStack.length > 0, run: ({ store }) => void store.getState().reviewUndo(),
  },
  {
    id: 'review.redo', label: 'Redo', group: 'Flags', keys: ['Ctrl+Shift+Z', 'Ctrl+Y'],
    enabled: ({ store }) => store.getState().reviewRedoStack.length > 0, run: ({ store }) => void store.getState().reviewRedo(),
  },
  { id: 'view.in', label: 'Zoom in', group: 'View', keys: ['+', '='], enabled: hasViewer, run: ({ viewer }) => viewer!.zoomBy(1.5) },
  { id: 'view.out', label: 'Zoom out', group: 'View', keys: ['-', '_'], enabled: hasViewer, run: ({ viewer }) => viewer!.zoomBy(1 / 1.5) },
  { id: 'view.fit', label: 'Fit frame', group: 'View', keys: ['F'], enabled: hasViewer, run: ({ viewer }) => viewer!.fit() },
  { id: 'view.actual', label: 'Actual pixels (1:1)', group: 'View', keys: ['O'], enabled: hasViewer, run: ({ viewer }) => viewer!.oneToOne() },
  {
    id: 'view.grid', label: 'Pixel grid (when zoomed in)', group: 'View', keys: ['G'], enabled: hasFrames,
    run: ({ store }) => store.getState().pixelGridSet(!store.getState().pixelGrid),
  },
  {
    id: 'help', label: 'Show / hide this help', group: 'Help', keys: ['?'], enabled: () => true,
    run: ({ store }) => store.getState().helpOpenSet(!store.getState().helpOpen),
  },
];
