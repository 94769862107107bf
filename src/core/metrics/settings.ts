import { fail, ok, type Result } from '../result.ts';

/** The settings every score depends on (src/docs/metrics.md); they are printed with every report. */
export interface ScoreSettings {
  /** Ground-truth id of void pixels, left out of every score. */
  ignore: number;
  /** Boundary IoU dilation as a ratio of the image diagonal (Cheng et al. 2021 default 0.02). */
  biouDilationRatio: number;
  /** Boundary F tolerance as a ratio of the image diagonal (0.0075, the usual default). */
  bfTolerance: number;
}

/** The defaults src/docs/metrics.md names. */
export const DEFAULT_SCORE_SETTINGS: ScoreSettings = Object.freeze({
  ignore: 255,
  biouDilationRatio: 0.02,
  bfTolerance: 0.0075,
});

/** Returns `v` rounded to the nearest integer, ties to even (Python's `round`, which the Boundary IoU reference uses). */
export function roundHalfEven(v: number): number {
  const f = Math.floor(v);
  const r = v - f; // exact for |v| < 2^52
  if (r > 0.5) return f + 1;
  if (r < 0.5) return f;
  return f % 2 === 0 ? f : f + 1;
}

/** Returns the Boundary IoU dilation in pixels: max(1, round-half-even(ratio · diagonal)). */
export function boundaryIoUDilation(width: number, height: number, ratio: number): number {
  return Math.max(1, roundHalfEven(ratio * Math.sqrt(width * width + height * height)));
}

/** Returns the Boundary F tolerance θ in pixels: ratio · diagonal. */
export function boundaryFTolerance(width: number, height: number, ratio: number): number {
  return ratio * Math.sqrt(width * width + height * height);
}

/**
 * Returns the largest integer n with `Math.sqrt(n) <= theta` (−1 when theta < 0): a squared pixel
 * distance is within θ exactly when it is ≤ n. Comparing through the same rounded square root as the
 * reference (which compares float distances to θ) keeps the two in agreement even at ties.
 */
export function squaredDistanceLimit(theta: number): number {
  if (!(theta >= 0)) return -1;
  let n = Math.floor(theta * theta);
  while (Math.sqrt(n + 1) <= theta) n++;
  while (n >= 0 && Math.sqrt(n) > theta) n--;
  return n;
}

/** Returns the settings if usable, or a message naming the bad one. */
export function scoreSettingsCheck(settings: ScoreSettings): Result<ScoreSettings> {
  const { ignore, biouDilationRatio, bfTolerance } = settings;
  if (!Number.isInteger(ignore) || ignore < 0 || ignore > 65535) {
    return fail('', `score settings: "ignore" must be an integer 0..65535, got ${ignore}`);
  }
  if (!Number.isFinite(biouDilationRatio) || biouDilationRatio < 0) {
    return fail('', `score settings: "biouDilationRatio" must be a finite number ≥ 0, got ${biouDilationRatio}`);
  }
  if (!Number.isFinite(bfTolerance) || bfTolerance < 0) {
    return fail('', `score settings: "bfTolerance" must be a finite number ≥ 0, got ${bfTolerance}`);
  }
  return ok(settings);
}
