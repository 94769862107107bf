import { CLASSES_MAX, type ClassTable } from './classTable.ts';
import { frameSizesCheck, labelMapIdsCheck } from './frameCheck.ts';
import type { FileBytes } from './frameFiles.ts';
import type { LabelMap } from './labelMap.ts';
import { frameScore, type FrameStats } from './metrics/frameScore.ts';
import { scoreScratchCodeTable, scoreScratchCreate, type ScoreScratch } from './metrics/scratch.ts';
import { frameExtrasCompute, type RunExtras } from './frameExtras.ts';
import type { ScoreSettings } from './metrics/settings.ts';
import { idCensusOf, type IdCensus } from './idCensus.ts';
import { labelMapRead } from './labelRead.ts';
import { labelMapReadCached, type LabelReadCache } from './labelReadCache.ts';
import { labelMapFromPng } from './png/decodeLabel.ts';
import { photoFit, predictionFit } from './labelScale.ts';
import type { RgbaImage } from './png/decodePhoto.ts';
import { confidenceFromPng, type ConfidenceMap } from './regions/confidenceMap.ts';
import { frameRegionsCompute } from './regions/frameRegions.ts';
import { regionScratchCreate, type RegionScratch } from './regions/regionScratch.ts';
import { regionSettingsCheck, type RegionSettings } from './regions/regionSettings.ts';
import type { ClassAppearance } from './regions/appearance.ts';
import type { FrameGrid, RunRegions } from './regions/regionTypes.ts';

/** Everything needed to score one frame against every run; plain data so it crosses to a worker. */
export interface FrameJobInput {
  name: string;
  truth: FileBytes;
  /** Per run: its prediction file, or null when the run has none for this frame. */
  preds: { run: string; file: FileBytes | null }[];
  /**
   * The photo as RGBA pixels, for the image evidence of error regions (browser: from
   * createImageBitmap; Node: photoFromPng), at the label's size or a whole multiple or fraction of it
   * (photoFit). `file` names it in messages. Absent: no image evidence.
   */
  photoRgba?: PhotoPixels | null;
  /** Per run: its confidence map (8/16-bit gray PNG, high = confident), or null / absent without one. */
  confidence?: { run: string; file: FileBytes | null }[];
  /** Region settings (defaults: REGION_DEFAULTS); false skips error regions. */
  regions?: Partial<RegionSettings> | false;
  /**
   * Per run: its predictions at this frame's neighbours in its sequence (src/core/temporal/sequences.ts),
   * for the flip-back rate; null at a sequence end. Absent: no flicker scores.
   */
  neighbours?: { run: string; prev: FileBytes | null; next: FileBytes | null }[];
  /** The frame's instance map (8/16-bit gray PNG, 0 = no instance), for iIoU; null / absent without one. */
  instances?: FileBytes | null;
  table: ClassTable;
  settings: ScoreSettings;
  maxPixels?: number;
}

/** A decoded photo with the name used in messages. */
export interface PhotoPixels extends RgbaImage {
  file: string;
}

/** The outcome per run: counts, or why this run could not be scored on this frame. */
export interface FrameRunResult {
  run: string;
  stats: FrameStats | null;
  error: string | null;
  /** Error regions of this run (README "Error regions"); null when the run failed or regions were skipped. */
  regions?: RunRegions | null;
  /** How this run's ids line up with the truth's (for the id-space warnings of src/core/idCensus.ts). */
  census?: IdCensus;
  /** Objects, flicker and iIoU counts (src/core/frameExtras.ts); absent when the run failed. */
  extras?: RunExtras | null;
  /** The whole factor the prediction was scaled up by to the label's size (nearest neighbour), when it was. */
  scaledBy?: number;
}

/** Scores of one frame: `error` set when the frame itself (its ground truth) failed, else per-run results. */
export interface FrameJobResult {
  name: string;
  width: number;
  height: number;
  error: string | null;
  runs: FrameRunResult[];
  /** Coarse truth grid for temporal evidence (each run's grid is in its regions); null without regions. */
  grid?: FrameGrid | null;
  /** What each class looks like in the photo where label and runs agree (appearance.ts); null without a photo or regions. */
  appearance?: ClassAppearance | null;
  /** Optional inputs that could not be used (a confidence map or photo), each naming the file and the problem. */
  warnings?: string[];
}

