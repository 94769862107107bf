import type { Result } from '../../core/result.ts';
import type { Flag } from '../../core/review/flag.ts';
import { suspectRefOf, type ReviewJudgement } from '../../core/review/judgement.ts';
import { suspectKey } from '../../core/review/verdict.ts';
import type { Suspect } from '../../core/suspects/suspectQueue.ts';
import type { FlagInput } from '../../state/reviewSlice.ts';
import { queueShownSel } from '../../state/queueShown.ts';
import { QUEUE_SORTS, QUEUE_VERDICT_FILTERS, type QueueView } from '../../state/queueView.ts';
import { suspectsRankedSel } from '../../state/suspectsRanked.ts';
import type { AppState } from '../../state/store.ts';
import { VERDICT_NAMES } from '../regionWords.ts';
import { hasFrames } from './frameCommands.ts';
import { cmd, commandTable, type CommandContext } from './registry.ts';

/** Returns the verdict given to a queue item, if any. */
export function verdictOf(s: AppState, item: Suspect): ReviewJudgement | undefined {
  return s.reviewVerdicts[suspectKey(suspectRefOf(item))]?.verdict;
}

/** Returns the flag draft for a queue item: the region with what the finder said, its verdict as the reason (label mistake when unjudged). */
export function flagDraftOf(item: Suspect, verdict: ReviewJudgement | undefined): FlagInput {
  return {
    frame: item.frame, kind: 'region', bbox: item.bbox, reason: verdict ?? 'label-mistake', run: item.run,
    region: { kind: item.kind, truthClass: item.truthClass, predictedClass: item.predictedClass, score: item.score, reasons: item.reasons },
  };
}

function selectedItem(s: AppState): Suspect | undefined {
  return s.queueSelected ? suspectsRankedSel(s).find((x) => suspectKey(suspectRefOf(x)) === s.queueSelected) : undefined;
}

/** Gives `verdict` to a queue item, or clears it when the item already has that verdict. */
function verdictToggle({ store }: CommandContext, { item, verdict }: { item: Suspect; verdict: ReviewJudgement }): void {
  const s = store.getState();
  s.verdictSet(suspectRefOf(item), verdictOf(s, item) === verdict ? null : verdict);
}

/** Selects a queue item: the queue list shows, the viewer goes to its frame and outlines it. */
function queueSelect({ store }: CommandContext, item: Suspect): void {
  const s = store.getState();
  if (s.leftTab !== 'queue') s.leftTabSet('queue');
  s.queueSelect(suspectKey(suspectRefOf(item)), item.frameIndex, item.bbox);
}

/** Moves the queue selection by `step` through the queue as the list shows it (selecting the first item when none shown is selected). */
function queueStep(ctx: CommandContext, step: number): void {
  const s = ctx.store.getState();
  const queue = queueShownSel(s);
  if (queue.length === 0) return;
  const at = s.queueSelected ? queue.findIndex((q) => suspectKey(suspectRefOf(q)) === s.queueSelected) : -1;
  queueSelect(ctx, queue[at < 0 ? 0 : Math.max(0, Math.min(queue.length - 1, at + step))]);
}

const VERDICT_KEYS: Record<ReviewJudgement, string> = { 'label-mistake': 'L', 'model-error': 'E', unsure: 'U' };

function verdictKeyed(verdict: ReviewJudgement) {
  return cmd({
    label: `Judge the selected queue item: ${VERDICT_NAMES[verdict]} (again to clear)`, group: 'Likely label mistakes', keys: [VERDICT_KEYS[verdict]],
    enabled: ({ store }) => store.getState().queueSelected !== null,
    run: (ctx: CommandContext) => {
      const item = selectedItem(ctx.store.getState());
      if (item) verdictToggle(ctx, { item, verdict });
    },
  });
}

/** Returns the entry after `v` in `list`, wrapping round. */
function nextOf<T>(list: readonly T[], v: T): T {
  return list[(list.indexOf(v) + 1) % list.length];
}

const hasQueue = ({ store }: CommandContext) => queueShownSel(store.getState()).length > 0;

