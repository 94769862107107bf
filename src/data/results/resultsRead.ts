// A results folder (README "Large datasets") read in the page with hyparquet: summary.json, the
// per-frame scores of frames.parquet into typed columns (no object per frame), and the queue. Only
// the columns the page shows are read; the large count lists stay on disk.
import { parquetMetadataAsync, parquetRead, parquetReadObjects, type AsyncBuffer } from 'hyparquet';
import type { DatasetTotals } from '../../core/metrics/datasetTotals.ts';
import type { ScoreSettings } from '../../core/metrics/settings.ts';
import type { RegionKind } from '../../core/regions/regionTypes.ts';
import { runSumsFromJson, type RunSumsJson } from '../../core/results/runSums.ts';
import type { Suspect } from '../../core/suspects/suspectQueue.ts';
import type { SuspectContributions } from '../../core/suspects/suspectScore.ts';
import type { PickedFile } from '../sources/folderSource.ts';

/** The files of a results folder, wherever they are (served by `npm start --results`, or picked). */
export interface ResultsFiles {
  title: string;
  text(name: string): Promise<string>;
  buffer(name: string): Promise<AsyncBuffer>;
}

/** The per-frame scores of one run, by frame index; NaN where a score is undefined or the frame failed. */
export interface RunColumns {
  meanIoU: Float64Array;
  pixelAccuracy: Float64Array;
  /** Band IoU at the table's band width (summary `rowBandWidth`, 3 px). */
  bandIoU: Float64Array;
  boundaryIoU: Float64Array;
  boundaryF: Float64Array;
  errorPixels: Float64Array;
  validPixels: Float64Array;
  /** Flip-back rates over non-void and void truth, and small-object recall (NaN where undefined, or all NaN in a table without them). */
  flipBack: Float64Array;
  flipBackVoid: Float64Array;
  smallObjectRecall: Float64Array;
  /** 1 where the frame has a row for this run, 0 where none was found. */
  present: Uint8Array;
  /** Why the frame failed, by frame index (few). */
  errors: Map<number, string>;
}

/** The per-frame score columns of a run, in the frame list's order of keys. */
export const RESULT_SCORE_KEYS = [
  'meanIoU', 'pixelAccuracy', 'bandIoU', 'boundaryIoU', 'boundaryF', 'errorPixels', 'validPixels', 'flipBack', 'flipBackVoid', 'smallObjectRecall',
] as const;
export type ResultScoreKey = (typeof RESULT_SCORE_KEYS)[number];

/** A results folder as the page holds it. */
export interface StoredResults {
  title: string;
  frames: number;
  runNames: string[];
  settings: ScoreSettings;
  classTable: { generated: boolean; ignore: number; classes: { id: number; name: string }[] };
  /** Per run: its frame scores. */
  runs: Record<string, RunColumns>;
  /** Per run: the dataset sums (every dataset score and the band curve at any width come from them). */
  totals: Record<string, DatasetTotals>;
  /** The likely-label-mistake queue as stored, best first. */
  queue: Suspect[];
  /** Band width of the table's bandIoU column. */
  bandWidth: number;
}

/** Band width (px) of frames.parquet's bandIoU column (the writer's ROW_BAND_WIDTH). */
export const STORED_BAND_WIDTH = 3;

const FILES = { summary: 'summary.json', frames: 'frames.parquet', queue: 'queue.parquet' } as const;

/**
 * Returns an AsyncBuffer whose reads, issued together (hyparquet plans a whole read at once), are
 * joined into few large range reads: ranges closer than `gap` bytes are fetched as one, up to `most`
 * bytes a read. A table of 100 000 frames has thousands of row groups; one request each would be slow.
 */
