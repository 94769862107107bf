// The page's view of a results folder: frame-list rows from its typed columns, whether the stored
// scores still hold for the settings, and the live score of the frame on screen checked against its row.
import { digestSummary } from '../core/metrics/frameDigest.ts';
import type { FrameSummary } from '../core/metrics/frameSummary.ts';
import type { ScoreSettings } from '../core/metrics/settings.ts';
import type { RunColumns, StoredResults } from '../data/results/resultsRead.ts';
import type { FrameTable } from './frameRows.ts';
import type { StoredFrame } from './scoresSlice.ts';
import type { AppStore } from './store.ts';

/** Datasets up to this many frames are offered a re-score in the page when stored scores go stale; larger ones get the headless command. */
export const RESCORE_IN_PAGE_MAX = 2000;

/** Puts a results folder in the store with the settings it was scored with (so it starts fresh). */
export function storedInstall(store: AppStore, stored: StoredResults): void {
  const s = store.getState();
  s.settingsSet(stored.settings);
  s.storedSet(stored);
}

const value = (a: Float64Array, i: number): number | null => (Number.isNaN(a[i]) ? null : a[i]);

/** Returns the frame summary of frame `i` in a run's stored columns (null when it failed or has no row). */
export function storedSummaryOf(c: RunColumns, i: number): FrameSummary | null {
  if (!c.present[i] || c.errors.has(i)) return null;
  return {
    meanIoU: value(c.meanIoU, i), pixelAccuracy: value(c.pixelAccuracy, i), bandIoU: value(c.bandIoU, i), boundaryIoU: value(c.boundaryIoU, i),
    boundaryF: value(c.boundaryF, i), errorPixels: value(c.errorPixels, i) ?? 0, validPixels: value(c.validPixels, i) ?? 0,
  };
}

/** Returns the frame table of `run` over a results folder's columns (frames named by `names`; band values at the table's width). */
export function frameTableOfStored(stored: StoredResults, names: readonly string[], run: string | null): FrameTable {
  const c = run ? stored.runs[run] : undefined;
  const error = (i: number) => (!c ? 'no prediction run' : c.errors.get(i) ?? (c.present[i] ? null : 'no row in the results folder'));
  return {
    count: names.length,
    bandWidth: stored.bandWidth,
    name: (i) => names[i],
    pending: () => false,
    error,
    value: (i, key) => {
      if (!c || error(i) !== null) return null;
      const v = c[key][i];
      return Number.isNaN(v) ? null : v;
    },
  };
}

const SETTING_WORDS: Record<keyof ScoreSettings, string> = { ignore: 'void id', biouDilationRatio: 'Boundary IoU dilation ratio', bfTolerance: 'Boundary F tolerance ratio' };

/** Returns how the settings differ from those the results were scored with ("void id 255 → 0"); empty while they hold. */
export function storedStaleOf(stored: StoredResults, settings: ScoreSettings): string[] {
  return (Object.keys(SETTING_WORDS) as (keyof ScoreSettings)[])
    .filter((k) => stored.settings[k] !== settings[k])
    .map((k) => `${SETTING_WORDS[k]} ${stored.settings[k]} → ${settings[k]}`);
}

/** Returns the command that scores the dataset again headless into the results folder with `settings`. */
export function storedRescoreCommand(datasetTitle: string, stored: StoredResults, settings: ScoreSettings): string {
  const q = (s: string) => (/^[\w./-]+$/.test(s) ? s : `'${s.replace(/'/g, `'\\''`)}'`);
  return `npm run score -- --dataset ${q(datasetTitle)} --results ${q(stored.title)} --ignore ${settings.ignore} --biou-ratio ${settings.biouDilationRatio} --bf-tolerance ${settings.bfTolerance}`;
}

/** The frame on screen scored live against its stored row. */
export type LiveCheck =
  | { state: 'pending' }
  | { state: 'failed'; error: string }
  | { state: 'match' }
  | { state: 'mismatch'; diffs: { key: keyof FrameSummary; stored: number | null; live: number | null }[] };

const CHECKED: (keyof FrameSummary)[] = ['meanIoU', 'pixelAccuracy', 'bandIoU', 'boundaryIoU', 'boundaryF', 'errorPixels', 'validPixels'];

/** Returns whether the live score of frame `index` (run `run`) equals its stored row (scores within 1e-9). */
export function liveCheckOf(stored: StoredResults, run: string | null, index: number, live: StoredFrame | undefined): LiveCheck {
  if (!live) return { state: 'pending' };
  const c = run ? stored.runs[run] : undefined;
  const r = run ? live.runs.find((x) => x.run === run) : undefined;
  const error = live.error ?? r?.error ?? null;
  const storedError = c?.errors.get(index) ?? null;
  if (error || !r?.stats) {
    return storedError ? { state: 'match' } : { state: 'failed', error: error ?? 'not scored' };
  }
  const now = digestSummary(r.stats, stored.bandWidth);
  const then = c ? storedSummaryOf(c, index) : null;
  if (!then) return { state: 'mismatch', diffs: [{ key: 'meanIoU', stored: null, live: now.meanIoU }] };
  const diffs = CHECKED.filter((k) => {
    const a = then[k], b = now[k];
    return a === null || b === null ? a !== b : Math.abs(a - b) > 1e-9;
  }).map((key) => ({ key, stored: then[key], live: now[key] }));
  return diffs.length ? { state: 'mismatch', diffs } : { state: 'match' };
}
