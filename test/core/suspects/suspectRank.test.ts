import { describe, expect, it } from 'vitest';
import type { SuspectCandidate } from '../../../src/core/suspects/suspectCandidates.ts';
import { suspectOrder, suspectQueue, suspectRank, suspectScore, type ScoredCandidate } from '../../../src/core/suspects/suspectQueue.ts';
import { SUSPECT_DEFAULTS } from '../../../src/core/suspects/suspectSettings.ts';
import { rngCreate } from '../../support/paint.ts';

// The queue ranked from stored evidence (a results folder, merged shards) must equal the queue of the
// whole dataset in one pass: merging never crosses frames, so the dataset's queue is the best
// queueMax entries of each frame's own queue. Checked here on random candidates with ties.

const className = (id: number) => `c${id}`;

function candidates(seed: number, frames: number): SuspectCandidate[] {
  const rnd = rngCreate(seed);
  const out: SuspectCandidate[] = [];
  for (let f = 0; f < frames; f++) {
    const n = Math.floor(rnd() * 7);
    for (let i = 0; i < n; i++) {
      const x = Math.floor(rnd() * 60), y = Math.floor(rnd() * 40), w = 1 + Math.floor(rnd() * 12), h = 1 + Math.floor(rnd() * 12);
      const geometry = Math.round(rnd() * 4) / 4; // coarse values make ties
      out.push({
        frameIndex: f, frame: `f${f}`, run: rnd() < 0.5 ? 'a' : 'b', regionId: i, truthSegment: Math.floor(rnd() * 3), kind: 'missedObject',
        truthClass: Math.floor(rnd() * 3), predictedClass: 3 + Math.floor(rnd() * 2), bbox: [x, y, x + w, y + h], area: Math.ceil((w * h) / 2),
        thickness: 2, bandShare: 0.3, geometry, agreement: null, agreementRuns: [], image: null, edges: null, confidenceHist: null, appearanceHist: null, cells: [], bound: geometry,
      });
    }
  }
  return out;
}

const scoredOf = (c: SuspectCandidate): ScoredCandidate => {
  const signals = { geometry: c.geometry, agreement: null, confidence: null, image: null, appearance: null, temporal: 0, steady: 0, habit: 0 };
  return { c, signals, score: suspectScore(signals, SUSPECT_DEFAULTS), threshold: null, flip: { share: 0, before: null, after: null } };
};

describe('suspectRank', () => {
  it('the dataset queue equals the best queueMax entries of the frames\' own queues', () => {
    for (const seed of [1, 2, 3]) {
      const all = candidates(seed, 40);
      for (const queueMax of [5, 17, 1000]) {
        const s = { ...SUSPECT_DEFAULTS, queueMax };
        const whole = suspectQueue({ candidates: all, grids: all.map(() => null), confidence: new Map(), className }, s);
        const heads: { c: SuspectCandidate; score: number; entry: ReturnType<typeof suspectRank>[number] }[] = [];
        for (let f = 0; f < 40; f++) {
          const mine = all.filter((c) => c.frameIndex === f);
          const byRegion = new Map(mine.map((c) => [`${c.run}/${c.regionId}`, c]));
          for (const e of suspectRank(mine.map(scoredOf), { className }, { ...s, queueMax: Infinity })) {
            heads.push({ c: byRegion.get(`${e.run}/${e.regionId}`)!, score: e.score, entry: e });
          }
        }
        const best = heads.sort(suspectOrder).slice(0, queueMax).map((h) => h.entry);
        expect(best.length).toBe(whole.length);
        expect(best).toEqual(whole);
      }
    }
  });
});