/** Most decoded predictions a thread keeps for the next frames' flicker (2048×1024 8-bit: 2 MB each). */
const READS_KEPT_MAX = 16;

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
 * sizes and ids, scores every run and finds each run's error regions with their evidence (every run
 * of the frame, the photo's pixels and the confidence maps; `regions: false` skips them). A bad ground
 * truth fails the frame; a bad prediction fails only its run; an unusable confidence map only loses
 * its evidence (a warning). With a generated table (no classes.json) the classes are the ids present.
 */
export function frameJobScore(
  input: FrameJobInput, scratch: ScoreScratch = scoreScratchCreate(), regionScratch: RegionScratch = regionScratchCreate(),
): FrameJobResult {
  const { table, settings } = input;
  const base = { name: input.name, width: 0, height: 0 };
  const failAll = (error: string): FrameJobResult => ({ ...base, error, runs: input.preds.map((p) => ({ run: p.run, stats: null, error })) });

  // Each run's prediction is read by this frame and, for flicker, by the frames before and after it.
  scratch.reads.capacity = input.neighbours?.length ? Math.min(READS_KEPT_MAX, 3 * input.preds.length + 1) : 0;
  const truth = labelMapRead(input.truth.bytes, { file: input.truth.file, table, maxPixels: input.maxPixels, role: 'truth' });
  if (!truth.ok) return failAll(truth.error);
  const ids = labelMapIdsCheck(truth.value, table, input.truth.file, 'truth');
  if (!ids.ok) return failAll(ids.error);
  const { width, height } = truth.value;
  const warnings: string[] = [];
  const decoded: { run: string; map: LabelMap | null; error: string | null; factor?: number }[] = input.preds.map(({ run, file }) => {
    if (!file) return { run, map: null, error: `predictions/${run}: no prediction file for frame ${input.name}` };
    const r = labelMapReadCached(scratch.reads, file.bytes, { file: file.file, table, maxPixels: input.maxPixels, role: 'prediction' });
    if (!r.ok) return { run, map: null, error: r.error };
    if (r.value.warning) warnings.push(r.value.warning);
    const fit = predictionFit({ file: input.truth.file, width, height }, { file: file.file, map: r.value });
    if (!fit.ok) return { run, map: null, error: fit.error };
    return { run, map: fit.value.map, error: null, factor: fit.value.factor };
  });

  const classIds = table.generated
    ? presentIds([truth.value, ...decoded.flatMap((d) => (d.map ? [d.map] : []))], settings.ignore)
    : table.classes.map((c) => c.id);
  if (classIds.length > CLASSES_MAX) {
    return failAll(
      `${input.truth.file}: ${classIds.length} distinct ids in this frame's ground truth and predictions and no classes.json; ` +
        `at most ${CLASSES_MAX} classes are scored (give a classes.json naming the classes)`,
    );
  }
  let scored = false; // after a first run is scored, the truth's distance transform is in `scratch`
  const runs = decoded.map(({ run, map, error, factor }): FrameRunResult => {
    if (!map) return { run, stats: null, error };
    const s = frameScore(truth.value, map, classIds, settings, scratch, scored);
    scored = true;
    if (!s.ok) return { run, stats: null, error: `${input.truth.file}: ${s.error}` };
    const scaled = factor && factor > 1 ? { scaledBy: factor } : {};
    return { run, stats: s.value, error: null, census: idCensusOf(truth.value, map, settings.ignore), ...scaled };
  });
  extrasAdd(input, truth.value, decoded.map((d, i) => (runs[i].error ? null : d.map)), classIds, scratch, runs, warnings);
  if (input.regions === false) return { ...base, width, height, error: null, runs, ...(warnings.length ? { warnings } : {}) };
  const regionSettings = regionSettingsCheck(input.regions);
  if (!regionSettings.ok) return failAll(regionSettings.error);
  // A photo of another size is brought to the label's (photoFit); one that cannot be only loses the
  // image evidence, with a warning: the scores never depend on it.
  let photo = input.photoRgba ?? null;
  if (photo) {
    const fit = photoFit({ file: input.truth.file, width, height }, photo);
    if (!fit.ok) warnings.push(`${fit.error}; no image evidence on this frame`);
    else if (fit.value.note) warnings.push(fit.value.note);
    photo = fit.ok ? { file: photo.file, width, height, rgba: fit.value.rgba } : null;
  }
  const preds = decoded.map((d, i) => {
    if (!d.map || runs[i].error) return null;
    const confidence = confidenceOf(input, d.run, width, height, warnings);
    return { run: d.run, map: d.map, confidence };
  });
  // The truth's boundary distances made for the scores (when a run was scored) serve the regions' band too.
  const truthDist2 = scratch.distanceIds === truth.value.ids ? scratch.dist2 : null;
  const regions = frameRegionsCompute({ truth: truth.value, preds, classIds, ignore: settings.ignore, photo, truthDist2 }, regionSettings.value, regionScratch);
  if (!regions.ok) {
    warnings.push(`${input.truth.file}: error regions not computed (${regions.error})`);
    return { ...base, width, height, error: null, runs, grid: null, warnings };
  }
  runs.forEach((r, i) => (r.regions = regions.value.runs[i]));
  return { ...base, width, height, error: null, runs, grid: regions.value.grid, appearance: regions.value.appearance, warnings };
}

