import { SMALL_OBJECT_AREA } from '../core/objects/objectsBySize.ts';
import { useEffect, useRef, useState } from 'react';
import type { FrameTable } from '../state/frameRows.ts';
import { frameOrderSel, frameTableSel } from '../state/selectors.ts';
import type { FrameScoreKey } from '../state/viewSlice.ts';
import { countShort, pct } from './format.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';
import { FrameSortLine } from './FrameSortLine.tsx';

const ROW_H = 24;

const COLUMNS: { key: FrameScoreKey; label: string; title: string }[] = [
  { key: 'meanIoU', label: 'mIoU', title: 'Mean IoU of the frame (%)' },
  { key: 'bandIoU', label: 'band', title: 'Mean IoU inside the boundary band at the chosen width (%)' },
  { key: 'boundaryIoU', label: 'BIoU', title: 'Boundary IoU (%)' },
  { key: 'boundaryF', label: 'BF', title: 'Boundary F-score (%)' },
  { key: 'errorPixels', label: 'wrong', title: 'Valid pixels where the prediction differs from the ground truth' },
  { key: 'flipBack', label: 'flick', title: 'Flip-back rate: share of non-void pixels whose prediction changes at this frame and changes back at the next (%)' },
  { key: 'smallObjectRecall', label: 'small', title: `Small-object recall: mean recall of the ground-truth objects under ${SMALL_OBJECT_AREA} pixels (%)` },
];

function cell(table: FrameTable, index: number, key: FrameScoreKey): string {
  const v = table.value(index, key);
  if (v === null) return table.pending(index) ? '…' : '—';
  return key === 'errorPixels' ? countShort(v) : pct(v, key === 'flipBack' ? 2 : 1);
}

/** The frame list: every frame with its scores for run A, sortable, virtualised for long datasets. */
export function FrameList() {
  const run = useCommand();
  const sortKey = useApp((s) => s.frameScore);
  const worstFirst = useApp((s) => s.sortWorstFirst);
  const frameClass = useApp((s) => s.frameClass);
  const byClass = frameClass !== null;
  const current = useApp((s) => s.frameIndex);
  const table = useApp(frameTableSel);
  const liveOrder = useApp(frameOrderSel);
  // While the pointer is over the list its order holds (frames landing would move rows under the
  // pointer); 'sort now' takes the current order, leaving the list lets it go. A new sort key applies at once.
  const [held, setHeld] = useState<{ order: number[]; key: FrameScoreKey; worstFirst: boolean; frameClass: typeof frameClass } | null>(null);
  const holding = held !== null && held.key === sortKey && held.worstFirst === worstFirst && held.frameClass === frameClass;
  const order = holding ? held.order : liveOrder;
  const stale = holding && held.order !== liveOrder;
  const hold = () => setHeld({ order: liveOrder, key: sortKey, worstFirst, frameClass });
  const scroller = useRef<HTMLDivElement>(null);
  const [scrollTop, setScrollTop] = useState(0);
  const [height, setHeight] = useState(400);

  useEffect(() => {
    const el = scroller.current;
    if (!el) return;
    const ro = new ResizeObserver(() => setHeight(el.clientHeight));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  // Keep the current frame in view when it changes from the keyboard or the timeline.
  useEffect(() => {
    const el = scroller.current;
    if (!el) return;
    const at = order.indexOf(current);
    if (at < 0) return;
    const top = at * ROW_H;
    if (top < el.scrollTop) el.scrollTop = top;
    else if (top + ROW_H > el.scrollTop + el.clientHeight) el.scrollTop = top + ROW_H - el.clientHeight;
  }, [current, order]);

  const first = Math.max(0, Math.floor(scrollTop / ROW_H) - 5);
  const last = Math.min(order.length, Math.ceil((scrollTop + height) / ROW_H) + 5);


  return (
    <div className="frame-list" data-held={holding ? '' : undefined} onPointerEnter={hold} onPointerLeave={() => setHeld(null)}>
      <FrameSortLine />
      <div className="fl-head">
        {stale ? (
          <button className="fl-resort" onClick={hold} title="The list keeps its order while the pointer is over it; frames scored since would move rows">
            sort now
          </button>
        ) : (
          <span className="fl-name">frame</span>
        )}
        {COLUMNS.map((c) => (
          <button key={c.key} className={`fl-col fl-c-${c.key}${c.key === sortKey && !byClass ? ' fl-sorted' : ''}`} title={c.title} onClick={() => run('frames.sortBy', c.key)}>
            {c.key === 'bandIoU' ? `${c.label} ${table.bandWidth}` : c.label}
            {c.key === sortKey && !byClass ? (worstFirst ? ' ▲' : ' ▼') : ''}
          </button>
        ))}
      </div>
      <div className="fl-scroll" ref={scroller} onScroll={(e) => setScrollTop(e.currentTarget.scrollTop)}>
        <div style={{ height: order.length * ROW_H, position: 'relative' }}>
          {order.slice(first, last).map((index, i) => {
            const error = table.error(index);
            const name = table.name(index);
            return (
              <div
                key={index}
                className={`fl-row${index === current ? ' fl-current' : ''}${error ? ' fl-error' : ''}`}
                style={{ top: (first + i) * ROW_H, height: ROW_H }}
                title={error ?? name}
                data-frame={name}
                onClick={() => run('frame.go', index)}
              >
                <span className="fl-name">{name}</span>
                {error ? (
                  <span className="fl-err">failed</span>
                ) : (
                  COLUMNS.map((c) => (
                    <span key={c.key} className={`fl-col fl-c-${c.key}`}>
                      {cell(table, index, c.key)}
                    </span>
                  ))
                )}
              </div>
            );
          })}
        </div>
      </div>
    </div>
  );
}
