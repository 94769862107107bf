import { describe, expect, it } from 'vitest';
import { scaleMin, viewFitted, viewOrigin, viewPanned, viewScreenToImage, viewZoomedAt } from '../../src/view/viewTransform.ts';

describe('view transform', () => {
  it('fits the whole image centred', () => {
    expect(viewFitted(200, 100, 800, 600)).toEqual({ cx: 100, cy: 50, scale: 4 });
    expect(viewFitted(4000, 1000, 800, 600).scale).toBe(0.2);
  });
  it('keeps the image point under the cursor in place while zooming', () => {
    let v = viewFitted(200, 100, 800, 600);
    const before = viewScreenToImage(v, 123, 456, 800, 600);
    for (const f of [2, 1.7, 0.3, 5]) {
      v = viewZoomedAt(v, f, 123, 456, 800, 600, 0.01);
      const after = viewScreenToImage(v, 123, 456, 800, 600);
      // Within the one device pixel the origin rounding may move it.
      expect(Math.abs(after.x - before.x) * v.scale).toBeLessThanOrEqual(1);
      expect(Math.abs(after.y - before.y) * v.scale).toBeLessThanOrEqual(1);
    }
  });
  it('clamps zoom to the lower limit given', () => {
    const v = viewZoomedAt(viewFitted(200, 100, 800, 600), 1e-9, 0, 0, 800, 600, scaleMin(200, 100, 800, 600));
    expect(v.scale).toBe(0.25);
  });
  it('puts the image origin on whole device pixels, so 1:1 maps pixel to pixel', () => {
    const o = viewOrigin({ cx: 10.3, cy: 7.7, scale: 1 }, 101, 51);
    expect(Number.isInteger(o.ox) && Number.isInteger(o.oy)).toBe(true);
    const p = viewScreenToImage({ cx: 10.3, cy: 7.7, scale: 1 }, o.ox + 3.5, o.oy + 2.5, 101, 51);
    expect([Math.floor(p.x), Math.floor(p.y)]).toEqual([3, 2]);
  });
  it('pans with the pointer: dragging right moves the image right', () => {
    const v = viewPanned({ cx: 50, cy: 50, scale: 2 }, 10, -4);
    expect(v).toEqual({ cx: 45, cy: 52, scale: 2 });
  });
});
