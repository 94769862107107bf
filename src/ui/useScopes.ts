import { useMemo } from 'react';
import type { ClassInfo } from '../core/classTable.ts';
import { runTotals } from '../state/runTotals.ts';
import { scoringTableOf } from '../state/scoringRun.ts';
import type { AppState } from '../state/store.ts';
import { datasetScope, frameScope, type ScopeScores } from './scoreboardData.ts';
import { useApp, useAppStore } from './storeContext.tsx';

/** Returns the dataset and current-frame scores of `run` at the current band width (recomputed as frames land). */
export function useScopes(run: string | null): { dataset: ScopeScores | null; frame: ScopeScores | null; classes: Map<number, ClassInfo> } {
  const store = useAppStore();
  const dataset = useApp((s) => s.dataset);
  const settings = useApp((s) => s.settings);
  const version = useApp((s) => s.resultsVersion);
  const w = useApp((s) => s.bandWidth);
  const frameResult = useApp((s) => s.results[s.frameIndex]);
  const classes = useMemo(() => {
    const m = new Map<number, ClassInfo>();
    if (dataset) for (const c of scoringTableOf(dataset, settings).classes) m.set(c.id, c);
    return m;
  }, [dataset, settings]);
  const totals = useMemo(() => (run ? runTotals(store.getState() as AppState, run) : null), [store, run, version]);
  const datasetScores = useMemo(
    () => (totals && totals.totals.frames > 0 ? datasetScope(totals.totals, classes, w) : null),
    [totals, totals?.version, classes, w],
  );
  const frameStats = run ? frameResult?.runs.find((r) => r.run === run)?.stats ?? null : null;
  const frameScores = useMemo(() => (frameStats ? frameScope(frameStats, classes, w) : null), [frameStats, classes, w]);
  return { dataset: datasetScores, frame: frameScores, classes };
}
