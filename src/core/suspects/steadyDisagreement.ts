import type { SuspectCandidate } from './suspectCandidates.ts';

/** Index of candidates by run and frame, for looking up the same disagreement in neighbouring frames. */
export type CandidateIndex = Map<string, Map<number, SuspectCandidate[]>>;

/** Returns the candidates grouped by run and frame index. */
export function candidateIndexBuild(candidates: readonly SuspectCandidate[]): CandidateIndex {
  const out: CandidateIndex = new Map();
  for (const c of candidates) {
    let byFrame = out.get(c.run);
    if (!byFrame) out.set(c.run, (byFrame = new Map()));
    const list = byFrame.get(c.frameIndex);
    if (list) list.push(c);
    else byFrame.set(c.frameIndex, [c]);
  }
  return out;
}

/**
 * Returns the steady-disagreement share 0..1 of a candidate: of the frames within `window` on each
 * side that the run has regions for (`scored(frameIndex)`), the share holding a region of the same run
 * and class pair whose box comes within max(4, half the longer side) pixels of this one's. The same
 * disagreement under the same label frame after frame is the model's habit more often than a
 * labeller's slip (a mistake copied into many frames is missed by this; README). Our own heuristic.
 */
export function steadyDisagreement(c: SuspectCandidate, index: CandidateIndex, window: number, scored: (frameIndex: number, run: string) => boolean): number {
  const byFrame = index.get(c.run);
  const [x0, y0, x1, y1] = c.bbox;
  const m = Math.max(4, Math.max(x1 - x0, y1 - y0) / 2);
  let looked = 0, same = 0;
  for (let t = c.frameIndex - window; t <= c.frameIndex + window; t++) {
    if (t === c.frameIndex || !scored(t, c.run)) continue;
    looked++;
    const list = byFrame?.get(t);
    if (!list) continue;
    const hit = list.some(
      (o) => o.truthClass === c.truthClass && o.predictedClass === c.predictedClass &&
        o.bbox[0] < x1 + m && x0 - m < o.bbox[2] && o.bbox[1] < y1 + m && y0 - m < o.bbox[3],
    );
    if (hit) same++;
  }
  return looked ? same / looked : 0;
}
