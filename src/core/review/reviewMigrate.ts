import { fail, ok, type Result } from '../result.ts';
import type { Flag } from './flag.ts';
import { flagFromJson } from './flagCheck.ts';
import type { ReviewRecord } from './reviewRecord.ts';

/**
 * Layout 1 of saved flags (and of flags files with `"version": 1`): the whole list of a dataset in one
 * value, each flag with an x/y/width/height box (null for a whole frame), a short reason word and one
 * creation time. Layout 2 keeps one record per flag with end-exclusive boxes and edit times.
 */
export interface ReviewV1 {
  version: 1;
  flags: ReviewV1Flag[];
}

export interface ReviewV1Flag {
  id: string;
  frame: string;
  box: { x: number; y: number; width: number; height: number } | null;
  /** 'label' | 'model' | 'unsure' or a tag. */
  reason: string;
  note?: string;
  run?: string | null;
  /** ms since the epoch. */
  created: number;
}

/** Writer id given to records converted from layout 1 (a real tab id never equals it). */
export const V1_WRITER = 'migrated-v1';

const V1_REASONS: Record<string, string> = { label: 'label-mistake', model: 'model-error', unsure: 'unsure' };

/** Returns a layout-2 flag converted from a layout-1 flag, checked as any flag is, or the problem. */
export function flagFromV1(v: unknown, where: string, now?: number): Result<Flag> {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return fail('', `${where} must be an object`);
  const o = v as Record<string, unknown>;
  let bbox: unknown = null;
  if (o.box !== null && o.box !== undefined) {
    const b = o.box as Record<string, unknown>;
    const nums = [b.x, b.y, b.width, b.height];
    if (typeof o.box !== 'object' || !nums.every((n) => typeof n === 'number')) {
      return fail('', `${where}: "box" must be { x, y, width, height } or null, got ${JSON.stringify(o.box)}`);
    }
    const [x, y, w, h] = nums as number[];
    bbox = [x, y, x + w, y + h];
  }
  const reason = typeof o.reason === 'string' ? (V1_REASONS[o.reason] ?? o.reason) : o.reason;
  return flagFromJson(
    {
      id: o.id, frame: o.frame, kind: bbox === null ? 'frame' : 'rect', bbox, reason, note: o.note ?? '',
      run: o.run ?? null, createdAt: o.created, updatedAt: o.created,
    },
    where,
    now,
  );
}

/** Returns the layout-2 records of a stored layout-1 value (one per flag, edit time = creation time), or the first problem. */
export function reviewV1Migrate(stored: unknown, where: string): Result<ReviewRecord[]> {
  if (typeof stored !== 'object' || stored === null || (stored as Record<string, unknown>).version !== 1) {
    return fail('', `${where}: not a layout-1 flag list (expected { "version": 1, "flags": [...] })`);
  }
  const flags = (stored as Record<string, unknown>).flags;
  if (!Array.isArray(flags)) return fail('', `${where}: "flags" must be an array`);
  const out: ReviewRecord[] = [];
  for (let i = 0; i < flags.length; i++) {
    const f = flagFromV1(flags[i], `${where} flags[${i}]`);
    if (!f.ok) return f;
    out.push({ type: 'flag', id: f.value.id, updatedAt: f.value.updatedAt, writer: V1_WRITER, flag: f.value });
  }
  return ok(out);
}
