import { describe, expect, it } from 'vitest';
import { codeTableBuild } from '../../../src/core/metrics/codes.ts';
import { objectTotalsAdd, objectTotalsCreate, objectTotalsMerge, objectTotalsReport } from '../../../src/core/objects/objectTotals.ts';
import { runObjectsOf } from '../../../src/core/objects/runObjects.ts';
import { truthObjectLabels } from '../../../src/core/objects/truthObjects.ts';
import { flipBackCountsAdd, flipBackCountsCreate } from '../../../src/core/temporal/flipBack.ts';
import { flickerTotalsAdd, flickerTotalsCreate, flickerTotalsMerge, flickerTotalsReport } from '../../../src/core/temporal/flickerTotals.ts';

// Hand-worked objects (src/docs/metrics.md "Objects") and the additivity the report relies on:
// totals summed in two parts and merged equal totals summed in one pass.
const u8 = (s: string) => Uint8Array.from(s.replace(/\s/g, ''), (ch) => (ch === '.' ? 255 : Number(ch)));

describe('runObjectsOf', () => {
  it('finds 8-connected objects, their recall and the missed small ones', () => {
    // 6×4: class 1 forms one object through a corner, class 2 two objects, class 0 the rest, '.' void.
    const truth = u8('100022 010002 000200 ..0000');
    const pred = u8('100000 000002 000200 000000');
    const ids = [0, 1, 2];
    const codes = codeTableBuild(ids, 255);
    const labels = truthObjectLabels(truth, 6, 4, codes, 3);
    const r = runObjectsOf(labels, pred, codes, ids);
    // Objects: class 0 one region of 16 pixels (all 8-connected) recall 1, class 1 {(0,0),(1,1)}
    // recall 1/2, class 2 {(4,0),(5,0),(5,1)} recall 1/3 and {(3,2)} recall 1.
    expect(labels.count).toBe(4);
    expect(r.missed).toEqual([{ classId: 2, area: 3, recall: 1 / 3, box: [4, 0, 5, 1] }]);
    expect(r.smallRecall).toBeCloseTo((1 + 0.5 + 1 / 3 + 1) / 4, 12);
    const t = objectTotalsReport(objectTotalsAdd(objectTotalsCreate(), r.counts, ids), ids);
    expect(t.objectsBySize[0]).toEqual({ minArea: 1, maxArea: 16, objects: 3, meanRecall: (0.5 + 1 / 3 + 1) / 3, detected: 2 / 3 });
    expect(t.objectsBySize[1]).toEqual({ minArea: 16, maxArea: 64, objects: 1, meanRecall: 1, detected: 1 });
    expect(t.objectsBySize[5]).toEqual({ minArea: 4096, maxArea: null, objects: 0, meanRecall: null, detected: null });
    expect(t.objectsBySizePerClass[2].bins[0].objects).toBe(2);
  });
});

describe('totals are additive', () => {
  it('merging two halves gives the one-pass totals, for class lists that differ by frame', () => {
    const frames = [
      { ids: [0, 1], truth: u8('0011 0011 1100'), prev: u8('0011 0111 1100'), cur: u8('0111 0011 1000'), next: u8('0011 0111 1100') },
      { ids: [0, 2], truth: u8('2200 2.00 0022'), prev: u8('2200 2200 0022'), cur: u8('2000 2000 0022'), next: u8('2200 2200 0020') },
      { ids: [1, 2], truth: u8('1122 1122 1122'), prev: u8('1122 1122 1122'), cur: u8('1222 1122 1111'), next: u8('1122 1122 1121') },
    ];
    const one = { o: objectTotalsCreate(), f: flickerTotalsCreate() };
    const parts = [{ o: objectTotalsCreate(), f: flickerTotalsCreate() }, { o: objectTotalsCreate(), f: flickerTotalsCreate() }];
    frames.forEach((fr, i) => {
      const codes = codeTableBuild(fr.ids, 255);
      const labels = truthObjectLabels(fr.truth, 4, 3, codes, fr.ids.length);
      const r = runObjectsOf(labels, fr.cur, codes, fr.ids);
      const fb = flipBackCountsAdd(fr.truth, fr.prev, fr.cur, fr.next, codes, fr.ids.length, flipBackCountsCreate(fr.ids.length));
      for (const t of [one, parts[i === 0 ? 0 : 1]]) {
        objectTotalsAdd(t.o, r.counts, fr.ids);
        flickerTotalsAdd(t.f, fb, fr.ids);
      }
    });
    const all = [0, 1, 2];
    const merged = { o: objectTotalsMerge(parts[0].o, parts[1].o), f: flickerTotalsMerge(parts[0].f, parts[1].f) };
    expect(objectTotalsReport(merged.o, all)).toEqual(objectTotalsReport(one.o, all));
    expect(flickerTotalsReport(merged.f, all)).toEqual(flickerTotalsReport(one.f, all));
    const f = flickerTotalsReport(one.f, all);
    expect(f.flipBackVoid).toBe(1); // the one void pixel went 2 → 0 → 2
    expect(f.flipBack).toBeGreaterThan(0);
  });
});
