import type { DecodedFrame } from '../decodedFrame.ts';
import type { LabelMap } from '../labelMap.ts';
import { fail, ok, type Result } from '../result.ts';

/** Longest side, pixels, of a frame the viewer and the composite accept. */
export const FRAME_SIDE_MAX = 8192;

/**
 * The predictions at a frame's neighbours in its sequence (src/core/temporal/sequences.ts), by run,
 * for the flicker layer: a pixel flips back at this frame when `prev == next` and this frame differs.
 */
export interface FrameAround {
  prev: Record<string, LabelMap>;
  next: Record<string, LabelMap>;
}

/**
 * One frame as the viewer draws it: every array row-major, all of the ground truth's size.
 * `around` is absent or null at a sequence end (no flicker there); its maps of another size are not used.
 */
export type CompositeFrame = Pick<DecodedFrame<LabelMap>, 'photo' | 'truth' | 'preds' | 'bandBins'> & { around?: FrameAround | null };

/** Returns run `run`'s predictions at both neighbours when both exist at the frame's size, else null. */
export function aroundOf(frame: CompositeFrame, run: string | null): { prev: LabelMap; next: LabelMap } | null {
  const a = frame.around;
  if (!a || run === null || !Object.hasOwn(a.prev, run) || !Object.hasOwn(a.next, run)) return null;
  const prev = a.prev[run], next = a.next[run];
  const { width, height } = frame.truth;
  const fits = (m: LabelMap) => m.width === width && m.height === height && m.ids.length === width * height;
  return fits(prev) && fits(next) ? { prev, next } : null;
}

/** Returns the frame's size in pixels, or an error naming the part whose size is wrong or a side over FRAME_SIDE_MAX. */
export function compositeFrameCheck(frame: CompositeFrame, name = 'frame'): Result<{ width: number; height: number }> {
  const { width, height } = frame.truth;
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) {
    return fail(name, `ground truth is ${width}×${height} pixels; a frame needs at least 1×1`);
  }
  if (width > FRAME_SIDE_MAX || height > FRAME_SIDE_MAX) {
    return fail(name, `is ${width}×${height} pixels; the viewer shows frames up to ${FRAME_SIDE_MAX} pixels on the long side`);
  }
  const n = width * height;
  if (frame.truth.ids.length !== n) return fail(name, `ground truth holds ${frame.truth.ids.length} ids for ${width}×${height} pixels`);
  if (frame.photo && frame.photo.length !== n * 4) {
    return fail(name, `photo holds ${frame.photo.length} bytes; ${width}×${height} RGBA needs ${n * 4}`);
  }
  for (const [run, map] of Object.entries(frame.preds)) {
    if (map.width !== width || map.height !== height || map.ids.length !== n) {
      return fail(name, `prediction "${run}" is ${map.width}×${map.height} pixels but the ground truth is ${width}×${height}`);
    }
  }
  if (frame.bandBins && frame.bandBins.length !== n) {
    return fail(name, `band bins hold ${frame.bandBins.length} values for ${width}×${height} pixels`);
  }
  return ok({ width, height });
}
