// The label-mistake queue's evidence from neighbouring frames (a label flip, a steady disagreement)
// worked out as frames arrive, in any order, keeping only a few frames' grids and candidates: frame
// f is finished once the frames within temporalWindow on each side are in. A shard reads those few
// frames beyond its edges too, so its evidence equals that of one pass over the whole dataset.
import { candidateIndexBuild, steadyDisagreement } from '../suspects/steadyDisagreement.ts';
import type { SuspectCandidate } from '../suspects/suspectCandidates.ts';
import type { SuspectSettings } from '../suspects/suspectSettings.ts';
import { temporalFlip, type FrameGrids } from '../suspects/temporalFlip.ts';
import type { CandidateEvidence } from './resultRows.ts';

interface Held<T> {
  grids: FrameGrids | null;
  candidates: SuspectCandidate[];
  payload: T | null;
}

/** A window over the dataset's frames in order. */
export interface EvidenceWindow<T> {
  /** Hands over frame `index` (its grids, its candidates, and what `finish` gets back; payload null for a frame read only as a neighbour). */
  add(index: number, grids: FrameGrids | null, candidates: SuspectCandidate[], payload: T | null): void;
  /** Frames held now (arrived and not yet finished or no longer needed). */
  held(): number;
}

/**
 * Returns a window over frames `from`..`to`-1 of a dataset of `total` frames; frames from
 * `from − window` to `to + window − 1` (within the dataset) are expected. `finish(index, payload,
 * candidates, evidence)` is called once per frame from..to−1 with a payload, in order.
 */
export function evidenceWindowCreate<T>(
  total: number, from: number, to: number, s: SuspectSettings,
  finish: (index: number, payload: T, candidates: SuspectCandidate[], evidence: CandidateEvidence[]) => void,
): EvidenceWindow<T> {
  const w = s.temporalWindow;
  const first = Math.max(0, from - w), last = Math.min(total, to + w); // frames read: [first, last)
  const held = new Map<number, Held<T>>();
  let next = from;
  const ready = (f: number) => {
    for (let t = Math.max(first, f - w); t < Math.min(last, f + w + 1); t++) if (!held.has(t)) return false;
    return true;
  };
  const finishFrame = (f: number) => {
    const here = held.get(f)!;
    const evidence = frameEvidenceOf(f, total, s, (t) => held.get(t));
    if (here.payload !== null) finish(f, here.payload, here.candidates, evidence);
  };
  return {
    add(index, grids, candidates, payload) {
      if (index < first || index >= last) throw new Error(`frame ${index} is outside the frames read (${first}..${last - 1})`);
      held.set(index, { grids, candidates, payload });
      while (next < to && ready(next)) {
        finishFrame(next);
        next++;
        for (const t of held.keys()) if (t < next - w) held.delete(t);
      }
    },
    held: () => held.size,
  };
}

/**
 * Returns the temporal evidence of frame `f`'s candidates (label flips, steady disagreement) from the
 * frames within temporalWindow of it, as `at` gives them (undefined: not read or not scored).
 */
export function frameEvidenceOf(
  f: number, total: number, s: SuspectSettings, at: (t: number) => { grids: FrameGrids | null; candidates: readonly SuspectCandidate[] } | undefined,
): CandidateEvidence[] {
  const w = s.temporalWindow;
  const lo = Math.max(0, f - w), hi = Math.min(total - 1, f + w);
  const slice: (FrameGrids | null)[] = [];
  const near: SuspectCandidate[] = [];
  for (let t = lo; t <= hi; t++) {
    const h = at(t);
    slice.push(h?.grids ?? null);
    if (h) near.push(...h.candidates);
  }
  const index = candidateIndexBuild(near);
  const scored = (t: number, run: string) => t >= lo && t <= hi && !!slice[t - lo]?.runs[run];
  return (at(f)?.candidates ?? []).map((c) => ({
    flip: temporalFlip(slice, f - lo, c.run, c.cells, c.truthClass, c.predictedClass, w, s.temporalReach),
    steady: steadyDisagreement(c, index, w, scored),
  }));
}