export function rangeBatched(byteLength: number, read: (start: number, end: number) => Promise<ArrayBuffer>, gap = 1 << 20, most = 1 << 24): AsyncBuffer {
  let queue: { start: number; end: number; resolve: (b: ArrayBuffer) => void; reject: (e: unknown) => void }[] = [];
  const flush = () => {
    const wanted = queue.sort((a, b) => a.start - b.start);
    queue = [];
    let i = 0;
    while (i < wanted.length) {
      let j = i + 1;
      let end = wanted[i].end;
      while (j < wanted.length && wanted[j].start - end <= gap && Math.max(end, wanted[j].end) - wanted[i].start <= most) end = Math.max(end, wanted[j++].end);
      const group = wanted.slice(i, j);
      const start = wanted[i].start;
      read(start, end).then(
        (buf) => group.forEach((g) => g.resolve(buf.slice(g.start - start, g.end - start))),
        (e) => group.forEach((g) => g.reject(e)),
      );
      i = j;
    }
  };
  return {
    byteLength,
    slice(start, end = byteLength) {
      return new Promise<ArrayBuffer>((resolve, reject) => {
        if (queue.length === 0) setTimeout(flush, 0);
        queue.push({ start, end, resolve, reject });
      });
    },
  };
}

/** Returns the results folder that `npm start -- DATASET --results DIR` serves, or null when it serves none. */
export async function servedResultsFiles(base = '/results/'): Promise<ResultsFiles | null> {
  const res = await fetch(`${base}index.json`, { cache: 'no-store' });
  if (res.status === 404) return null;
  if (!res.ok) throw new Error(`the server could not list the results folder (HTTP ${res.status})`);
  const index = (await res.json()) as { title: string | null; files: Record<string, number> | null };
  if (index.title === null || index.files === null) return null;
  const files = index.files;
  const url = (name: string) => `${base}file/${encodeURIComponent(name)}`;
  return {
    title: index.title,
    async text(name) {
      const r = await fetch(url(name), { cache: 'no-store' });
      if (!r.ok) throw new Error(`${index.title}/${name}: could not be read (HTTP ${r.status})`);
      return r.text();
    },
    async buffer(name) {
      if (files[name] === undefined) throw new Error(`${index.title}/${name}: missing from the results folder`);
      return rangeBatched(files[name], async (start, end) => {
        const r = await fetch(url(name), { headers: { range: `bytes=${start}-${end - 1}` }, cache: 'no-store' });
        if (r.status !== 206 && r.status !== 200) throw new Error(`${index.title}/${name}: could not be read (HTTP ${r.status})`);
        const buf = await r.arrayBuffer();
        return r.status === 200 ? buf.slice(start, end) : buf;
      });
    },
  };
}

/** Returns the results folder among picked or dropped files (summary.json at its top, or one level down), or null. */
export function pickedResultsFiles(picked: PickedFile[]): ResultsFiles | null {
  const summary = picked.find((f) => /^([^/]+\/)?summary\.json$/.test(f.path));
  if (!summary) return null;
  const prefix = summary.path.slice(0, -FILES.summary.length);
  const title = prefix ? prefix.slice(0, -1) : 'results folder';
  const byName = new Map(picked.filter((f) => f.path.startsWith(prefix)).map((f) => [f.path.slice(prefix.length), f.file]));
  const get = (name: string) => {
    const f = byName.get(name);
    if (!f) throw new Error(`${title}/${name}: missing from the results folder`);
    return f;
  };
  return {
    title,
    text: async (name) => get(name).text(),
    buffer: async (name) => {
      const f = get(name);
      return rangeBatched(f.size, (start, end) => f.slice(start, end).arrayBuffer());
    },
  };
}

/** summary.json as far as the page needs it. */
interface SummaryJson {
  format: string;
  version: number;
  settings: { ignore: number; biouDilationRatio: number; bfTolerance: number };
  runNames: string[];
  classTable: StoredResults['classTable'];
  datasetId: string;
  frames: { total: number; from: number; to: number };
  shard: { index: number; count: number } | null;
  sums: { runs: Record<string, RunSumsJson> };
}

/** Returns the identity the scorer gives a dataset (its runs and every frame name in order; SHA-256, first 32 hex digits). */
export async function datasetIdOfNames(runs: readonly string[], frameNames: readonly string[]): Promise<string> {
  const text = JSON.stringify(runs) + frameNames.map((n) => `\n${n}`).join('');
  const digest = await crypto.subtle.digest('SHA-256', new TextEncoder().encode(text));
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('').slice(0, 32);
}

