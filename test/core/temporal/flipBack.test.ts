import { describe, expect, it } from 'vitest';
import { codeTableBuild } from '../../../src/core/metrics/codes.ts';
import { flipBackCountsAdd, flipBackCountsCreate, flipBackRate } from '../../../src/core/temporal/flipBack.ts';
import { harbourPrediction, harbourTruth, HARBOUR_CLASSES, HARBOUR_VOID } from '../../support/harbourScene.ts';
import { flipBackPlain } from './flipBackPlain.ts';

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

describe('flipBackCountsAdd on whole maps (4 pixels a step for 8-bit maps)', () => {
  // Compared with the plain per-pixel definition (flipBackPlain.ts) on the synthetic harbour scene
  // (long runs of one id, a few wobbling borders) and on noise (no runs at all).
  const W = 203, H = 61; // width not a multiple of 4: words straddle rows, and the tail is per pixel
  const harbour = [0, 1, 2].map((s) => harbourPrediction(harbourTruth(W, H, 40), 40 + s, 4).ids as Uint8Array);
  const truthMap = harbourTruth(W, H, 40).ids as Uint8Array;
  const k = HARBOUR_CLASSES.length;
  const hCodes = codeTableBuild(HARBOUR_CLASSES.map((_, i) => i).filter((i) => i !== 5), HARBOUR_VOID); // one class left out: "no class" ids too
  const plainFields = (c: ReturnType<typeof flipBackPlain>) => [c.flips, c.pixels, c.flipsVoid, c.pixelsVoid, [...c.classFlips], [...c.classPixels]];

  it('equals the plain count on harbour-scene predictions, aligned and not aligned to 4 bytes', () => {
    const [p, c, n] = harbour;
    const want = flipBackPlain(truthMap, p, c, n, hCodes, k - 1);
    expect(want.flips + want.flipsVoid).toBeGreaterThan(0);
    expect(plainFields(flipBackCountsAdd(truthMap, p, c, n, hCodes, k - 1, flipBackCountsCreate(k - 1)))).toEqual(plainFields(want));
    const off = (a: Uint8Array) => a.subarray(1);
    const wantOff = flipBackPlain(off(truthMap), off(p), off(c), off(n), hCodes, k - 1);
    expect(plainFields(flipBackCountsAdd(off(truthMap), off(p), off(c), off(n), hCodes, k - 1, flipBackCountsCreate(k - 1)))).toEqual(plainFields(wantOff));
    // prev and next swapped, and t-1 equal to t (no flips at all)
    expect(plainFields(flipBackCountsAdd(truthMap, n, c, p, hCodes, k - 1, flipBackCountsCreate(k - 1)))).toEqual(plainFields(flipBackPlain(truthMap, n, c, p, hCodes, k - 1)));
    expect(plainFields(flipBackCountsAdd(truthMap, p, p, n, hCodes, k - 1, flipBackCountsCreate(k - 1)))).toEqual(plainFields(flipBackPlain(truthMap, p, p, n, hCodes, k - 1)));
  });

  it('equals the plain count on noise over few ids, 8-bit and 16-bit, and adds to earlier counts', () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) >>> 16) % 4;
    const noise = () => Uint8Array.from({ length: 4001 }, () => [0, 1, 2, 255][rnd()]);
    const [t, p, c, n] = [noise(), noise(), noise(), noise()];
    const want = plainFields(flipBackPlain(t, p, c, n, codes, 3));
    expect(plainFields(flipBackCountsAdd(t, p, c, n, codes, 3, flipBackCountsCreate(3)))).toEqual(want);
    const w16 = (a: Uint8Array) => Uint16Array.from(a);
    expect(plainFields(flipBackCountsAdd(w16(t), w16(p), w16(c), w16(n), codes, 3, flipBackCountsCreate(3)))).toEqual(want);
    const twice = flipBackCountsAdd(t, p, c, n, codes, 3, flipBackCountsAdd(t, p, c, n, codes, 3, flipBackCountsCreate(3)));
    expect(plainFields(twice)).toEqual((want as (number | number[])[]).map((v) => (Array.isArray(v) ? v.map((x) => 2 * x) : 2 * v)));
  });
});
