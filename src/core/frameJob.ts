import { classTableGenerated, type ClassTable } from './classTable.ts';
import { frameSizesCheck, labelMapIdsCheck } from './frameCheck.ts';
import type { LabelMap } from './labelMap.ts';
import { frameScore, type FrameStats } from './metrics/frameScore.ts';
import { scoreScratchCreate, type ScoreScratch } from './metrics/scratch.ts';
import type { ScoreSettings } from './metrics/settings.ts';
import { labelMapFromPng } from './png/decodeLabel.ts';
import { pngHeaderRead } from './png/header.ts';

/** One file of a frame, as bytes, with the name used in messages (e.g. `truth/kq-0001.png`). */
export interface FileBytes {
  file: string;
  bytes: Uint8Array;
}

/** Everything needed to score one frame against every run; plain data so it crosses to a worker. */
export interface FrameJobInput {
  name: string;
  truth: FileBytes;
  /** Per run: its prediction file, or null when the run has none for this frame. */
  preds: { run: string; file: FileBytes | null }[];
  /** A photo whose size is checked against the label maps (PNG header only), or null. */
  photo?: FileBytes | null;
  table: ClassTable;
  settings: ScoreSettings;
  maxPixels?: number;
}

/** The outcome per run: counts, or why this run could not be scored on this frame. */
export interface FrameRunResult {
  run: string;
  stats: FrameStats | null;
  error: string | null;
}

/** Scores of one frame: `error` set when the frame itself (its ground truth) failed, else per-run results. */
export interface FrameJobResult {
  name: string;
  width: number;
  height: number;
  error: string | null;
  runs: FrameRunResult[];
}

/** Returns the ids a generated table scores on this frame: every id in truth or predictions except void. */
function presentIds(maps: LabelMap[], ignore: number): number[] {
  const seen = new Uint8Array(65536);
  for (const m of maps) {
    const ids = m.ids;
    for (let i = 0; i < ids.length; i++) seen[ids[i]] = 1;
  }
  const out: number[] = [];
  for (let id = 0; id < 65536; id++) if (seen[id] && id !== ignore) out.push(id);
  return out;
}

/**
 * Returns the per-run scores of one frame from its file bytes: decodes each label PNG exactly, checks
 * sizes and ids, and scores every run. A bad ground truth fails the frame; a bad prediction fails only
 * its run. With a generated table (no classes.json) the classes are the ids present in the frame.
 */
export function frameJobScore(input: FrameJobInput, scratch: ScoreScratch = scoreScratchCreate()): FrameJobResult {
  const { table, settings } = input;
  const base = { name: input.name, width: 0, height: 0 };
  const failAll = (error: string): FrameJobResult => ({ ...base, error, runs: input.preds.map((p) => ({ run: p.run, stats: null, error })) });

  const truth = labelMapFromPng(input.truth.bytes, { file: input.truth.file, table, maxPixels: input.maxPixels });
  if (!truth.ok) return failAll(truth.error);
  const ids = labelMapIdsCheck(truth.value, table, input.truth.file, 'truth');
  if (!ids.ok) return failAll(ids.error);
  const { width, height } = truth.value;
  if (input.photo) {
    const h = pngHeaderRead(input.photo.bytes, input.photo.file);
    // Only PNG photos can be sized without a decoder here; other formats are checked where they are decoded.
    if (h.ok) {
      const sizes = frameSizesCheck([
        { file: input.truth.file, width, height },
        { file: input.photo.file, width: h.value.width, height: h.value.height },
      ]);
      if (!sizes.ok) return failAll(sizes.error);
    }
  }

  const decoded: { run: string; map: LabelMap | null; error: string | null }[] = input.preds.map(({ run, file }) => {
    if (!file) return { run, map: null, error: `predictions/${run}: no prediction file for frame ${input.name}` };
    const r = labelMapFromPng(file.bytes, { file: file.file, table, maxPixels: input.maxPixels });
    if (!r.ok) return { run, map: null, error: r.error };
    const sizes = frameSizesCheck([
      { file: input.truth.file, width, height },
      { file: file.file, width: r.value.width, height: r.value.height },
    ]);
    if (!sizes.ok) return { run, map: null, error: sizes.error };
    return { run, map: r.value, error: null };
  });

  const classIds = table.generated
    ? presentIds([truth.value, ...decoded.flatMap((d) => (d.map ? [d.map] : []))], settings.ignore)
    : table.classes.map((c) => c.id);
  const runs = decoded.map(({ run, map, error }): FrameRunResult => {
    if (!map) return { run, stats: null, error };
    const s = frameScore(truth.value, map, classIds, settings, scratch);
    return s.ok ? { run, stats: s.value, error: null } : { run, stats: null, error: `${input.truth.file}: ${s.error}` };
  });
  return { ...base, width, height, error: null, runs };
}

/** Returns a class table for scoring: the given one, or a generated one when there is none. */
export function scoringTable(table: ClassTable | null, ignore: number): ClassTable {
  return table ?? { ...classTableGenerated(-1, ignore), generated: true };
}
