import { datasetTotalsCreate } from '../core/metrics/datasetTotals.ts';
import { reportBuild, reportLineOf, type ReportFull } from '../core/report/reportBuild.ts';
import { censusKeep } from '../core/report/reportCensus.ts';
import { reportRegionsOf, reportSuspectsOf } from '../core/report/reportParts.ts';
import { openedOf, type Opened } from '../data/opened.ts';
import type { UnpairedFile } from '../data/pairing.ts';
import { scoringTableOf } from './scoringRun.ts';
import type { AppState } from './store.ts';
import { suspectsRankedSel } from './suspectsRanked.ts';

/**
 * Returns the report the headless scorer would write with `run` as its first run, over the frames
 * scored so far (the same core builder, reportBuild, over the same sums, frame lines, regions and
 * ranked queue; frames in natural order), or null when there is no dataset.
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
    lines: pairing.frames.map((f, i) => {
      const res = s.results[i];
      if (!res) return reportLineOf(f.name, null, null, 'not scored yet');
      const x = res.runs.find((y) => y.run === r);
      const error = res.error ?? x?.error ?? (x?.stats ? null : `no scores for run ${r}`);
      return reportLineOf(f.name, x?.stats, x?.extras, error);
    }),
  }));
  const lines = pairing.frames.map((_, i) => {
    const res = s.results[i];
    return reportRegionsOf(res && !res.error ? res.runs.find((y) => y.run === run) : null);
  });
  const census = censusKeep(pairing.runs);
  for (const res of s.results) if (res && !res.error) census.add(res);
  const { how: _how, ...loaded } = s.dataset.opened ?? { ...openedOf(pairing, s.dataset.table), how: null };
  const opened: Opened = { ...loaded, warnings: [...loaded.warnings, ...census.warnings()] };
  return reportBuild({
    classes: table.classes, generated: table.generated, settings: s.settings, runs: parts,
    regions: lines.map((l) => l.regions), voidSpill: lines.map((l) => l.voidSpill),
    suspects: reportSuspectsOf(suspectsRankedSel(s)), unpaired: pairing.unpaired, opened,
  });
}
