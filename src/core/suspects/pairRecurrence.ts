// How common each (truth class → predicted class) confusion is across the dataset, per run: a count of
// frames, so the tally of a dataset is the sum of its frames' tallies and shards merge exactly.
import type { SuspectFrame } from './suspectCandidates.ts';
import type { SuspectSettings } from './suspectSettings.ts';

/** Per run: frames scored, and per pair key `g>p` the frames where the run shows that pair as a solid region the other runs back. */
export type PairRecurrence = Map<string, { frames: number; pairs: Map<string, number> }>;

/** Returns the key of a (truth class, predicted class) pair in a PairRecurrence. */
export function pairKeyOf(truthClass: number, predictedClass: number): string {
  return `${truthClass}>${predictedClass}`;
}

/**
 * Adds one frame's tally to `acc`: for every run with regions, one frame scored, and one frame for each
 * class pair it shows as a listed region that is not boundary jitter (kind other than "boundary" and at
 * least `thickPx` thick) and that the other runs of the frame, if any, back (they predict the same
 * class on at least half of it on average): a shared habit is the runs making one error together, not
 * each making its own errors of a common pair. Counting frames, not pixels, keeps one large region from
 * looking like a habit.
 */
export function pairRecurrenceAdd(acc: PairRecurrence, result: SuspectFrame, s: Pick<SuspectSettings, 'thickPx'>): void {
  if (result.error) return;
  for (const r of result.runs) {
    if (!r.regions) continue;
    let e = acc.get(r.run);
    if (!e) acc.set(r.run, (e = { frames: 0, pairs: new Map() }));
    e.frames++;
    const seen = new Set<string>();
    for (const g of r.regions.regions) {
      if (g.predictedClass === null || g.kind === 'boundary' || g.thickness < s.thickPx) continue;
      const others = g.evidence.agreement;
      if (others.length && others.reduce((a, x) => a + x.share, 0) / others.length < 0.5) continue;
      seen.add(pairKeyOf(g.truthClass, g.predictedClass));
    }
    for (const k of seen) e.pairs.set(k, (e.pairs.get(k) ?? 0) + 1);
  }
}

/** Adds tally `b` into `a` (shards of one dataset: the sum equals the tally of all their frames). */
export function pairRecurrenceMerge(a: PairRecurrence, b: PairRecurrence): void {
  for (const [run, eb] of b) {
    let ea = a.get(run);
    if (!ea) a.set(run, (ea = { frames: 0, pairs: new Map() }));
    ea.frames += eb.frames;
    for (const [k, n] of eb.pairs) ea.pairs.set(k, (ea.pairs.get(k) ?? 0) + n);
  }
}

/** How common one pair is: the share of frames (0..1) and the frames, in the run where it is rarest. */
export interface PairHabit {
  /** Lowest over the runs with scored frames of (frames showing the pair / frames scored), 0..1. */
  share: number;
  /** Frames showing the pair in that run. */
  frames: number;
  /** Frames that run scored. */
  of: number;
  /** Habit strength 0..1 (see pairHabitOf). */
  habit: number;
}

/**
 * Returns how common pair g→p is in every run: the lowest share of frames showing it over the runs
 * (a labeller's slip is one label, so a pair that only one run makes often is that run's habit, and a
 * pair every run makes often is the models' shared habit either way), and the habit strength: 0 below
 * `recurrenceFrom` or with fewer than `recurrenceMinFrames` frames, 1 at `recurrenceFull`, linear
 * between. Our own heuristic (src/docs/metrics.md "Likely label mistakes: our own heuristics").
 */
export function pairHabitOf(acc: PairRecurrence, g: number, p: number, s: Pick<SuspectSettings, 'recurrenceFrom' | 'recurrenceFull' | 'recurrenceMinFrames'>): PairHabit {
  const key = pairKeyOf(g, p);
  let best: PairHabit | null = null;
  for (const e of acc.values()) {
    if (e.frames === 0) continue;
    const n = e.pairs.get(key) ?? 0;
    const share = n / e.frames;
    if (!best || share < best.share) best = { share, frames: n, of: e.frames, habit: 0 };
  }
  if (!best) return { share: 0, frames: 0, of: 0, habit: 0 };
  if (best.frames >= s.recurrenceMinFrames && s.recurrenceFull > s.recurrenceFrom) {
    best.habit = Math.min(1, Math.max(0, (best.share - s.recurrenceFrom) / (s.recurrenceFull - s.recurrenceFrom)));
  }
  return best;
}
