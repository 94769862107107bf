/**
 * A reviewer's flag: a whole frame, an error region / queue item, or a rectangle drawn on the viewer,
 * with why it was flagged. Plain data, so it persists, exports and crosses to a worker unchanged.
 */

import { isReviewJudgement, REVIEW_JUDGEMENTS, type ReviewJudgement } from './judgement.ts';

/** What a flag marks. */
export const FLAG_KINDS = ['frame', 'region', 'rect'] as const;
export type FlagKind = (typeof FLAG_KINDS)[number];

/** The reasons every dataset offers (the review judgements); any other non-empty tag string is a user-defined reason. */
export const FLAG_REASONS = REVIEW_JUDGEMENTS;
export type FlagBuiltinReason = ReviewJudgement;
/** A built-in reason or a user-defined tag (1..64 characters, no control characters). */
export type FlagReason = FlagBuiltinReason | (string & {});

/** A box in source pixels: columns x0..x1-1, rows y0..y1-1 (end-exclusive). */
export type FlagBox = readonly [x0: number, y0: number, x1: number, y1: number];

/** Largest coordinate a box may have, pixels (well above any frame the decoder accepts). */
export const FLAG_COORD_MAX = 1 << 20;
/** Longest note kept, characters. */
export const FLAG_NOTE_MAX = 10_000;
/** Longest user-defined reason tag, characters. */
export const FLAG_TAG_MAX = 64;
/** Most reasons kept on a flag's region, and the longest of them, characters. */
export const FLAG_REGION_REASONS_MAX = 20;
export const FLAG_REGION_REASON_MAX = 300;
/** Most flags (and, separately, verdicts) read from one flags file. */
export const FLAGS_FILE_MAX = 50_000;
/** Times a flag or verdict may carry, ms since the epoch: 1970-01-01 to 2200-01-01. */
export const REVIEW_TIME_MIN = 0;
export const REVIEW_TIME_MAX = Date.UTC(2200, 0, 1);
/** How far ahead of this machine's clock a time in a flags file may be (another machine's clock may run ahead). */
export const REVIEW_FUTURE_MAX_MS = 24 * 3600 * 1000;

/** What the region finder said about a region a flag was made from. */
export interface FlagRegion {
  /** The finder's name for the region's kind (e.g. a disagreement or a suspect label). */
  kind: string;
  /** Ground-truth class id inside the region, or null. */
  truthClass: number | null;
  /** Predicted class id inside the region, or null. */
  predictedClass: number | null;
  /** The finder's score for the region (its own scale), or null. */
  score: number | null;
  /** Short reasons the finder gave. */
  reasons: string[];
}

export interface Flag {
  id: string;
  /** Frame name (the stem the dataset pairs files by). */
  frame: string;
  kind: FlagKind;
  /** null for a whole frame, else the flagged box. */
  bbox: FlagBox | null;
  reason: FlagReason;
  note: string;
  /** The prediction run the flag refers to, or null. */
  run: string | null;
  /** Milliseconds since the epoch. */
  createdAt: number;
  updatedAt: number;
  /** Set when the flag was made from a region of the finder. */
  region?: FlagRegion;
}

/** Returns whether `r` is one of the built-in reasons. */
export function isFlagBuiltinReason(r: string): r is FlagBuiltinReason {
  return isReviewJudgement(r);
}

/** Returns the box's width and height in pixels. */
export function flagBoxSize(b: FlagBox): { width: number; height: number } {
  return { width: b[2] - b[0], height: b[3] - b[1] };
}
