import type { Flag } from './flag.ts';

/** Which flags to take: every one, or those with one of `reasons` and/or on one of `frames`. */
export interface FlagsChoice {
  reasons?: readonly string[] | null;
  frames?: readonly string[] | null;
}

/** Returns the flags matching `choice` (an empty or missing list does not filter), in their order. */
export function flagsSelect(flags: readonly Flag[], choice: FlagsChoice = {}): Flag[] {
  const reasons = choice.reasons?.length ? new Set(choice.reasons) : null;
  const frames = choice.frames?.length ? new Set(choice.frames) : null;
  return flags.filter((f) => (!reasons || reasons.has(f.reason)) && (!frames || frames.has(f.frame)));
}

/** Returns the flags with reason `reason`. */
export function flagsByReason(flags: readonly Flag[], reason: string): Flag[] {
  return flags.filter((f) => f.reason === reason);
}

/** Returns the flags on frame `frame`. */
export function flagsOfFrame(flags: readonly Flag[], frame: string): Flag[] {
  return flags.filter((f) => f.frame === frame);
}

/** Returns each reason in use with its number of flags, most used first (ties by name). */
export function flagReasonCounts(flags: readonly Flag[]): { reason: string; count: number }[] {
  const counts = new Map<string, number>();
  for (const f of flags) counts.set(f.reason, (counts.get(f.reason) ?? 0) + 1);
  return [...counts].map(([reason, count]) => ({ reason, count })).sort((a, b) => b.count - a.count || (a.reason < b.reason ? -1 : 1));
}
