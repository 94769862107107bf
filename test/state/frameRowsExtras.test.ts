import { describe, expect, it } from 'vitest';
import { frameOrderOf, higherIsBetter, type FrameTable } from '../../src/state/frameRows.ts';

// The frame list's flicker and small-object columns (src/docs/metrics.md "Flicker", "Objects"):
// worst first means the most flip-back first, and the lowest small-object recall first; frames
// without a value (sequence ends, no small objects) go last.
const flip = [null, 0.02, 0.05, 0.01];
const small = [0.5, 0.9, null, 0.2];
const table: FrameTable = {
  count: 4, bandWidth: 3, name: (i) => `f${i}`, pending: () => false, error: () => null,
  value: (i, key) => (key === 'flipBack' ? flip[i] : key === 'smallObjectRecall' ? small[i] : null),
};

describe('frame table: flicker and small-object recall', () => {
  it('reads the values and sorts worst first', () => {
    expect(higherIsBetter('flipBack')).toBe(false);
    expect(higherIsBetter('smallObjectRecall')).toBe(true);
    expect(frameOrderOf(table, 'flipBack', true)).toEqual([2, 1, 3, 0]);
    expect(frameOrderOf(table, 'flipBack', false)).toEqual([3, 1, 2, 0]);
    expect(frameOrderOf(table, 'smallObjectRecall', true)).toEqual([3, 0, 1, 2]);
  });
});
