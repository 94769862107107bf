import type { FrameScoreKey } from '../../state/viewSlice.ts';
import { extrasASel } from '../../state/extrasScores.ts';
import { classColumnSel, classInfoSel, frameOrderSel, shownRunSel } from '../../state/selectors.ts';
import { CLASS_MEASURES, classWorstRegion, type ClassMeasure } from '../../state/classFrames.ts';
import type { AppState } from '../../state/store.ts';
import { cmd, commandTable, type CommandContext } from './registry.ts';

export const hasFrames = ({ store }: CommandContext) => frameCount(store.getState()) > 0;
const frameCount = (s: AppState) => s.dataset?.pairing.frames.length ?? 0;

/** Moves along the frame list's current order (the order the user sorted by) by `step`. */
function frameStepInOrder(ctx: CommandContext, step: number): void {
  const s = ctx.store.getState();
  const order = frameOrderSel(s);
  const at = order.indexOf(s.frameIndex);
  const next = order[Math.max(0, Math.min(order.length - 1, (at < 0 ? -1 : at) + step))];
  if (next !== undefined) s.frameIndexSet(next);
}

/** Frames the next (`step` 1) or previous missed small object of run A on this frame, after the one framed now. */
function missedStep(ctx: CommandContext, step: number): void {
  const s = ctx.store.getState();
  const missed = extrasASel(s).frame?.missed ?? [];
  if (missed.length === 0) return;
  const boxes = missed.map((m) => [m.box[0], m.box[1], m.box[2] + 1, m.box[3] + 1] as const);
  const at = s.focusBox ? boxes.findIndex((b) => b.every((v, k) => v === s.focusBox![k])) : -1;
  const next = at < 0 ? (step > 0 ? 0 : boxes.length - 1) : (at + step + boxes.length) % boxes.length;
  s.focusOn(s.frameIndex, boxes[next]);
}

/** Applies a class sort (see frames.byClass), then shows the worst frame and its worst region of the class. */
function classSortApply(ctx: CommandContext, pick: { classId: number; measure?: ClassMeasure } | null): void {
  const s = ctx.store.getState();
  if (!pick) {
    s.frameClassSet(null);
    return;
  }
  const same = s.frameClass?.classId === pick.classId;
  const measure = pick.measure ?? (same ? CLASS_MEASURES[(CLASS_MEASURES.indexOf(s.frameClass!.measure) + 1) % CLASS_MEASURES.length] : 'iou');
  s.frameClassSet({ classId: pick.classId, measure });
  s.sortWorstFirstSet(true);
  const after = ctx.store.getState();
  const column = classColumnSel(after);
  const worst = frameOrderSel(after)[0];
  if (!column || worst === undefined || Number.isNaN(column[worst])) return;
  const box = classWorstRegion(after.results[worst], shownRunSel(after), pick.classId);
  if (box) after.focusOn(worst, box);
  else after.frameIndexSet(worst);
}

const hasMissed = ({ store }: CommandContext) => (extrasASel(store.getState()).frame?.missed.length ?? 0) > 0;

