import type { RegionKind } from '../core/regions/regionTypes.ts';
import type { SuspectVerdictKind } from '../core/review/verdict.ts';

/** Plain names of region kinds on screen. */
export const KIND_NAMES: Record<RegionKind, string> = {
  boundary: 'boundary',
  missedObject: 'missed object',
  falseObject: 'false object',
  classConfusion: 'class confusion',
};

/** Plain names of reviewer verdicts on screen. */
export const VERDICT_NAMES: Record<SuspectVerdictKind, string> = {
  'label-mistake': 'label mistake',
  'model-error': 'model error',
  unsure: 'unsure',
};
