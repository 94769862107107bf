import { fail, ok, type Result } from '../result.ts';

/**
 * Weights and references of the likely-label-mistake score (README "Likely label mistakes"). Every
 * value is our own heuristic except the confidence signal's per-class threshold, which follows
 * Northcutt, Jiang, Chuang, "Confident Learning", JAIR 70, 2021.
 */
export const SUSPECT_DEFAULTS = {
  /** Weights of the weighted mean over the signals a region has (geometry always; the others when their inputs exist). */
  weightGeometry: 1,
  weightAgreement: 2,
  weightConfidence: 2,
  weightImage: 1,
  /** Appearance speaks to the class itself, as agreement does, so it weighs as much. */
  weightAppearance: 2,
  /** Appearance signal = 0.5 + tanh(log-likelihood ratio / appearanceScale) / 2 (nats per pixel). */
  appearanceScale: 2,
  /** Fewest sampled pixels (even rows and columns) of a region, and of each class in the dataset, for an appearance signal. */
  appearanceMinPixels: 6,
  appearanceClassMinPixels: 50,
  /** A label flip raises a score: score = 1 − (1 − mean)(1 − weightTemporal · flip). */
  weightTemporal: 0.6,
  /** The same disagreement under the same label in the frames around lowers it: score · (1 − weightSteady · steady). */
  weightSteady: 0.5,
  /**
   * A class pair every run makes in many frames (habit h, pairRecurrence.ts) moves h of agreement's
   * weight to a "common confusion" term of value 0, so a shared model habit is not read as proof of a
   * wrong label. Habit strength is 0 at or below this share of frames showing the pair (in the run where it is rarest)...
   */
  recurrenceFrom: 0.1,
  /** ... and 1 at or above this share, linear between. */
  recurrenceFull: 0.3,
  /** A pair shown in fewer frames than this (in the run where it is rarest) is no habit, whatever its share. */
  recurrenceMinFrames: 4,
  /** Thickness (pixels) scoring 0 and 1 in the geometry signal; linear between. */
  thinPx: 1,
  thickPx: 3,
  /** Added to both edge strengths (luma levels per pixel) before they are compared, so flat areas compare as equal. */
  edgeFloor: 1,
  /** Frames looked at on each side for a label that flips while the predictions stay. */
  temporalWindow: 3,
  /** Grid cells (chessboard) around a flipped cell where the region's label class must not newly appear in the bracketing frames. */
  temporalReach: 1,
  /** Regions with a geometry signal below this have their score scaled by geometry / geometryGate (0: off). */
  geometryGate: 0.5,
  /**
   * Regions of one frame inside one truth segment or with one class pair (of any run) whose boxes come within mergeGap pixels
   * of a suspect's box, or within mergeReach times the longer side of the smaller box, and score at
   * least mergeScoreShare of its score, join that suspect (its box grows):
   * one label mistake often splits into several regions, and every run finds it.
   */
  mergeGap: 2,
  /** ... or within mergeReach × the longer side of the smaller box. */
  mergeReach: 1,
  mergeScoreShare: 0.75,
  /** Candidates kept per run and frame (by their score without temporal and with full confidence). */
  perFrameMax: 50,
  /** Length of the queue. */
  queueMax: 200,
} as const;

/** Suspect settings: the defaults' shape with any values. */
export type SuspectSettings = { -readonly [K in keyof typeof SUSPECT_DEFAULTS]: number };

/** Returns the settings with defaults filled in, or a message naming the bad value. */
export function suspectSettingsCheck(partial: Partial<SuspectSettings> = {}): Result<SuspectSettings> {
  const s: SuspectSettings = { ...SUSPECT_DEFAULTS, ...partial };
  for (const key of Object.keys(SUSPECT_DEFAULTS) as (keyof SuspectSettings)[]) {
    const v = s[key];
    if (!Number.isFinite(v) || v < 0) return fail('', `suspect settings: "${key}" must be a finite number ≥ 0, got ${v}`);
  }
  if (s.geometryGate > 1) return fail('', `suspect settings: "geometryGate" must be 0..1, got ${s.geometryGate}`);
  for (const key of ['weightTemporal', 'weightSteady'] as const) {
    if (s[key] > 1) return fail('', `suspect settings: "${key}" must be 0..1, got ${s[key]}`);
  }
  if (s.mergeScoreShare > 1) return fail('', `suspect settings: "mergeScoreShare" must be 0..1, got ${s.mergeScoreShare}`);
  if (!(s.recurrenceFull > s.recurrenceFrom) || s.recurrenceFull > 1) return fail('', `suspect settings: "recurrenceFull" (${s.recurrenceFull}) must be above "recurrenceFrom" (${s.recurrenceFrom}) and at most 1`);
  if (!(s.thickPx > s.thinPx)) return fail('', `suspect settings: "thickPx" (${s.thickPx}) must be larger than "thinPx" (${s.thinPx})`);
  for (const key of ['temporalWindow', 'temporalReach', 'perFrameMax', 'queueMax', 'recurrenceMinFrames'] as const) {
    if (!Number.isInteger(s[key])) return fail('', `suspect settings: "${key}" must be a whole number, got ${s[key]}`);
  }
  if (!(s.appearanceScale > 0)) return fail('', `suspect settings: "appearanceScale" must be above 0, got ${s.appearanceScale}`);
  if (s.weightGeometry + s.weightAgreement + s.weightConfidence + s.weightImage + s.weightAppearance <= 0) {
    return fail('', 'suspect settings: at least one of the weights of geometry, agreement, confidence and image must be above 0');
  }
  return ok(s);
}
