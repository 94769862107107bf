import { datasetTotalsCreate } from '../core/metrics/datasetTotals.ts';
import { reportBuild, reportLineOf, type ReportFull } from '../core/report/reportBuild.ts';
import type { ReportFrameLine } from '../core/metrics/report.ts';
import { reportRegionsOf, reportSuspectsOf } from '../core/report/reportParts.ts';
import { openedOf, type Opened } from '../data/opened.ts';
import type { UnpairedFile } from '../data/pairing.ts';
import { frameColumnsHas, frameColumnValue, type FrameColumnKey, type FrameColumns } from './frameColumns.ts';
import { scoringTableOf } from './scoringRun.ts';
import type { AppState } from './store.ts';
import { suspectsRankedSel } from './suspectsRanked.ts';

/** Returns a frame line of the report from the page's score columns (as reportLineOf gives it from the frame's counts). */
function columnsLineOf(columns: FrameColumns, run: string, i: number, name: string): ReportFrameLine {
  if (!frameColumnsHas(columns, i)) return reportLineOf(name, null, null, 'not scored yet');
  const col = columns.runs[run];
  const error = col ? col.errors.get(i) ?? null : `no scores for run ${run}`;
  if (error || !col) return reportLineOf(name, null, null, error);
  const at = (key: FrameColumnKey) => frameColumnValue(col, i, key);
  return {
    name, meanIoU: at('meanIoU'), pixelAccuracy: at('pixelAccuracy'), boundaryIoU: at('boundaryIoU'), boundaryF: at('boundaryF'), error: null,
    flipBack: at('flipBack'), flipBackVoid: at('flipBackVoid'), smallObjectRecall: at('smallObjectRecall'),
  };
}

/**
 * Returns the report the headless scorer would write with `run` as its first run, over the frames
 * scored so far (the same core builder, reportBuild, over the same sums, frame lines, regions and
 * ranked queue; frames in natural order), or null when there is no dataset. Frame lines come from the
 * score columns; regions are listed for the frames whose full result the store still holds (every
 * frame up to DETAIL_KEEP frames; a larger dataset's regions are in `npm run score --results`).
 */
export function stateReport(s: AppState, run: string): ReportFull<UnpairedFile[], Opened> | null {
  if (!s.dataset) return null;
  const { pairing } = s.dataset;
  const table = scoringTableOf(s.dataset, s.settings);
  const runs = [run, ...pairing.runs.filter((r) => r !== run)];
  const parts = runs.map((r) => ({
    run: r,
    totals: s.totals[r] ?? datasetTotalsCreate(s.totalsClassIds ?? []),
    extras: s.extrasTotals[r] ?? null,
    lines: pairing.frames.map((f, i) => columnsLineOf(s.columns, r, i, f.name)),
  }));
  const lines = pairing.frames.map((_, i) => {
    const res = s.results[i];
    return reportRegionsOf(res && !res.error ? res.runs.find((y) => y.run === run) : null);
  });
  const census = s.census;
  const { how: _how, ...loaded } = s.dataset.opened ?? { ...openedOf(pairing, s.dataset.table), how: null };
  const opened: Opened = { ...loaded, warnings: [...loaded.warnings, ...census.warnings()] };
  return reportBuild({
    classes: table.classes, generated: table.generated, settings: s.settings, runs: parts,
    regions: lines.map((l) => l.regions), voidSpill: lines.map((l) => l.voidSpill),
    suspects: reportSuspectsOf(suspectsRankedSel(s)), unpaired: pairing.unpaired, opened,
  });
}
