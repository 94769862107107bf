import { describe, expect, it } from 'vitest';
import { digestBandScores, digestCurve, digestSummary, frameDigestOf } from '../../../src/core/metrics/frameDigest.ts';
import { frameScore } from '../../../src/core/metrics/frameScore.ts';
import { frameSummary } from '../../../src/core/metrics/frameSummary.ts';
import { bandCurve, bandScoresAt } from '../../../src/core/metrics/iouFamily.ts';
import { randomPair } from '../../support/randomMaps.ts';

describe('frameDigestOf: the compact per-frame counts the app keeps', () => {
  it('answers every band width exactly as the full band histogram does', () => {
    const ids = [0, 1, 2, 4];
    for (let seed = 1; seed <= 6; seed++) {
      const { truth, pred } = randomPair(61 + seed * 7, 40 + seed, seed, { classIds: ids, ignore: 255, invalidIds: [9, 255], voids: true, shapes: 12 });
      const r = frameScore(truth, pred, ids, { ignore: 255, biouDilationRatio: 0.02, bfTolerance: 0.0075 });
      if (!r.ok) throw new Error(r.error);
      const stats = r.value;
      const d = frameDigestOf(stats);
      expect('band' in d).toBe(false);
      expect(d.bandClass.length).toBeLessThan(stats.band.length);
      for (const w of [0, 1, 3, 7, 20, 64]) {
        const full = bandScoresAt(stats.band, ids.length, w);
        const mine = digestBandScores(d, w);
        expect(mine.meanIoU).toBe(full.meanIoU);
        expect(mine.pixelAccuracy).toBe(full.pixelAccuracy);
        expect(mine.iou).toEqual(full.perClass.map((p) => p.iou));
        expect(digestSummary(d, w)).toEqual(frameSummary(stats, w));
      }
      expect(digestCurve(d)).toEqual(bandCurve(stats.band, ids.length));
    }
  });
});
