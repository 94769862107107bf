import { datasetTotalsAdd, datasetTotalsCreate, type DatasetTotals } from '../core/metrics/datasetTotals.ts';
import type { AppState } from './store.ts';
import { scoringTableOf } from './scoringRun.ts';

interface Running {
  generation: number;
  run: string;
  totals: DatasetTotals;
  added: Uint8Array;
  /** Frames added so far: changes whenever a frame lands, so React can memoise on it. */
  version: number;
}

const running = new Map<string, Running>();

/** Returns the class ids dataset totals are kept over: the table's, or every id seen (generated table). */
function totalsClassIds(s: AppState): number[] {
  const table = scoringTableOf(s.dataset!, s.settings);
  if (!table.generated) return table.classes.map((c) => c.id);
  const ids = new Set<number>();
  for (const r of s.results) for (const x of r?.runs ?? []) for (const id of x.stats?.classIds ?? []) ids.add(id);
  return [...ids].sort((a, b) => a - b);
}

/**
 * Returns the dataset totals of `run` over the frames scored so far in the current pass, adding only
 * frames not yet added (each frame once), so keeping up with a pass costs one merge per frame.
 */
export function runTotals(s: AppState, run: string): { totals: DatasetTotals; version: number } | null {
  if (!s.dataset) return null;
  const gen = s.scoring.generation;
  let r = running.get(run);
  const ids = totalsClassIds(s);
  if (!r || r.generation !== gen || r.totals.classIds.join() !== ids.join()) {
    r = { generation: gen, run, totals: datasetTotalsCreate(ids), added: new Uint8Array(s.results.length), version: 0 };
    running.set(run, r);
  }
  for (let i = 0; i < s.results.length; i++) {
    if (r.added[i]) continue;
    const stats = s.results[i]?.runs.find((x) => x.run === run)?.stats;
    if (!s.results[i]) continue;
    r.added[i] = 1;
    if (stats) {
      datasetTotalsAdd(r.totals, stats);
      r.version++;
    }
  }
  return { totals: r.totals, version: r.version };
}
