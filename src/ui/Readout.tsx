import { useEffect, useRef } from 'react';
import { classTableFind } from '../core/classTable.ts';
import { truthBoundaryDistanceAt } from '../core/pointDistance.ts';
import { scoringTableSel } from '../state/selectors.ts';
import type { Viewer } from '../view/viewer.ts';
import { useAppStore } from './storeContext.tsx';

/**
 * The line under the viewer: pixel position, ground-truth class, each run's class and the distance to
 * the nearest ground-truth boundary. Written straight into the DOM on pointer moves (no re-render).
 */
export function Readout({ viewer }: { viewer: Viewer }) {
  const store = useAppStore();
  const line = useRef<HTMLDivElement>(null);
  useEffect(
    () =>
      viewer.onPointer((p) => {
        const el = line.current;
        if (!el) return;
        const s = store.getState();
        const f = s.shown;
        const table = scoringTableSel(s);
        if (!p || !f?.truth || !s.dataset || !table) {
          el.textContent = 'point at the frame to read classes';
          return;
        }
        const name = (id: number) => (id === table.ignore ? 'void' : (classTableFind(table, id)?.name ?? `not a class (${id})`));
        const i = p.y * f.width + p.x;
        // Where the class table maps stored ids, the file's own id is shown beside the class.
        const label = (m: { ids: ArrayLike<number>; stored?: ArrayLike<number> }) => (m.stored ? `${name(m.ids[i])} (stored id ${m.stored[i]})` : name(m.ids[i]));
        const parts = [`x ${p.x}  y ${p.y}`, `truth: ${label(f.truth)}`];
        for (const run of s.dataset.pairing.runs) {
          const m = f.preds[run];
          if (m) parts.push(`${run}: ${label(m)}`);
        }
        const d = truthBoundaryDistanceAt(f.truth, p.x, p.y);
        parts.push(d === null ? 'boundary > 64 px' : `boundary ${d.toFixed(2)} px`);
        el.textContent = parts.join('   ·   ');
      }),
    [viewer, store],
  );
  return (
    <div className="readout" ref={line} data-testid="readout">
      point at the frame to read classes
    </div>
  );
}
