// The report's per-frame region lines and its likely-label-mistake entries, taken from frame results
// and the ranked queue in one way for the headless scorer and the page's "save report".
import type { RegionKind, RunRegions } from '../regions/regionTypes.ts';
import type { Suspect } from '../suspects/suspectQueue.ts';

/** One listed region of the report's run on a frame. */
export interface ReportRegion {
  kind: RegionKind;
  truthClass: number;
  predictedClass: number | null;
  area: number;
  bbox: [number, number, number, number];
}

/** The report's run's void spill on a frame: pixels where the truth is void and it predicts a class, and those areas of at least minArea pixels. */
export interface ReportVoidSpill {
  pixels: number;
  regions: { predictedClass: number; area: number; bbox: [number, number, number, number] }[];
}

/** One entry of the report's `suspects`, keys as README "Scoring headless" lists them. */
export type ReportSuspect = Pick<Suspect, 'frame' | 'run' | 'bbox' | 'truthClass' | 'predictedClass' | 'kind' | 'score' | 'reasons' | 'contributions' | 'contributionsText'>;

/** Returns a frame's `regions` and `voidSpill` lines from the report's run on it (both null when it has no regions: failed, or none computed). */
export function reportRegionsOf(run: { regions?: RunRegions | null } | undefined | null): { regions: ReportRegion[] | null; voidSpill: ReportVoidSpill | null } {
  const r = run?.regions;
  if (!r) return { regions: null, voidSpill: null };
  return {
    regions: r.regions.map((x) => ({ kind: x.kind, truthClass: x.truthClass, predictedClass: x.predictedClass, area: x.area, bbox: x.bbox })),
    voidSpill: { pixels: r.voidSpill.pixels, regions: r.voidSpill.regions },
  };
}

/** Returns the ranked queue in the report's shape, each item moved by a verdict with that reason first among its reasons. */
export function reportSuspectsOf(queue: readonly Suspect[]): ReportSuspect[] {
  return queue.map((s) => ({
    frame: s.frame, run: s.run, bbox: s.bbox, truthClass: s.truthClass, predictedClass: s.predictedClass, kind: s.kind,
    score: s.score, reasons: s.learnedReason ? [s.learnedReason, ...s.reasons] : s.reasons, contributions: s.contributions, contributionsText: s.contributionsText,
  }));
}
