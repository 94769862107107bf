import { REGION_KINDS, type RegionKind } from '../core/regions/regionTypes.ts';
import type { ReviewJudgement } from '../core/review/judgement.ts';

/** Plain names of region kinds on screen. */
export const KIND_NAMES: Record<RegionKind, string> = {
  boundary: 'boundary',
  missedObject: 'missed object',
  falseObject: 'false object',
  classConfusion: 'class confusion',
};

/** Plain names of the review judgements (verdicts and built-in flag reasons) on screen. */
export const VERDICT_NAMES: Record<ReviewJudgement, string> = {
  'label-mistake': 'label mistake',
  'model-error': 'model error',
  unsure: 'unsure',
};

/** Returns the plain name of a flag's region kind; a kind this version does not know (from another file) is just "region". */
export function regionKindName(kind: string | undefined): string {
  return kind && (REGION_KINDS as readonly string[]).includes(kind) ? KIND_NAMES[kind as RegionKind] : 'region';
}
