import type { DatasetTotals } from '../core/metrics/datasetTotals.ts';
import type { AppState } from './store.ts';

/** Returns the dataset totals of `run` over the frames scored so far in this pass (null before any). */
export function runTotals(s: AppState, run: string): { totals: DatasetTotals; version: number } | null {
  const totals = s.totals[run];
  return totals ? { totals, version: s.resultsVersion } : null;
}
