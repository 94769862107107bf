import { describe, expect, it } from 'vitest';
import { maskShiftDilate } from '../../src/demo/mistakes.ts';
import { Rng } from '../../src/demo/random.ts';

describe('maskShiftDilate', () => {
  it('equals the brute-force definition: some mask pixel q with |p − q − s|∞ ≤ r', () => {
    const rng = new Rng(2);
    for (let trial = 0; trial < 20; trial++) {
      const w = 5 + rng.int(20);
      const h = 5 + rng.int(20);
      const mask = new Uint8Array(w * h).map(() => (rng.next() < 0.15 ? 1 : 0));
      const sx = rng.int(9) - 4;
      const sy = rng.int(9) - 4;
      const r = rng.int(3);
      const fast = maskShiftDilate(mask, w, h, sx, sy, r);
      for (let y = 0; y < h; y++) {
        for (let x = 0; x < w; x++) {
          let want = 0;
          for (let qy = 0; qy < h && !want; qy++) {
            for (let qx = 0; qx < w; qx++) {
              if (mask[qy * w + qx] && Math.abs(x - qx - sx) <= r && Math.abs(y - qy - sy) <= r) {
                want = 1;
                break;
              }
            }
          }
          expect(fast[y * w + x], `trial ${trial} (${x}, ${y})`).toBe(want);
        }
      }
    }
  });
});
