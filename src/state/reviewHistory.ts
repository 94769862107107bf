import { reviewRecordKey, type ReviewRecord } from '../core/review/reviewRecord.ts';

/** Most changes kept for undo (each change may touch many records, e.g. an import). */
export const REVIEW_HISTORY_MAX = 200;

/** One undoable change: per record key, the record before it (undefined: none) and the one it wrote. */
export interface ReviewChange {
  label: string;
  steps: { key: string; before: ReviewRecord | undefined; after: ReviewRecord }[];
}

/** What an undo or redo did: the change's label, records restored, and records left because they changed since. */
export interface ReviewUndoOutcome {
  label: string;
  applied: number;
  /** Records edited since (in another tab or by a later import merge), left as they are. */
  skipped: number;
}

/** Returns a record time for `key` that is now, but always after the record it replaces (clock steps back, fast edits). */
export function reviewStamp(records: Readonly<Record<string, ReviewRecord>>, key: string, now: number): number {
  const prior = records[key]?.updatedAt ?? -Infinity;
  return Math.max(now, Math.floor(prior) + 1);
}

function boxSame(a: readonly number[] | null, b: readonly number[] | null): boolean {
  return a === b || (a !== null && b !== null && a.every((v, i) => v === b[i]));
}

/** Returns whether two records hold the same flag or verdict, apart from when and by whom they were written. */
export function reviewRecordSameContent(a: ReviewRecord | undefined, b: ReviewRecord): boolean {
  if (!a || a.type !== b.type || a.id !== b.id) return false;
  if (a.type === 'flag' && b.type === 'flag') {
    const x = a.flag, y = b.flag;
    if (x === null || y === null) return x === y;
    return x.frame === y.frame && x.kind === y.kind && boxSame(x.bbox, y.bbox) && x.reason === y.reason && x.note === y.note &&
      x.run === y.run && x.createdAt === y.createdAt && JSON.stringify(x.region ?? null) === JSON.stringify(y.region ?? null);
  }
  if (a.type === 'verdict' && b.type === 'verdict') return (a.verdict?.verdict ?? null) === (b.verdict?.verdict ?? null);
  return false;
}

/** Returns a copy of `r` with time `t` and writer `writer` (the flag or verdict inside stamped the same), or its tombstone when `content` is undefined. */
function restamp(template: ReviewRecord, content: ReviewRecord | undefined, t: number, writer: string): ReviewRecord {
  const base = { id: template.id, updatedAt: t, writer };
  if (template.type === 'flag') {
    const flag = content?.type === 'flag' && content.flag ? { ...content.flag, updatedAt: t } : null;
    return { ...base, type: 'flag', flag };
  }
  const verdict = content?.type === 'verdict' && content.verdict ? { ...content.verdict, updatedAt: t } : null;
  return { ...base, type: 'verdict', verdict };
}

/**
 * Returns the records that undo `change` (each record put back as it was, written anew so it wins over
 * the later version everywhere), the inverse change for the other stack, and the outcome. Steps whose
 * record is no longer the one the change wrote are skipped, so an undo never overwrites someone else's edit.
 */
export function reviewChangeInvert(
  change: ReviewChange,
  records: Readonly<Record<string, ReviewRecord>>,
  writer: string,
  now: number,
): { records: ReviewRecord[]; inverse: ReviewChange; outcome: ReviewUndoOutcome } {
  const out: ReviewRecord[] = [];
  const steps: ReviewChange['steps'] = [];
  let skipped = 0;
  for (let i = change.steps.length - 1; i >= 0; i--) {
    const step = change.steps[i];
    // An undo of a later change rewrites the record with the same content and a new time; that still counts as ours.
    if (records[step.key] !== step.after && !reviewRecordSameContent(records[step.key], step.after)) {
      skipped++;
      continue;
    }
    const restored = restamp(step.after, step.before, reviewStamp(records, step.key, now), writer);
    out.push(restored);
    steps.push({ key: reviewRecordKey(restored), before: step.after, after: restored });
  }
  return { records: out, inverse: { label: change.label, steps }, outcome: { label: change.label, applied: out.length, skipped } };
}

/** Returns `stack` with `change` on top, the oldest dropped beyond REVIEW_HISTORY_MAX. */
export function reviewStackPush(stack: readonly ReviewChange[], change: ReviewChange): ReviewChange[] {
  const next = stack.length >= REVIEW_HISTORY_MAX ? stack.slice(stack.length - REVIEW_HISTORY_MAX + 1) : stack.slice();
  next.push(change);
  return next;
}