const num = (v: unknown): number => (v === null || v === undefined ? NaN : Number(v));

function runColumnsCreate(n: number): RunColumns {
  const f = () => new Float64Array(n).fill(NaN);
  return {
    meanIoU: f(), pixelAccuracy: f(), bandIoU: f(), boundaryIoU: f(), boundaryF: f(), errorPixels: f(), validPixels: f(),
    flipBack: f(), flipBackVoid: f(), smallObjectRecall: f(),
    present: new Uint8Array(n), errors: new Map(),
  };
}

/** Reads frames.parquet's score columns into per-run typed columns, one row group at a time. */
async function frameColumnsRead(file: AsyncBuffer, where: string, frames: number, runNames: readonly string[]): Promise<Record<string, RunColumns>> {
  const metadata = await parquetMetadataAsync(file);
  const rows = Number(metadata.num_rows);
  const frameIndex = new Int32Array(rows);
  const runOf = new Uint8Array(rows);
  // A table written before the flicker columns existed has none: those stay NaN.
  const names = new Set(metadata.schema.map((e) => e.name));
  const keys = RESULT_SCORE_KEYS.filter((k) => names.has(k));
  const values: Record<ResultScoreKey, Float64Array> = Object.fromEntries(RESULT_SCORE_KEYS.map((k) => [k, new Float64Array(rows).fill(NaN)])) as Record<ResultScoreKey, Float64Array>;
  const errors = new Map<number, string>();
  const runIndex = new Map(runNames.map((r, i) => [r, i]));
  let badRun: string | null = null;
  await parquetRead({
    file, metadata,
    columns: ['frameIndex', 'run', 'error', ...keys],
    onChunk: ({ columnName, columnData, rowStart }) => {
      const n = columnData.length;
      if (columnName === 'frameIndex') for (let i = 0; i < n; i++) frameIndex[rowStart + i] = Number(columnData[i]);
      else if (columnName === 'run') {
        for (let i = 0; i < n; i++) {
          const r = runIndex.get(columnData[i] as string);
          if (r === undefined) badRun ??= String(columnData[i]);
          else runOf[rowStart + i] = r;
        }
      } else if (columnName === 'error') {
        for (let i = 0; i < n; i++) if (columnData[i] !== null && columnData[i] !== undefined) errors.set(rowStart + i, String(columnData[i]));
      } else {
        const out = values[columnName as ResultScoreKey];
        for (let i = 0; i < n; i++) out[rowStart + i] = num(columnData[i]);
      }
    },
  });
  if (badRun !== null) throw new Error(`${where}: run "${badRun}" is not among the summary's runs (${runNames.join(', ')})`);
  const out: Record<string, RunColumns> = Object.fromEntries(runNames.map((r) => [r, runColumnsCreate(frames)]));
  for (let row = 0; row < rows; row++) {
    const f = frameIndex[row];
    if (f < 0 || f >= frames) throw new Error(`${where}: row ${row} has frame index ${f}, outside 0..${frames - 1}`);
    const c = out[runNames[runOf[row]]];
    if (c.present[f]) throw new Error(`${where}: frame ${f} of run "${runNames[runOf[row]]}" has two rows`);
    c.present[f] = 1;
    for (const k of RESULT_SCORE_KEYS) c[k][f] = values[k][row];
    const e = errors.get(row);
    if (e !== undefined) c.errors.set(f, e);
  }
  return out;
}

const json = <T>(text: unknown, fallback: T): T => {
  try {
    return typeof text === 'string' ? (JSON.parse(text) as T) : fallback;
  } catch {
    return fallback;
  }
};

