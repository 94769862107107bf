/**
 * Every value the app derives from its state, memoised in one place. A selector returns the same
 * object while the state it is made from stays the same, so React (`useApp(sel)`), store subscribers
 * (`store.subscribe(sel, …)`) and commands can all call it freely and compare answers by identity.
 */
import type { ClassInfo, ClassTable } from '../core/classTable.ts';
import { layerSettingsOf, type LayerSettings, type PixelBox } from '../core/composite/layerSettings.ts';
import { runsCompareCounts, type RunsCompareCounts } from '../core/runsCompare.ts';
import type { Suspect } from '../core/suspects/suspectQueue.ts';
import { FRAME_TABLE_EMPTY, frameOrderOf, frameTableOfColumns, type FrameTable } from './frameRows.ts';
import { datasetScope, frameScope, type ScopeScores } from './scopeScores.ts';
import { scoringTableOf } from './scoringRun.ts';
import { queueOfEvidence } from './queueEvidence.ts';
import { frameTableOfStored, liveCheckOf, storedStaleOf, type LiveCheck } from './storedResults.ts';
import type { AppState } from './store.ts';
import { classFrameColumnOf, classFrameOrder } from './classFrames.ts';

type Sel<T> = (s: AppState) => T;

/**
 * Returns a selector that computes `combine` of its inputs and returns the previous answer while
 * every input is the same value (`Object.is`) as last time.
 */
export function selectorOf<I extends readonly unknown[], R>(inputs: { [K in keyof I]: Sel<I[K]> }, combine: (...args: I) => R): Sel<R> {
  let last: { args: I; value: R } | null = null;
  return (s) => {
    const args = inputs.map((f) => f(s)) as unknown as I;
    if (last && args.every((a, i) => Object.is(a, last!.args[i]))) return last.value;
    last = { args, value: combine(...args) };
    return last.value;
  };
}

const datasetIn: Sel<AppState['dataset']> = (s) => s.dataset;
const bandWidthIn: Sel<number> = (s) => s.bandWidth;

/** Returns the class table frames are scored and coloured with (the void id from the settings), or null without a dataset. */
export const scoringTableSel: Sel<ClassTable | null> = selectorOf([datasetIn, (s: AppState) => s.settings], (dataset, settings) =>
  dataset ? scoringTableOf(dataset, settings) : null,
);

/** Returns the classes of the scoring table by id. */
export const classInfoSel: Sel<Map<number, ClassInfo>> = selectorOf([scoringTableSel], (table) => new Map((table?.classes ?? []).map((c) => [c.id, c])));

/** Returns the on-screen name of a class id: its table name, `id N` for an id outside the table, "not a class" for null. */
export const classNameSel: Sel<(id: number | null) => string> = selectorOf([classInfoSel], (classes) => (id: number | null) =>
  id === null ? 'not a class' : (classes.get(id)?.name ?? `id ${id}`),
);

/** Returns the run the frame list, timeline and scoreboard describe: run A, else the dataset's first run. */
export const shownRunSel: Sel<string | null> = (s) => s.runA ?? s.dataset?.pairing.runs[0] ?? null;

const frameNamesSel: Sel<string[]> = selectorOf([datasetIn], (dataset) => (dataset?.pairing.frames ?? []).map((f) => f.name));

/**
 * Returns every frame's scores for the shown run at the band width, read from typed columns (a
 * results folder's, else the page's own scoring's, filled in place: a new table each time frames land).
 */
export const frameTableSel: Sel<FrameTable> = selectorOf(
  [frameNamesSel, (s: AppState) => s.stored, (s: AppState) => s.columns, (s: AppState) => (s.stored ? 0 : s.resultsVersion), shownRunSel, bandWidthIn],
  (names, stored, columns, _version, run, w) => {
    if (names.length === 0) return FRAME_TABLE_EMPTY;
    return stored ? frameTableOfStored(stored, names, run) : frameTableOfColumns(columns, names, run, w);
  },
);

/** Returns frame indices in the frame list's order (the chosen score, worst first unless flipped, unscored last). */
export const frameOrderSel: Sel<number[]> = selectorOf(
  [frameTableSel, (s: AppState) => s.frameScore, (s: AppState) => s.sortWorstFirst, (s: AppState) => s.frameClass, (s: AppState) => classColumnSel(s)],
  (table, key, worstFirst, byClass, column) => (byClass && column ? classFrameOrder(column, worstFirst) : frameOrderOf(table, key, worstFirst)),
);

