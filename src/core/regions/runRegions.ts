import type { AppearancePhoto } from './appearance.ts';
import { componentStatsFill } from './componentStats.ts';
import type { ConfidenceMap } from './confidenceMap.ts';
import { confidenceBinTable } from './confidenceMap.ts';
import { gridDominant, type GridShape } from './frameGrid.ts';
import { regionEvidence, type EvidenceContext } from './regionEvidence.ts';
import { regionKind } from './regionKind.ts';
import type { RegionScratch } from './regionScratch.ts';
import type { RegionSettings } from './regionSettings.ts';
import { regionThickness } from './regionThickness.ts';
import {
  GRID_NOT_A_CLASS, REGION_KINDS, type ConfidenceTotals, type ErrorRegion, type RegionCounts, type RegionKind, type RunRegions, type VoidSpillRegion,
} from './regionTypes.ts';
import { RUN_KEEP, runAt, runsLabel } from './runLabel.ts';
import { bandCountDist2, bandCountRun, bandReach } from './truthBand.ts';

/** One run's inputs on a frame whose truth codes, band distances and truth segments are in the scratch. */
export interface RunRegionsInput {
  width: number;
  height: number;
  classIds: readonly number[];
  /** Index of this run's codes in scratch.predCodes, and the other runs' names and indices. */
  index: number;
  others: { run: string; index: number }[];
  confidence: ConfidenceMap | null;
  /** The photo's luma and its gradient computed so far (gradientAt), or null. */
  photo: AppearancePhoto | null;
  grid: GridShape;
  /** The truth's squared boundary distances (RegionFrameInput.truthDist2), or null: band membership from scratch.edgeReach. */
  truthDist2: Uint16Array | null;
}

/** Returns the per-class confidence sums where truth and prediction agree (confident learning's per-class threshold inputs). */
function confidenceTotals(tc: Uint16Array, pc: Uint16Array, n: number, k: number, m: ConfidenceMap, classIds: readonly number[]): ConfidenceTotals {
  const sum = new Float64Array(k), count = new Uint32Array(k);
  const values = m.values, scale = 1 / m.max;
  // Hot loop: flat typed arrays, no allocation per pixel.
  for (let i = 0; i < n; i++) {
    const c = pc[i];
    if (c < k && tc[i] === c) {
      sum[c] += values[i] * scale;
      count[c]++;
    }
  }
  return { classIds: [...classIds], sum, count };
}

/**
 * Returns the error regions of one run (README "Error regions"): 8-connected components of
 * (truth class, predicted value) pairs over valid pixels that disagree, counted by kind and pair,
 * the largest listed worst first with thickness and evidence; void-spill areas (truth void,
 * prediction a class) counted apart; the run's grid and confidence sums.
 */
