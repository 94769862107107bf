import { describe, expect, it } from 'vitest';
import { classTableFromJson, classTableGenerated, type ClassTable } from '../../src/core/classTable.ts';
import { frameSizesCheck, labelMapIdsCheck } from '../../src/core/frameCheck.ts';

function table(json: unknown): ClassTable {
  const r = classTableFromJson(json);
  if (!r.ok) throw new Error(r.error);
  return r.value;
}

describe('frameSizesCheck', () => {
  it('returns the common size', () => {
    const parts = [{ file: 'images/f.png', width: 640, height: 480 }, { file: 'truth/f.png', width: 640, height: 480 }];
    expect(frameSizesCheck(parts)).toEqual({ ok: true, value: { width: 640, height: 480 } });
  });
  it('names both files and both sizes when they differ', () => {
    const r = frameSizesCheck([
      { file: 'images/f.png', width: 640, height: 480 },
      { file: 'truth/f.png', width: 640, height: 480 },
      { file: 'predictions/run1/f.png', width: 320, height: 240 },
    ]);
    expect(r).toEqual({
      ok: false,
      error: 'predictions/run1/f.png: is 320×240 pixels but images/f.png is 640×480; all files of a frame must have the same size',
    });
  });
});

describe('labelMapIdsCheck', () => {
  const t = table({ ignore: 255, classes: Array.from({ length: 41 }, (_, id) => ({ id, name: `c${id}`, color: `#0000${id.toString(16).padStart(2, '0')}` })) });

  it('accepts class ids and ignore in ground truth', () => {
    const ids = Uint8Array.from([0, 40, 255, 7]);
    expect(labelMapIdsCheck({ width: 2, height: 2, ids }, t, 'truth/f.png', 'truth')).toEqual({ ok: true, value: undefined });
  });

  it('names an unknown id and its pixel count in ground truth', () => {
    const ids = new Uint16Array(1000).fill(3);
    ids.fill(301, 0, 312);
    expect(labelMapIdsCheck({ width: 100, height: 10, ids }, t, 'truth/frame7.png', 'truth')).toEqual({
      ok: false,
      error: 'truth/frame7.png: 312 pixels have id 301, which is not in classes.json (largest id 40)',
    });
  });

  it('lists up to three unknown ids, most pixels first', () => {
    const ids = new Uint8Array(100).fill(1);
    ids.fill(41, 0, 5); // 5 pixels
    ids.fill(50, 5, 25); // 20
    ids.fill(60, 25, 26); // 1
    ids.fill(61, 26, 36); // 10
    expect(labelMapIdsCheck({ width: 10, height: 10, ids }, t, 'truth/g.png', 'truth')).toEqual({
      ok: false,
      error: 'truth/g.png: 36 pixels have ids that are not in classes.json (largest id 40): 50 (20 pixels), 61 (10 pixels), 41 (5 pixels) and 1 more',
    });
  });

  it('lets predictions hold any id, and skips generated tables', () => {
    const ids = Uint8Array.from([99, 100, 200, 1]);
    expect(labelMapIdsCheck({ width: 2, height: 2, ids }, t, 'p.png', 'prediction').ok).toBe(true);
    expect(labelMapIdsCheck({ width: 2, height: 2, ids }, classTableGenerated(5), 'truth/f.png', 'truth').ok).toBe(true);
  });

  it('says "1 pixel has" for a single pixel', () => {
    const ids = Uint8Array.from([0, 1, 2, 77]);
    const r = labelMapIdsCheck({ width: 2, height: 2, ids }, t, 't.png', 'truth');
    expect(r.ok ? '' : r.error).toBe('t.png: 1 pixel has id 77, which is not in classes.json (largest id 40)');
  });
});
