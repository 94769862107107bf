// The browser's per-frame scores while it scores a dataset, kept in compact typed columns (one
// Float64Array per score and run, NaN where a score is undefined, grown by doubling) instead of an
// object per frame: the frame list, the timeline and the report read them; a frame's full counts
// live only in the short window of recent frames (scoresSlice).
import { BAND_WIDTH_MAX } from '../core/metrics/bandHistogram.ts';
import { digestBandScores, type FrameDigest } from '../core/metrics/frameDigest.ts';
import { frameSummaryOf } from '../core/metrics/frameSummary.ts';
import { extrasFrameLine } from '../core/metrics/extrasTotals.ts';
import type { RunExtras } from '../core/frameExtras.ts';
import { classIoU } from './classFrames.ts';

/** Per-frame scores held per run (ratios 0..1, pixel counts), in this order. */
export const FRAME_COLUMN_KEYS = [
  'meanIoU', 'pixelAccuracy', 'boundaryIoU', 'boundaryF', 'errorPixels', 'validPixels', 'flipBack', 'flipBackVoid', 'smallObjectRecall',
] as const;
export type FrameColumnKey = (typeof FRAME_COLUMN_KEYS)[number];

/** Band widths a frame's band mean IoU is kept at: 0..BAND_WIDTH_MAX px. */
const BAND_STRIDE = BAND_WIDTH_MAX + 1;

/** One run's columns; index = frame index, NaN = undefined or not scored. */
export interface RunFrameColumns {
  values: Record<FrameColumnKey, Float64Array>;
  /** BAND_STRIDE per frame: the frame's band mean IoU at width 0..BAND_WIDTH_MAX. */
  band: Float64Array;
  /** Why the frame has no scores for this run (frame or run failed), by frame index (few). */
  errors: Map<number, string>;
  /** Per class id: the class's IoU and Boundary IoU on each frame (NaN where the class is in neither map or has no boundary). */
  classes: Map<number, { iou: Float64Array; biou: Float64Array }>;
}

/** Frame states in `FrameColumns.state`. */
export const FRAME_STATE = { pending: 0, scored: 1 } as const;

/** Every run's columns over a dataset of `total` frames. */
export interface FrameColumns {
  total: number;
  /** Frames the columns have room for (grown by doubling up to `total`). */
  capacity: number;
  /** Per frame: FRAME_STATE (pending until its result lands, failed or not). */
  state: Uint8Array;
  runs: Record<string, RunFrameColumns>;
}

const nanArray = (n: number) => new Float64Array(n).fill(NaN);

function runColumnsCreate(capacity: number): RunFrameColumns {
  const values = Object.fromEntries(FRAME_COLUMN_KEYS.map((k) => [k, nanArray(capacity)])) as Record<FrameColumnKey, Float64Array>;
  return { values, band: nanArray(capacity * BAND_STRIDE), errors: new Map(), classes: new Map() };
}

/** Returns empty columns for a dataset of `total` frames and `runs`. */
export function frameColumnsCreate(total: number, runs: readonly string[]): FrameColumns {
  const capacity = Math.min(total, 64);
  return { total, capacity, state: new Uint8Array(capacity), runs: Object.fromEntries(runs.map((r) => [r, runColumnsCreate(capacity)])) };
}

function grown<T extends Float64Array | Uint8Array>(a: T, length: number, fill: number): T {
  const out = new (a.constructor as new (n: number) => T)(length);
  out.set(a);
  if (fill !== 0) out.fill(fill, a.length);
  return out;
}

/** Makes room for frame `index` (doubling the capacity until it fits, at most `total`). */
function frameColumnsReserve(c: FrameColumns, index: number): void {
  if (index < c.capacity) return;
  let cap = Math.max(1, c.capacity);
  while (cap <= index) cap *= 2;
  cap = Math.min(c.total, cap);
  c.state = grown(c.state, cap, 0);
  for (const r of Object.values(c.runs)) {
    for (const k of FRAME_COLUMN_KEYS) r.values[k] = grown(r.values[k], cap, NaN);
    r.band = grown(r.band, cap * BAND_STRIDE, NaN);
    for (const k of r.classes.values()) {
      k.iou = grown(k.iou, cap, NaN);
      k.biou = grown(k.biou, cap, NaN);
    }
  }
  c.capacity = cap;
}

const nan = (v: number | null | undefined) => (v === null || v === undefined ? NaN : v);

/** What one run's outcome on a frame puts into the columns: its digest and extras, or why it has none. */
export interface FrameRunOutcome {
  run: string;
  stats: FrameDigest | null;
  extras?: RunExtras | null;
  error: string | null;
}

/**
 * Writes frame `index`'s outcomes into the columns (in place; `frameError` fails every run) and marks
 * it scored. A run without stats and without an error is recorded as failed ("no scores for run R").
 */
export function frameColumnsAdd(c: FrameColumns, index: number, frameError: string | null, runs: readonly FrameRunOutcome[]): void {
  if (index < 0 || index >= c.total) return;
  frameColumnsReserve(c, index);
  c.state[index] = FRAME_STATE.scored;
  for (const [name, col] of Object.entries(c.runs)) {
    const r = runs.find((x) => x.run === name);
    const error = frameError ?? r?.error ?? (r?.stats ? null : `no scores for run ${name}`);
    if (error || !r?.stats) {
      col.errors.set(index, error ?? `no scores for run ${name}`);
      continue;
    }
    const s = r.stats;
    const summary = frameSummaryOf(s, null);
    const extras = extrasFrameLine(r.extras);
    const v = col.values;
    v.meanIoU[index] = nan(summary.meanIoU);
    v.pixelAccuracy[index] = nan(summary.pixelAccuracy);
    v.boundaryIoU[index] = nan(summary.boundaryIoU);
    v.boundaryF[index] = nan(summary.boundaryF);
    v.errorPixels[index] = summary.errorPixels;
    v.validPixels[index] = summary.validPixels;
    v.flipBack[index] = nan(extras.flipBack);
    v.flipBackVoid[index] = nan(extras.flipBackVoid);
    v.smallObjectRecall[index] = nan(extras.smallObjectRecall);
    for (let w = 0; w < BAND_STRIDE; w++) col.band[index * BAND_STRIDE + w] = nan(digestBandScores(s, w).meanIoU);
    s.classIds.forEach((id, k) => {
      let cc = col.classes.get(id);
      if (!cc) col.classes.set(id, (cc = { iou: nanArray(c.capacity), biou: nanArray(c.capacity) }));
      cc.iou[index] = nan(classIoU(s, k));
      cc.biou[index] = s.biouUnion[k] > 0 ? s.biouInter[k] / s.biouUnion[k] : NaN;
    });
  }
}

/** Returns whether frame `index` has landed (scored or failed). */
export function frameColumnsHas(c: FrameColumns, index: number): boolean {
  return index >= 0 && index < c.capacity && c.state[index] === FRAME_STATE.scored;
}

/** Returns a run's score `key` of frame `index` (null when undefined, failed or not scored). */
export function frameColumnValue(col: RunFrameColumns, index: number, key: FrameColumnKey): number | null {
  const a = col.values[key];
  return index < a.length && !Number.isNaN(a[index]) ? a[index] : null;
}

/** Returns a run's band mean IoU of frame `index` at width `w` px (null when undefined or not scored). */
export function frameColumnBand(col: RunFrameColumns, index: number, w: number): number | null {
  const at = index * BAND_STRIDE + Math.max(0, Math.min(BAND_WIDTH_MAX, Math.round(w)));
  return at < col.band.length && !Number.isNaN(col.band[at]) ? col.band[at] : null;
}
