import { describe, expect, it } from 'vitest';
import { flagBoxCheck, flagFromJson, flagReasonCheck, flagRegionCheck } from '../../../src/core/review/flagCheck.ts';
import { suspectKey, verdictFromJson } from '../../../src/core/review/verdict.ts';

const good = {
  id: 'f1', frame: 'kq-0001', kind: 'rect', bbox: [10, 20, 30, 40], reason: 'label-mistake', note: 'edge of the crane',
  run: 'run-a', createdAt: 1000, updatedAt: 2000,
};

function err(v: unknown): string {
  const r = flagFromJson(v, 'flags[0]');
  if (r.ok) throw new Error('expected an error');
  return r.error;
}

describe('flagFromJson: every field of a stored or imported flag is checked', () => {
  it('accepts a complete flag and copies it (the bbox is a fresh tuple)', () => {
    const r = flagFromJson(good, 'x');
    expect(r.ok && r.value).toEqual(good);
    expect(r.ok && r.value.bbox).not.toBe(good.bbox);
  });

  it('names the field and the flag for each kind of mistake', () => {
    expect(err({ ...good, id: '' })).toMatch(/flags\[0\]: "id" must be a non-empty string/);
    expect(err({ ...good, frame: 7 })).toMatch(/flags\[0\] \(id "f1"\): "frame" must be a non-empty string, got 7/);
    expect(err({ ...good, kind: 'box' })).toMatch(/"kind" must be one of frame, region, rect, got "box"/);
    expect(err({ ...good, bbox: [10, 20, 10, 40] })).toMatch(/"bbox" \[10, 20, 10, 40\] is empty: needs x0 < x1/);
    expect(err({ ...good, bbox: [1.5, 2, 3, 4] })).toMatch(/"bbox" must be \[x0, y0, x1, y1\]/);
    expect(err({ ...good, bbox: [-1, 2, 3, 4] })).toMatch(/"bbox" must be/);
    expect(err({ ...good, bbox: null })).toMatch(/"bbox" must be/);
    expect(err({ ...good, kind: 'frame' })).toMatch(/"bbox" must be null for a whole-frame flag/);
    expect(err({ ...good, reason: '  ' })).toMatch(/"reason" is empty/);
    expect(err({ ...good, reason: 'x'.repeat(65) })).toMatch(/"reason" is 65 characters long; a tag has at most 64/);
    expect(err({ ...good, reason: 'bad\u0007tag' })).toMatch(/"reason" holds a control character/);
    expect(err({ ...good, note: 5 })).toMatch(/"note" must be a string/);
    expect(err({ ...good, note: 'n'.repeat(10_001) })).toMatch(/"note" is 10001 characters long/);
    expect(err({ ...good, run: '' })).toMatch(/"run" must be a non-empty string.*\(or null\)/);
    expect(err({ ...good, createdAt: 'yesterday' })).toMatch(/"createdAt" must be a time between 1970 and 2200, got "yesterday"/);
    expect(err({ ...good, updatedAt: Number.NaN })).toMatch(/"updatedAt" must be/);
    expect(err({ ...good, region: { kind: 'x', truthClass: -1 } })).toMatch(/"region" "truthClass" must be a class id/);
    expect(err([1, 2])).toMatch(/flags\[0\] must be an object/);
  });

  it('a whole-frame flag has a null bbox; missing note and run default to "" and null', () => {
    const r = flagFromJson({ id: 'a', frame: 'f', kind: 'frame', reason: 'unsure', createdAt: 0, updatedAt: 0 }, 'x');
    expect(r.ok && r.value).toEqual({ id: 'a', frame: 'f', kind: 'frame', bbox: null, reason: 'unsure', note: '', run: null, createdAt: 0, updatedAt: 0 });
  });

  it('user-defined reasons are kept (trimmed); region details are copied', () => {
    expect(flagReasonCheck('  fence posts  ')).toEqual({ ok: true, value: 'fence posts' });
    const region = { kind: 'suspect', truthClass: 3, predictedClass: 5, score: 0.82, reasons: ['compact', 'confident'] };
    const r = flagFromJson({ ...good, kind: 'region', region }, 'x');
    expect(r.ok && r.value.region).toEqual(region);
    expect(flagRegionCheck({ kind: 'k' })).toEqual({ ok: true, value: { kind: 'k', truthClass: null, predictedClass: null, score: null, reasons: [] } });
  });

  it('flagBoxCheck accepts a 1×1 box and refuses inverted ones', () => {
    expect(flagBoxCheck([0, 0, 1, 1])).toEqual({ ok: true, value: [0, 0, 1, 1] });
    expect(flagBoxCheck([5, 0, 4, 1]).ok).toBe(false);
    expect(flagBoxCheck([0, 0, 1]).ok).toBe(false);
  });
});

describe('suspect keys and verdicts', () => {
  it('the key is the same for the same item and differs when any part differs, with no bleeding between fields', () => {
    const ref = { frame: 'a', run: 'b,c', bbox: [1, 2, 3, 4] as const, truthClass: 1, predictedClass: 2 };
    expect(suspectKey(ref)).toBe(suspectKey({ ...ref, bbox: [1, 2, 3, 4] }));
    const others = [
      { ...ref, frame: 'a,b', run: 'c' },
      { ...ref, bbox: [1, 2, 3, 5] as const },
      { ...ref, truthClass: 2, predictedClass: 1 },
      { ...ref, run: null },
    ];
    const keys = new Set([ref, ...others].map(suspectKey));
    expect(keys.size).toBe(5);
  });

  it('verdictFromJson recomputes the key and refuses one that does not match', () => {
    const v = { frame: 'a', run: null, bbox: [0, 0, 2, 2], truthClass: 1, predictedClass: null, verdict: 'model-error', updatedAt: 5 };
    const r = verdictFromJson(v, 'verdicts[0]');
    expect(r.ok && r.value.key).toBe(suspectKey({ frame: 'a', run: null, bbox: [0, 0, 2, 2], truthClass: 1, predictedClass: null }));
    const bad = verdictFromJson({ ...v, key: 'other' }, 'verdicts[0]');
    expect(!bad.ok && bad.error).toMatch(/verdicts\[0\]: "key" "other" does not match/);
    const kind = verdictFromJson({ ...v, verdict: 'fine' }, 'verdicts[1]');
    expect(!kind.ok && kind.error).toMatch(/"verdict" must be one of label-mistake, model-error, unsure/);
  });
});
