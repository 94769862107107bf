// A results folder written as frames finish (README "Large datasets"): frame and region rows go out
// in row groups in frame order, the sums are added up, and nothing per frame stays once its rows are
// written. At the end the queue is ranked from the stored region evidence and summary.json written;
// everything is written into DIR.partial and renamed to DIR last, so a run that stops leaves any
// earlier results as they were.
import { mkdir, rename, rm, stat, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { FrameJobResult } from '../core/frameJob.ts';
import type { ScoreReport } from '../core/metrics/report.ts';
import type { ScoreSettings } from '../core/metrics/settings.ts';
import { datasetSumsAdd, datasetSumsConfidence, datasetSumsCreate, datasetSumsToJson, type DatasetSums, type DatasetSumsJson } from '../core/results/datasetSums.ts';
import { evidenceWindowCreate } from '../core/results/evidenceWindow.ts';
import { queueRankCreate } from '../core/results/queueRank.ts';
import { candidateOfRow, frameRowsOf, regionRowsOf, type FrameRow, type RegionRow } from '../core/results/resultRows.ts';
import { runSumsDataset } from '../core/results/runSums.ts';
import { frameGridsOf, suspectCandidates, type SuspectCandidate } from '../core/suspects/suspectCandidates.ts';
import type { Suspect } from '../core/suspects/suspectQueue.ts';
import type { SuspectSettings } from '../core/suspects/suspectSettings.ts';
import { UsageError } from './args.ts';
import { heapTrim } from './heapTrim.ts';
import { tableRowGroups, tableWriterCreate } from './parquetTable.ts';
import { FRAME_COLUMNS, QUEUE_COLUMNS, REGION_COLUMNS, RESULTS_FILES, type QueueRow } from './resultsTables.ts';

/** The shard a results folder holds: frames from..to−1 of `total`, part `index` of `count` (null: every frame). */
export interface ResultsShard {
  index: number;
  count: number;
}

/** What a results folder says about itself; summary.json. */
export interface ResultsSummary {
  format: 'hairline-results';
  version: 1;
  classes: ScoreReport['classes'];
  settings: ScoreReport['settings'];
  /** The first run's dataset scores, exactly as the JSON report's `dataset`. */
  dataset: ScoreReport['dataset'];
  /** Every run's dataset scores, by run name (runNames gives their order). */
  runs: Record<string, ScoreReport['dataset']>;
  runNames: string[];
  /** The class table scored with (generated: none was given, classes are the ids found). */
  classTable: { generated: boolean; ignore: number; classes: { id: number; name: string }[] };
  suspectSettings: SuspectSettings;
  /** Identity of the dataset: a digest of every frame name and run, the same for each of its shards. */
  datasetId: string;
  frames: { total: number; from: number; to: number; scored: number; failed: number };
  shard: ResultsShard | null;
  unpaired: unknown[];
  sums: DatasetSumsJson;
  rows: { frames: number; regions: number; queue: number };
}

/** What the writer needs to know before the first frame. */
export interface ResultsStart {
  dir: string;
  runs: string[];
  classTable: ResultsSummary['classTable'];
  settings: ScoreSettings;
  suspectSettings: SuspectSettings;
  datasetId: string;
  total: number;
  from: number;
  to: number;
  shard: ResultsShard | null;
  unpaired: unknown[];
}

export interface ResultsWriter {
  /** Takes frame `index`'s result (a frame outside from..to is read only for its neighbours' evidence). */
  add(index: number, result: FrameJobResult): void;
  /** Frames held for evidence now (a few at most). */
  held(): number;
  /** Ranks the queue, writes summary.json and puts the folder in place; returns the summary and the queue. */
  finish(): Promise<{ summary: ResultsSummary; queue: Suspect[] }>;
  /** Removes the partial folder (after a failure). */
  abandon(): Promise<void>;
}

/** Frames between two full garbage collections (heapTrim.ts). */
const TRIM_FRAMES = 50;

/** Checks that `dir` can take a results folder: absent, empty, or an earlier results folder. */
export async function resultsDirCheck(dir: string, what = '--results'): Promise<void> {
  const s = await stat(dir).catch(() => null);
  if (!s) return;
  if (!s.isDirectory()) throw new UsageError(`${what} ${dir}: exists and is not a folder`);
  const { readdir } = await import('node:fs/promises');
  const names = await readdir(dir);
  if (names.length && !names.includes(RESULTS_FILES.summary)) throw new UsageError(`${what} ${dir}: exists and is not a results folder (no ${RESULTS_FILES.summary}); choose a new folder`);
}

/** Returns summary.json's text: indented, with the long sum arrays kept on one line each. */
export function summaryJson(summary: ResultsSummary): string {
  const { sums, ...rest } = summary;
  const runs = Object.entries(sums.runs).map(([r, s]) => `      ${JSON.stringify(r)}: ${JSON.stringify(s)}`).join(',\n');
  const tail = Object.entries(sums).filter(([k]) => k !== 'runs').map(([k, v]) => `    ${JSON.stringify(k)}: ${JSON.stringify(v)}`).join(',\n');
  return `${JSON.stringify(rest, null, 2).slice(0, -2)},\n  "sums": {\n    "runs": {\n${runs}\n    },\n${tail}\n  }\n}\n`;
}

/** Moves the finished `partial` folder to `dir`, replacing an earlier results folder there. */
export async function resultsDirCommit(partial: string, dir: string): Promise<void> {
  const old = `${dir}.old-${process.pid}`;
  const had = await stat(dir).then(() => true, () => false);
  if (had) await rename(dir, old);
  await rename(partial, dir);
  if (had) await rm(old, { recursive: true, force: true });
}

/** Returns the summary's per-run dataset blocks and classes from the sums. */
export function summaryScores(sums: DatasetSums, runs: readonly string[], classTable: ResultsSummary['classTable'], settings: ScoreSettings) {
  const names = new Map(classTable.classes.map((c) => [c.id, c.name]));
  const blocks = Object.fromEntries(runs.map((r) => [r, runSumsDataset(sums.runs.get(r)!, settings)]));
  const classes = sums.runs.get(runs[0])!.totals.classIds.map((id) => ({ id, name: names.get(id) ?? String(id) }));
  return { classes, dataset: blocks[runs[0]], runs: blocks };
}

/** Returns a queue row from a queue entry. */
export function queueRowOf(s: Suspect, rank: number): QueueRow {
  return {
    rank, frameIndex: s.frameIndex, frame: s.frame, run: s.run, regionId: s.regionId, kind: s.kind, truthClass: s.truthClass, predictedClass: s.predictedClass,
    x0: s.bbox[0], y0: s.bbox[1], x1: s.bbox[2], y1: s.bbox[3], score: s.score, reasons: JSON.stringify(s.reasons),
    geometry: s.signals.geometry, agreement: s.signals.agreement, confidence: s.signals.confidence, image: s.signals.image,
    temporal: s.signals.temporal, steady: s.signals.steady, habit: s.signals.habit, appearance: s.signals.appearance, contributions: JSON.stringify(s.contributions),
    contributionsText: s.contributionsText, alsoRuns: JSON.stringify(s.alsoRuns), merged: JSON.stringify(s.merged),
  };
}

/**
 * Ranks the queue from region tables read in frame order (one or several, e.g. the shards of a merge)
 * and writes queue.parquet into `dir`; returns the queue.
 */
export async function queueWrite(
  dir: string, regionTables: readonly string[], sums: DatasetSums, s: SuspectSettings, className: (id: number) => string,
): Promise<Suspect[]> {
  const rank = queueRankCreate(s, { confidence: datasetSumsConfidence(sums), recurrence: sums.recurrence, appearance: sums.appearance }, className);
  let frame = -1;
  let pending: ReturnType<typeof candidateOfRow>[] = [];
  const flush = () => {
    if (pending.length) rank.addFrame(pending as NonNullable<(typeof pending)[number]>[]);
    pending = [];
  };
  for (const path of regionTables) {
    for await (const rows of tableRowGroups<RegionRow>(path)) {
      for (const row of rows) {
        if (row.frameIndex !== frame) {
          flush();
          frame = row.frameIndex;
        }
        const c = candidateOfRow(row);
        if (c) pending.push(c);
      }
    }
  }
  flush();
  const queue = rank.result();
  const table = tableWriterCreate<QueueRow>(join(dir, RESULTS_FILES.queue), QUEUE_COLUMNS);
  queue.forEach((q, i) => table.add(queueRowOf(q, i + 1)));
  table.close();
  return queue;
}

/** Returns the class-name look-up of a class table. */
export function classNameOf(classTable: ResultsSummary['classTable']): (id: number) => string {
  const names = new Map(classTable.classes.map((c) => [c.id, c.name]));
  return (id) => names.get(id) ?? String(id);
}

/** Starts a results folder; throws UsageError when `dir` cannot take one. */
export async function resultsWriterCreate(start: ResultsStart): Promise<ResultsWriter> {
  await resultsDirCheck(start.dir);
  const partial = `${start.dir}.partial`;
  await rm(partial, { recursive: true, force: true });
  await mkdir(partial, { recursive: true });
  const frames = tableWriterCreate<FrameRow>(join(partial, RESULTS_FILES.frames), FRAME_COLUMNS);
  const regions = tableWriterCreate<RegionRow>(join(partial, RESULTS_FILES.regions), REGION_COLUMNS);
  const generated = start.classTable.generated;
  const sums = datasetSumsCreate(start.runs, generated ? [] : start.classTable.classes.map((c) => c.id));
  const s = start.suspectSettings;
  let finished = 0;
  let frameRows = 0, regionRows = 0;
  const window = evidenceWindowCreate<{ result: FrameJobResult; rows: FrameRow[] }>(start.total, start.from, start.to, s, (index, p, candidates, evidence) => {
    for (const r of p.rows) frames.add(r);
    frameRows += p.rows.length;
    for (const r of regionRowsOf(index, p.result, candidates, evidence, start.settings.ignore)) {
      regions.add(r);
      regionRows++;
    }
    finished++;
    if (finished % TRIM_FRAMES === 0) heapTrim();
  });
  return {
    add(index, result) {
      const own = index >= start.from && index < start.to;
      let payload: { result: FrameJobResult; rows: FrameRow[] } | null = null;
      if (own) {
        datasetSumsAdd(sums, result, generated, s);
        // The counts are in the rows and the sums now; only the regions wait for their neighbours.
        payload = { rows: frameRowsOf(index, result), result: { ...result, runs: result.runs.map((r) => ({ ...r, stats: null })) } };
      }
      const candidates: SuspectCandidate[] = suspectCandidates(result, index, s);
      window.add(index, frameGridsOf(result), candidates, payload);
    },
    held: () => window.held(),
    async finish() {
      if (finished !== start.to - start.from) throw new Error(`results: ${start.to - start.from - finished} frames were never finished`);
      frames.close();
      regions.close();
      const queue = await queueWrite(partial, [join(partial, RESULTS_FILES.regions)], sums, s, classNameOf(start.classTable));
      const summary: ResultsSummary = {
        format: 'hairline-results', version: 1,
        ...summaryScores(sums, start.runs, start.classTable, start.settings),
        settings: { ignore: start.settings.ignore, biouDilationRatio: start.settings.biouDilationRatio, bfTolerance: start.settings.bfTolerance },
        runNames: [...start.runs], classTable: start.classTable, suspectSettings: s, datasetId: start.datasetId,
        frames: { total: start.total, from: start.from, to: start.to, scored: sums.scored, failed: sums.failed },
        shard: start.shard, unpaired: start.unpaired, sums: datasetSumsToJson(sums), rows: { frames: frameRows, regions: regionRows, queue: queue.length },
      };
      await writeFile(join(partial, RESULTS_FILES.summary), summaryJson(summary));
      await resultsDirCommit(partial, start.dir);
      return { summary, queue };
    },
    abandon: () => rm(partial, { recursive: true, force: true }),
  };
}
