// The shapes error regions travel in: plain objects and typed arrays, so a worker can post them.

/** Kinds of a listed error region (README "Error regions"). */
export const REGION_KINDS = ['boundary', 'missedObject', 'falseObject', 'classConfusion'] as const;
export type RegionKind = (typeof REGION_KINDS)[number];

/** Bins of a region's confidence histogram over 0..1 (bin b holds [b/16, (b+1)/16), the last one includes 1). */
export const CONFIDENCE_BINS = 16;

/** Grid value of a cell whose most common prediction is no class id. */
export const GRID_NOT_A_CLASS = 65535;

/** The segment (8-connected same-value component of one map) a region lies in, and how much of it the region covers. */
export interface RegionSegment {
  /** Component id in raster order of the map's segments (reproducible with segmentsLabel). */
  id: number;
  /** Pixels. */
  area: number;
  /** Region area / segment area, 0..1. */
  covered: number;
}

/** What a region's pixels say beyond its shape; raw values, weighed later by suspectScore. */
export interface RegionEvidence {
  /** Per other run with a map of this frame: share (0..1) of the region's pixels where it predicts the same class. */
  agreement: { run: string; share: number }[];
  /**
   * Edge strength along the region's outline where only the prediction changes class, where only the
   * truth does, and inside the region: the mean over those pixels of the strongest Sobel gradient of
   * the photo's luma within edgeTolerance px (levels per pixel, 0..180); null where there are no such
   * pixels. Null altogether without a photo.
   */
  edges: {
    predicted: number | null;
    truth: number | null;
    inside: number | null;
    /** Outline pixels where only the prediction changes class, only the truth does, and both do (shared outline). */
    outline: { predicted: number; truth: number; shared: number };
  } | null;
  /** Histogram (CONFIDENCE_BINS bins, pixels) of this run's confidence over the region; null without a confidence map. */
  confidence: number[] | null;
  /** Appearance histogram of the region in the photo (colour then texture bins, appearance.ts); null without a photo. */
  appearance: number[] | null;
  /** Cells of the frame grid the region fills to at least gridCellShare (row-major index; none for thin slivers); see FrameGrid. */
  cells: number[];
}

/** One listed region of disagreement: connected pixels with one (truth class, predicted class) pair. */
export interface ErrorRegion {
  /** Component id in raster order of this run's regions (tiny ones included; reproducible with frameRegionsCompute). */
  id: number;
  kind: RegionKind;
  /** Class ids; predictedClass null means "not a class" (void or an id outside the table). */
  truthClass: number;
  predictedClass: number | null;
  /** Pixels. */
  area: number;
  /** [x0, y0, x1, y1], end exclusive, pixels. */
  bbox: [number, number, number, number];
  /** Mean of pixel centres (x + 0.5, y + 0.5), in the same frame as bbox. */
  centroid: [number, number];
  /** Share of its pixels inside Band(bandWidth) of the ground-truth boundary (src/docs/metrics.md), 0..1. */
  bandShare: number;
  /** Largest Euclidean distance (pixels, centre to centre) from a region pixel to the nearest pixel outside it; 1 for a one-pixel line. */
  thickness: number;
  truthSegment: RegionSegment;
  /** The predicted segment, and the share of its pixels where the truth has its class (0..1). */
  predSegment: RegionSegment & { truthAgrees: number };
  /** Ordering weight, pixels: pixels outside Band(bandWidth) + bandPixelWeight × pixels inside. */
  severity: number;
  evidence: RegionEvidence;
}

/** An informational region where the ground truth is void and the prediction a class: never an error. */
export interface VoidSpillRegion {
  predictedClass: number;
  area: number;
  bbox: [number, number, number, number];
}

/** Regions and pixels of one group. */
export interface RegionTally {
  regions: number;
  pixels: number;
}

/** Counts of a run's regions on one frame. */
export interface RegionCounts {
  /** Every region of disagreement, tiny ones included; pixels = the frame's wrong valid pixels. */
  all: RegionTally;
  /** Regions of at least minArea pixels, by kind (listed or not). */
  byKind: Record<RegionKind, RegionTally>;
  /** Regions under minArea pixels. */
  tiny: RegionTally;
  /** Every region by (truth class, predicted class), most pixels first. */
  byPair: { truthClass: number; predictedClass: number | null; regions: number; pixels: number }[];
  /** Regions of at least minArea pixels left out of the list by listMax. */
  unlisted: number;
}

/** Per class (same order as classIds): summed confidence and pixel count where truth and prediction both say it. */
export interface ConfidenceTotals {
  classIds: number[];
  sum: Float64Array;
  count: Uint32Array;
}

/** The error regions of one run on one frame. */
export interface RunRegions {
  /** Listed regions, worst (highest severity) first. */
  regions: ErrorRegion[];
  counts: RegionCounts;
  /** Pixels where the truth is void and this run predicts a class, and those areas of at least minArea pixels. */
  voidSpill: { pixels: number; regions: VoidSpillRegion[] };
  /** Null without a confidence map for this run. */
  confidence: ConfidenceTotals | null;
  /** Most common predicted id per grid cell (GRID_NOT_A_CLASS for no class); same layout as FrameGrid. */
  grid: Uint16Array;
}

/** Coarse per-frame grid for temporal evidence: cells of `cell` × `cell` pixels, row-major. */
export interface FrameGrid {
  columns: number;
  rows: number;
  /** Cell side, pixels (cells at the right and bottom edges may be smaller). */
  cell: number;
  /** Most common ground-truth id per cell (the void id where void is most common). */
  truth: Uint16Array;
}
