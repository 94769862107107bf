import { describe, expect, it } from 'vitest';
import { codeTableBuild } from '../../src/core/metrics/codes.ts';
import { objectSizeBins, objectSizeCountsAdd, objectSizeCountsCreate } from '../../src/core/objects/objectsBySize.ts';
import { truthObjectsOf } from '../../src/core/objects/truthObjects.ts';
import { flipBackCountsAdd, flipBackCountsCreate, flipBackRate } from '../../src/core/temporal/flipBack.ts';
import { DEMO_CLASS, DEMO_CLASS_COUNT, DEMO_IGNORE } from '../../src/demo/classes.ts';
import { demoFrameRaster } from '../../src/demo/frame.ts';
import { DEMO_RUNS } from '../../src/demo/runs.ts';

// The demo's two stories for src/docs/metrics.md "Flicker" and "Objects": run-a flickers (most of
// all over void) in the middle of the sequence; run-b drops small people, bollards and trucks.
describe('demo flicker and small-object stories', () => {
  const o = { width: 384, height: 192, frames: 48, seed: 1 };
  const frames = Array.from({ length: 9 }, (_, i) => demoFrameRaster(18 + i, o));
  const ids = Array.from({ length: DEMO_CLASS_COUNT }, (_, i) => i);
  const codes = codeTableBuild(ids, DEMO_IGNORE);
  const k = ids.length;

  it('run-a flips back over void far more often than run-b, and more over void than elsewhere', () => {
    const rate = Object.fromEntries(DEMO_RUNS.map((run) => {
      const c = flipBackCountsCreate(k);
      for (let t = 1; t + 1 < frames.length; t++) {
        flipBackCountsAdd(frames[t].truth.ids, frames[t - 1].preds[run].ids, frames[t].preds[run].ids, frames[t + 1].preds[run].ids, codes, k, c);
      }
      return [run, { all: flipBackRate(c.flips, c.pixels)!, void: flipBackRate(c.flipsVoid, c.pixelsVoid)! }];
    }));
    expect(rate['run-a'].void).toBeGreaterThan(5 * rate['run-b'].void);
    expect(rate['run-a'].void).toBeGreaterThan(2 * rate['run-a'].all);
  });

  it('run-b recalls small people, bollards and trucks much worse than run-a', () => {
    const small = Object.fromEntries(DEMO_RUNS.map((run) => {
      const sizes = objectSizeCountsCreate(k);
      for (const f of frames) objectSizeCountsAdd(sizes, truthObjectsOf(f.truth.ids, f.preds[run].ids, o.width, o.height, codes, k));
      let n = 0, sum = 0;
      for (const cls of [DEMO_CLASS.person, DEMO_CLASS.bollard, DEMO_CLASS.truck]) {
        const b = objectSizeBins(sizes, cls)[1]; // [16, 64) pixels
        n += b.objects;
        sum += (b.meanRecall ?? 0) * b.objects;
      }
      return [run, { n, recall: sum / n }];
    }));
    expect(small['run-a'].n).toBeGreaterThan(10);
    expect(small['run-b'].recall).toBeLessThan(small['run-a'].recall / 2);
  });
});
