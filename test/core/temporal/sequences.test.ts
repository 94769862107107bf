import { describe, expect, it } from 'vitest';
import { sequenceKeyOf, sequencePlaces } from '../../../src/core/temporal/sequences.ts';

// Hand-worked cases of src/docs/metrics.md "Flicker": a sequence is a run of frames, in name order,
// whose keys differ only in their last number.
describe('sequencePlaces', () => {
  it('links neighbours within a run and leaves both ends without a neighbour', () => {
    const p = sequencePlaces(['a/f_001', 'a/f_002', 'a/f_010', 'b/f_001', 'b/f_002', 'still', 'c/x3_y1', 'c/x3_y2']);
    expect(p.map((x) => [x.sequence, x.prev, x.next])).toEqual([
      [0, null, 1], [0, 0, 2], [0, 1, null], // a gap in the numbers is still the next frame of the run
      [1, null, 4], [1, 3, null], // another folder starts another sequence
      [2, null, null], // no number: a sequence of its own
      [3, null, 7], [3, 6, null], // only the last number may differ
    ]);
  });

  it('does not join keys that differ in text around the last number or in an earlier number', () => {
    expect(sequenceKeyOf('cam_0001_left')).not.toBe(sequenceKeyOf('cam_0002_right'));
    expect(sequenceKeyOf('run1_0001')).not.toBe(sequenceKeyOf('run2_0001'));
    expect(sequenceKeyOf('run1_0001')).toBe(sequenceKeyOf('run1_0002'));
    expect(sequenceKeyOf('overview')).toBeNull();
    expect(sequencePlaces(['x1', 'y1', 'x2']).every((q) => q.prev === null && q.next === null)).toBe(true);
  });
});
