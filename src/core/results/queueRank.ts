// The likely-label-mistake queue ranked from stored evidence, one frame at a time: each frame's own
// queue (suspectRank), and the best queueMax entries of all of them kept. Merging never crosses
// frames, so this equals the one-pass queue of the whole dataset; memory is one frame's candidates
// plus the queue.
import type { SuspectCandidate } from '../suspects/suspectCandidates.ts';
import { suspectOrder, suspectRank, suspectScored, type Suspect, type SuspectSums } from '../suspects/suspectQueue.ts';
import type { SuspectSettings } from '../suspects/suspectSettings.ts';
import type { CandidateEvidence } from './resultRows.ts';

/** A queue being filled frame by frame. */
export interface QueueRank {
  /** Adds one frame's candidates (in their stored order) with their evidence. */
  addFrame(candidates: readonly { c: SuspectCandidate; evidence: CandidateEvidence }[]): void;
  /** The queue, best first. */
  result(): Suspect[];
}

/**
 * Returns an empty queue ranked with the dataset-wide sums: confidence (confident learning's per-class
 * thresholds), how often each class pair shows per run (model habits) and each class's appearance.
 */
export function queueRankCreate(s: SuspectSettings, sums: SuspectSums, className: (id: number) => string, bandWidth?: number): QueueRank {
  const best: { c: SuspectCandidate; score: number; entry: Suspect }[] = [];
  const local = { ...s, queueMax: Number.POSITIVE_INFINITY };
  return {
    addFrame(candidates) {
      if (candidates.length === 0 || s.queueMax === 0) return;
      const scored = candidates.map(({ c, evidence }) => suspectScored(c, evidence.flip, evidence.steady, sums, s));
      const byRegion = new Map(candidates.map(({ c }) => [`${c.run}\n${c.regionId}`, c]));
      for (const entry of suspectRank(scored, { className, bandWidth }, local)) {
        const head = { c: byRegion.get(`${entry.run}\n${entry.regionId}`)!, score: entry.score, entry };
        if (best.length >= s.queueMax && suspectOrder(head, best[best.length - 1]) >= 0) break; // the frame's later entries rank lower still
        let lo = 0, hi = best.length;
        while (lo < hi) {
          const mid = (lo + hi) >> 1;
          if (suspectOrder(best[mid], head) <= 0) lo = mid + 1;
          else hi = mid;
        }
        best.splice(lo, 0, head);
        if (best.length > s.queueMax) best.pop();
      }
    },
    result: () => best.map((b) => b.entry),
  };
}
