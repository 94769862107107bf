import { describe, expect, it } from 'vitest';
import { idPairRunEnd, idRunEnd, idWords } from '../../src/core/idRuns.ts';
import { harbourPrediction, harbourTruth } from '../support/harbourScene.ts';

// Run ends four pixels a step against the pixel-by-pixel definition: every start on harbour-scene
// maps (long runs) and noise (short runs), 8-bit aligned, 8-bit at byte offset 1 (no words) and 16-bit.
const plainEnd = (ids: ArrayLike<number>, j: number, n: number, v: number) => {
  while (j < n && ids[j] === v) j++;
  return j;
};
const plainPairEnd = (t: ArrayLike<number>, p: ArrayLike<number>, j: number, n: number, a: number, b: number) => {
  while (j < n && t[j] === a && p[j] === b) j++;
  return j;
};

describe('idRunEnd and idPairRunEnd', () => {
  const truth = harbourTruth(101, 23, 9).ids as Uint8Array;
  const pred = harbourPrediction({ width: 101, height: 23, ids: truth }, 9, 3).ids as Uint8Array;
  let seed = 1;
  const noise = Uint8Array.from(truth, (v) => ((seed = (seed * 69069 + 1) >>> 0) >>> 30 === 0 ? v + 1 : v));
  const shifted = (a: Uint8Array) => new Uint8Array([0, ...a]).subarray(1);
  const cases: [string, Uint8Array | Uint16Array, Uint8Array | Uint16Array][] = [
    ['8-bit', truth, pred], ['8-bit noise', noise, pred], ['8-bit at byte offset 1', shifted(truth), shifted(pred)],
    ['16-bit', Uint16Array.from(truth), Uint16Array.from(noise)],
  ];
  for (const [name, t, p] of cases) {
    it(`${name}: equal to the plain end from every start`, () => {
      const tw = idWords(t), pw = idWords(p), n = t.length;
      expect(tw !== null).toBe(name === '8-bit' || name === '8-bit noise');
      let long = 0;
      for (let i = 0; i < n; i++) {
        const e = idRunEnd(t, tw, i + 1, n, t[i]);
        expect(e).toBe(plainEnd(t, i + 1, n, t[i]));
        if (e - i > 8) long++;
        expect(idPairRunEnd(t, tw, p, pw, i + 1, n, t[i], p[i])).toBe(plainPairEnd(t, p, i + 1, n, t[i], p[i]));
        expect(idRunEnd(t, tw, i, n - 3, t[i])).toBe(plainEnd(t, i, n - 3, t[i]));
      }
      expect(long).toBeGreaterThan(0);
    });
  }
});
