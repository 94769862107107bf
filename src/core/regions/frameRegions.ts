import type { LabelMap } from '../labelMap.ts';
import { classIdsCheck, labelCodesFill } from '../metrics/codes.ts';
import type { RgbaImage } from '../png/decodePhoto.ts';
import { fail, ok, type Result } from '../result.ts';
import { classAppearanceOfFrame, photoLabBins, type AppearancePhoto, type ClassAppearance } from './appearance.ts';
import { componentStatsFill } from './componentStats.ts';
import type { ConfidenceMap } from './confidenceMap.ts';
import { gridDominant, gridShape } from './frameGrid.ts';
import { GRADIENT_UNKNOWN, photoLuma } from './photoEdges.ts';
import { regionScratchCreate, regionScratchFit, regionScratchPhoto, regionScratchTables, type RegionScratch } from './regionScratch.ts';
import type { RegionSettings } from './regionSettings.ts';
import type { FrameGrid, RunRegions } from './regionTypes.ts';
import { RUN_KEEP, runsLabel } from './runLabel.ts';
import { truthEdgeReach } from './truthBand.ts';
import { runRegions } from './runRegions.ts';

/** One frame's maps for region extraction; a run without a map is null. */
export interface RegionFrameInput {
  truth: LabelMap;
  preds: ({ run: string; map: LabelMap; confidence: ConfidenceMap | null } | null)[];
  /** Ascending class ids scored (as frameScore takes them) and the void id. */
  classIds: readonly number[];
  ignore: number;
  photo: RgbaImage | null;
  /**
   * Squared distance (pixels²) of every pixel to the nearest truth boundary pixel, exact at least up
   * to BAND_WIDTH_MAX² (frameScore's, src/core/metrics/distanceBand.ts; the same boundary as
   * truthEdgeReach's): when given, band membership is read from it instead of found again.
   */
  truthDist2?: Uint16Array | null;
}

/** The frame's grid, per run in input order its regions (null where the run had no map), and its classes' appearance (null without a photo). */
export interface FrameRegions {
  grid: FrameGrid;
  runs: (RunRegions | null)[];
  appearance: ClassAppearance | null;
}

function sizeCheck(what: string, w: number, h: number, width: number, height: number): Result<true> {
  return w === width && h === height ? ok(true) : fail('', `${what} is ${w}×${h} but the ground truth is ${width}×${height}`);
}

/**
 * Returns the error regions of every run of one frame, or the problem with the input (sizes that
 * differ, a bad class list). The truth's codes, boundary counts for Band(w) (src/docs/metrics.md) and segments
 * are made once and shared by the runs; every run sees the others'
 * predictions for agreement. Pass one `scratch` per thread to reuse buffers.
 */
export function frameRegionsCompute(
  input: RegionFrameInput, settings: RegionSettings, scratch: RegionScratch = regionScratchCreate(),
): Result<FrameRegions> {
  const { truth, classIds, ignore, photo } = input;
  const { width, height } = truth;
  const ids = classIdsCheck(classIds, ignore);
  if (!ids.ok) return ids;
  if (truth.ids.length !== width * height) return fail('', `ground truth holds ${truth.ids.length} ids for ${width}×${height}`);
  for (const p of input.preds) {
    if (!p) continue;
    const sized = sizeCheck(`prediction of ${p.run}`, p.map.width, p.map.height, width, height);
    if (!sized.ok) return sized;
    if (p.confidence) {
      const c = sizeCheck(`confidence map of ${p.run}`, p.confidence.width, p.confidence.height, width, height);
      if (!c.ok) return c;
    }
  }
  if (photo) {
    const sized = sizeCheck('photo', photo.width, photo.height, width, height);
    if (!sized.ok) return sized;
  }
  const n = width * height, k = classIds.length;
  const shape = gridShape(width, height, settings.gridColumns);
  const s = scratch;
  regionScratchFit(s, width, height, input.preds.length, shape.columns * shape.rows);
  regionScratchTables(s, classIds, ignore);

  const tc = s.truthCodes;
  labelCodesFill(truth.ids, s.truthTable, tc, 0, n);
  const dist2 = input.truthDist2 ?? null;
  // The along-row reach serves band membership when no distances are given, and the photo's appearance always.
  if (!dist2 || photo) truthEdgeReach(tc, width, height, s.edgeReach);
  runsLabel(tc, null, null, width, height, k, RUN_KEEP.all, s.truthRuns);
  componentStatsFill(s.truthRuns, s.truthSegments);
  const grid: FrameGrid = { ...shape, truth: gridDominant(s.truthRuns, k, classIds, ignore, shape) };
  let photoMaps: AppearancePhoto | null = null;
  if (photo) {
    photoMaps = regionScratchPhoto(s);
    photoLuma(photo.rgba, n, photoMaps.luma);
    photoLabBins(photo.rgba, n, photoMaps.bins);
    photoMaps.gradient.fill(GRADIENT_UNKNOWN, 0, n);
  }
  const present: { run: string; index: number }[] = [];
  input.preds.forEach((p, index) => {
    if (!p) return;
    labelCodesFill(p.map.ids, s.predTable, s.predCodes[index], 0, n);
    present.push({ run: p.run, index });
  });
  const runs = input.preds.map((p, index) => {
    if (!p) return null;
    const others = present.filter((o) => o.index !== index);
    return runRegions({ width, height, classIds, index, others, confidence: p.confidence, photo: photoMaps, grid: shape, truthDist2: dist2 }, s, settings);
  });
  const appearance = photoMaps && present.length
    ? classAppearanceOfFrame(width, height, tc, present.map((p) => s.predCodes[p.index]), s.edgeReach, photoMaps, classIds)
    : null;
  return ok({ grid, runs, appearance });
}
