// The likely-label-mistake score of one region from its signals, split into what each signal added, so
// a reviewer can see why an item ranks where it does.
import type { SuspectSignals } from './suspectReasons.ts';
import type { SuspectSettings } from './suspectSettings.ts';

/** The parts of a score, in score units: the score is 0.5 plus their sum. */
export const CONTRIBUTION_KEYS = ['agreement', 'confidence', 'appearance', 'image', 'geometry', 'habit', 'temporal', 'steady', 'gate', 'learned'] as const;
export type ContributionKey = (typeof CONTRIBUTION_KEYS)[number];
export type SuspectContributions = Record<ContributionKey, number>;

/** Words for each part in the contributions text. */
const CONTRIBUTION_WORDS: Record<ContributionKey, string> = {
  agreement: 'run agreement', confidence: 'confidence', appearance: 'appearance', image: 'image edges', geometry: 'shape',
  habit: 'common confusion', temporal: 'label flip', steady: 'steady', gate: 'thin sliver', learned: 'your verdicts',
};

/** Returns contributions that are all 0. */
export function contributionsZero(): SuspectContributions {
  return Object.fromEntries(CONTRIBUTION_KEYS.map((k) => [k, 0])) as SuspectContributions;
}

/**
 * Returns the score 0..1 of a region from its signals and what each part contributed (score = 0.5 + Σ):
 * the weighted mean of geometry, agreement, confidence, appearance and image (those it has) and a
 * "common confusion" term of value 0 taking weight h·weightAgreement from agreement (which keeps
 * weightAgreement·(1 − h)) for habit h of its class pair, in one run or several; each term contributes w·(v − 0.5)/Σw.
 * Then raised by a label flip, 1 − (1 − mean)(1 − weightTemporal·flip), lowered by steadiness,
 * ·(1 − weightSteady·steady), and scaled by the geometry gate; each step contributes the change it makes.
 */
export function suspectScoreOf(v: SuspectSignals, s: SuspectSettings): { score: number; contributions: SuspectContributions } {
  const h = v.habit;
  const terms: [ContributionKey, number | null, number][] = [
    ['geometry', v.geometry, s.weightGeometry],
    ['agreement', v.agreement, s.weightAgreement * (1 - h)],
    ['confidence', v.confidence, s.weightConfidence],
    ['appearance', v.appearance, s.weightAppearance],
    ['image', v.image, s.weightImage],
    ['habit', 0, h * s.weightAgreement],
  ];
  const out = contributionsZero();
  let weight = 0;
  for (const [, x, w] of terms) if (x !== null && w > 0) weight += w;
  let mean = 0.5;
  if (weight > 0) {
    for (const [k, x, w] of terms) {
      if (x === null || w <= 0) continue;
      out[k] = (w * (x - 0.5)) / weight;
      mean += out[k];
    }
  }
  const raised = 1 - (1 - mean) * (1 - s.weightTemporal * v.temporal);
  out.temporal = raised - mean;
  const steadied = raised * (1 - s.weightSteady * v.steady);
  out.steady = steadied - raised;
  const gate = s.geometryGate > 0 && v.geometry < s.geometryGate ? v.geometry / s.geometryGate : 1;
  const score = steadied * gate;
  out.gate = score - steadied;
  return { score, contributions: out };
}

/** Returns the contributions in words, largest first, those under 0.005 left out: "run agreement +0.31, common confusion −0.22". */
export function contributionsText(c: SuspectContributions): string {
  return CONTRIBUTION_KEYS.filter((k) => Math.abs(c[k]) >= 0.005)
    .sort((a, b) => Math.abs(c[b]) - Math.abs(c[a]))
    .map((k) => `${CONTRIBUTION_WORDS[k]} ${c[k] > 0 ? '+' : '−'}${Math.abs(c[k]).toFixed(2)}`)
    .join(', ');
}
