import { describe, expect, it } from 'vitest';
import { classTableFromJson } from '../../src/core/classTable.ts';
import { idMapInvalidId, labelMapIdsMap } from '../../src/core/idMap.ts';
import { labelMapRead } from '../../src/core/labelRead.ts';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { rngCreate } from '../support/paint.ts';

const classes = [
  { id: 1, name: 'slab', color: '#111111' },
  { id: 2, name: 'kelp', color: '#222222' },
];

function errorOf(json: object): string {
  const r = classTableFromJson({ classes, ...json }, 'classes.json');
  if (r.ok) throw new Error('expected an error');
  return r.error;
}

describe('id maps of classes.json (README "Your data": truthIds, predictionIds, ignore as a list)', () => {
  it('reads stored id → class id pairs, many to one and many to void', () => {
    const r = classTableFromJson({ ignore: 255, classes, truthIds: { '7': 1, '8': 1, '9': 2, '0': null, '3': null } });
    expect(r.ok && r.value.truthIds).toEqual([[0, null], [3, null], [7, 1], [8, 1], [9, 2]]);
    expect(r.ok && r.value.predictionIds).toBeNull();
  });

  it('bad maps give one-line errors naming the key', () => {
    expect(errorOf({ truthIds: { '7': 4 } })).toBe('classes.json: "truthIds" key "7": 4 is not a class id in "classes" (use null for void)');
    expect(errorOf({ predictionIds: { x: 1 } })).toBe('classes.json: "predictionIds" key "x": stored ids must be integers 0..65535');
    expect(errorOf({ predictionIds: { '70000': 1 } })).toBe('classes.json: "predictionIds" key "70000": stored ids must be integers 0..65535');
    expect(errorOf({ truthIds: [1, 2] })).toMatch(/^classes.json: "truthIds" must be an object from stored id to class id/);
    expect(errorOf({ truthIds: {} })).toBe('classes.json: "truthIds" is empty: list the stored ids, or leave the key out');
    expect(errorOf({ ignore: [0, 2] })).toBe('classes.json: "ignore" lists 2, which is the id of class "kelp"');
    expect(errorOf({ ignore: [] })).toMatch(/"ignore" is an empty list/);
  });

  it('an ignore list makes its other ids void in the truth (identity for the classes)', () => {
    const r = classTableFromJson({ ignore: [255, 0, 254], classes });
    expect(r.ok && r.value.ignore).toBe(255);
    expect(r.ok && r.value.truthIds).toEqual([[0, null], [1, 1], [2, 2], [254, null], [255, null]]);
  });

  it('labelMapIdsMap agrees with a plain per-pixel lookup on random maps, and counts unlisted ids', () => {
    const rng = rngCreate(4);
    const ids = new Uint16Array(5000).map(() => Math.floor(rng() * 12) * 500);
    const pairs: [number, number | null][] = [[0, 1], [500, 2], [1000, null], [1500, 2]];
    const m = labelMapIdsMap({ width: 100, height: 50, ids }, pairs, 255, 77);
    const plain = new Map(pairs.map(([s, c]) => [s, c === null ? 255 : c]));
    ids.forEach((v, i) => expect(m.ids[i]).toBe(plain.get(v) ?? 77));
    expect(m.ids).toBeInstanceOf(Uint8Array);
    expect(m.stored).toBe(ids);
    expect(m.unmapped.reduce((s, u) => s + u.count, 0)).toBe(ids.filter((v) => !plain.has(v)).length);
    expect(idMapInvalidId([0, 1, 2], 255)).toBe(3);
  });

  it('labelMapRead: an unlisted stored id is an error in the truth, counted wrong with a warning in a prediction', () => {
    const t = classTableFromJson({ classes, truthIds: { '7': 1, '9': 2 }, predictionIds: { '0': 1, '1': 2 } });
    if (!t.ok) throw new Error(t.error);
    const png = labelMapToPng({ width: 3, height: 1, ids: new Uint8Array([7, 9, 8]) }, { kind: 'gray', bitDepth: 8 });
    const truth = labelMapRead(png, { file: 'gt/a.png', table: t.value, role: 'truth' });
    expect(truth.ok ? '' : truth.error).toBe('gt/a.png: stored id 8 (1 pixel) not listed in "truthIds" of classes.json; add it (null means void)');
    const predPng = labelMapToPng({ width: 3, height: 1, ids: new Uint8Array([0, 1, 5]) }, { kind: 'gray', bitDepth: 8 });
    const pred = labelMapRead(predPng, { file: 'p/a.png', table: t.value, role: 'prediction' });
    if (!pred.ok) throw new Error(pred.error);
    expect([...pred.value.ids]).toEqual([1, 2, 0]);
    expect([...pred.value.stored!]).toEqual([0, 1, 5]);
    expect(pred.value.warning).toBe('p/a.png: stored id 5 (1 pixel) not listed in "predictionIds" of classes.json; counted as wrong');
  });
});
