// What the likely-label-mistake queue needs of the page's own scoring, kept compact: each frame's
// candidates with their temporal evidence (worked out once the frames within temporalWindow of it
// have landed, in any order), the coarse grids only while a neighbour still needs them, and the
// dataset-wide sums (confidence, class-pair habits, class appearance) added in place. The queue is
// then ranked frame by frame (queueRankCreate), as the headless scorer ranks it from its region table.
import { frameEvidenceOf } from '../core/results/evidenceWindow.ts';
import { queueRankCreate } from '../core/results/queueRank.ts';
import type { CandidateEvidence } from '../core/results/resultRows.ts';
import { appearanceSumsAdd, type AppearanceSums } from '../core/suspects/appearanceModel.ts';
import { pairRecurrenceAdd, type PairRecurrence } from '../core/suspects/pairRecurrence.ts';
import { confidenceSumsAdd, frameGridsOf, suspectCandidates, type ConfidenceSums, type SuspectCandidate, type SuspectFrame } from '../core/suspects/suspectCandidates.ts';
import type { Suspect } from '../core/suspects/suspectQueue.ts';
import type { SuspectSettings } from '../core/suspects/suspectSettings.ts';
import type { FrameGrids } from '../core/suspects/temporalFlip.ts';

/** The queue's evidence over a dataset of `total` frames (mutated in place). */
export interface QueueEvidence {
  total: number;
  settings: SuspectSettings;
  /** Per frame: 1 once it has landed. */
  arrived: Uint8Array;
  /** Per frame: 1 once its candidates' evidence is worked out. */
  finished: Uint8Array;
  /** Frames whose grids or candidates a neighbour may still need. */
  held: Map<number, { grids: FrameGrids | null; candidates: SuspectCandidate[] }>;
  /** Per frame with candidates: each candidate (its grid cells dropped) with its evidence, in candidate order. */
  ranked: Map<number, { c: SuspectCandidate; evidence: CandidateEvidence }[]>;
  confidence: ConfidenceSums;
  recurrence: PairRecurrence;
  appearance: AppearanceSums;
}

/** Returns empty evidence for a dataset of `total` frames. */
export function queueEvidenceCreate(total: number, settings: SuspectSettings): QueueEvidence {
  return {
    total, settings, arrived: new Uint8Array(total), finished: new Uint8Array(total), held: new Map(), ranked: new Map(),
    confidence: new Map(), recurrence: new Map(), appearance: new Map(),
  };
}

/** Adds frame `index`'s result (once; a frame that landed before is ignored). */
export function queueEvidenceAdd(q: QueueEvidence, index: number, result: SuspectFrame): void {
  if (index < 0 || index >= q.total || q.arrived[index]) return;
  const s = q.settings, w = s.temporalWindow;
  q.arrived[index] = 1;
  q.held.set(index, { grids: frameGridsOf(result), candidates: suspectCandidates(result, index, s) });
  confidenceSumsAdd(q.confidence, result);
  pairRecurrenceAdd(q.recurrence, result, s);
  appearanceSumsAdd(q.appearance, result);
  const inRange = (f: number, fn: (t: number) => boolean) => {
    for (let t = Math.max(0, f - w); t <= Math.min(q.total - 1, f + w); t++) if (!fn(t)) return false;
    return true;
  };
  for (let f = Math.max(0, index - w); f <= Math.min(q.total - 1, index + w); f++) {
    if (q.finished[f] || !q.arrived[f] || !inRange(f, (t) => q.arrived[t] === 1)) continue;
    const evidence = frameEvidenceOf(f, q.total, s, (t) => q.held.get(t));
    const cands = q.held.get(f)!.candidates;
    if (cands.length) q.ranked.set(f, cands.map((c, i) => ({ c: { ...c, cells: [] }, evidence: evidence[i] })));
    q.finished[f] = 1;
  }
  // A frame is let go once every frame within reach of it has its evidence.
  for (let t = Math.max(0, index - 2 * w); t <= Math.min(q.total - 1, index + 2 * w); t++) {
    if (q.held.has(t) && inRange(t, (f) => q.finished[f] === 1)) q.held.delete(t);
  }
}

/** Returns the queue over the frames whose evidence is in, best first (the same ranking as the results writer's). */
export function queueOfEvidence(q: QueueEvidence, className: (id: number) => string): Suspect[] {
  const rank = queueRankCreate(q.settings, { confidence: q.confidence, recurrence: q.recurrence, appearance: q.appearance }, className);
  const frames = [...q.ranked.keys()].sort((a, b) => a - b);
  for (const f of frames) rank.addFrame(q.ranked.get(f)!);
  return rank.result();
}
