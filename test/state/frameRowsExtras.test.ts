import { describe, expect, it } from 'vitest';
import { frameOrderOf, higherIsBetter, rowValue, type FrameRow } from '../../src/state/frameRows.ts';

// The frame list's flicker and small-object columns (src/docs/metrics.md "Flicker", "Objects"):
// worst first means the most flip-back first, and the lowest small-object recall first; frames
// without a value (sequence ends, no small objects) go last.
const row = (index: number, flipBack: number | null, smallObjectRecall: number | null): FrameRow => ({
  index, name: `f${index}`, pending: false, error: null, summary: null, extras: { flipBack, flipBackVoid: null, smallObjectRecall },
});

describe('frame rows: flicker and small-object recall', () => {
  const rows = [row(0, null, 0.5), row(1, 0.02, 0.9), row(2, 0.05, null), row(3, 0.01, 0.2)];
  it('reads the values and sorts worst first', () => {
    expect(rowValue(rows[1], 'flipBack')).toBe(0.02);
    expect(rowValue(rows[3], 'smallObjectRecall')).toBe(0.2);
    expect(higherIsBetter('flipBack')).toBe(false);
    expect(higherIsBetter('smallObjectRecall')).toBe(true);
    expect(frameOrderOf(rows, 'flipBack', true)).toEqual([2, 1, 3, 0]);
    expect(frameOrderOf(rows, 'flipBack', false)).toEqual([3, 1, 2, 0]);
    expect(frameOrderOf(rows, 'smallObjectRecall', true)).toEqual([3, 0, 1, 2]);
  });
});
