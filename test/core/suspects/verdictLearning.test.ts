import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import type { SuspectVerdictKind } from '../../../src/core/review/verdict.ts';
import { suspectQueueOfResults } from '../../../src/core/suspects/suspectQueue.ts';
import { SUSPECT_DEFAULTS } from '../../../src/core/suspects/suspectSettings.ts';
import { logisticFit, type VerdictSample } from '../../../src/core/suspects/verdictLearning.ts';
import { suspectItemKey, suspectsRerank } from '../../../src/core/suspects/verdictRerank.ts';
import { rngCreate } from '../../support/paint.ts';
import { boxFinds, habitSceneBuild, rankingFigures } from '../../support/habitScenes.ts';
import { pythonRefRequire } from '../../reference/pythonRef.ts';

// Learning from the reviewer (src/core/suspects/verdictLearning.ts, verdictRerank.ts): the fit
// against scipy.optimize.minimize on the same regularised log-likelihood (test/reference/logistic_ref.py),
// and verdicts moving the items that resemble the judged ones on a generated scene.

const LOGISTIC_REF = fileURLToPath(new URL('../../reference/logistic_ref.py', import.meta.url));

function scipyFit(samples: VerdictSample[], theta0: number[], lambda: number): number[] {
  const r = spawnSync('python3', [LOGISTIC_REF], { input: JSON.stringify({ X: samples.map((s) => s.x), y: samples.map((s) => s.y), theta0, lambda }), encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`logistic_ref.py failed: ${r.stderr}`);
  const out = JSON.parse(r.stdout) as { theta: number[]; gradNorm: number };
  expect(out.gradNorm).toBeLessThan(1e-7);
  return out.theta;
}

describe('logisticFit', () => {
  it('finds the θ scipy finds for the same prior and data (several seeds, separable and not)', () => {
    pythonRefRequire();
    for (const seed of [1, 2, 3]) {
      const rng = rngCreate(seed);
      const d = 7;
      const truth = Array.from({ length: d }, () => rng() * 6 - 3);
      const samples: VerdictSample[] = Array.from({ length: 10 + seed * 12 }, () => {
        const x = [1, ...Array.from({ length: d - 1 }, () => rng() - 0.5)];
        const z = x.reduce((a, v, i) => a + v * truth[i], 0);
        return { x, y: (seed === 3 ? z > 0 : rng() < 1 / (1 + Math.exp(-z))) ? 1 : 0 };
      });
      const theta0 = Array.from({ length: d }, (_, j) => (j === 0 ? 0 : 8));
      const ours = logisticFit(samples, theta0, 1);
      const ref = scipyFit(samples, theta0, 1);
      for (let j = 0; j < d; j++) expect(Math.abs(ours[j] - ref[j]), `seed ${seed} θ${j}: ${ours[j]} vs ${ref[j]}`).toBeLessThan(1e-5);
    }
  });

  it('with no samples it stays at θ0', () => {
    expect(logisticFit([], [0, 8, 8], 1)).toEqual([0, 8, 8]);
  });
});

describe('verdicts re-rank the queue', () => {
  // The shared-habit scene of habitScenes.test.ts with common confusion and appearance switched off,
  // so the habit reaches the top (P@12 0.83): the reviewer's verdicts have to do the work.
  const scene = habitSceneBuild({ seed: 11, frames: 24, runs: 2, habitShare: 0.6, photos: true });
  const queue = suspectQueueOfResults(scene.results, String, { ...SUSPECT_DEFAULTS, recurrenceMinFrames: 1e6, weightAppearance: 0 });
  const isHabit = (q: (typeof queue)[number]) => scene.habits.some((h) => boxFinds(q.frame, q.bbox, h));
  const isMistake = (q: (typeof queue)[number]) => scene.mistakes.some((m) => boxFinds(q.frame, q.bbox, m));

  it('no verdicts: the same queue', () => {
    expect(suspectsRerank(queue, new Map())).toEqual(queue);
  });

  it('judging the habit items in the top M model errors moves every other habit item down, with the reason', () => {
    const m = scene.mistakes.length;
    const before = rankingFigures(queue, scene.mistakes);
    const judged = queue.slice(0, m).filter(isHabit);
    expect(judged.length).toBeGreaterThanOrEqual(1);
    const verdicts = new Map<string, SuspectVerdictKind>(judged.map((q) => [suspectItemKey(q), 'model-error']));
    const after = suspectsRerank(queue, verdicts);
    const byKey = new Map(after.map((q) => [suspectItemKey(q), q]));
    // The other items of the habit: its class pair (a building read as a container) in a habit box.
    const others = queue.filter((q) => isHabit(q) && q.truthClass === judged[0].truthClass && q.predictedClass === judged[0].predictedClass && !verdicts.has(suspectItemKey(q)));
    expect(others.length).toBeGreaterThanOrEqual(8);
    for (const q of others) {
      const moved = byKey.get(suspectItemKey(q))!;
      expect(moved.score, `${q.frame}`).toBeLessThan(q.score - 0.02);
      expect(moved.learnedReason).toMatch(new RegExp(`^${judged.length} similar items? (was|were) judged model errors? \\(down 0\\.\\d\\d\\)$`));
      expect(moved.contributions.learned).toBeCloseTo(moved.score - q.score, 12);
      expect(moved.contributionsText).toMatch(/your verdicts −0\.\d\d/);
    }
    const figures = rankingFigures(after, scene.mistakes);
    console.log(`verdicts on ${judged.length} habit items: P@${m} ${before.precision.toFixed(2)} → ${figures.precision.toFixed(2)}`);
    expect(figures.precision).toBe(1);
    // Planted mistakes of other class pairs keep their scores: none moved down by more than 0.02.
    const otherPair = queue.filter((q) => isMistake(q) && (q.truthClass !== judged[0].truthClass || q.predictedClass !== judged[0].predictedClass));
    for (const q of otherPair) expect(byKey.get(suspectItemKey(q))!.score).toBeGreaterThan(q.score - 0.02);
  });

  it('judging a low item a label mistake moves the low items of its class pair up', () => {
    const lowOf = (q: (typeof queue)[number]) => q.score < 0.5;
    const samePair = (a: (typeof queue)[number], b: (typeof queue)[number]) => a !== b && a.truthClass === b.truthClass && a.predictedClass === b.predictedClass;
    const low = queue.find((q) => lowOf(q) && queue.filter((o) => lowOf(o) && samePair(o, q)).length >= 3)!;
    const after = suspectsRerank(queue, new Map([[suspectItemKey(low), 'label-mistake']]));
    const same = after.filter((q) => q.score < 0.6 && q.truthClass === low.truthClass && q.predictedClass === low.predictedClass && suspectItemKey(q) !== suspectItemKey(low));
    const beforeOf = new Map(queue.map((q) => [suspectItemKey(q), q.score]));
    const shifts = same.map((q) => q.score - beforeOf.get(suspectItemKey(q))!);
    expect(shifts.reduce((a, b) => a + b, 0) / shifts.length).toBeGreaterThan(0.02);
    expect(same.some((q) => q.learnedReason?.startsWith('1 similar item was judged label mistake'))).toBe(true);
    // Unsure teaches nothing.
    expect(suspectsRerank(queue, new Map([[suspectItemKey(low), 'unsure']]))).toEqual(queue);
  });
});
