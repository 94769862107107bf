import { datasetTotalsCreate } from '../core/metrics/datasetTotals.ts';
import { extrasFrameLine, extrasTotalsCreate, extrasTotalsReport } from '../core/metrics/extrasTotals.ts';
import { reportFrameLine, scoreReport, type ScoreReport } from '../core/metrics/report.ts';
import { scoringTableOf } from './scoringRun.ts';
import type { AppState } from './store.ts';

/**
 * Returns the report the headless scorer would write for `run` over the frames scored so far (the
 * same core report builder over the same dataset sums, frames in natural order), or null when there
 * is no dataset.
 */
export function stateReport(s: AppState, run: string): ScoreReport | null {
  if (!s.dataset) return null;
  const table = scoringTableOf(s.dataset, s.settings);
  const lines = s.dataset.pairing.frames.map((f, i) => {
    const r = s.results[i];
    if (!r) return reportFrameLine(f.name, null, 'not scored yet');
    const x = r.runs.find((y) => y.run === run);
    const error = r.error ?? x?.error ?? (x?.stats ? null : `no scores for run ${run}`);
    return { ...reportFrameLine(f.name, error ? null : x!.stats, error), ...extrasFrameLine(error ? null : x!.extras) };
  });
  const totals = s.totals[run] ?? datasetTotalsCreate(s.totalsClassIds ?? []);
  const classes = table.generated ? totals.classIds.map((id) => ({ id, name: String(id) })) : table.classes;
  const report = scoreReport(classes, s.settings, totals, lines);
  const extras = s.extrasTotals[run] ?? extrasTotalsCreate();
  Object.assign(report.dataset, extrasTotalsReport(extras, totals.classIds, report.dataset.perClass.map((c) => c.fp)));
  return report;
}
