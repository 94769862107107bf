// The page's own scoring keeps only compact queue evidence (src/state/queueEvidence.ts): candidates
// with their temporal evidence, grids only while a neighbour needs them. Its queue must equal the one
// pass over every full result (suspectQueueOfResults, the ranking the queue has always had) on
// generated yard scenes with planted label mistakes (test/support/habitScenes.ts), whatever order the
// frames land in, and it must let go of the grids as it goes.
import { describe, expect, it } from 'vitest';
import { suspectQueueOfResults } from '../../src/core/suspects/suspectQueue.ts';
import { SUSPECT_DEFAULTS } from '../../src/core/suspects/suspectSettings.ts';
import { scoreOrder } from '../../src/state/scoringRun.ts';
import { queueEvidenceAdd, queueEvidenceCreate, queueOfEvidence } from '../../src/state/queueEvidence.ts';
import { habitSceneBuild } from '../support/habitScenes.ts';

describe('queue evidence: the page queue from compact evidence', () => {
  const scene = habitSceneBuild({ seed: 11, frames: 24, runs: 2, habitShare: 0.6, photos: true });
  const n = scene.results.length;
  const oneWay = suspectQueueOfResults(scene.results, String, SUSPECT_DEFAULTS);

  for (const [what, order] of [
    ['in frame order', Array.from({ length: n }, (_, i) => i)],
    ['around a frame in the middle (a deep link)', scoreOrder(Array.from({ length: n }, (_, i) => i), 13)],
    ['backwards', Array.from({ length: n }, (_, i) => n - 1 - i)],
  ] as const) {
    it(`equals the one-pass queue with frames landing ${what}`, () => {
      const q = queueEvidenceCreate(n, SUSPECT_DEFAULTS);
      let mostHeld = 0;
      for (const i of order) {
        queueEvidenceAdd(q, i, scene.results[i]);
        mostHeld = Math.max(mostHeld, q.held.size);
      }
      expect(oneWay.length).toBeGreaterThan(5);
      expect(queueOfEvidence(q, String)).toEqual(oneWay);
      // Grids are let go once every neighbour has its evidence: none at the end, a few at most on the way.
      expect(q.held.size).toBe(0);
      expect(mostHeld).toBeLessThanOrEqual(4 * SUSPECT_DEFAULTS.temporalWindow + 2);
    });
  }
});
