// The per-region signals of the likely-label-mistake score, each 0..1 (higher: more like a label
// mistake than a model error), or null where its input is missing.
import { CONFIDENCE_BINS, type ErrorRegion } from '../regions/regionTypes.ts';
import type { SuspectSettings } from './suspectSettings.ts';

/**
 * Returns the geometry signal 0..1: the mean of thickness scaled from thinPx (0) to thickPx (1) and the
 * share of the region outside Band(w). Thin slivers along a label boundary (boundary jitter, which
 * any model shows) score near 0; thick patches away from label boundaries near 1. Our own heuristic.
 */
export function signalGeometry(r: Pick<ErrorRegion, 'thickness' | 'bandShare'>, s: SuspectSettings): number {
  const t = Math.min(1, Math.max(0, (r.thickness - s.thinPx) / (s.thickPx - s.thinPx)));
  return (t + (1 - r.bandShare)) / 2;
}

/**
 * Returns the run-agreement signal 0..1: the mean over the other runs of the share of the region where
 * each predicts the same class as this run (and so also disagrees with the label); null with no other
 * run. Two models making one mistake on the same pixels is less likely than one label being wrong. Our own heuristic.
 */
export function signalAgreement(agreement: readonly { share: number }[]): number | null {
  if (agreement.length === 0) return null;
  return agreement.reduce((a, x) => a + x.share, 0) / agreement.length;
}

/**
 * Returns the share 0..1 of the histogram's pixels with confidence ≥ `threshold` (0..1): whole bins
 * above it, and the bin holding it in proportion (pixels taken as spread evenly over a bin).
 */
export function histogramShareAtLeast(hist: readonly number[], threshold: number): number {
  let total = 0, above = 0;
  for (let b = 0; b < CONFIDENCE_BINS; b++) {
    total += hist[b];
    const lo = b / CONFIDENCE_BINS, hi = (b + 1) / CONFIDENCE_BINS;
    if (lo >= threshold) above += hist[b];
    else if (hi > threshold) above += (hist[b] * (hi - threshold)) / (hi - lo);
  }
  return total ? above / total : 0;
}

/**
 * Returns the confidence signal 0..1, the confident-learning test (Northcutt, Jiang, Chuang,
 * "Confident Learning: Estimating Uncertainty in Dataset Labels", JAIR 70, 2021, §3.1, the confident
 * joint (section number from memory): a sample labelled i counts towards "truly j" when its predicted
 * probability of j reaches t_j, the mean predicted probability of j over samples labelled j): the share of the region's pixels whose
 * confidence in the predicted class reaches that class's threshold. With one confidence per pixel
 * (the predicted class's), t_j is the run's mean confidence over the pixels where label and
 * prediction are both j. Null without a confidence map or a threshold.
 */
export function signalConfidence(hist: readonly number[] | null, threshold: number | null): number | null {
  if (!hist || threshold === null) return null;
  return histogramShareAtLeast(hist, threshold);
}

/**
 * Returns the image signal 0..1 from the edge strengths along the region's outline: 0.5 + w·c/2 with
 * c = (Ep − Et) / (Ep + Et) the contrast of the prediction-only outline (Ep) against the truth-only
 * outline (Et), each plus `edgeFloor`, and w the share of the outline that is not shared by both
 * (where label and prediction draw the same edge the image cannot tell them apart, so a region whose
 * class is wrong but whose outline is right stays near 0.5 whatever a model's wobble does). A side
 * with no outline of its own (the label draws no edge there, or the prediction does not) takes the
 * region's inside strength: the image is compared with "no edge". 1: the prediction's outline lies
 * on image edges and the label's does not; 0: the reverse; null without a photo or when prediction
 * and label share the whole outline. Our own heuristic.
 */
export function signalImage(edges: ErrorRegion['evidence']['edges'], s: SuspectSettings): number | null {
  if (!edges || (edges.predicted === null && edges.truth === null)) return null;
  const ep = edges.predicted ?? edges.inside, et = edges.truth ?? edges.inside;
  if (ep === null || et === null) return null;
  const a = ep + s.edgeFloor, b = et + s.edgeFloor;
  const { predicted, truth, shared } = edges.outline;
  const own = predicted + truth;
  return 0.5 + ((a - b) / (a + b) / 2) * (own / (own + shared));
}
