import { describe, expect, it } from 'vitest';
import { reviewV1Migrate, V1_WRITER } from '../../../src/core/review/reviewMigrate.ts';

// A value exactly as layout 1 stored it: one list per dataset, x/y/width/height boxes, short reasons.
const OLD = {
  version: 1,
  flags: [
    { id: 'a1', frame: 'kq-0003', box: { x: 10, y: 20, width: 30, height: 5 }, reason: 'label', note: 'mast cut off', created: 1700000000000 },
    { id: 'a2', frame: 'kq-0004', box: null, reason: 'model', created: 1700000001000, run: 'run-b' },
    { id: 'a3', frame: 'kq-0004', box: { x: 0, y: 0, width: 1, height: 1 }, reason: 'unsure', note: '', created: 1700000002000 },
    { id: 'a4', frame: 'kq-0005', box: null, reason: 'fence', created: 1700000003000 },
  ],
};

describe('reviewV1Migrate: layout 1 (one list) to layout 2 (one record per flag)', () => {
  it('converts every flag: end-exclusive boxes, kinds, reasons, edit time = creation time', () => {
    const r = reviewV1Migrate(structuredClone(OLD), 'saved');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value).toEqual([
      { type: 'flag', id: 'a1', updatedAt: 1700000000000, writer: V1_WRITER, flag: { id: 'a1', frame: 'kq-0003', kind: 'rect', bbox: [10, 20, 40, 25], reason: 'label-mistake', note: 'mast cut off', run: null, createdAt: 1700000000000, updatedAt: 1700000000000 } },
      { type: 'flag', id: 'a2', updatedAt: 1700000001000, writer: V1_WRITER, flag: { id: 'a2', frame: 'kq-0004', kind: 'frame', bbox: null, reason: 'model-error', note: '', run: 'run-b', createdAt: 1700000001000, updatedAt: 1700000001000 } },
      { type: 'flag', id: 'a3', updatedAt: 1700000002000, writer: V1_WRITER, flag: { id: 'a3', frame: 'kq-0004', kind: 'rect', bbox: [0, 0, 1, 1], reason: 'unsure', note: '', run: null, createdAt: 1700000002000, updatedAt: 1700000002000 } },
      { type: 'flag', id: 'a4', updatedAt: 1700000003000, writer: V1_WRITER, flag: { id: 'a4', frame: 'kq-0005', kind: 'frame', bbox: null, reason: 'fence', note: '', run: null, createdAt: 1700000003000, updatedAt: 1700000003000 } },
    ]);
  });

  it('names the flag and the problem when the old data is unusable', () => {
    const zero = structuredClone(OLD);
    zero.flags[2].box = { x: 0, y: 0, width: 0, height: 1 };
    const r = reviewV1Migrate(zero, 'saved');
    expect(!r.ok && r.error).toMatch(/saved flags\[2\] \(id "a3"\): "bbox" \[0, 0, 0, 1\] is empty/);
    expect(reviewV1Migrate({ version: 2, flags: [] }, 'saved').ok).toBe(false);
    const noList = reviewV1Migrate({ version: 1 }, 'saved');
    expect(!noList.ok && noList.error).toMatch(/"flags" must be an array/);
  });
});
