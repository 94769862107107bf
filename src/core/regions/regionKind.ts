import type { RegionSettings } from './regionSettings.ts';
import type { RegionKind } from './regionTypes.ts';

/** The measurements a region's kind is decided from. */
export interface KindInputs {
  /** Region area / area of the truth segment it lies in, 0..1. */
  truthCovered: number;
  /** Region area / area of the predicted segment it lies in, 0..1. */
  predCovered: number;
  /** Share of the predicted segment where the truth has the predicted class, 0..1. */
  predTruthAgrees: number;
  /** Share of the region inside Band(bandWidth), 0..1. */
  bandShare: number;
}

/**
 * Returns the kind of a region, first rule that holds (README "Error regions"):
 * missed object — it covers at least `objectCover` of its truth segment (the truth's object is gone);
 * false object — it covers at least `objectCover` of its predicted segment, and at most
 * `counterpartShareMax` of that segment agrees with the truth (a predicted object with no truth counterpart);
 * boundary — at least `boundaryBandShare` of it lies within `bandWidth` px of the truth boundary (thin, along it);
 * class confusion — otherwise: a patch inside a truth segment, predicted as another class.
 */
export function regionKind(m: KindInputs, s: RegionSettings): RegionKind {
  if (m.truthCovered >= s.objectCover) return 'missedObject';
  if (m.predCovered >= s.objectCover && m.predTruthAgrees <= s.counterpartShareMax) return 'falseObject';
  if (m.bandShare >= s.boundaryBandShare) return 'boundary';
  return 'classConfusion';
}
