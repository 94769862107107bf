import { suspectQueueOfResults, type Suspect } from '../core/suspects/suspectQueue.ts';
import { SUSPECT_DEFAULTS } from '../core/suspects/suspectSettings.ts';
import { scoringTableOf } from './scoringRun.ts';
import type { AppState } from './store.ts';

let memo: { version: number; dataset: unknown; queue: Suspect[] } | null = null;

/**
 * Returns the likely-label-mistake queue over the frames scored so far (best first), the same pass
 * the headless scorer runs; memoised on the results, so it is rebuilt only when frames land.
 */
export function suspectsOf(s: AppState): Suspect[] {
  if (!s.dataset) return [];
  if (memo && memo.version === s.resultsVersion && memo.dataset === s.dataset) return memo.queue;
  const table = scoringTableOf(s.dataset, s.settings);
  const names = new Map(table.classes.map((c) => [c.id, c.name]));
  const queue = suspectQueueOfResults(s.results, (id) => names.get(id) ?? `id ${id}`, SUSPECT_DEFAULTS);
  memo = { version: s.resultsVersion, dataset: s.dataset, queue };
  return queue;
}
