import type { Suspect } from '../suspects/suspectQueue.ts';
import type { SuspectRef } from './verdict.ts';

/**
 * What a reviewer can say about a region: the ground truth is wrong there, the model is, or it is not
 * clear. One list serves as the verdicts on queue items and as the built-in flag reasons.
 */
export const REVIEW_JUDGEMENTS = ['label-mistake', 'model-error', 'unsure'] as const;
export type ReviewJudgement = (typeof REVIEW_JUDGEMENTS)[number];

/** Returns whether `v` is one of the review judgements. */
export function isReviewJudgement(v: unknown): v is ReviewJudgement {
  return (REVIEW_JUDGEMENTS as readonly unknown[]).includes(v);
}

/** Returns the verdict identity of a queue item (the same item keeps it when the queue is rebuilt). */
export function suspectRefOf(s: Pick<Suspect, 'frame' | 'run' | 'bbox' | 'truthClass' | 'predictedClass'>): SuspectRef {
  return { frame: s.frame, run: s.run, bbox: s.bbox, truthClass: s.truthClass, predictedClass: s.predictedClass };
}
