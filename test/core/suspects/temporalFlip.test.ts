import { describe, expect, it } from 'vitest';
import type { FrameGrids } from '../../../src/core/suspects/temporalFlip.ts';
import { temporalFlip } from '../../../src/core/suspects/temporalFlip.ts';

// Constructed 3×3-cell grids over a short sequence, each case plain from the picture: a label that
// flips for one frame while the run does not, a run that changes its mind, a class that moves next
// door, a flip longer than the window.

const G = 4, P = 6, OTHER = 2;

/** Frames whose truth and run grids are all `P`, with the overrides given as [frame, cell, truth, run]. */
function sequence(n: number, overrides: [number, number, number, number][]): FrameGrids[] {
  return Array.from({ length: n }, (_, f) => {
    const truth = new Uint16Array(9).fill(P), run = new Uint16Array(9).fill(P);
    for (const [of, c, t, r] of overrides) if (of === f) (truth[c] = t), (run[c] = r);
    return { name: `f${f}`, grid: { columns: 3, rows: 3, cell: 8, truth }, runs: { a: run } };
  });
}

describe('temporalFlip', () => {
  it('a label that says g for one frame while the run keeps predicting p: a flip, bracketed by its neighbours', () => {
    const frames = sequence(5, [[2, 4, G, P]]);
    expect(temporalFlip(frames, 2, 'a', [4], G, P, 3)).toEqual({ share: 1, before: 'f1', after: 'f3' });
  });

  it('a flip over three frames is found from each of them within a window of 3', () => {
    const frames = sequence(7, [[2, 4, G, P], [3, 4, G, P], [4, 4, G, P]]);
    for (const f of [2, 3, 4]) expect(temporalFlip(frames, f, 'a', [4], G, P, 3)).toEqual({ share: 1, before: 'f1', after: 'f5' });
    // A window of 1 does not reach past the middle frame's neighbours.
    expect(temporalFlip(frames, 3, 'a', [4], G, P, 1).share).toBe(0);
  });

  it('no flip when the run changes its mind, the label says a third class, or a side is missing', () => {
    expect(temporalFlip(sequence(5, [[2, 4, G, P], [1, 4, P, G]]), 2, 'a', [4], G, P, 3).share).toBe(0);
    expect(temporalFlip(sequence(5, [[2, 4, G, P], [3, 4, OTHER, P]]), 2, 'a', [4], G, P, 3).share).toBe(0);
    expect(temporalFlip(sequence(5, [[0, 4, G, P]]), 0, 'a', [4], G, P, 3).share).toBe(0);
    const gap = sequence(5, [[2, 4, G, P]]) as (FrameGrids | null)[];
    gap[1] = null;
    expect(temporalFlip(gap, 2, 'a', [4], G, P, 3).share).toBe(0);
  });

  it('a class that moves into the next cell (a thin object passing by) is no flip', () => {
    // Frame 2: g in cell 4; frame 3: g in cell 5, which held p in frame 2.
    const frames = sequence(5, [[2, 4, G, P], [3, 5, G, P]]);
    expect(temporalFlip(frames, 2, 'a', [4], G, P, 3).share).toBe(0);
    // g that was already next door in frame 2 (the scene around it) does not count as moving.
    const still = sequence(5, [[1, 5, G, P], [2, 4, G, P], [2, 5, G, P], [3, 5, G, P]]);
    expect(temporalFlip(still, 2, 'a', [4], G, P, 3).share).toBe(1);
  });

  it('the share is over the region cells; cells where this frame does not show g under p do not count', () => {
    const frames = sequence(5, [[2, 4, G, P], [2, 0, G, P], [1, 0, G, P], [0, 0, G, P]]);
    // Cell 4 flips; cell 0 holds g from the first frame on (nothing brackets it before), and cell 8
    // shows no disagreement at all.
    expect(temporalFlip(frames, 2, 'a', [0, 4, 8], G, P, 3).share).toBeCloseTo(1 / 3, 12);
  });
});