/** The likely-label-mistake queue, verdicts and flags. */
export const REVIEW_COMMANDS = commandTable({
  'queue.next': cmd({ label: 'Next likely label mistake', group: 'Likely label mistakes', keys: ['Q'], enabled: hasQueue, run: (ctx) => queueStep(ctx, 1) }),
  'queue.prev': cmd({ label: 'Previous likely label mistake', group: 'Likely label mistakes', keys: ['Shift+Q'], enabled: hasQueue, run: (ctx) => queueStep(ctx, -1) }),
  'queue.select': cmd<Suspect>({ label: 'Inspect a likely label mistake', group: 'Likely label mistakes', keys: [], enabled: () => true, run: queueSelect }),
  /** Flags every queue item judged a label mistake that has no flag of its box yet (region, reasons and score on the flag), then opens the export on them. */
  'verdicts.export': cmd({
    label: 'Flag the items judged label mistakes and export them…', group: 'Flags', keys: ['Shift+E'],
    enabled: ({ store }) => Object.values(store.getState().reviewVerdicts).some((v) => v.verdict === 'label-mistake'),
    run: ({ store }) => {
      const s = store.getState();
      const flagged = new Set(s.reviewFlags.filter((f) => f.kind === 'region' && f.bbox).map((f) => `${f.frame}|${f.bbox!.join(',')}`));
      for (const item of suspectsRankedSel(s)) {
        if (verdictOf(s, item) !== 'label-mistake' || flagged.has(`${item.frame}|${item.bbox.join(',')}`)) continue;
        flagged.add(`${item.frame}|${item.bbox.join(',')}`);
        store.getState().flagAdd(flagDraftOf(item, 'label-mistake'));
      }
      store.getState().dialogSet('exportMistakes');
    },
  }),
  'queue.verdictNext': cmd({
    label: 'Queue: show the next verdict filter (every, not judged, each verdict)', group: 'Likely label mistakes', keys: ['Shift+V'], enabled: () => true,
    run: ({ store }) => store.getState().queueViewSet({ verdict: nextOf(QUEUE_VERDICT_FILTERS, store.getState().queueView.verdict) }),
  }),
  'queue.sortNext': cmd({
    label: 'Queue: next order (rank, score high first, score low first)', group: 'Likely label mistakes', keys: ['Shift+S'], enabled: () => true,
    run: ({ store }) => store.getState().queueViewSet({ sort: nextOf(QUEUE_SORTS, store.getState().queueView.sort) }),
  }),
  'queue.view': cmd<Partial<QueueView>>({
    label: 'Filter or sort the queue', group: 'Likely label mistakes', keys: [], enabled: () => true,
    run: ({ store }, patch) => store.getState().queueViewSet(patch),
  }),
  'verdict.label-mistake': verdictKeyed('label-mistake'),
  'verdict.model-error': verdictKeyed('model-error'),
  'verdict.unsure': verdictKeyed('unsure'),
  'verdict.toggle': cmd<{ item: Suspect; verdict: ReviewJudgement }>({
    label: 'Judge a queue item (again to clear)', group: 'Likely label mistakes', keys: [], enabled: () => true, run: verdictToggle,
  }),
  'flag.frame': cmd({
    label: 'Flag this frame', group: 'Flags', keys: ['M'], enabled: hasFrames,
    run: ({ store }) => {
      const s = store.getState();
      const frame = s.dataset!.pairing.frames[s.frameIndex].name;
      s.flagDraftSet({ frame, kind: 'frame', bbox: null, reason: 'label-mistake', run: s.runA });
    },
  }),
  'flag.selected': cmd({
    label: 'Flag the selected region or queue item', group: 'Flags', keys: ['Shift+M'],
    enabled: ({ store }) => store.getState().focusBox !== null || store.getState().queueSelected !== null,
    run: ({ store }) => {
      const s = store.getState();
      const frame = s.dataset?.pairing.frames[s.frameIndex]?.name;
      if (!frame) return;
      const item = selectedItem(s);
      if (item && item.frameIndex === s.frameIndex) return s.flagDraftSet(flagDraftOf(item, verdictOf(s, item)));
      if (s.focusBox) s.flagDraftSet({ frame, kind: 'region', bbox: s.focusBox, reason: 'label-mistake', run: s.runA });
    },
  }),
  'flag.item': cmd<Suspect>({
    label: 'Flag a queue item for relabelling', group: 'Flags', keys: [], enabled: () => true,
    run: ({ store }, item) => store.getState().flagDraftSet(flagDraftOf(item, verdictOf(store.getState(), item))),
  }),
  'flag.box': cmd({
    label: 'Draw a box on the picture to flag (or Shift+drag)', group: 'Flags', keys: ['B'], enabled: hasFrames,
    run: ({ store }) => store.getState().boxDrawingSet(!store.getState().boxDrawing),
  }),
  /** Ends box drawing with the box drawn (image pixels, end-exclusive); a box under 2 px a side flags nothing. */
  'flag.boxDrawn': cmd<readonly [number, number, number, number]>({
    label: 'Flag the box drawn', group: 'Flags', keys: [], enabled: () => true,
    run: ({ store }, [x0, y0, x1, y1]) => {
      const s = store.getState();
      s.boxDrawingSet(false);
      const frame = s.shown?.name;
      if (frame && x1 - x0 >= 2 && y1 - y0 >= 2) s.flagDraftSet({ frame, kind: 'rect', bbox: [x0, y0, x1, y1], reason: 'label-mistake', run: s.runA });
    },
  }),
  /** Saves the flag being written with its reason and note; the form closes unless the flag is refused. */
  'flag.save': cmd<{ reason: string; note: string }, Result<Flag> | null>({
    label: 'Save the flag', group: 'Flags', keys: [], enabled: ({ store }) => store.getState().flagDraft !== null,
    run: ({ store }, { reason, note }) => {
      const s = store.getState();
      if (!s.flagDraft) return null;
      const r = s.flagAdd({ ...s.flagDraft, reason, note });
      if (r.ok) s.flagDraftSet(null);
      return r;
    },
  }),
  'flag.cancel': cmd({ label: 'Close the flag form', group: 'Flags', keys: [], enabled: () => true, run: ({ store }) => store.getState().flagDraftSet(null) }),
  'review.undo': cmd({
    label: 'Undo the last flag change', group: 'Flags', keys: ['Ctrl+Z'],
    enabled: ({ store }) => store.getState().reviewUndoStack.length > 0, run: ({ store }) => void store.getState().reviewUndo(),
  }),
  'review.redo': cmd({
    label: 'Redo', group: 'Flags', keys: ['Ctrl+Shift+Z', 'Ctrl+Y'],
    enabled: ({ store }) => store.getState().reviewRedoStack.length > 0, run: ({ store }) => void store.getState().reviewRedo(),
  }),
});
