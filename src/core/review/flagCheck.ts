import { fail, ok, type Result } from '../result.ts';
import {
  FLAG_COORD_MAX,
  FLAG_KINDS,
  FLAG_NOTE_MAX,
  FLAG_REGION_REASON_MAX,
  FLAG_REGION_REASONS_MAX,
  FLAG_TAG_MAX,
  REVIEW_FUTURE_MAX_MS,
  REVIEW_TIME_MAX,
  REVIEW_TIME_MIN,
  type Flag,
  type FlagBox,
  type FlagKind,
  type FlagRegion,
} from './flag.ts';

// Control characters (C0, DEL, C1) and bidirectional overrides: never wanted in a tag or a name.
const CONTROL_RE = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/;
/** Longest id, frame or run name accepted, characters. */
const NAME_MAX = 1000;

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function isCoord(v: unknown): v is number {
  return typeof v === 'number' && Number.isInteger(v) && v >= 0 && v <= FLAG_COORD_MAX;
}

/** Returns the box as a fresh tuple when it is four integers with x0 < x1 and y0 < y1, else why not. */
export function flagBoxCheck(v: unknown): Result<FlagBox> {
  if (!Array.isArray(v) || v.length !== 4 || !v.every(isCoord)) {
    return fail('', `must be [x0, y0, x1, y1]: four integers 0..${FLAG_COORD_MAX}, got ${JSON.stringify(v)}`);
  }
  const [x0, y0, x1, y1] = v as number[];
  if (!(x0 < x1 && y0 < y1)) return fail('', `[${v.join(', ')}] is empty: needs x0 < x1 and y0 < y1 (end-exclusive pixels)`);
  return ok([x0, y0, x1, y1] as const);
}

/** Returns the reason trimmed when it is a built-in reason or a usable tag, else why not. */
export function flagReasonCheck(v: unknown): Result<string> {
  if (typeof v !== 'string') return fail('', `must be a string, got ${JSON.stringify(v)}`);
  const r = v.trim();
  if (r === '') return fail('', 'is empty; use label-mistake, model-error, unsure or a tag of your own');
  if (r.length > FLAG_TAG_MAX) return fail('', `is ${r.length} characters long; a tag has at most ${FLAG_TAG_MAX}`);
  if (CONTROL_RE.test(r)) return fail('', 'holds a control character');
  return ok(r);
}

function nameCheck(v: unknown, what: string): string | null {
  if (typeof v !== 'string' || v === '') return `"${what}" must be a non-empty string, got ${JSON.stringify(v)}`;
  if (v.length > NAME_MAX) return `"${what}" is ${v.length} characters long (at most ${NAME_MAX})`;
  return null;
}

/**
 * Returns why `v` is not a usable time (ms since 1970, before 2200, and, when `now` is given, at most
 * a day ahead of it), or null. A time far ahead would win every later edit and bring deleted flags back.
 */
export function reviewTimeCheck(v: unknown, what: string, now?: number): string | null {
  if (typeof v !== 'number' || !Number.isFinite(v) || v < REVIEW_TIME_MIN || v > REVIEW_TIME_MAX) {
    return `"${what}" must be a time between 1970 and 2200, got ${JSON.stringify(v)?.slice(0, 40)}`;
  }
  if (now !== undefined && v > now + REVIEW_FUTURE_MAX_MS) {
    return `"${what}" is ${new Date(v).toISOString()}, more than a day ahead of this computer's clock`;
  }
  return null;
}

function classIdOrNull(v: unknown): boolean {
  return v === null || (typeof v === 'number' && Number.isInteger(v) && v >= 0 && v <= 65535);
}

