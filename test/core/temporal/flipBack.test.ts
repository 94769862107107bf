import { describe, expect, it } from 'vitest';
import { codeTableBuild } from '../../../src/core/metrics/codes.ts';
import { flipBackCountsAdd, flipBackCountsCreate, flipBackRate } from '../../../src/core/temporal/flipBack.ts';

// Hand-worked cases of src/docs/metrics.md "Flicker" (flip-back rate: pred[t-1] == pred[t+1] and
// pred[t] != pred[t-1]), classes 0, 1, 2 and void 255.
const codes = codeTableBuild([0, 1, 2], 255);
const u8 = (a: number[]) => Uint8Array.from(a);

describe('flipBackCountsAdd', () => {
  it('counts a pixel that leaves and comes back, not one that changes for good or changes twice', () => {
    //                  back  kept  moved  twice  back-void  still-void
    const truth = u8([0, 1, 1, 2, 255, 255]);
    const prev = u8([0, 1, 1, 2, 0, 1]);
    const cur = u8([1, 1, 2, 0, 2, 1]);
    const next = u8([0, 1, 2, 1, 0, 1]);
    const c = flipBackCountsAdd(truth, prev, cur, next, codes, 3, flipBackCountsCreate(3));
    expect([c.flips, c.pixels, c.flipsVoid, c.pixelsVoid]).toEqual([1, 4, 1, 2]);
    expect(flipBackRate(c.flips, c.pixels)).toBe(0.25);
    expect(flipBackRate(c.flipsVoid, c.pixelsVoid)).toBe(0.5);
    // Per class, by the t-1 prediction over non-void truth: class 0 had 1 pixel (flipped), class 1 two, class 2 one.
    expect([...c.classFlips]).toEqual([1, 0, 0]);
    expect([...c.classPixels]).toEqual([1, 2, 1]);
  });

  it('treats a truth id outside the class table as void, and a t-1 prediction outside it as no class', () => {
    const c = flipBackCountsAdd(u8([7, 0]), u8([9, 9]), u8([1, 1]), u8([9, 9]), codes, 3, flipBackCountsCreate(3));
    expect([c.flips, c.pixels, c.flipsVoid, c.pixelsVoid]).toEqual([1, 1, 1, 1]);
    expect([...c.classPixels]).toEqual([0, 0, 0]);
  });

  it('gives no rate for an empty set', () => {
    const c = flipBackCountsAdd(u8([255]), u8([0]), u8([1]), u8([0]), codes, 3, flipBackCountsCreate(3));
    expect(flipBackRate(c.flips, c.pixels)).toBeNull();
    expect(flipBackRate(c.flipsVoid, c.pixelsVoid)).toBe(1);
  });
});
