// Does a region look like its labelled class or its predicted class? Each class's appearance in the
// dataset (summed over frames, so shards merge exactly) against the region's own.
import { APPEARANCE_BINS, COLOUR_BINS } from '../regions/appearance.ts';
import type { SuspectFrame } from './suspectCandidates.ts';
import type { SuspectSettings } from './suspectSettings.ts';

/** Per class id: the dataset's appearance histogram (colour then texture bins, pixels sampled). */
export type AppearanceSums = Map<number, Float64Array>;

/** Adds one frame's class appearance to `acc`. */
export function appearanceSumsAdd(acc: AppearanceSums, result: SuspectFrame): void {
  const a = result.error ? null : result.appearance;
  if (!a) return;
  a.classIds.forEach((id, c) => {
    let h = acc.get(id);
    if (!h) acc.set(id, (h = new Float64Array(APPEARANCE_BINS)));
    for (let b = 0, o = c * APPEARANCE_BINS; b < APPEARANCE_BINS; b++) h[b] += a.counts[o + b];
  });
}

/** Adds sums `b` into `a` (shards of one dataset). */
export function appearanceSumsMerge(a: AppearanceSums, b: AppearanceSums): void {
  for (const [id, hb] of b) {
    let h = a.get(id);
    if (!h) a.set(id, (h = new Float64Array(APPEARANCE_BINS)));
    for (let i = 0; i < APPEARANCE_BINS; i++) h[i] += hb[i];
  }
}

/** The appearance evidence of a region: mean log-likelihood ratios (nats per pixel) of colour and texture, predicted class against labelled. */
export interface AppearanceEvidence {
  colour: number;
  texture: number;
  /** Pixels of the region sampled, and of the two classes in the dataset. */
  pixels: number;
}

/** Probability added to every bin of a class's histogram, so a colour never seen there is rare, not impossible. */
const BIN_FLOOR = 1e-3;

function part(hist: readonly number[], g: Float64Array, p: Float64Array, from: number, to: number): { llr: number; n: number; ng: number; np: number } {
  let n = 0, ng = 0, np = 0;
  for (let b = from; b < to; b++) (n += hist[b]), (ng += g[b]), (np += p[b]);
  let llr = 0;
  if (n > 0 && ng > 0 && np > 0) {
    for (let b = from; b < to; b++) if (hist[b]) llr += (hist[b] / n) * Math.log((p[b] / np + BIN_FLOOR) / (g[b] / ng + BIN_FLOOR));
  }
  return { llr, n, ng, np };
}

/**
 * Returns the region's appearance evidence: over its sampled pixels, the mean of
 * log((P(bin | predicted class) + 0.001) / (P(bin | labelled class) + 0.001)) for colour bins and, on
 * its own, for texture bins, each class's P from the dataset's agreed pixels (a naive-Bayes reading:
 * bins taken as independent); null when the region has fewer than appearanceMinPixels sampled pixels
 * or either class fewer than appearanceClassMinPixels. Our own heuristic.
 */
export function appearanceEvidenceOf(hist: readonly number[] | null, g: number, p: number, sums: AppearanceSums, s: Pick<SuspectSettings, 'appearanceMinPixels' | 'appearanceClassMinPixels'>): AppearanceEvidence | null {
  if (!hist) return null;
  const mg = sums.get(g), mp = sums.get(p);
  if (!mg || !mp) return null;
  const colour = part(hist, mg, mp, 0, COLOUR_BINS);
  if (colour.n < s.appearanceMinPixels || colour.ng < s.appearanceClassMinPixels || colour.np < s.appearanceClassMinPixels) return null;
  const texture = part(hist, mg, mp, COLOUR_BINS, APPEARANCE_BINS);
  return { colour: colour.llr, texture: texture.llr, pixels: colour.n };
}

/** Returns the appearance signal 0..1: 0.5 + tanh((colour + texture) / appearanceScale) / 2 (1: looks like the predicted class), or null. */
export function signalAppearance(e: AppearanceEvidence | null, s: Pick<SuspectSettings, 'appearanceScale'>): number | null {
  return e ? 0.5 + Math.tanh((e.colour + e.texture) / s.appearanceScale) / 2 : null;
}
