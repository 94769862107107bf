import { describe, expect, it } from 'vitest';
import { distanceSquaredCapped, distanceWorkCreate } from '../../../src/core/metrics/distanceCapped.ts';
import { edgeMark } from '../../../src/core/metrics/edgeMark.ts';
import { rngCreate } from '../../support/paint.ts';
import { plainDistance2, plainEdges } from './plainScores.ts';

// The capped transform against brute force (exact Euclidean distance between pixel centres, as
// scipy.ndimage.distance_transform_edt and Felzenszwalb & Huttenlocher 2012 define it).

describe('distanceSquaredCapped', () => {
  it('equals the brute-force squared distance up to limit², and limit² + 1 beyond', () => {
    const rng = rngCreate(42);
    for (const [w, h, share, limit] of [[1, 1, 0.5, 64], [13, 1, 0.1, 64], [1, 17, 0.1, 64], [37, 29, 0.02, 64], [90, 70, 0.002, 64], [60, 41, 0.01, 5], [80, 3, 0.01, 254]] as const) {
      for (let rep = 0; rep < 4; rep++) {
        const marks = new Uint8Array(w * h).map(() => (rng() < share ? 1 : 0));
        const out = new Uint16Array(w * h);
        distanceSquaredCapped(marks, w, h, limit, out, distanceWorkCreate(w));
        const want = plainDistance2(Array.from(marks, (m) => m === 1), w, h).map((d) => (d <= limit * limit ? d : limit * limit + 1));
        expect(Array.from(out)).toEqual(want);
      }
    }
  });
  it('marks nothing as near when there are no marked pixels', () => {
    const out = new Uint16Array(12);
    distanceSquaredCapped(new Uint8Array(12), 4, 3, 64, out, distanceWorkCreate(4));
    expect(Array.from(out)).toEqual(new Array(12).fill(64 * 64 + 1));
  });
});

describe('edgeMark', () => {
  it('marks pixels with a differing 4-neighbour inside the image, as the plain definition', () => {
    const rng = rngCreate(7);
    const codes = new Uint16Array(23 * 19).map(() => (rng() < 0.9 ? 1 : Math.floor(rng() * 4)));
    const out = new Uint8Array(codes.length);
    const count = edgeMark(codes, 23, 19, out);
    const want = plainEdges(codes, 23, 19);
    expect(Array.from(out, (v) => v === 1)).toEqual(want);
    expect(count).toBe(want.filter(Boolean).length);
  });
});
