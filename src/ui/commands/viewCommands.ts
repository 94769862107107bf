import { cmd, commandTable, type CommandContext } from './registry.ts';
import { shownRunSel } from '../../state/selectors.ts';
import { stateReport } from '../../state/stateReport.ts';
import type { AppState } from '../../state/store.ts';
import { PANE_WIDTH_MAX, PANE_WIDTH_MIN } from '../../state/viewSlice.ts';
import { downloadBlob } from '../download.ts';
import { hasFrames } from './frameCommands.ts';

const hasViewer = (ctx: CommandContext) => ctx.viewer !== null && hasFrames(ctx);

const LEFT_LISTS = ['frames', 'queue', 'flags'] as const;

/** Returns what Esc would close now (the topmost open thing), or null when nothing is open. */
function escapeStep(s: AppState): (() => void) | null {
  if (s.flagDraft) return () => s.flagDraftSet(null);
  if (s.helpOpen) return () => s.helpOpenSet(false);
  if (s.dialog) return () => s.dialogSet(null);
  if (s.boxDrawing) return () => s.boxDrawingSet(false);
  if (s.layers.solo.on) return () => s.layersSet({ solo: { ...s.layers.solo, on: false } });
  if (s.datasetError) return () => s.datasetErrorSet(null);
  return null;
}

/** The viewer's zoom and grid, the left pane's lists, help. */
export const VIEW_COMMANDS = commandTable({
  'view.in': cmd({ label: 'Zoom in', group: 'View', keys: ['+', '='], enabled: hasViewer, run: ({ viewer }) => viewer!.zoomBy(1.5) }),
  'view.out': cmd({ label: 'Zoom out', group: 'View', keys: ['-', '_'], enabled: hasViewer, run: ({ viewer }) => viewer!.zoomBy(1 / 1.5) }),
  'view.fit': cmd({ label: 'Fit frame', group: 'View', keys: ['F'], enabled: hasViewer, run: ({ viewer }) => viewer!.fit() }),
  'view.actual': cmd({ label: 'Actual pixels (1:1)', group: 'View', keys: ['O'], enabled: hasViewer, run: ({ viewer }) => viewer!.oneToOne() }),
  'view.grid': cmd({
    label: 'Pixel grid (when zoomed in)', group: 'View', keys: ['G'], enabled: hasFrames,
    run: ({ store }) => store.getState().pixelGridSet(!store.getState().pixelGrid),
  }),
  'pane.left': cmd<'frames' | 'queue' | 'flags'>({ label: 'Show a list in the left pane', group: 'View', keys: [], enabled: () => true, run: ({ store }, tab) => store.getState().leftTabSet(tab) }),
  'pane.nextList': cmd({
    label: 'Left pane: next list (frames, doubts, flags)', group: 'View', keys: ['Shift+L'], enabled: () => true,
    run: ({ store }) => store.getState().leftTabSet(LEFT_LISTS[(LEFT_LISTS.indexOf(store.getState().leftTab) + 1) % LEFT_LISTS.length]),
  }),
  'dialog.export': cmd({
    label: 'Export flagged tiles…', group: 'Flags', keys: ['Shift+T'], enabled: ({ store }) => Object.keys(store.getState().reviewFlags).length > 0,
    run: ({ store }) => store.getState().dialogSet(store.getState().dialog === 'export' ? null : 'export'),
  }),
  'dialog.opened': cmd({
    label: 'What was opened (files, warnings)', group: 'View', keys: ['Shift+O'], enabled: ({ store }) => store.getState().dataset?.opened != null,
    run: ({ store }) => store.getState().dialogSet(store.getState().dialog === 'opened' ? null : 'opened'),
  }),
  'dialog.close': cmd({ label: 'Close the dialog', group: 'View', keys: [], enabled: () => true, run: ({ store }) => store.getState().dialogSet(null) }),
  'report.save': cmd({
    label: 'Save the scores of run A as the JSON report', group: 'Scores', keys: ['Shift+D'], enabled: ({ store }) => shownRunSel(store.getState()) !== null,
    run: ({ store }) => {
      const run = shownRunSel(store.getState());
      const report = run ? stateReport(store.getState(), run) : null;
      if (report) downloadBlob(`hairline-report-${run}.json`, new Blob([JSON.stringify(report, null, 2)], { type: 'application/json' }));
    },
  }),
  /** Esc: closes the topmost thing open, in this order, one per press. */
  'overlay.close': cmd({
    label: 'Close the form, help or dialog; stop box drawing; show every class again; dismiss a message', group: 'View', keys: ['Escape'],
    enabled: ({ store }) => escapeStep(store.getState()) !== null,
    run: ({ store }) => escapeStep(store.getState())?.(),
  }),
  /** Sets a side pane's width, kept between PANE_WIDTH_MIN and PANE_WIDTH_MAX (remembered for the next visit). */
  'pane.resize': cmd<{ pane: 'left' | 'right'; width: number }>({
    label: 'Resize a side pane', group: 'View', keys: [], enabled: () => true,
    run: ({ store }, { pane, width }) => {
      if (!Number.isFinite(width)) return;
      store.getState().paneWidthsSet({ [pane]: Math.round(Math.max(PANE_WIDTH_MIN, Math.min(PANE_WIDTH_MAX, width))) });
    },
  }),
  help: cmd({ label: 'Show / hide this help', group: 'Help', keys: ['?'], enabled: () => true, run: ({ store }) => store.getState().helpOpenSet(!store.getState().helpOpen) }),
});
