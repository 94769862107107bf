import type { FrameJobResult, FrameRunResult } from '../frameJob.ts';

/** What the queue reads of a scored frame: its name, error, grid and each run's regions (never the scores). */
export type SuspectFrame = Pick<FrameJobResult, 'name' | 'error' | 'grid' | 'appearance'> & { runs: readonly Pick<FrameRunResult, 'run' | 'regions'>[] };
import type { RegionEvidence, RegionKind } from '../regions/regionTypes.ts';
import type { SuspectSettings } from './suspectSettings.ts';
import { signalAgreement, signalGeometry, signalImage } from './suspectSignals.ts';
import type { FrameGrids } from './temporalFlip.ts';

/** A region that may be a label mistake, reduced to what the dataset pass needs (the frame's maps are gone by then). */
export interface SuspectCandidate {
  frameIndex: number;
  frame: string;
  run: string;
  regionId: number;
  /** Id of the truth segment the region lies in (the same for every run of the frame). */
  truthSegment: number;
  kind: RegionKind;
  truthClass: number;
  predictedClass: number;
  bbox: [number, number, number, number];
  area: number;
  thickness: number;
  bandShare: number;
  geometry: number;
  agreement: number | null;
  agreementRuns: { run: string; share: number }[];
  image: number | null;
  edges: RegionEvidence['edges'];
  confidenceHist: number[] | null;
  /** The region's appearance histogram in the photo (appearance.ts); null without a photo. */
  appearanceHist: number[] | null;
  cells: number[];
  /** The gated weighted mean with confidence taken as 1 where a histogram exists: no score exceeds it before temporal evidence. */
  bound: number;
}

/** Returns Σ w·v / Σ w over the parts whose value is not null (0..1; 0 when none). */
export function weightedMean(parts: readonly [number | null, number][]): number {
  let sum = 0, weight = 0;
  for (const [v, w] of parts) {
    if (v === null || w <= 0) continue;
    sum += v * w;
    weight += w;
  }
  return weight > 0 ? sum / weight : 0;
}

/**
 * Returns the candidates of one frame's result: listed regions whose prediction is a class (a
 * prediction of no class cannot say what the label should be, and void spill is never an error),
 * with their geometry, agreement and image signals, at most `perFrameMax` per run by `bound`.
 */
export function suspectCandidates(result: SuspectFrame, frameIndex: number, s: SuspectSettings): SuspectCandidate[] {
  const out: SuspectCandidate[] = [];
  if (result.error) return out;
  for (const r of result.runs) {
    if (!r.regions) continue;
    const list: SuspectCandidate[] = [];
    for (const g of r.regions.regions) {
      if (g.predictedClass === null) continue;
      const geometry = signalGeometry(g, s);
      const agreement = signalAgreement(g.evidence.agreement);
      const image = signalImage(g.evidence.edges, s);
      const hist = g.evidence.confidence;
      const bound = (geometry < s.geometryGate && s.geometryGate > 0 ? geometry / s.geometryGate : 1) * weightedMean([[geometry, s.weightGeometry], [agreement, s.weightAgreement], [hist ? 1 : null, s.weightConfidence], [image, s.weightImage]]);
      list.push({
        frameIndex, frame: result.name, run: r.run, regionId: g.id, truthSegment: g.truthSegment.id, kind: g.kind, truthClass: g.truthClass, predictedClass: g.predictedClass,
        bbox: g.bbox, area: g.area, thickness: g.thickness, bandShare: g.bandShare, geometry, agreement, agreementRuns: g.evidence.agreement,
        image, edges: g.evidence.edges, confidenceHist: hist, appearanceHist: g.evidence.appearance ?? null, cells: g.evidence.cells, bound,
      });
    }
    list.sort((a, b) => b.bound - a.bound || b.area - a.area);
    out.push(...list.slice(0, s.perFrameMax));
  }
  return out;
}

/** Returns the grids of one frame's result for the temporal pass, or null when it has none. */
export function frameGridsOf(result: SuspectFrame): FrameGrids | null {
  if (result.error || !result.grid) return null;
  const runs: Record<string, Uint16Array> = {};
  for (const r of result.runs) if (r.regions) runs[r.run] = r.regions.grid;
  return { name: result.name, grid: result.grid, runs };
}

/** Per run and class id: summed confidence and pixels where label and prediction agree (confident learning's thresholds). */
export type ConfidenceSums = Map<string, Map<number, { sum: number; count: number }>>;

/** Adds one frame's confidence sums to `acc`. */
export function confidenceSumsAdd(acc: ConfidenceSums, result: SuspectFrame): void {
  if (result.error) return;
  for (const r of result.runs) {
    const c = r.regions?.confidence;
    if (!c) continue;
    let m = acc.get(r.run);
    if (!m) acc.set(r.run, (m = new Map()));
    c.classIds.forEach((id, i) => {
      const e = m.get(id) ?? { sum: 0, count: 0 };
      e.sum += c.sum[i];
      e.count += c.count[i];
      m.set(id, e);
    });
  }
}
