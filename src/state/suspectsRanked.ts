import type { SuspectVerdictKind } from '../core/review/verdict.ts';
import type { Suspect } from '../core/suspects/suspectQueue.ts';
import { suspectsRerank } from '../core/suspects/verdictRerank.ts';
import { selectorOf, suspectsSel } from './selectors.ts';
import type { AppState } from './store.ts';

/**
 * Returns the likely-label-mistake queue as the reviewer sees it: the queue of the frames scored so
 * far, re-ranked by the verdicts given (suspectsRerank, the same pass `npm run score --verdicts`
 * runs); the same array until the queue or a verdict changes.
 */
export const suspectsRankedSel: (s: AppState) => Suspect[] = selectorOf(
  [suspectsSel, (s: AppState) => s.reviewVerdicts],
  (queue, verdicts) => suspectsRerank(queue, new Map<string, SuspectVerdictKind>(Object.values(verdicts).map((v) => [v.key, v.verdict]))),
);
