import { fail, ok, type Result } from '../core/result.ts';

/** What to generate: frame size in pixels, number of frames and the seed of the whole sequence. */
export interface DemoOptions {
  width: number;
  height: number;
  frames: number;
  seed: number;
}

/** The default demo: 48 frames of 1024×512 from seed 1. */
export const DEMO_DEFAULTS: Readonly<DemoOptions> = { width: 1024, height: 512, frames: 48, seed: 1 };

/** Smallest and largest accepted frame side, in pixels (the layout needs a few hundred pixels to read). */
export const DEMO_SIZE_MIN = 64;
export const DEMO_SIZE_MAX = 8192;
/** Largest accepted number of frames. */
export const DEMO_FRAMES_MAX = 9999;

/** Returns the options with defaults filled in, or a message naming the bad setting. */
export function demoOptionsCheck(partial: Partial<DemoOptions>, source = 'demo options'): Result<DemoOptions> {
  const o = { ...DEMO_DEFAULTS, ...partial };
  for (const key of ['width', 'height'] as const) {
    const v = o[key];
    if (!Number.isInteger(v) || v < DEMO_SIZE_MIN || v > DEMO_SIZE_MAX) {
      return fail(source, `${key} must be an integer ${DEMO_SIZE_MIN}..${DEMO_SIZE_MAX} pixels, got ${v}`);
    }
  }
  if (!Number.isInteger(o.frames) || o.frames < 1 || o.frames > DEMO_FRAMES_MAX) {
    return fail(source, `frames must be an integer 1..${DEMO_FRAMES_MAX}, got ${o.frames}`);
  }
  if (!Number.isInteger(o.seed) || o.seed < 0 || o.seed > 0xffffffff) {
    return fail(source, `seed must be an integer 0..4294967295, got ${o.seed}`);
  }
  return ok(o);
}

/** Returns the stem of frame `index` (0-based): `kq-0001` for index 0. */
export function demoFrameName(index: number): string {
  return 'kq-' + String(index + 1).padStart(4, '0');
}
