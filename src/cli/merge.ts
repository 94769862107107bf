// `npm run merge -- --out DIR PART…`: merges the results folders of a dataset's shards into one
// results folder equal to scoring every frame in one run (README "Large datasets"): additive sums
// added, frame and region tables joined in frame order, and the queue ranked again over the whole
// dataset from the stored region evidence. Parts of different settings, class tables, runs or
// datasets, and missing or doubled shards, are refused (exit 2) with a message naming the difference.
import { mkdir, readFile, rm, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { datasetSumsFromJson, datasetSumsMerge, datasetSumsToJson, type DatasetSums } from '../core/results/datasetSums.ts';
import type { FrameRow, RegionRow } from '../core/results/resultRows.ts';
import { argsParse, UsageError } from './args.ts';
import { tableRowGroups, tableWriterCreate, type ColumnSpec } from './parquetTable.ts';
import { FRAME_COLUMNS, REGION_COLUMNS, RESULTS_FILES } from './resultsTables.ts';
import {
  classNameOf, queueWrite, resultsDirCheck, resultsDirCommit, summaryJson, summaryScores, type ResultsSummary,
} from './resultsWrite.ts';

export const MERGE_USAGE = 'usage: npm run merge -- --out DIR PART [PART ...]   (each PART a results folder of one shard)';

/** Exit codes: merged / bad arguments / parts refused. */
export const MERGE_EXIT = { ok: 0, usage: 1, refused: 2 } as const;

/** Parts that cannot be merged, with the reason. */
export class MergeRefused extends Error {}

/** Returns the first place where two JSON values differ ("classTable.classes[3].name: \"crane\" vs \"hoist\""), or null. */
export function jsonDifference(a: unknown, b: unknown, path = ''): string | null {
  if (a === b) return null;
  const show = (v: unknown) => (v === undefined ? '(none)' : JSON.stringify(v));
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null || Array.isArray(a) !== Array.isArray(b)) {
    return `${path || '(value)'}: ${show(a)} vs ${show(b)}`;
  }
  if (Array.isArray(a) && Array.isArray(b) && a.length !== b.length) return `${path}: ${a.length} entries vs ${(b as unknown[]).length}`;
  const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])];
  for (const k of keys) {
    const d = jsonDifference((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], Array.isArray(a) ? `${path}[${k}]` : path ? `${path}.${k}` : k);
    if (d) return d;
  }
  return null;
}