/** Decodes a neighbour's prediction or an instance map for the extras; null (with a warning) when it is unusable. */
function extraMapRead(
  file: FileBytes | null, input: FrameJobInput, role: 'prediction' | 'instances', width: number, height: number, warnings: string[], loses: string,
  reads: LabelReadCache,
): LabelMap | null {
  if (!file) return null;
  const r = role === 'prediction'
    ? labelMapReadCached(reads, file.bytes, { file: file.file, table: input.table, maxPixels: input.maxPixels, role })
    : labelMapFromPng(file.bytes, { file: file.file, maxPixels: input.maxPixels });
  const sizes = r.ok ? frameSizesCheck([{ file: input.truth.file, width, height }, { file: file.file, width: r.value.width, height: r.value.height }]) : r;
  if (!sizes.ok) {
    warnings.push(`${sizes.error}; ${loses} not computed on this frame`);
    return null;
  }
  return r.ok ? r.value : null;
}

/** Computes each scored run's objects, flicker and iIoU counts into `runs[i].extras`. */
function extrasAdd(
  input: FrameJobInput, truth: LabelMap, maps: (LabelMap | null)[], classIds: readonly number[], scratch: ScoreScratch,
  runs: FrameRunResult[], warnings: string[],
): void {
  if (classIds.length === 0) return;
  const { width, height } = truth;
  const instances = extraMapRead(input.instances ?? null, input, 'instances', width, height, warnings, 'instance-weighted IoU', scratch.reads);
  const runMaps = runs.map((r, i) => {
    const n = input.neighbours?.find((x) => x.run === r.run);
    const map = maps[i];
    if (!map || !n || !n.prev || !n.next) return { map, prev: null, next: null };
    const prev = extraMapRead(n.prev, input, 'prediction', width, height, warnings, `flicker of ${r.run}`, scratch.reads);
    const next = prev ? extraMapRead(n.next, input, 'prediction', width, height, warnings, `flicker of ${r.run}`, scratch.reads) : null;
    return { map, prev, next };
  });
  const codes = scoreScratchCodeTable(scratch, classIds, input.settings.ignore);
  const extras = frameExtrasCompute(truth, runMaps, instances, classIds, codes);
  runs.forEach((r, i) => {
    if (extras[i]) r.extras = extras[i];
  });
}

/** Returns the run's decoded confidence map, or null (absent, or unusable: then the reason is added to `warnings`). */
function confidenceOf(input: FrameJobInput, run: string, width: number, height: number, warnings: string[]): ConfidenceMap | null {
  const file = input.confidence?.find((c) => c.run === run)?.file;
  if (!file) return null;
  const m = confidenceFromPng(file.bytes, { file: file.file, maxPixels: input.maxPixels });
  if (!m.ok) {
    warnings.push(`${m.error}; confidence of ${run} not used on this frame`);
    return null;
  }
  const sizes = frameSizesCheck([{ file: input.truth.file, width, height }, { file: file.file, width: m.value.width, height: m.value.height }]);
  if (!sizes.ok) {
    warnings.push(`${sizes.error}; confidence of ${run} not used on this frame`);
    return null;
  }
  return m.value;
}
