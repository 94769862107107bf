import { countText } from './countText.ts';
import { idPairRunEnd, idWords } from './idRuns.ts';
import type { LabelMap } from './labelMap.ts';

/**
 * How a run's ids line up with the truth's on one frame (or summed over frames): pixels of non-void
 * truth, how many carry the same id, the truth id + 1, the truth id − 1, and which ids occur.
 */
export interface IdCensus {
  valid: number;
  same: number;
  up: number;
  down: number;
  /** Distinct non-void truth ids. */
  truthIds: number[];
  /** Predicted id → pixels, over non-void truth pixels. */
  predIds: Record<number, number>;
}

/**
 * Returns the census of `pred` against `truth` (same size), leaving out truth pixels equal to `ignore`.
 * Hot loop: one pass, dense histograms, no allocation per pixel.
 */
export function idCensusOf(truth: LabelMap, pred: LabelMap, ignore: number): IdCensus {
  const t = truth.ids;
  const p = pred.ids;
  const seenT = new Uint8Array(65536);
  const histP = new Uint32Array(65536);
  let valid = 0, same = 0, up = 0, down = 0;
  // Neighbouring pixels mostly repeat the same (truth, prediction) pair: count runs of a pair in a
  // register and add each run once (an increment per pixel chains every store behind the last).
  const n = t.length;
  const tw = idWords(t), pw = idWords(p);
  let i = 0;
  while (i < n) {
    const a = t[i], b = p[i];
    const j = idPairRunEnd(t, tw, p, pw, i + 1, n, a, b);
    const run = j - i;
    i = j;
    if (a === ignore) continue;
    valid += run;
    seenT[a] = 1;
    histP[b] += run;
    if (a === b) same += run;
    else if (b === a + 1) up += run;
    else if (b === a - 1) down += run;
  }
  const truthIds: number[] = [];
  const predIds: Record<number, number> = {};
  for (let id = 0; id < 65536; id++) {
    if (seenT[id]) truthIds.push(id);
    if (histP[id]) predIds[id] = histP[id];
  }
  return { valid, same, up, down, truthIds, predIds };
}

/** Returns an empty census to add frames to. */
export function idCensusCreate(): IdCensus {
  return { valid: 0, same: 0, up: 0, down: 0, truthIds: [], predIds: {} };
}

/** Adds frame census `b` into the running total `a` (in place) and returns `a`. */
export function idCensusAdd(a: IdCensus, b: IdCensus): IdCensus {
  a.valid += b.valid;
  a.same += b.same;
  a.up += b.up;
  a.down += b.down;
  const ids = new Set(a.truthIds);
  for (const id of b.truthIds) ids.add(id);
  a.truthIds = [...ids].sort((x, y) => x - y);
  for (const [id, n] of Object.entries(b.predIds)) a.predIds[Number(id)] = (a.predIds[Number(id)] ?? 0) + n;
  return a;
}

/** Share of pixels (0..1) above which a one-id shift is reported (common practice for a warning that should never fire on a working model). */
const SHIFT_SHARE = 0.3;
/** Share of predicted pixels (0..1) carrying a truth id below which the id spaces are reported as barely overlapping. */
const OVERLAP_SHARE = 0.5;

function rangeText(ids: number[]): string {
  if (ids.length === 0) return 'none';
  return ids.length <= 6 ? ids.join(', ') : `${ids.slice(0, 3).join(', ')} … ${ids[ids.length - 1]} (${ids.length} ids)`;
}

/**
 * Returns the warnings for a run whose ids cannot mean what the truth's mean: predicted ids that look
 * shifted by one against the truth (0..N-1 against 1..N), or predicted ids that barely occur in the
 * truth at all. These are the cases where mean IoU comes out near 0 without any error.
 */
export function idCensusWarnings(run: string, c: IdCensus): string[] {
  if (c.valid === 0) return [];
  const pct = (n: number) => `${Math.round((100 * n) / c.valid)}%`;
  const out: string[] = [];
  const shift = Math.max(c.up, c.down);
  if (shift > SHIFT_SHARE * c.valid && shift > 2 * c.same) {
    const sign = c.up >= c.down ? '+ 1' : '− 1';
    out.push(
      `run "${run}": predicted ids look shifted by one against the truth (prediction = truth ${sign} on ${pct(shift)} of pixels, equal on ${pct(c.same)}); ` +
        `if one side counts from 0 and the other from 1, map the predictions with "predictionIds" in classes.json`,
    );
  }
  const truthSet = new Set(c.truthIds);
  let inTruth = 0;
  const predList = Object.keys(c.predIds).map(Number).sort((a, b) => a - b);
  for (const id of predList) if (truthSet.has(id)) inTruth += c.predIds[id];
  if (out.length === 0 && inTruth < OVERLAP_SHARE * c.valid) {
    out.push(
      `run "${run}": predicted ids and truth ids barely overlap (only ${pct(inTruth)} of ${countText(c.valid)} pixels carry an id the truth uses; ` +
        `truth ids ${rangeText(c.truthIds)}, predicted ids ${rangeText(predList)}); the scores mean little until the ids are mapped with "truthIds" / "predictionIds" in classes.json`,
    );
  }
  return out;
}