/** Reads queue.parquet into queue entries (the table is short: the queue's length). */
async function queueRead(file: AsyncBuffer): Promise<Suspect[]> {
  const rows = (await parquetReadObjects({ file })) as Record<string, unknown>[];
  return rows.map((r) => ({
    frame: String(r.frame), run: String(r.run), frameIndex: Number(r.frameIndex), regionId: Number(r.regionId),
    bbox: [Number(r.x0), Number(r.y0), Number(r.x1), Number(r.y1)], truthClass: Number(r.truthClass), predictedClass: Number(r.predictedClass),
    kind: String(r.kind) as RegionKind, score: Number(r.score), reasons: json<string[]>(r.reasons, []),
    signals: {
      geometry: num(r.geometry), agreement: r.agreement == null ? null : Number(r.agreement), confidence: r.confidence == null ? null : Number(r.confidence),
      image: r.image == null ? null : Number(r.image), appearance: r.appearance == null ? null : Number(r.appearance),
      temporal: num(r.temporal), steady: num(r.steady), habit: num(r.habit),
    },
    contributions: json(r.contributions, {} as SuspectContributions), contributionsText: String(r.contributionsText ?? ''),
    alsoRuns: json<string[]>(r.alsoRuns, []), merged: json<{ run: string; regionId: number }[]>(r.merged, []),
  }));
}

/**
 * Reads a results folder for the dataset whose runs and frame names are given; throws an Error naming
 * the file and the problem when it is no results folder, a single shard, or the results of another dataset.
 */
export async function resultsRead(files: ResultsFiles, dataset: { runs: readonly string[]; frameNames: readonly string[] }): Promise<StoredResults> {
  const where = (name: string) => `${files.title}/${name}`;
  const text = await files.text(FILES.summary);
  let s: SummaryJson;
  try {
    s = JSON.parse(text);
  } catch (e) {
    throw new Error(`${where(FILES.summary)}: not valid JSON (${(e as Error).message})`);
  }
  if (s?.format !== 'hairline-results' || s.version !== 1) throw new Error(`${where(FILES.summary)}: not a Hairline results summary (format ${JSON.stringify(s?.format)})`);
  if (s.shard) throw new Error(`${files.title} holds shard ${s.shard.index}/${s.shard.count} only (frames ${s.frames.from}..${s.frames.to - 1}); merge the shards first (npm run merge)`);
  const n = dataset.frameNames.length;
  if (s.frames.total !== n) throw new Error(`${files.title} holds the results of ${s.frames.total} frames, the open dataset has ${n}`);
  const sameRuns = s.runNames.length === dataset.runs.length && s.runNames.every((r, i) => r === dataset.runs[i]);
  if (!sameRuns) throw new Error(`${files.title} was scored with runs ${s.runNames.join(', ')}; the open dataset has ${dataset.runs.join(', ') || 'none'}`);
  if ((await datasetIdOfNames(dataset.runs, dataset.frameNames)) !== s.datasetId) {
    throw new Error(`${files.title} holds the results of other frames (same count and runs, different frame names); score this dataset with npm run score -- --dataset DIR --results OUT`);
  }
  const totals: Record<string, DatasetTotals> = {};
  for (const r of s.runNames) {
    const sums = s.sums?.runs?.[r];
    if (!sums) throw new Error(`${where(FILES.summary)}: no sums for run "${r}"`);
    const read = runSumsFromJson(sums, where(FILES.summary));
    if (!read.ok) throw new Error(read.error);
    totals[r] = read.value.totals;
  }
  const [runs, queue] = await Promise.all([
    files.buffer(FILES.frames).then((b) => frameColumnsRead(b, where(FILES.frames), n, s.runNames)),
    files.buffer(FILES.queue).then(queueRead),
  ]).catch((e: Error) => {
    throw new Error(e.message.startsWith(files.title) ? e.message : `${files.title}: a table could not be read (${e.message})`);
  });
  return {
    title: files.title, frames: n, runNames: s.runNames, classTable: s.classTable, runs, totals, queue, bandWidth: STORED_BAND_WIDTH,
    settings: { ignore: s.settings.ignore, biouDilationRatio: s.settings.biouDilationRatio, bfTolerance: s.settings.bfTolerance },
  };
}
