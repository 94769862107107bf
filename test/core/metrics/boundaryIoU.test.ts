import { describe, expect, it } from 'vitest';
import { innerBandReset, innerBandRow, innerBandTail, innerBandWorkCreate } from '../../../src/core/metrics/boundaryIoU.ts';
import { rngCreate } from '../../support/paint.ts';
import { randomPair } from '../../support/randomMaps.ts';
import { plainInnerBand } from './plainScores.ts';

// The all-classes-at-once window reading (a pixel is in its own class's inner band iff its
// (2·dil+1)² window leaves the image or holds another value) must equal, class by class, the
// definition of Cheng et al. (CVPR 2021) as src/docs/metrics.md states it: X minus X eroded dil times with a
// 3×3 square, pixels outside the image not in X; then void-truth pixels are removed.

function kernelCounts(truth: Uint16Array, pred: Uint16Array, w: number, h: number, k: number, dil: number) {
  const inter = new Uint32Array(k), union = new Uint32Array(k);
  const work = innerBandWorkCreate(w);
  innerBandReset(work, w);
  for (let y = 0; y < h; y++) innerBandRow(truth, pred, w, y, dil, k, work, inter, union);
  innerBandTail(truth, pred, w, h, dil, k, inter, union);
  return { inter: Array.from(inter), union: Array.from(union) };
}

function erosionCounts(truth: Uint16Array, pred: Uint16Array, w: number, h: number, k: number, dil: number) {
  const inter: number[] = [], union: number[] = [];
  for (let c = 0; c < k; c++) {
    const valid = Array.from(truth, (t) => t < k);
    const g = plainInnerBand(Array.from(truth, (t) => t === c), w, h, dil).map((b, i) => b && valid[i]);
    const p = plainInnerBand(Array.from(pred, (v) => v === c), w, h, dil).map((b, i) => b && valid[i]);
    inter.push(g.filter((b, i) => b && p[i]).length);
    union.push(g.filter((b, i) => b || p[i]).length);
  }
  return { inter, union };
}

describe('Boundary IoU inner bands, all classes in one scan', () => {
  it('equal per-class erosion on random multi-label maps for every dilation, including dil past the image', () => {
    const rng = rngCreate(3);
    let seed = 1;
    for (const [w, h] of [[1, 1], [2, 5], [6, 2], [11, 13], [25, 9], [30, 30]] as const) {
      for (const dil of [1, 2, 3, 5, 8, 40]) {
        // Codes: 0..2 are classes, 3 is void, 4+ are ids outside the table (see codes.ts).
        const { truth, pred } = randomPair(w, h, seed++, { classIds: [0, 1, 2], ignore: 3, invalidIds: [4, 5], voids: true, shapes: 8 });
        const t = Uint16Array.from(truth.ids, (v) => (rng() < 0.01 ? 6 : v));
        const p = Uint16Array.from(pred.ids);
        expect(kernelCounts(t, p, w, h, 3, dil)).toEqual(erosionCounts(t, p, w, h, 3, dil));
      }
    }
  });
});
