// The one builder of the JSON report (src/docs/metrics.md "What the scorer prints"): the headless
// scorer (src/cli/score.ts) and the page's "save report" (src/state/stateReport.ts) both hand it their
// sums, frame lines, region lines and ranked queue, so the two files have the same keys and numbers.
import type { DatasetTotals } from '../metrics/datasetTotals.ts';
import type { RunExtras } from '../frameExtras.ts';
import { extrasFrameLine, extrasTotalsCreate, extrasTotalsReport, type ExtrasTotals } from '../metrics/extrasTotals.ts';
import type { FrameCounts } from '../metrics/frameSummary.ts';
import { reportFrameLine, scoreReport, type ReportFrameLine, type ScoreReport } from '../metrics/report.ts';
import type { ScoreSettings } from '../metrics/settings.ts';
import type { ReportRegion, ReportSuspect, ReportVoidSpill } from './reportParts.ts';

/** One run's part of the report: its dataset sums and its line per frame (in the report's frame order). */
export interface ReportRunPart {
  run: string;
  totals: DatasetTotals;
  extras: ExtrasTotals | null;
  lines: ReportFrameLine[];
}

/** Everything the report is built from. `U` and `O` are the pairing's unpaired files and the "opened" summary. */
export interface ReportInput<U, O> {
  /** The class table's classes (names by id); with `generated`, classes are named by their ids instead. */
  classes: readonly { id: number; name: string }[];
  generated: boolean;
  settings: ScoreSettings;
  /** Every run, the report's own run first (its dataset and frames are the report's top level). */
  runs: ReportRunPart[];
  /** Per frame (same order as the lines): the report's run's regions and void spill, or null. */
  regions: readonly (ReportRegion[] | null)[];
  voidSpill: readonly (ReportVoidSpill | null)[];
  suspects: ReportSuspect[];
  unpaired: U;
  opened: O;
}

/** A frame's line with the report's run's regions. */
export type ReportFrameFull = ReportFrameLine & { regions: ReportRegion[] | null; voidSpill: ReportVoidSpill | null };

/** The whole report: the first run's scores at the top, `runs` (every run's dataset block) when there are several. */
export type ReportFull<U, O> = Omit<ScoreReport, 'frames'> & {
  frames: ReportFrameFull[];
  runs?: Record<string, ScoreReport['dataset']>;
  unpaired: U;
  opened: O;
  suspects: ReportSuspect[];
};

/** Returns a frame's line for one run: its scores and flicker / small-object keys, or null scores and `error`. */
export function reportLineOf(name: string, stats: FrameCounts | null | undefined, extras: RunExtras | null | undefined, error: string | null): ReportFrameLine {
  return { ...reportFrameLine(name, error ? null : (stats ?? null), error), ...extrasFrameLine(error ? null : extras) };
}

/** Returns one run's dataset block and frame lines (the report's top level for that run). */
function runReport(part: ReportRunPart, classes: ReportInput<unknown, unknown>['classes'], generated: boolean, settings: ScoreSettings): ScoreReport {
  const t = part.totals;
  const named = generated ? t.classIds.map((id) => ({ id, name: String(id) })) : classes;
  const out = scoreReport(named, settings, t, part.lines);
  Object.assign(out.dataset, extrasTotalsReport(part.extras ?? extrasTotalsCreate(), t.classIds, out.dataset.perClass.map((c) => c.fp)));
  return out;
}

/** Returns the report: keys in the order the scorer has always written them. Throws when there is no run. */
export function reportBuild<U, O>(input: ReportInput<U, O>): ReportFull<U, O> {
  if (input.runs.length === 0) throw new Error('reportBuild: no run to report');
  const reports = input.runs.map((p) => runReport(p, input.classes, input.generated, input.settings));
  const first = reports[0];
  const frames: ReportFrameFull[] = first.frames.map((f, i) => ({ ...f, regions: input.regions[i] ?? null, voidSpill: input.voidSpill[i] ?? null }));
  return {
    classes: first.classes,
    settings: first.settings,
    dataset: first.dataset,
    frames,
    ...(reports.length > 1 ? { runs: Object.fromEntries(input.runs.map((p, i) => [p.run, reports[i].dataset])) } : {}),
    unpaired: input.unpaired,
    opened: input.opened,
    suspects: input.suspects,
  };
}