/** Frames: stepping, jumping, the list's order, playing through. */
export const FRAME_COMMANDS = commandTable({
  'frame.next': cmd({
    label: 'Next frame', group: 'Frames', keys: ['ArrowRight', 'J'], enabled: hasFrames,
    run: ({ store }) => store.getState().frameIndexSet(store.getState().frameIndex + 1),
  }),
  'frame.prev': cmd({
    label: 'Previous frame', group: 'Frames', keys: ['ArrowLeft', 'K'], enabled: hasFrames,
    run: ({ store }) => store.getState().frameIndexSet(store.getState().frameIndex - 1),
  }),
  'frame.first': cmd({ label: 'First frame', group: 'Frames', keys: ['Home'], enabled: hasFrames, run: ({ store }) => store.getState().frameIndexSet(0) }),
  'frame.last': cmd({
    label: 'Last frame', group: 'Frames', keys: ['End'], enabled: hasFrames,
    run: ({ store }) => store.getState().frameIndexSet(frameCount(store.getState()) - 1),
  }),
  'frame.worse': cmd({
    label: 'Next in list order (worst first when sorted so)', group: 'Frames', keys: ['W'], enabled: hasFrames,
    run: (ctx) => frameStepInOrder(ctx, 1),
  }),
  'frame.better': cmd({ label: 'Previous in list order', group: 'Frames', keys: ['Shift+W'], enabled: hasFrames, run: (ctx) => frameStepInOrder(ctx, -1) }),
  /** Goes to frame `index` (natural order), clamped to the dataset. */
  'frame.go': cmd<number>({ label: 'Go to a frame', group: 'Frames', keys: [], enabled: hasFrames, run: ({ store }, index) => store.getState().frameIndexSet(index) }),
  /** Centres the viewer on a box of a frame and outlines it. */
  'region.focus': cmd<{ frameIndex: number; bbox: readonly [number, number, number, number] }>({
    label: 'Show a region', group: 'Frames', keys: [], enabled: hasFrames,
    run: ({ store }, { frameIndex, bbox }) => store.getState().focusOn(frameIndex, bbox),
  }),
  'object.next': cmd({ label: 'Next missed small object on this frame', group: 'Frames', keys: ['N'], enabled: hasMissed, run: (ctx) => missedStep(ctx, 1) }),
  'object.prev': cmd({ label: 'Previous missed small object', group: 'Frames', keys: ['Shift+N'], enabled: hasMissed, run: (ctx) => missedStep(ctx, -1) }),
  /** Sorts the frame list by a score, worst first; the same score again flips the order. */
  'frames.sortBy': cmd<FrameScoreKey>({
    label: 'Sort the frame list', group: 'Frames', keys: [], enabled: () => true,
    run: ({ store }, key) => {
      const s = store.getState();
      if (s.frameScore === key && !s.frameClass) s.sortWorstFirstSet(!s.sortWorstFirst);
      else {
        s.frameClassSet(null);
        s.frameScoreSet(key);
        s.sortWorstFirstSet(true);
      }
    },
  }),
  /**
   * Sorts the frame list by one class's per-frame measure, worst first, goes to the worst frame and
   * frames run A's worst error region of that class there; the same class without a measure steps to
   * its next measure (IoU, band IoU, Boundary IoU); null goes back to the list's score.
   */
  'frames.byClass': cmd<{ classId: number; measure?: ClassMeasure } | null>({
    label: 'Sort frames by a class (IoU, band IoU, Boundary IoU) and show its worst region', group: 'Frames', keys: [], enabled: hasFrames,
    run: (ctx, pick) => classSortApply(ctx, pick),
  }),
  'frames.classNext': cmd({
    label: 'Sort frames by the next class (after the last: back to the list\'s score)', group: 'Frames', keys: ['I'], enabled: hasFrames,
    run: (ctx) => {
      const s = ctx.store.getState();
      const ids = [...classInfoSel(s).keys()];
      const at = s.frameClass ? ids.indexOf(s.frameClass.classId) : -1;
      classSortApply(ctx, at + 1 < ids.length ? { classId: ids[at + 1], measure: s.frameClass?.measure ?? 'iou' } : null);
    },
  }),
  'frames.classMeasure': cmd({
    label: 'Class sort: next measure (IoU, band IoU, Boundary IoU)', group: 'Frames', keys: ['Shift+I'], enabled: hasFrames,
    run: (ctx) => {
      const s = ctx.store.getState();
      const first = [...classInfoSel(s).keys()][0];
      if (s.frameClass) classSortApply(ctx, { classId: s.frameClass.classId });
      else if (first !== undefined) classSortApply(ctx, { classId: first, measure: 'iou' });
    },
  }),
  'play.toggle': cmd({
    label: 'Play / pause', group: 'Frames', keys: ['Space'], enabled: hasFrames,
    run: ({ store }) => store.getState().playingSet(!store.getState().playing),
  }),
  /** One step of playing: the next frame, or stop at the last. */
  'play.step': cmd({
    label: 'Play: next frame', group: 'Frames', keys: [], enabled: hasFrames,
    run: ({ store }) => {
      const s = store.getState();
      if (s.frameIndex >= frameCount(s) - 1) s.playingSet(false);
      else s.frameIndexSet(s.frameIndex + 1);
    },
  }),
  'play.rate': cmd<number>({ label: 'Frames per second while playing', group: 'Frames', keys: [], enabled: () => true, run: ({ store }, fps) => store.getState().playRateSet(fps) }),
});