async function summaryRead(dir: string): Promise<ResultsSummary> {
  const file = join(dir, RESULTS_FILES.summary);
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (e) {
    throw new MergeRefused(`${dir}: not a results folder (cannot read ${RESULTS_FILES.summary}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  let s: ResultsSummary;
  try {
    s = JSON.parse(text);
  } catch (e) {
    throw new MergeRefused(`${file}: not valid JSON (${(e as Error).message})`);
  }
  if (s.format !== 'hairline-results' || s.version !== 1) throw new MergeRefused(`${file}: not a Hairline results summary (format ${JSON.stringify(s.format)}, version ${JSON.stringify(s.version)})`);
  return s;
}

/** What must be the same in every part, by the words used in messages. */
const SAME: [string, (s: ResultsSummary) => unknown][] = [
  ['scoring settings', (s) => s.settings],
  ['class table', (s) => s.classTable],
  ['runs', (s) => s.runNames],
  ['label-mistake settings', (s) => s.suspectSettings],
  ['dataset (frame names and runs)', (s) => ({ datasetId: s.datasetId, frames: s.frames.total })],
];

/** Checks the parts against each other and returns them in shard order; throws MergeRefused naming the problem. */
export function partsCheck(parts: { dir: string; summary: ResultsSummary }[]): { dir: string; summary: ResultsSummary }[] {
  const [first] = parts;
  for (const p of parts.slice(1)) {
    for (const [what, get] of SAME) {
      const d = jsonDifference(get(first.summary), get(p.summary));
      if (d) throw new MergeRefused(`${p.dir} and ${first.dir} differ in their ${what}: ${d}`);
    }
  }
  const whole = parts.find((p) => p.summary.shard === null);
  if (whole) throw new MergeRefused(`${whole.dir} holds every frame (it was not scored with --shard); there is nothing to merge it with`);
  const count = first.summary.shard!.count;
  const other = parts.find((p) => p.summary.shard!.count !== count);
  if (other) throw new MergeRefused(`${other.dir} is shard ${other.summary.shard!.index}/${other.summary.shard!.count} but ${first.dir} is one of ${count} shards`);
  const byIndex = new Map<number, string>();
  for (const p of parts) {
    const i = p.summary.shard!.index;
    if (byIndex.has(i)) throw new MergeRefused(`shard ${i}/${count} is given twice: ${byIndex.get(i)} and ${p.dir}`);
    byIndex.set(i, p.dir);
  }
  const missing = Array.from({ length: count }, (_, i) => i).filter((i) => !byIndex.has(i));
  if (missing.length) throw new MergeRefused(`shard${missing.length > 1 ? 's' : ''} ${missing.map((i) => `${i}/${count}`).join(', ')} missing (given: ${[...byIndex.keys()].sort((a, b) => a - b).map((i) => `${i}/${count}`).join(', ')})`);
  return [...parts].sort((a, b) => a.summary.shard!.index - b.summary.shard!.index);
}

async function tablesJoin<R extends object>(parts: readonly string[], file: string, columns: readonly ColumnSpec[], out: string): Promise<number> {
  const table = tableWriterCreate<R>(join(out, file), columns);
  for (const dir of parts) for await (const rows of tableRowGroups<R>(join(dir, file))) for (const r of rows) table.add(r);
  return table.close();
}

/** Merges the parts into `out`; returns the merged summary. */
export async function resultsMerge(out: string, dirs: readonly string[]): Promise<ResultsSummary> {
  const parts = partsCheck(await Promise.all(dirs.map(async (dir) => ({ dir, summary: await summaryRead(dir) }))));
  await resultsDirCheck(out, '--out');
  const first = parts[0].summary;
  const widen = first.classTable.generated;
  let sums: DatasetSums | null = null;
  for (const p of parts) {
    const s = datasetSumsFromJson(p.summary.sums, p.summary.runNames, join(p.dir, RESULTS_FILES.summary));
    if (!s.ok) throw new MergeRefused(s.error);
    if (!sums) sums = s.value;
    else {
      const m = datasetSumsMerge(sums, s.value, widen);
      if (!m.ok) throw new MergeRefused(`${p.dir}: ${m.error}`);
    }
  }
  const partial = `${out}.partial`;
  await rm(partial, { recursive: true, force: true });
  await mkdir(partial, { recursive: true });
  try {
    const frameRows = await tablesJoin<FrameRow>(parts.map((p) => p.dir), RESULTS_FILES.frames, FRAME_COLUMNS, partial);
    const regionRows = await tablesJoin<RegionRow>(parts.map((p) => p.dir), RESULTS_FILES.regions, REGION_COLUMNS, partial);
    const queue = await queueWrite(partial, [join(partial, RESULTS_FILES.regions)], sums!, first.suspectSettings, classNameOf(first.classTable));
    const settings = { ...first.settings };
    const summary: ResultsSummary = {
      format: 'hairline-results', version: 1,
      ...summaryScores(sums!, first.runNames, first.classTable, settings),
      settings, runNames: first.runNames, classTable: first.classTable, suspectSettings: first.suspectSettings, datasetId: first.datasetId,
      frames: { total: first.frames.total, from: 0, to: first.frames.total, scored: sums!.scored, failed: sums!.failed },
      shard: null, unpaired: first.unpaired, sums: datasetSumsToJson(sums!),
      rows: { frames: frameRows, regions: regionRows, queue: queue.length },
    };
    await writeFile(join(partial, RESULTS_FILES.summary), summaryJson(summary));
    await resultsDirCommit(partial, out);
    return summary;
  } catch (e) {
    await rm(partial, { recursive: true, force: true });
    throw e;
  }
}

async function main(): Promise<void> {
  try {
    const a = argsParse(process.argv.slice(2), { out: { kind: 'string' }, help: { kind: 'flag' } });
    if (a.help) throw new UsageError(MERGE_USAGE);
    if (typeof a.out !== 'string') throw new UsageError('--out DIR is required');
    if (a._.length === 0) throw new UsageError('name the results folders of the shards to merge');
    const s = await resultsMerge(a.out, a._);
    process.stdout.write(
      `merged ${a._.length} shards into ${a.out}: ${s.frames.total} frames (${s.frames.scored} scored, ${s.frames.failed} failed), ` +
        `${s.rows.regions} region rows, ${s.rows.queue} in the queue; mean IoU ${s.runNames.map((r) => `${r} ${s.runs[r].meanIoU === null ? '—' : (s.runs[r].meanIoU! * 100).toFixed(2)}`).join(', ')}\n`,
    );
  } catch (e) {
    if (e instanceof UsageError) {
      process.stderr.write(e.message === MERGE_USAGE ? `${MERGE_USAGE}\n` : `hairline merge: ${e.message}\n${MERGE_USAGE}\n`);
      process.exit(MERGE_EXIT.usage);
    }
    if (e instanceof MergeRefused) {
      process.stderr.write(`hairline merge: refused: ${e.message}\n`);
      process.exit(MERGE_EXIT.refused);
    }
    process.stderr.write(`hairline merge: ${(e as Error).message}\n`);
    process.exit(MERGE_EXIT.usage);
  }
}

if (process.argv[1]?.endsWith('/cli/merge.ts')) await main();
