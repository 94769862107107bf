// Flicker, objects and iIoU of a run as the scoreboard, the object-size chart and the missed-object
// list show them: over the frames scored so far (the same report keys the scorer prints) and on the
// frame on screen.
import { extrasFrameLine, extrasTotalsReport, type ExtrasFrameLine, type ExtrasReport } from '../core/metrics/extrasTotals.ts';
import { iouFamily } from '../core/metrics/iouFamily.ts';
import { objectSizeBins, type ObjectSizeBin } from '../core/objects/objectsBySize.ts';
import type { MissedObject } from '../core/objects/runObjects.ts';
import { selectorOf, shownRunSel } from './selectors.ts';
import type { AppState } from './store.ts';

type Sel<T> = (s: AppState) => T;

/** One run's extras: dataset (frames scored so far) and the frame on screen. */
export interface RunExtrasScores {
  run: string | null;
  dataset: ExtrasReport | null;
  frame: (ExtrasFrameLine & { objectsBySize: ObjectSizeBin[]; missed: MissedObject[] }) | null;
}

function runExtrasSelOf(runOf: Sel<string | null>): Sel<RunExtrasScores> {
  // Totals are summed in place as frames land; resultsVersion says when.
  const datasetSel = selectorOf<[string | null, AppState['extrasTotals'], AppState['totals'], number], ExtrasReport | null>(
    [runOf, (s: AppState) => s.extrasTotals, (s: AppState) => s.totals, (s: AppState) => s.resultsVersion],
    (run, extras, totals) => {
      const e = run ? extras[run] : undefined;
      const t = run ? totals[run] : undefined;
      if (!e || !t || t.frames === 0) return null;
      const fp = iouFamily(t.confusion, t.classIds.length).perClass.map((p) => p.fp);
      return extrasTotalsReport(e, t.classIds, fp);
    },
  );
  const frameSel = selectorOf([runOf, (s: AppState) => s.results[s.frameIndex]], (run, result): RunExtrasScores['frame'] => {
    const r = run ? result?.runs.find((x) => x.run === run) : undefined;
    if (!r?.extras || result?.error || r.error) return null;
    return { ...extrasFrameLine(r.extras), objectsBySize: objectSizeBins(r.extras.objects.counts, null), missed: r.extras.objects.missed };
  });
  return selectorOf([runOf, datasetSel, frameSel], (run, dataset, frame) => ({ run, dataset, frame }));
}

/** Returns run A's flicker, objects and iIoU (the shown run). */
export const extrasASel: Sel<RunExtrasScores> = runExtrasSelOf(shownRunSel);
/** Returns run B's (all null without one). */
export const extrasBSel: Sel<RunExtrasScores> = runExtrasSelOf((s) => s.runB);
