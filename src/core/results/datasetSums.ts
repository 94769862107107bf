// Everything additive a results folder keeps about its frames, per run: score sums (runSums.ts),
// confidence sums behind confident learning's thresholds (exact), how often each class pair shows
// (frames), and frames scored and failed. Shards' sums add up to the sums of one pass, exactly.
import type { FrameJobResult } from '../frameJob.ts';
import { fail, ok, type Result } from '../result.ts';
import { appearanceSumsAdd, appearanceSumsMerge, type AppearanceSums } from '../suspects/appearanceModel.ts';
import { pairRecurrenceAdd, pairRecurrenceMerge, type PairRecurrence } from '../suspects/pairRecurrence.ts';
import type { ConfidenceSums } from '../suspects/suspectCandidates.ts';
import type { SuspectSettings } from '../suspects/suspectSettings.ts';
import { exactOf, exactValue } from './exactSum.ts';
import { runSumsAdd, runSumsCreate, runSumsFromJson, runSumsMerge, runSumsToJson, type RunSums, type RunSumsJson } from './runSums.ts';

export interface DatasetSums {
  runs: Map<string, RunSums>;
  /** Per run and class id: exact sum of confidence and pixels where label and prediction agree. */
  confidence: Map<string, Map<number, { sum: bigint; count: number }>>;
  recurrence: PairRecurrence;
  /** Per class id: its appearance histogram over the dataset's photos (pixels sampled). */
  appearance: AppearanceSums;
  /** Frames whose every run scored, and frames where the frame or some run failed. */
  scored: number;
  failed: number;
}

export interface DatasetSumsJson {
  runs: Record<string, RunSumsJson>;
  confidence: Record<string, [number, string, number][]>;
  recurrence: Record<string, { frames: number; pairs: Record<string, number> }>;
  appearance: [number, number[]][];
  scored: number;
  failed: number;
}

/** Returns empty sums for `runs` over `classIds` (empty for a dataset without a class table). */
export function datasetSumsCreate(runs: readonly string[], classIds: readonly number[]): DatasetSums {
  return { runs: new Map(runs.map((r) => [r, runSumsCreate(classIds)])), confidence: new Map(), recurrence: new Map(), appearance: new Map(), scored: 0, failed: 0 };
}

/** Adds one frame's result; `widen` when there is no class table. */
export function datasetSumsAdd(d: DatasetSums, result: FrameJobResult, widen: boolean, s: Pick<SuspectSettings, 'thickPx'>): void {
  let anyFailed = false;
  for (const r of result.runs) {
    const error = result.error ?? r.error;
    if (r.stats && !error) runSumsAdd(d.runs.get(r.run)!, r.stats, widen, r.extras);
    else anyFailed = true;
    const c = error ? null : r.regions?.confidence;
    if (!c) continue;
    let m = d.confidence.get(r.run);
    if (!m) d.confidence.set(r.run, (m = new Map()));
    c.classIds.forEach((id, i) => {
      const e = m.get(id) ?? { sum: 0n, count: 0 };
      e.sum += exactOf(c.sum[i]);
      e.count += c.count[i];
      m.set(id, e);
    });
  }
  pairRecurrenceAdd(d.recurrence, result, s);
  appearanceSumsAdd(d.appearance, result);
  if (anyFailed) d.failed++;
  else d.scored++;
}

/** Adds `from` into `into` (shards of one dataset), or says why they cannot be added. */
export function datasetSumsMerge(into: DatasetSums, from: DatasetSums, widen: boolean): Result<DatasetSums> {
  for (const [run, s] of from.runs) {
    const a = into.runs.get(run);
    if (!a) return fail('', `run "${run}" is not in every part`);
    const m = runSumsMerge(a, s, widen);
    if (!m.ok) return m;
    into.runs.set(run, m.value);
  }
  for (const [run, m] of from.confidence) {
    let to = into.confidence.get(run);
    if (!to) into.confidence.set(run, (to = new Map()));
    for (const [id, e] of m) {
      const t = to.get(id) ?? { sum: 0n, count: 0 };
      to.set(id, { sum: t.sum + e.sum, count: t.count + e.count });
    }
  }
  pairRecurrenceMerge(into.recurrence, from.recurrence);
  appearanceSumsMerge(into.appearance, from.appearance);
  into.scored += from.scored;
  into.failed += from.failed;
  return ok(into);
}

/** Returns the confidence sums as the queue reads them. */
export function datasetSumsConfidence(d: DatasetSums): ConfidenceSums {
  return new Map([...d.confidence].map(([run, m]) => [run, new Map([...m].map(([id, e]) => [id, { sum: exactValue(e.sum), count: e.count }]))]));
}

export function datasetSumsToJson(d: DatasetSums): DatasetSumsJson {
  return {
    runs: Object.fromEntries([...d.runs].map(([r, s]) => [r, runSumsToJson(s)])),
    confidence: Object.fromEntries([...d.confidence].map(([r, m]) => [r, [...m].sort((a, b) => a[0] - b[0]).map(([id, e]) => [id, e.sum.toString(), e.count])])),
    recurrence: Object.fromEntries([...d.recurrence].map(([r, e]) => [r, { frames: e.frames, pairs: Object.fromEntries([...e.pairs].sort()) }])),
    appearance: [...d.appearance].sort((a, b) => a[0] - b[0]).map(([id, h]) => [id, Array.from(h)]),
    scored: d.scored,
    failed: d.failed,
  };
}

/** Returns sums read back from JSON (`where` names the file in messages), runs in the order given. */
export function datasetSumsFromJson(j: DatasetSumsJson, runs: readonly string[], where: string): Result<DatasetSums> {
  try {
    const out: DatasetSums = { runs: new Map(), confidence: new Map(), recurrence: new Map(), appearance: new Map(), scored: j.scored, failed: j.failed };
    for (const r of runs) {
      if (!j.runs[r]) return fail(where, `no sums for run "${r}"`);
      const s = runSumsFromJson(j.runs[r], where);
      if (!s.ok) return s;
      out.runs.set(r, s.value);
    }
    for (const [r, list] of Object.entries(j.confidence)) out.confidence.set(r, new Map(list.map(([id, sum, count]) => [id, { sum: BigInt(sum), count }])));
    for (const [r, e] of Object.entries(j.recurrence)) out.recurrence.set(r, { frames: e.frames, pairs: new Map(Object.entries(e.pairs)) });
    for (const [id, h] of j.appearance) out.appearance.set(id, Float64Array.from(h));
    return ok(out);
  } catch (e) {
    return fail(where, `unreadable sums (${(e as Error).message})`);
  }
}
