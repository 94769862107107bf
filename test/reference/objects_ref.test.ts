import { beforeAll, describe, expect, it } from 'vitest';
import { codeTableBuild } from '../../src/core/metrics/codes.ts';
import { objectSizeBins, objectSizeCountsAdd, objectSizeCountsCreate, smallObjectRecall } from '../../src/core/objects/objectsBySize.ts';
import { instanceCountsAdd, instanceCountsCreate, instanceIoU } from '../../src/core/objects/instanceIoU.ts';
import { truthObjectsOf } from '../../src/core/objects/truthObjects.ts';
import { flipBackCountsAdd, flipBackCountsCreate, flipBackRate } from '../../src/core/temporal/flipBack.ts';
import { sequencePlaces } from '../../src/core/temporal/sequences.ts';
import { CLASS_IDS, IGNORE, objectsRefRun, sequenceMake, type Frame } from './objectsRef.ts';
import { pythonRefRequire, reportDifferences } from './pythonRef.ts';

// Objects, object recall by size, iIoU and flip-back checked against test/reference/objects_ref.py:
// scipy.ndimage.label with a 3×3 structure of ones for the objects, a numpy reading of Cordts et al.,
// CVPR 2016, §3.2 for iIoU, and a numpy reading of src/docs/metrics.md "Flicker" for flip-back.

function tsRun(frames: Frame[]): Record<string, unknown> {
  const k = CLASS_IDS.length;
  const codes = codeTableBuild(CLASS_IDS, IGNORE);
  const sizes = objectSizeCountsCreate(k);
  const inst = instanceCountsCreate(k);
  const fp = new Float64Array(k);
  const places = sequencePlaces(frames.map((f) => f.name));
  const all = flipBackCountsCreate(k);
  const outFrames = frames.map((f, t) => {
    const { width, height } = f.truth;
    const objects = truthObjectsOf(f.truth.ids, f.pred.ids, width, height, codes, k);
    objectSizeCountsAdd(sizes, objects);
    instanceCountsAdd(f.truth.ids, f.pred.ids, f.instances, codes, k, inst);
    for (let i = 0; i < f.truth.ids.length; i++) {
      const g = codes[f.truth.ids[i]], p = codes[f.pred.ids[i]];
      if (g < k && p < k && g !== p) fp[p]++;
    }
    const list = [];
    for (let o = 0; o < objects.count; o++) list.push({ classId: CLASS_IDS[objects.classIndex[o]], area: objects.area[o], hits: objects.hits[o] });
    list.sort((a, b) => a.classId - b.classId || a.area - b.area || a.hits - b.hits);
    const line: Record<string, unknown> = { name: f.name, objects: list, smallObjectRecall: smallObjectRecall(objects), flipBack: null, flipBackVoid: null };
    const { prev, next } = places[t];
    if (prev !== null && next !== null) {
      const fb = flipBackCountsAdd(f.truth.ids, frames[prev].pred.ids, f.pred.ids, frames[next].pred.ids, codes, k, flipBackCountsCreate(k));
      line.flipBack = flipBackRate(fb.flips, fb.pixels);
      line.flipBackVoid = flipBackRate(fb.flipsVoid, fb.pixelsVoid);
      line.classFlipBack = CLASS_IDS.map((_, c) => flipBackRate(fb.classFlips[c], fb.classPixels[c]));
      all.flips += fb.flips;
      all.pixels += fb.pixels;
      all.flipsVoid += fb.flipsVoid;
      all.pixelsVoid += fb.pixelsVoid;
    }
    return line;
  });
  return {
    frames: outFrames,
    objectsBySize: objectSizeBins(sizes, null),
    objectsBySizePerClass: CLASS_IDS.map((_, c) => objectSizeBins(sizes, c)),
    iIoU: instanceIoU(inst, fp),
    flipBack: flipBackRate(all.flips, all.pixels),
    flipBackVoid: flipBackRate(all.flipsVoid, all.pixelsVoid),
  };
}

beforeAll(() => pythonRefRequire());

describe('objects, iIoU and flip-back against numpy/scipy', () => {
  it('agree on a seeded dataset of two sequences, a lone frame and a name with no number', () => {
    const frames = [
      ...sequenceMake(['quay/cam_0001', 'quay/cam_0002', 'quay/cam_0003', 'quay/cam_0004'], 160, 100, 11),
      ...sequenceMake(['quay/cam_0010_b'], 40, 30, 21),
      ...sequenceMake(['yard/run7_0005', 'yard/run7_0006', 'yard/run7_0009'], 57, 83, 31, 0.3),
      ...sequenceMake(['stills/overview'], 33, 17, 41),
    ];
    const ts = tsRun(frames);
    const py = objectsRefRun(frames);
    expect(reportDifferences(ts, py, 1e-9)).toEqual([]);
    // The dataset exercises what it claims to: flips, void flips, small and large objects, instances.
    const lines = ts.frames as { flipBack: number | null; flipBackVoid: number | null }[];
    expect(lines.filter((l) => l.flipBack !== null).length).toBe(3);
    expect(lines.some((l) => (l.flipBack ?? 0) > 0 && (l.flipBackVoid ?? 0) > 0)).toBe(true);
    const bins = ts.objectsBySize as { objects: number }[];
    expect(bins[0].objects).toBeGreaterThan(0);
    expect(bins[5].objects).toBeGreaterThan(0);
    expect((ts.iIoU as { mean: number | null }).mean).not.toBeNull();
  });
});
