import { cmd, commandTable, type CommandContext } from './registry.ts';
import { PANE_WIDTH_MAX, PANE_WIDTH_MIN } from '../../state/viewSlice.ts';
import { hasFrames } from './frameCommands.ts';

const hasViewer = (ctx: CommandContext) => ctx.viewer !== null && hasFrames(ctx);

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
