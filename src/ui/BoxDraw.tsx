import { useEffect, useState } from 'react';
import type { Viewer } from '../view/viewer.ts';
import { viewScreenToImage } from '../view/viewTransform.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp, useAppStore } from './storeContext.tsx';

/**
 * Drawing a box to flag: with Shift held (or after B) a drag on the picture draws a rectangle in image
 * pixels instead of panning; releasing opens the flag form for it. Listens in the capture phase on the
 * viewer's host so the viewer never sees those drags.
 */
export function BoxDraw({ host, viewer }: { host: HTMLElement; viewer: Viewer }) {
  const store = useAppStore();
  const run = useCommand();
  const armed = useApp((s) => s.boxDrawing);
  const [rect, setRect] = useState<{ x0: number; y0: number; x1: number; y1: number } | null>(null);

  useEffect(() => {
    let start: { cx: number; cy: number; ix: number; iy: number } | null = null;
    const toImage = (e: PointerEvent) => {
      const r = host.getBoundingClientRect();
      const dpr = window.devicePixelRatio || 1;
      const p = viewScreenToImage(viewer.viewGet(), (e.clientX - r.left) * dpr, (e.clientY - r.top) * dpr, host.clientWidth * dpr, host.clientHeight * dpr);
      return { x: p.x, y: p.y, cx: e.clientX - r.left, cy: e.clientY - r.top };
    };
    const down = (e: PointerEvent) => {
      if (e.button !== 0 || !(e.shiftKey || store.getState().boxDrawing) || !store.getState().shown) return;
      e.stopPropagation();
      e.preventDefault();
      const p = toImage(e);
      start = { cx: p.cx, cy: p.cy, ix: p.x, iy: p.y };
      host.setPointerCapture(e.pointerId);
      setRect({ x0: p.cx, y0: p.cy, x1: p.cx, y1: p.cy });
    };
    const move = (e: PointerEvent) => {
      if (!start) return;
      e.stopPropagation();
      const p = toImage(e);
      setRect({ x0: start.cx, y0: start.cy, x1: p.cx, y1: p.cy });
    };
    const up = (e: PointerEvent) => {
      if (!start) return;
      e.stopPropagation();
      const p = toImage(e);
      const f = store.getState().shown!;
      const clamp = (v: number, hi: number) => Math.max(0, Math.min(hi, v));
      const x0 = clamp(Math.floor(Math.min(start.ix, p.x)), f.width), x1 = clamp(Math.ceil(Math.max(start.ix, p.x)), f.width);
      const y0 = clamp(Math.floor(Math.min(start.iy, p.y)), f.height), y1 = clamp(Math.ceil(Math.max(start.iy, p.y)), f.height);
      start = null;
      setRect(null);
      run('flag.boxDrawn', [x0, y0, x1, y1]);
    };
    host.addEventListener('pointerdown', down, { capture: true });
    host.addEventListener('pointermove', move, { capture: true });
    host.addEventListener('pointerup', up, { capture: true });
    return () => {
      host.removeEventListener('pointerdown', down, { capture: true });
      host.removeEventListener('pointermove', move, { capture: true });
      host.removeEventListener('pointerup', up, { capture: true });
    };
  }, [host, viewer, store, run]);

  return (
    <>
      {armed && !rect && <div className="box-hint">drag on the picture to draw a box to flag (Esc to stop)</div>}
      {rect && (
        <div
          className="box-rubber"
          style={{ left: Math.min(rect.x0, rect.x1), top: Math.min(rect.y0, rect.y1), width: Math.abs(rect.x1 - rect.x0), height: Math.abs(rect.y1 - rect.y0) }}
        />
      )}
    </>
  );
}
