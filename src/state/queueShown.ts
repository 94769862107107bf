import { REVIEW_JUDGEMENTS, suspectRefOf, type ReviewJudgement } from '../core/review/judgement.ts';
import type { QueueView } from './queueView.ts';
export { QUEUE_SORTS, QUEUE_VERDICT_FILTERS, QUEUE_VIEW_DEFAULT, type QueueSort, type QueueVerdictFilter, type QueueView } from './queueView.ts';
import { suspectKey } from '../core/review/verdict.ts';
import type { Suspect } from '../core/suspects/suspectQueue.ts';
import { selectorOf } from './selectors.ts';
import { suspectsRankedSel } from './suspectsRanked.ts';
import type { AppState } from './store.ts';

/** Returns the class pair key of a queue item, as `QueueView.pair` names it. */
export function suspectPairOf(q: Suspect): string {
  return `${q.truthClass}>${q.predictedClass}`;
}

/**
 * Returns the queue as the list shows it and Q steps through it: the ranked queue filtered by the
 * queue view, in its order (score ties keep the rank order).
 */
export const queueShownSel: (s: AppState) => Suspect[] = selectorOf(
  [suspectsRankedSel, (s: AppState) => s.reviewVerdicts, (s: AppState) => s.queueView],
  (queue, verdicts, view) => queueShownOf(queue, verdicts, view),
);

/** Returns the items of `queue` the view lets through, in the view's order (a new array). */
export function queueShownOf(queue: readonly Suspect[], verdicts: AppState['reviewVerdicts'], view: QueueView): Suspect[] {
  const shown = queue.filter((q) => {
    if (view.kind && q.kind !== view.kind) return false;
    if (view.pair && suspectPairOf(q) !== view.pair) return false;
    if (view.run && q.run !== view.run && !q.alsoRuns.includes(view.run)) return false;
    if (view.verdict === 'all') return true;
    const v = verdicts[suspectKey(suspectRefOf(q))]?.verdict;
    return view.verdict === 'unjudged' ? !v : v === view.verdict;
  });
  if (view.sort === 'rank') return shown;
  const sign = view.sort === 'score-high' ? -1 : 1;
  const rank = new Map(shown.map((q, i) => [q, i]));
  return shown.sort((a, b) => sign * (a.score - b.score) || rank.get(a)! - rank.get(b)!);
}

/** How far the review of the queue has come: items judged of all, and how many got each verdict. */
export interface ReviewProgress {
  judged: number;
  total: number;
  byVerdict: Record<ReviewJudgement, number>;
}

/** Returns the review progress over the whole queue (filters do not change it). */
export const reviewProgressSel: (s: AppState) => ReviewProgress = selectorOf(
  [suspectsRankedSel, (s: AppState) => s.reviewVerdicts],
  (queue, verdicts) => reviewProgressOf(queue, verdicts),
);

/** Returns how many items of `queue` have a verdict, in all and per verdict. */
export function reviewProgressOf(queue: readonly Suspect[], verdicts: AppState['reviewVerdicts']): ReviewProgress {
  const byVerdict = Object.fromEntries(REVIEW_JUDGEMENTS.map((v) => [v, 0])) as Record<ReviewJudgement, number>;
  let judged = 0;
  for (const q of queue) {
    const v = verdicts[suspectKey(suspectRefOf(q))]?.verdict;
    if (!v) continue;
    judged++;
    byVerdict[v]++;
  }
  return { judged, total: queue.length, byVerdict };
}
