import { fail, ok, type Result } from '../result.ts';

/**
 * Thresholds of error-region extraction and kinds (README "Error regions"). Pixel sizes are image
 * pixels; shares are ratios 0..1. Every value is our own choice (common practice where noted).
 */
export const REGION_DEFAULTS = {
  /** Regions with fewer pixels are counted (kind "tiny") but not listed. */
  minArea: 20,
  /** Width w of the src/docs/metrics.md Band(w) a region is measured against, pixels. */
  bandWidth: 3,
  /** boundary: at least this share of the region lies in Band(bandWidth). */
  boundaryBandShare: 0.5,
  /** missed object / false object: the region covers at least this share of its truth / predicted segment. */
  objectCover: 0.5,
  /** false object: at most this share of the predicted segment agrees with the truth (no counterpart). */
  counterpartShareMax: 0.25,
  /** Most regions listed per run and frame (worst first); the rest are counted. */
  listMax: 400,
  /** Severity counts a pixel inside Band(bandWidth) this much of a pixel outside it. */
  bandPixelWeight: 0.1,
  /** Columns of the coarse per-frame grid used for temporal evidence (rows keep the cells square). */
  gridColumns: 128,
  /** A region's grid cells are those it fills to at least this share. */
  gridCellShare: 0.5,
  /** Image edges are looked for this far (pixels, chessboard) around each outline pixel, so a few pixels of model wobble do not count. */
  edgeTolerance: 2,
} as const;

/** Region settings: the defaults' shape with any values. */
export type RegionSettings = { -readonly [K in keyof typeof REGION_DEFAULTS]: number };

/** Smallest value of each whole-number setting. */
const WHOLE_MIN = { minArea: 0, bandWidth: 0, listMax: 1, gridColumns: 1, edgeTolerance: 0 } as const;

/** Returns the settings with defaults filled in, or a message naming the bad value. */
export function regionSettingsCheck(partial: Partial<RegionSettings> = {}): Result<RegionSettings> {
  const s: RegionSettings = { ...REGION_DEFAULTS, ...partial };
  for (const [key, min] of Object.entries(WHOLE_MIN) as [keyof typeof WHOLE_MIN, number][]) {
    const v = s[key];
    if (!Number.isInteger(v) || v < min || v > 1e9) return fail('', `region settings: "${key}" must be a whole number ≥ ${min}, got ${v}`);
  }
  if (s.bandWidth > 64) return fail('', `region settings: "bandWidth" must be 0..64 pixels (src/docs/metrics.md band widths), got ${s.bandWidth}`);
  if (s.edgeTolerance > 16) return fail('', `region settings: "edgeTolerance" must be 0..16 pixels, got ${s.edgeTolerance}`);
  const shares: (keyof RegionSettings)[] = ['boundaryBandShare', 'objectCover', 'counterpartShareMax', 'bandPixelWeight', 'gridCellShare'];
  for (const key of shares) {
    const v = s[key];
    if (!(Number.isFinite(v) && v >= 0 && v <= 1)) return fail('', `region settings: "${key}" must be a number 0..1, got ${v}`);
  }
  return ok(s);
}
