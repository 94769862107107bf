import { scoreReportOfFrames, type ReportFrameInput, type ScoreReport } from '../core/metrics/report.ts';
import { scoringTableOf } from './scoringRun.ts';
import type { AppState } from './store.ts';

/**
 * Returns the report the headless scorer would write for `run` over the frames scored so far (the
 * same core report builder, frames in natural order), or null when there is no dataset.
 */
export function stateReport(s: AppState, run: string): ScoreReport | null {
  if (!s.dataset) return null;
  const table = scoringTableOf(s.dataset, s.settings);
  const frames: ReportFrameInput[] = s.dataset.pairing.frames.map((f, i) => {
    const r = s.results[i];
    if (!r) return { name: f.name, stats: null, error: 'not scored yet' };
    const x = r.runs.find((y) => y.run === run);
    const error = r.error ?? x?.error ?? (x?.stats ? null : `no scores for run ${run}`);
    return { name: f.name, stats: error ? null : x!.stats, error };
  });
  const ids = table.generated
    ? [...new Set(frames.flatMap((f) => f.stats?.classIds ?? []))].sort((a, b) => a - b)
    : table.classes.map((c) => c.id);
  const classes = table.generated ? ids.map((id) => ({ id, name: String(id) })) : table.classes;
  return scoreReportOfFrames(classes, ids, s.settings, frames);
}
