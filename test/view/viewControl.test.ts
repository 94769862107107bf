import { describe, expect, it } from 'vitest';
import { ViewControl, type PointerReadout } from '../../src/view/viewControl.ts';

function control() {
  let redraws = 0;
  const c = new ViewControl(() => redraws++);
  c.viewportSet(800, 400);
  return { c, redraws: () => redraws };
}

describe('ViewControl', () => {
  it('fits a new image size, keeps the view for a frame of the same size', () => {
    const { c } = control();
    c.imageSet(200, 100);
    expect(c.view).toEqual({ cx: 100, cy: 50, scale: 4 });
    c.set({ cx: 20, cy: 30, scale: 16 });
    c.imageSet(200, 100);
    expect(c.view).toEqual({ cx: 20, cy: 30, scale: 16 });
    c.imageSet(400, 100);
    expect(c.view).toEqual({ cx: 200, cy: 50, scale: 2 });
  });
  it('clamps the scale and keeps the centre on the image', () => {
    const { c } = control();
    c.imageSet(200, 100);
    c.set({ cx: -50, cy: 500, scale: 1e6 });
    expect(c.view).toEqual({ cx: 0, cy: 100, scale: 256 });
    c.set({ cx: 10, cy: 10, scale: 1e-6 });
    expect(c.view.scale).toBe(0.25);
    c.set({ cx: NaN, cy: 0, scale: 1 }); // ignored
    expect(c.view.cx).toBe(10);
  });
  it('reports the pixel under the pointer only when it changes, and null off the image', () => {
    const { c } = control();
    c.imageSet(200, 100); // scale 4, image covers the viewport
    const seen: PointerReadout[] = [];
    c.onPointer((p) => seen.push(p));
    c.hover({ sx: 9, sy: 9 });
    c.hover({ sx: 10, sy: 11 }); // same pixel (2, 2)
    c.hover({ sx: 799, sy: 399 });
    c.set({ cx: 100, cy: 50, scale: 1 }); // the image shrinks away from under the pointer
    c.hover(null);
    expect(seen).toEqual([{ x: 2, y: 2 }, { x: 199, y: 99 }, null]);
  });
  it('tells view listeners and asks for a redraw on every change', () => {
    const { c, redraws } = control();
    c.imageSet(200, 100);
    const views: number[] = [];
    c.onViewChange((v) => views.push(v.scale));
    const before = redraws();
    c.zoomAt(2, 400, 200);
    c.pan(10, 0);
    expect(views).toEqual([8, 8]);
    expect(redraws() - before).toBe(2);
  });
});
