import { REVIEW_JUDGEMENTS } from '../core/review/judgement.ts';

/** Which verdicts the queue shows: every item, the unjudged ones, or those given one verdict. */
export const QUEUE_VERDICT_FILTERS = ['all', 'unjudged', ...REVIEW_JUDGEMENTS] as const;
export type QueueVerdictFilter = (typeof QUEUE_VERDICT_FILTERS)[number];
/** How the queue is ordered: its own rank (verdicts re-rank it), or the score high or low first. */
export const QUEUE_SORTS = ['rank', 'score-high', 'score-low'] as const;
export type QueueSort = (typeof QUEUE_SORTS)[number];

/** The reviewer's filter and order of the queue ('' = any kind / class pair / run). */
export interface QueueView {
  verdict: QueueVerdictFilter;
  kind: string;
  /** `${truthClass}>${predictedClass}`. */
  pair: string;
  run: string;
  sort: QueueSort;
}

export const QUEUE_VIEW_DEFAULT: QueueView = { verdict: 'all', kind: '', pair: '', run: '', sort: 'rank' };

