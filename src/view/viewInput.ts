// Pointer input for the viewer: drag to pan, wheel to zoom at the cursor, and the pointer position
// for the readout. Positions are handed on in device pixels of the element.

export interface ViewInputHandlers {
  /** The pointer moved to (sx, sy), or left the element (null). */
  hover(at: { sx: number; sy: number } | null): void;
  /** A drag moved by (dx, dy). */
  pan(dx: number, dy: number): void;
  /** The wheel asks to zoom by `factor` at (sx, sy). */
  zoom(factor: number, sx: number, sy: number): void;
}

/** Wheel travel (in CSS pixels of deltaY) for a factor-of-2 zoom. */
const WHEEL_PIXELS_PER_DOUBLING = 240;

/** Starts listening on `el`; returns the function that stops it. */
export function viewInputAttach(el: HTMLElement, h: ViewInputHandlers): () => void {
  let drag: { id: number; x: number; y: number } | null = null;
  const at = (e: PointerEvent | WheelEvent) => {
    const r = el.getBoundingClientRect();
    const dpr = window.devicePixelRatio || 1;
    return { sx: (e.clientX - r.left) * dpr, sy: (e.clientY - r.top) * dpr };
  };
  const down = (e: PointerEvent) => {
    if (e.button !== 0) return;
    const p = at(e);
    drag = { id: e.pointerId, x: p.sx, y: p.sy };
    el.setPointerCapture(e.pointerId);
  };
  const move = (e: PointerEvent) => {
    const p = at(e);
    if (drag && e.pointerId === drag.id) {
      h.pan(p.sx - drag.x, p.sy - drag.y);
      drag.x = p.sx;
      drag.y = p.sy;
    }
    h.hover(p);
  };
  const up = (e: PointerEvent) => {
    if (drag && e.pointerId === drag.id) {
      drag = null;
      if (el.hasPointerCapture(e.pointerId)) el.releasePointerCapture(e.pointerId);
    }
  };
  const leave = () => {
    if (!drag) h.hover(null);
  };
  const wheel = (e: WheelEvent) => {
    e.preventDefault();
    // Lines and pages are turned into pixels so every wheel zooms at about the same speed.
    const unit = e.deltaMode === 1 ? 16 : e.deltaMode === 2 ? 400 : 1;
    const p = at(e);
    h.zoom(Math.pow(2, (-e.deltaY * unit) / WHEEL_PIXELS_PER_DOUBLING), p.sx, p.sy);
  };
  el.addEventListener('pointerdown', down);
  el.addEventListener('pointermove', move);
  el.addEventListener('pointerup', up);
  el.addEventListener('pointercancel', up);
  el.addEventListener('pointerleave', leave);
  el.addEventListener('wheel', wheel, { passive: false });
  return () => {
    el.removeEventListener('pointerdown', down);
    el.removeEventListener('pointermove', move);
    el.removeEventListener('pointerup', up);
    el.removeEventListener('pointercancel', up);
    el.removeEventListener('pointerleave', leave);
    el.removeEventListener('wheel', wheel);
  };
}
