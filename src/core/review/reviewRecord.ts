import { fail, ok, type Result } from '../result.ts';
import type { Flag } from './flag.ts';
import { flagFromJson, reviewTimeCheck } from './flagCheck.ts';
import { verdictFromJson, type SuspectVerdict } from './verdict.ts';

/** Version of the stored record layout: 1 kept one list per dataset, 2 keeps one record per flag or verdict. */
export const REVIEW_SCHEMA = 2;

interface RecordBase {
  /** Flag id, or the suspect key of a verdict. */
  id: string;
  /** When this version was written, ms since the epoch; the newest version of a record wins. */
  updatedAt: number;
  /** Who wrote it (one id per tab); breaks ties between equal times so every tab picks the same winner. */
  writer: string;
}

/** One persisted item: a flag or a verdict, or its tombstone (null) once deleted or cleared. */
export type ReviewRecord =
  | (RecordBase & { type: 'flag'; flag: Flag | null })
  | (RecordBase & { type: 'verdict'; verdict: SuspectVerdict | null });

/** Returns the record's key within its dataset: `flag/<id>` or `verdict/<key>`. */
export function reviewRecordKey(r: Pick<ReviewRecord, 'type' | 'id'>): string {
  return `${r.type}/${r.id}`;
}

/** Returns whether `a` supersedes `b` under last-write-wins: later time, or the same time and the larger writer id. */
export function reviewRecordNewer(a: ReviewRecord, b: ReviewRecord): boolean {
  if (a.updatedAt !== b.updatedAt) return a.updatedAt > b.updatedAt;
  return a.writer > b.writer;
}

/** Returns whether the record holds a live flag or verdict (not a tombstone). */
export function reviewRecordLive(r: ReviewRecord): boolean {
  return r.type === 'flag' ? r.flag !== null : r.verdict !== null;
}

/** Returns the stored form of a record (plain JSON-safe data with its schema version). */
export function reviewRecordToStored(r: ReviewRecord): Record<string, unknown> {
  return { v: REVIEW_SCHEMA, ...r };
}

/** Returns the schema version a stored value says it has, or null when it says none. */
export function reviewStoredVersion(v: unknown): number | null {
  if (typeof v !== 'object' || v === null) return null;
  const n = (v as Record<string, unknown>).v;
  return typeof n === 'number' && Number.isInteger(n) ? n : null;
}

/** Returns a record read back from storage (version 2), every field checked, or why it is unusable. */
export function reviewRecordFromStored(v: unknown, where: string): Result<ReviewRecord> {
  const version = reviewStoredVersion(v);
  if (version !== REVIEW_SCHEMA) return fail('', `${where}: stored with schema ${version ?? 'unknown'}, this version reads ${REVIEW_SCHEMA}`);
  const o = v as Record<string, unknown>;
  if (typeof o.id !== 'string' || o.id === '') return fail('', `${where}: no "id"`);
  const time = reviewTimeCheck(o.updatedAt, 'updatedAt');
  if (time) return fail('', `${where}: ${time}`);
  if (typeof o.writer !== 'string') return fail('', `${where}: no "writer"`);
  const base = { id: o.id, updatedAt: o.updatedAt as number, writer: o.writer };
  if (o.type === 'flag') {
    if (o.flag === null) return ok({ ...base, type: 'flag', flag: null });
    const f = flagFromJson(o.flag, where);
    if (!f.ok) return f;
    if (f.value.id !== o.id) return fail('', `${where}: holds flag ${f.value.id} under id ${o.id}`);
    return ok({ ...base, type: 'flag', flag: f.value });
  }
  if (o.type === 'verdict') {
    if (o.verdict === null) return ok({ ...base, type: 'verdict', verdict: null });
    const x = verdictFromJson(o.verdict, where);
    if (!x.ok) return x;
    if (x.value.key !== o.id) return fail('', `${where}: holds verdict ${x.value.key} under id ${o.id}`);
    return ok({ ...base, type: 'verdict', verdict: x.value });
  }
  return fail('', `${where}: unknown record type ${JSON.stringify(o.type)}`);
}

/**
 * Returns `current` with `incoming` merged by last-write-wins per key (a new object only when something
 * won), and the incoming records that won, as the same objects.
 */
export function reviewRecordsMerge(
  current: Readonly<Record<string, ReviewRecord>>,
  incoming: readonly ReviewRecord[],
): { records: Readonly<Record<string, ReviewRecord>>; won: ReviewRecord[] } {
  const won: ReviewRecord[] = [];
  let next: Record<string, ReviewRecord> | null = null;
  for (const r of incoming) {
    const key = reviewRecordKey(r);
    const have = (next ?? current)[key];
    if (have && !reviewRecordNewer(r, have)) continue;
    next ??= { ...current };
    next[key] = r;
    won.push(r);
  }
  return { records: next ?? current, won };
}
