import type { PairHabit } from './pairRecurrence.ts';
import type { SuspectCandidate } from './suspectCandidates.ts';
import type { TemporalFlip } from './temporalFlip.ts';

/** The signals of one suspect, 0..1 (null where its input is missing). */
export interface SuspectSignals {
  geometry: number;
  agreement: number | null;
  confidence: number | null;
  image: number | null;
  /** Whether the region looks like its predicted class (1) or its labelled class (0) in the photo (appearanceModel.ts). */
  appearance: number | null;
  /** Share of the region's cells where the label flips for a few frames while the run does not. */
  temporal: number;
  /** Share of the frames around where the same disagreement recurs under the same label. */
  steady: number;
  /** Habit strength 0..1 of the region's class pair: how common it is in every run across the dataset (pairRecurrence.ts). */
  habit: number;
}

/** What the sentences need besides the candidate: class names, the threshold used, the temporal bracket, the band width. */
export interface ReasonContext {
  className: (id: number) => string;
  threshold: number | null;
  flip: TemporalFlip;
  bandWidth: number;
  /** How common the region's class pair is across the dataset (absent: not known). */
  pair?: PairHabit;
}

const pct = (v: number) => `${Math.round(v * 100)} %`;
const num = (v: number) => (v >= 10 ? v.toFixed(0) : v.toFixed(1));

function agreementText(c: SuspectCandidate, a: number, ctx: ReasonContext): string {
  const pred = ctx.className(c.predictedClass), label = ctx.className(c.truthClass);
  if (c.agreementRuns.length === 1) {
    const other = c.agreementRuns[0].run;
    return a >= 0.5
      ? `both runs agree on ${pred} here (${other} on ${pct(a)} of it), the label says ${label}`
      : `${other} does not back ${c.run} here: it predicts ${pred} on only ${pct(a)} of it`;
  }
  const backing = c.agreementRuns.filter((r) => r.share >= 0.5).length;
  return `${backing + 1} of ${c.agreementRuns.length + 1} runs predict ${pred} here (the others on ${pct(a)} of it on average), the label says ${label}`;
}

function imageText(c: SuspectCandidate, v: number): string {
  const e = c.edges!;
  const against = v < 0.5;
  if (e.truth === null) {
    return against
      ? `the predicted outline crosses no image edge (edge strength ${num(e.predicted!)}, inside ${num(e.inside!)})`
      : `the predicted outline lies on image edges (edge strength ${num(e.predicted!)}) where the label draws none (inside ${num(e.inside!)})`;
  }
  if (e.predicted === null) {
    return against
      ? `the label's outline lies on image edges (edge strength ${num(e.truth)}, inside ${num(e.inside!)})`
      : `the label's outline crosses no image edge (edge strength ${num(e.truth)}, inside ${num(e.inside!)})`;
  }
  return against
    ? `the label's outline follows image edges better than the predicted one (edge strength ${num(e.truth)} vs ${num(e.predicted)})`
    : `the predicted outline follows image edges better than the label's (edge strength ${num(e.predicted)} vs ${num(e.truth)})`;
}

/**
 * Returns short sentences for a suspect, strongest evidence first: the signals that speak for a label
 * mistake (value ≥ 0.6, temporal > 0), then those that speak against it (≤ 0.3), each naming its signal's numbers.
 */
export function suspectReasons(c: SuspectCandidate, s: SuspectSignals, weights: Record<keyof SuspectSignals, number>, ctx: ReasonContext): string[] {
  const items: { text: string; strength: number }[] = [];
  const pred = ctx.className(c.predictedClass), label = ctx.className(c.truthClass);
  if (s.temporal > 0) {
    items.push({
      strength: 2 + s.temporal,
      text: `the label says ${label} here only briefly: ${pred} in ${ctx.flip.before} and again in ${ctx.flip.after}, while ${c.run} predicts ${pred} in every frame between (${pct(s.temporal)} of its cells)`,
    });
  }
  if (s.steady >= 0.5) {
    items.push({
      strength: -3 - s.steady,
      text: `the label says ${label} here in the frames around too, and ${c.run} predicts ${pred} there as well (${pct(s.steady)}): a steady habit of the model more often than a slip of the labeller`,
    });
  }
  if (s.habit > 0 && ctx.pair) {
    const p = ctx.pair;
    items.push({
      strength: -1 - 2 * s.habit,
      text: `${c.agreementRuns.length ? 'every run predicts' : `${c.run} predicts`} ${pred} where the label says ${label} in many frames (${p.frames} of ${p.of}, ${pct(p.share)}${c.agreementRuns.length ? ' in the run where it is rarest' : ''}): a common confusion of the model${c.agreementRuns.length ? 's, so their agreement counts for less' : ''}`,
    });
  }
  const add = (key: keyof SuspectSignals, v: number | null, text: () => string) => {
    if (v === null) return;
    if (v >= 0.6) items.push({ text: text(), strength: weights[key] * v });
    else if (v <= 0.3) items.push({ text: text(), strength: -1 - weights[key] * (1 - v) });
  };
  add('agreement', s.agreement, () => agreementText(c, s.agreement!, ctx));
  add('confidence', s.confidence, () =>
    s.confidence! >= 0.5
      ? `${c.run} is confident here: ${pct(s.confidence!)} of it at or above its usual confidence for ${pred} (${ctx.threshold!.toFixed(2)}; confident learning, Northcutt et al., JAIR 2021)`
      : `${c.run} is unsure here: only ${pct(s.confidence!)} of it reaches its usual confidence for ${pred} (${ctx.threshold!.toFixed(2)})`,
  );
  add('appearance', s.appearance, () =>
    s.appearance! >= 0.5
      ? `it looks like ${pred} in the photo, not like ${label} (colour and texture against the dataset's undisputed ${pred} and ${label} pixels)`
      : `it looks like ${label} in the photo, as labelled (colour and texture against the dataset's undisputed ${label} and ${pred} pixels)`,
  );
  if (c.edges) add('image', s.image, () => imageText(c, s.image!));
  add('geometry', s.geometry, () =>
    s.geometry >= 0.5
      ? `thick (${num(c.thickness)} px) and away from label boundaries (${pct(1 - c.bandShare)} of it more than ${ctx.bandWidth} px inside)`
      : `thin (${num(c.thickness)} px) and along a label boundary (${pct(c.bandShare)} within ${ctx.bandWidth} px): looks like boundary jitter`,
  );
  if (items.length === 0) {
    items.push({ text: `${c.run} predicts ${pred} where the label says ${label} (${c.area} px, ${num(c.thickness)} px thick)`, strength: 0 });
  }
  return items.sort((a, b) => b.strength - a.strength).map((i) => i.text);
}
