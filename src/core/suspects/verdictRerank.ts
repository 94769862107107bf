// The queue re-ranked by the reviewer's verdicts: each item's score shifted by what a logistic model,
// refitted from the verdicts, now says differently from today's weights, with the reason in words.
import { suspectKey, type SuspectVerdictKind } from '../review/verdict.ts';
import type { Suspect } from './suspectQueue.ts';
import { CONTRIBUTION_KEYS, contributionsText, type ContributionKey } from './suspectScore.ts';
import { logisticFit, type VerdictSample } from './verdictLearning.ts';

/**
 * How verdicts re-rank (our own heuristic, README "Likely label mistakes"): the model starts as
 * z = slope·(score − 0.5), one weight `slope` per contribution; `lambda` is the prior's pull back to
 * it; items within `similarDistance` (Euclidean, over the contributions) or of the same class pair
 * count as similar in the reason.
 */
export const LEARN_DEFAULTS = { slope: 8, lambda: 1, similarDistance: 0.15 } as const;

/** The features the model reads: contributions (the learned one aside), then one indicator per judged class pair. */
const FEATURE_KEYS = CONTRIBUTION_KEYS.filter((k): k is Exclude<ContributionKey, 'learned'> => k !== 'learned');

const pairOf = (s: Pick<Suspect, 'truthClass' | 'predictedClass'>) => `${s.truthClass}>${s.predictedClass}`;
const sigmoid = (z: number) => 1 / (1 + Math.exp(-z));

/** Returns the verdict key of a queue item (the same item keeps it when the queue is rebuilt). */
export function suspectItemKey(s: Pick<Suspect, 'frame' | 'run' | 'bbox' | 'truthClass' | 'predictedClass'>): string {
  return suspectKey({ frame: s.frame, run: s.run, bbox: s.bbox, truthClass: s.truthClass, predictedClass: s.predictedClass });
}

function featuresOf(s: Suspect, pairs: readonly string[]): number[] {
  return [...FEATURE_KEYS.map((k) => s.contributions[k]), ...pairs.map((p) => (pairOf(s) === p ? 1 : 0))];
}

function distance(a: Suspect, b: Suspect): number {
  let d = 0;
  for (const k of FEATURE_KEYS) d += (a.contributions[k] - b.contributions[k]) ** 2;
  return Math.sqrt(d);
}

/**
 * Returns the queue re-ranked by `verdicts` (by item key; "unsure" teaches nothing): a logistic model
 * over each item's contributions and class pair, p = σ(θ·x), fitted to the judged items (label mistake
 * 1, model error 0) with a prior centred on today's weights (logisticFit); each item's score moves by
 * σ(θ·x) − σ(θ0·x) (clamped to 0..1), shown as the "learned" contribution, and items that moved by
 * 0.02 or more get a reason naming the similar judged items ("3 similar items were judged model
 * errors"). With no usable verdict the queue comes back as it was. New objects; the input is not changed.
 */
export function suspectsRerank(queue: readonly Suspect[], verdicts: ReadonlyMap<string, SuspectVerdictKind>, o = LEARN_DEFAULTS): Suspect[] {
  const judged: { s: Suspect; y: 0 | 1 }[] = [];
  for (const s of queue) {
    const v = verdicts.get(suspectItemKey(s));
    if (v === 'label-mistake' || v === 'model-error') judged.push({ s, y: v === 'label-mistake' ? 1 : 0 });
  }
  if (judged.length === 0) return [...queue];
  const pairs = [...new Set(judged.map((j) => pairOf(j.s)))];
  const theta0 = [...FEATURE_KEYS.map(() => o.slope), ...pairs.map(() => 0)];
  const samples: VerdictSample[] = judged.map((j) => ({ x: featuresOf(j.s, pairs), y: j.y }));
  const theta = logisticFit(samples, theta0, o.lambda);
  const dot = (t: readonly number[], x: readonly number[]) => t.reduce((a, v, i) => a + v * x[i], 0);
  const out = queue.map((s): Suspect => {
    const x = featuresOf(s, pairs);
    const shift = sigmoid(dot(theta, x)) - sigmoid(dot(theta0, x));
    const score = Math.min(1, Math.max(0, s.score + shift));
    const contributions = { ...s.contributions, learned: s.contributions.learned + score - s.score };
    let learnedReason: string | null = null;
    if (Math.abs(score - s.score) >= 0.02) {
      const similar = judged.filter((j) => j.s !== s && (pairOf(j.s) === pairOf(s) || distance(j.s, s) <= o.similarDistance));
      const want = shift > 0 ? 1 : 0;
      const n = similar.filter((j) => j.y === want).length;
      const what = want ? 'label mistakes' : 'model errors';
      learnedReason = n > 0
        ? `${n} similar item${n === 1 ? ' was' : 's were'} judged ${n === 1 ? what.slice(0, -1) : what} (${shift > 0 ? 'up' : 'down'} ${Math.abs(score - s.score).toFixed(2)})`
        : `your verdicts weigh its evidence ${shift > 0 ? 'up' : 'down'} (${Math.abs(score - s.score).toFixed(2)})`;
    }
    return { ...s, score, contributions, contributionsText: contributionsText(contributions), learnedReason };
  });
  // A stable sort: items whose scores tie keep the queue's own order (its tie-breaks: area, then frame).
  return out.sort((a, b) => b.score - a.score);
}
