import { fail, ok, type Result } from '../result.ts';
import type { FlagBox } from './flag.ts';
import { flagBoxCheck, reviewTimeCheck } from './flagCheck.ts';
import { isReviewJudgement, REVIEW_JUDGEMENTS, type ReviewJudgement } from './judgement.ts';

/** What a reviewer decided about an item of the suspect queue: one of the review judgements. */
export const SUSPECT_VERDICTS = REVIEW_JUDGEMENTS;
export type SuspectVerdictKind = ReviewJudgement;

/** The identity of a suspect-queue item: where it is, for which run, and which class pair it confuses. */
export interface SuspectRef {
  frame: string;
  run: string | null;
  bbox: FlagBox;
  truthClass: number | null;
  predictedClass: number | null;
}

/** A verdict on one suspect item, keyed by `suspectKey` of its ref. */
export interface SuspectVerdict extends SuspectRef {
  key: string;
  verdict: SuspectVerdictKind;
  /** Milliseconds since the epoch. */
  updatedAt: number;
}

/**
 * Returns the stable key of a suspect item: the same frame, run, box and class pair give the same key
 * whenever the queue is rebuilt (a JSON array, so no field can bleed into another).
 */
export function suspectKey(ref: SuspectRef): string {
  return JSON.stringify([ref.frame, ref.run, [...ref.bbox], ref.truthClass, ref.predictedClass]);
}

function classIdOrNull(v: unknown): v is number | null {
  return v === null || (typeof v === 'number' && Number.isInteger(v) && v >= 0 && v <= 65535);
}

/** Returns a verdict read from parsed JSON with every field checked (the key recomputed), or the problem; `now` as in flagFromJson. */
export function verdictFromJson(v: unknown, where: string, now?: number): Result<SuspectVerdict> {
  const bad = (p: string) => fail<SuspectVerdict>('', `${where}: ${p}`);
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return bad('must be an object');
  const o = v as Record<string, unknown>;
  if (typeof o.frame !== 'string' || o.frame === '' || o.frame.length > 1000) return bad(`"frame" must be a name of 1 to 1000 characters, got ${JSON.stringify(o.frame)?.slice(0, 60)}`);
  const run = o.run ?? null;
  if (run !== null && (typeof run !== 'string' || run === '' || run.length > 1000)) return bad(`"run" must be a run name or null, got ${JSON.stringify(o.run)?.slice(0, 60)}`);
  const box = flagBoxCheck(o.bbox);
  if (!box.ok) return bad(`"bbox" ${box.error}`);
  const truthClass = o.truthClass ?? null, predictedClass = o.predictedClass ?? null;
  if (!classIdOrNull(truthClass) || !classIdOrNull(predictedClass)) return bad('"truthClass" and "predictedClass" must be class ids 0..65535 or null');
  if (!isReviewJudgement(o.verdict)) return bad(`"verdict" must be one of ${SUSPECT_VERDICTS.join(', ')}, got ${JSON.stringify(o.verdict)}`);
  const time = reviewTimeCheck(o.updatedAt, 'updatedAt', now);
  if (time) return bad(time);
  const ref: SuspectRef = { frame: o.frame, run: run as string | null, bbox: box.value, truthClass, predictedClass };
  const key = suspectKey(ref);
  if (o.key !== undefined && o.key !== key) return bad(`"key" ${JSON.stringify(o.key)} does not match its frame, run, box and classes (${key})`);
  return ok({ ...ref, key, verdict: o.verdict as SuspectVerdictKind, updatedAt: o.updatedAt as number });
}
