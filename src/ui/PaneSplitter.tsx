import { useApp } from './storeContext.tsx';
import { useCommand } from './commands/useCommand.tsx';

const KEY_STEP = 24;

/**
 * The handle between a side pane and the viewer: drag it (or focus it and press ← / →) to resize the
 * pane; the width is remembered for the next visit.
 */
export function PaneSplitter({ pane }: { pane: 'left' | 'right' }) {
  const run = useCommand();
  const width = useApp((s) => s.paneWidths[pane]);
  // Dragging right widens the left pane and narrows the right one.
  const sign = pane === 'left' ? 1 : -1;
  return (
    <div
      className={`splitter splitter-${pane}`}
      role="separator"
      aria-orientation="vertical"
      aria-label={`resize the ${pane} pane`}
      aria-valuenow={width}
      tabIndex={0}
      title="Drag to resize (remembered)"
      onPointerDown={(e) => {
        e.preventDefault();
        const from = e.clientX;
        const start = width;
        const el = e.currentTarget;
        el.setPointerCapture(e.pointerId);
        const move = (m: PointerEvent) => run('pane.resize', { pane, width: start + sign * (m.clientX - from) });
        const up = () => {
          el.removeEventListener('pointermove', move);
          el.removeEventListener('pointerup', up);
          el.removeEventListener('pointercancel', up);
        };
        el.addEventListener('pointermove', move);
        el.addEventListener('pointerup', up);
        el.addEventListener('pointercancel', up);
      }}
      onKeyDown={(e) => {
        if (e.key !== 'ArrowLeft' && e.key !== 'ArrowRight') return;
        // Arrow keys here resize the pane instead of stepping frames.
        e.preventDefault();
        e.stopPropagation();
        run('pane.resize', { pane, width: width + sign * (e.key === 'ArrowRight' ? KEY_STEP : -KEY_STEP) });
      }}
    />
  );
}