export function runRegions(input: RunRegionsInput, s: RegionScratch, settings: RegionSettings): RunRegions {
  const { width, height, classIds, grid } = input;
  const n = width * height, k = classIds.length;
  const tc = s.truthCodes, pc = s.predCodes[input.index];
  runsLabel(pc, null, tc, width, height, k, RUN_KEEP.all, s.predRuns);
  componentStatsFill(s.predRuns, s.predSegments);
  const runGrid = gridDominant(s.predRuns, k, classIds, GRID_NOT_A_CLASS, grid);
  runsLabel(tc, pc, null, width, height, k, RUN_KEEP.pairs, s.pairRuns);
  const t = s.pairRuns, cs = s.pairs;
  componentStatsFill(t, cs);

  const w = settings.bandWidth, reach = bandReach(w), dist2 = input.truthDist2;
  const inBand = new Int32Array(cs.count);
  for (let r = 0; r < t.count; r++) {
    // Void-spill areas and tiny regions are never measured against the band.
    if (t.a[r] >= k || cs.area[t.comp[r]] < settings.minArea) continue;
    inBand[t.comp[r]] += dist2
      ? bandCountDist2(dist2, t.y[r] * width + t.x0[r], t.y[r] * width + t.x1[r], w * w)
      : bandCountRun(s.edgeReach, width, height, t.y[r], t.x0[r], t.x1[r], w, reach);
  }

  const idOf = (code: number) => (code < k ? classIds[code] : null);
  const counts: RegionCounts = {
    all: { regions: 0, pixels: 0 }, tiny: { regions: 0, pixels: 0 }, byPair: [], unlisted: 0,
    byKind: Object.fromEntries(REGION_KINDS.map((kind) => [kind, { regions: 0, pixels: 0 }])) as Record<RegionKind, { regions: number; pixels: number }>,
  };
  const pairTally = new Map<number, { truthClass: number; predictedClass: number | null; regions: number; pixels: number }>();
  const voidSpill: VoidSpillRegion[] = [];
  let voidPixels = 0;
  const listed: ErrorRegion[] = [];
  for (let c = 0; c < cs.count; c++) {
    const g = cs.a[c], p = cs.b[c], area = cs.area[c];
    const bbox: [number, number, number, number] = [cs.x0[c], cs.y0[c], cs.x1[c], cs.y1[c]];
    if (g === k) {
      voidPixels += area;
      if (area >= settings.minArea) voidSpill.push({ predictedClass: classIds[p], area, bbox });
      continue;
    }
    counts.all.regions++;
    counts.all.pixels += area;
    const key = g * (k + 1) + p;
    let pt = pairTally.get(key);
    if (!pt) pairTally.set(key, (pt = { truthClass: classIds[g], predictedClass: idOf(p), regions: 0, pixels: 0 }));
    pt.regions++;
    pt.pixels += area;
    if (area < settings.minArea) {
      counts.tiny.regions++;
      counts.tiny.pixels += area;
      continue;
    }
    const r0 = cs.order[cs.runStart[c]];
    const ts = s.truthRuns.comp[runAt(s.truthRuns, t.x0[r0], t.y[r0])];
    const ps = s.predRuns.comp[runAt(s.predRuns, t.x0[r0], t.y[r0])];
    const tArea = s.truthSegments.area[ts], pArea = s.predSegments.area[ps];
    const bandShare = inBand[c] / area;
    const truthSegment = { id: ts, area: tArea, covered: area / tArea };
    const predSegment = { id: ps, area: pArea, covered: area / pArea, truthAgrees: s.predSegments.same[ps] / pArea };
    const kind = regionKind({ truthCovered: truthSegment.covered, predCovered: predSegment.covered, predTruthAgrees: predSegment.truthAgrees, bandShare }, settings);
    counts.byKind[kind].regions++;
    counts.byKind[kind].pixels += area;
    listed.push({
      id: c, kind, truthClass: classIds[g], predictedClass: idOf(p), area, bbox,
      centroid: [cs.sumX[c] / area + 0.5, cs.sumY[c] / area + 0.5], bandShare, thickness: 0, truthSegment, predSegment,
      severity: area - inBand[c] + settings.bandPixelWeight * inBand[c],
      evidence: { agreement: [], edges: null, confidence: null, appearance: null, cells: [] },
    });
  }
  listed.sort((a, b) => b.severity - a.severity || a.id - b.id);
  counts.unlisted = Math.max(0, listed.length - settings.listMax);
  listed.length = Math.min(listed.length, settings.listMax);
  counts.byPair = [...pairTally.values()].sort((a, b) => b.pixels - a.pixels || a.truthClass - b.truthClass);

  const ctx: EvidenceContext = {
    width, height, tc, pc, others: input.others.map((o) => ({ run: o.run, pc: s.predCodes[o.index] })), photo: input.photo, edgeTolerance: settings.edgeTolerance,
    confidence: input.confidence ? { values: input.confidence.values, bins: confidenceBinTable(input.confidence.max) } : null,
    grid, cellCount: s.cellCount, cellTouched: s.cellTouched, gridCellShare: settings.gridCellShare,
  };
  for (const region of listed) {
    region.thickness = regionThickness(t, cs, region.id, s.thickness);
    region.evidence = regionEvidence(t, cs, region.id, ctx);
  }
  return {
    regions: listed, counts, voidSpill: { pixels: voidPixels, regions: voidSpill.sort((a, b) => b.area - a.area) },
    confidence: input.confidence ? confidenceTotals(tc, pc, n, k, input.confidence, classIds) : null,
    grid: runGrid,
  };
}