/** Returns every frame's measure of the class the frame list is sorted by (null when it is not sorted by a class). */
export const classColumnSel: Sel<Float64Array | null> = selectorOf(
  [(s: AppState) => s.frameClass, (s: AppState) => s.columns, (s: AppState) => s.results, frameNamesSel, shownRunSel, bandWidthIn],
  (byClass, columns, results, names, run, w) => (byClass ? classFrameColumnOf(columns, results, names.length, run, byClass.classId, byClass.measure, w) : null),
);

/**
 * Returns the likely-label-mistake queue over the frames scored so far (most likely first), the same
 * pass the headless scorer runs; rebuilt only when frames land or the class names change.
 */
export const suspectsSel: Sel<Suspect[]> = selectorOf(
  [datasetIn, (s: AppState) => s.queueEvidence, (s: AppState) => s.resultsVersion, (s: AppState) => s.stored, classNameSel],
  (dataset, evidence, _version, stored, name) => (!dataset ? [] : stored ? stored.queue : queueOfEvidence(evidence, name)),
);

/** Returns how the settings differ from those of the opened results folder (empty while its scores hold, or without one). */
export const storedStaleSel: Sel<string[]> = selectorOf([(s: AppState) => s.stored, (s: AppState) => s.settings], (stored, settings) =>
  stored ? storedStaleOf(stored, settings) : [],
);

/** Returns the live score of the frame on screen checked against its stored row (null without a results folder). */
export const liveCheckSel: Sel<LiveCheck | null> = selectorOf(
  [(s: AppState) => s.stored, shownRunSel, (s: AppState) => s.frameIndex, (s: AppState) => s.results[s.frameIndex]],
  (stored, run, index, live) => (stored ? liveCheckOf(stored, run, index, live) : null),
);

/** Dataset and current-frame scores of one run at the band width. */
export interface RunScopes {
  dataset: ScopeScores | null;
  frame: ScopeScores | null;
}

function runScopesSelOf(runOf: Sel<string | null>): Sel<RunScopes> {
  // Totals are summed in place as frames land (large arrays kept by reference); resultsVersion says when.
  const datasetSel = selectorOf(
    [runOf, (s: AppState) => s.totals, (s: AppState) => s.resultsVersion, (s: AppState) => s.stored, classInfoSel, bandWidthIn],
    (run, totals, _version, stored, classes, w) => {
      const t = run ? (stored ? stored.totals : totals)[run] : undefined;
      return t && t.frames > 0 ? datasetScope(t, classes, w) : null;
    },
  );
  const frameSel = selectorOf(
    [runOf, (s: AppState) => s.results[s.frameIndex], classInfoSel, bandWidthIn],
    (run, result, classes, w) => {
      const stats = run ? result?.runs.find((r) => r.run === run)?.stats ?? null : null;
      return stats ? frameScope(stats, classes, w) : null;
    },
  );
  return selectorOf([datasetSel, frameSel], (dataset, frame) => ({ dataset, frame }));
}

/** Returns the scores of the shown run (run A): dataset totals so far and the current frame. */
export const scopesASel: Sel<RunScopes> = runScopesSelOf(shownRunSel);
/** Returns the scores of run B (both null without one). */
export const scopesBSel: Sel<RunScopes> = runScopesSelOf((s) => s.runB);

/** Returns the pixels run B fixed and broke against run A on the frame on screen, or null when either is missing. */
export const compareCountsSel: Sel<RunsCompareCounts | null> = selectorOf(
  [(s: AppState) => s.shown, shownRunSel, (s: AppState) => s.runB, (s: AppState) => s.settings.ignore],
  (shown, runA, runB, ignore) => {
    const a = runA ? shown?.preds[runA] : undefined;
    const b = runB ? shown?.preds[runB] : undefined;
    return shown?.truth && a && b ? runsCompareCounts(shown.truth, a, b, ignore) : null;
  },
);

const NO_BOXES: PixelBox[] = [];

/** Returns the outline boxes: the focused box, if any (image pixels). */
export const highlightBoxesSel: Sel<PixelBox[]> = selectorOf([(s: AppState) => s.focusBox], (b) =>
  b ? [{ x: b[0], y: b[1], width: b[2] - b[0], height: b[3] - b[1] }] : NO_BOXES,
);

/** Returns what the compositor draws: the layer looks with run A, run B, the band width and the focus outline put in. */
export const layerSettingsSel: Sel<LayerSettings> = selectorOf(
  [(s: AppState) => s.layers, (s: AppState) => s.runA, (s: AppState) => s.runB, bandWidthIn, highlightBoxesSel],
  (looks, runA, runB, bandWidth, boxes) => layerSettingsOf(looks, { runA, runB, bandWidth, boxes }),
);