/** Returns the region details checked, or why they are unusable. */
export function flagRegionCheck(v: unknown): Result<FlagRegion> {
  if (!isPlainObject(v)) return fail('', 'must be an object { kind, truthClass, predictedClass, score, reasons }');
  if (typeof v.kind !== 'string' || v.kind === '') return fail('', `"kind" must be a non-empty string, got ${JSON.stringify(v.kind)}`);
  const truthClass = v.truthClass ?? null, predictedClass = v.predictedClass ?? null, score = v.score ?? null;
  if (!classIdOrNull(truthClass)) return fail('', `"truthClass" must be a class id 0..65535 or null, got ${JSON.stringify(v.truthClass)}`);
  if (!classIdOrNull(predictedClass)) return fail('', `"predictedClass" must be a class id 0..65535 or null, got ${JSON.stringify(v.predictedClass)}`);
  if (score !== null && (typeof score !== 'number' || !Number.isFinite(score))) return fail('', `"score" must be a number or null, got ${JSON.stringify(v.score)}`);
  if (v.kind.length > FLAG_TAG_MAX) return fail('', `"kind" is ${v.kind.length} characters long (at most ${FLAG_TAG_MAX})`);
  const reasons = v.reasons ?? [];
  if (!Array.isArray(reasons) || !reasons.every((r) => typeof r === 'string')) return fail('', '"reasons" must be an array of strings');
  if (reasons.length > FLAG_REGION_REASONS_MAX) return fail('', `"reasons" holds ${reasons.length} reasons (at most ${FLAG_REGION_REASONS_MAX})`);
  const long = reasons.find((r: string) => r.length > FLAG_REGION_REASON_MAX);
  if (long !== undefined) return fail('', `"reasons" has one of ${long.length} characters (at most ${FLAG_REGION_REASON_MAX})`);
  return ok({ kind: v.kind, truthClass: truthClass as number | null, predictedClass: predictedClass as number | null, score: score as number | null, reasons: [...reasons] });
}

/**
 * Returns a flag read from parsed JSON (storage or a flags file), every field checked, or the first
 * problem prefixed with `where` (e.g. `flags[3]`). With `now` (a file from elsewhere), times more
 * than a day ahead of it are refused.
 */
export function flagFromJson(v: unknown, where: string, now?: number): Result<Flag> {
  if (!isPlainObject(v)) return fail('', `${where} must be an object, got ${JSON.stringify(v)?.slice(0, 40)}`);
  const at = typeof v.id === 'string' && v.id !== '' ? `${where} (id ${JSON.stringify(v.id.slice(0, 60))})` : where;
  const bad = (problem: string) => fail<Flag>('', `${at}: ${problem}`);
  const problem =
    nameCheck(v.id, 'id') ?? nameCheck(v.frame, 'frame') ?? reviewTimeCheck(v.createdAt, 'createdAt', now) ?? reviewTimeCheck(v.updatedAt, 'updatedAt', now);
  if (problem) return bad(problem);
  if (!(FLAG_KINDS as readonly unknown[]).includes(v.kind)) return bad(`"kind" must be one of ${FLAG_KINDS.join(', ')}, got ${JSON.stringify(v.kind)}`);
  const kind = v.kind as FlagKind;
  let bbox: FlagBox | null = null;
  if (kind === 'frame') {
    if (v.bbox !== null && v.bbox !== undefined) return bad('"bbox" must be null for a whole-frame flag');
  } else {
    const b = flagBoxCheck(v.bbox);
    if (!b.ok) return bad(`"bbox" ${b.error}`);
    bbox = b.value;
  }
  const reason = flagReasonCheck(v.reason);
  if (!reason.ok) return bad(`"reason" ${reason.error}`);
  const note = v.note ?? '';
  if (typeof note !== 'string') return bad(`"note" must be a string, got ${JSON.stringify(v.note)}`);
  if (note.length > FLAG_NOTE_MAX) return bad(`"note" is ${note.length} characters long (at most ${FLAG_NOTE_MAX})`);
  const run = v.run ?? null;
  if (run !== null) {
    const p = nameCheck(run, 'run');
    if (p) return bad(`${p} (or null)`);
  }
  const flag: Flag = {
    id: v.id as string, frame: v.frame as string, kind, bbox, reason: reason.value, note,
    run: run as string | null, createdAt: v.createdAt as number, updatedAt: v.updatedAt as number,
  };
  if (v.region !== undefined && v.region !== null) {
    const r = flagRegionCheck(v.region);
    if (!r.ok) return bad(`"region" ${r.error}`);
    flag.region = r.value;
  }
  return ok(flag);
}
