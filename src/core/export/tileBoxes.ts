import { fail, ok, type Result } from '../result.ts';
import type { FlagBox } from '../review/flag.ts';

/** How tiles are cut: one crop around each flagged area with `padding` pixels of context, or fixed `size`×`size` tiles covering it. */
export type TileMode = { kind: 'crop'; padding: number } | { kind: 'tile'; size: number };

/** Largest padding and tile side accepted, pixels. */
export const TILE_SIDE_MAX = 8192;
/** Smallest fixed tile side, pixels. */
export const TILE_SIDE_MIN = 8;

/** Returns the mode checked (integers in range), or a message naming the setting and its limits. */
export function tileModeCheck(mode: TileMode): Result<TileMode> {
  if (mode.kind === 'crop') {
    const p = mode.padding;
    if (!Number.isInteger(p) || p < 0 || p > TILE_SIDE_MAX) return fail('', `padding must be a whole number of pixels 0..${TILE_SIDE_MAX}, got ${p}`);
    return ok({ kind: 'crop', padding: p });
  }
  const s = mode.size;
  if (!Number.isInteger(s) || s < TILE_SIDE_MIN || s > TILE_SIDE_MAX) return fail('', `tile size must be a whole number of pixels ${TILE_SIDE_MIN}..${TILE_SIDE_MAX}, got ${s}`);
  return ok({ kind: 'tile', size: s });
}

/**
 * Returns the starts of tiles of side `size` along one axis of length `length` that cover [a0, a1):
 * as few tiles as cover the span, centred on it, shifted to lie inside [0, length); when that many
 * tiles are longer than the axis they are spread evenly from 0 to length - size (overlapping).
 * A tile longer than the axis is cut to the axis (start 0, the caller clips).
 */
export function tileAxisStarts(a0: number, a1: number, size: number, length: number): number[] {
  if (size >= length) return [0];
  const n = Math.ceil((a1 - a0) / size);
  const total = n * size;
  if (total <= length) {
    const start = Math.min(Math.max(a0 - Math.floor((total - (a1 - a0)) / 2), 0), length - total);
    return Array.from({ length: n }, (_, i) => start + i * size);
  }
  return Array.from({ length: n }, (_, i) => Math.round((i * (length - size)) / (n - 1)));
}

/**
 * Returns the tile boxes (source pixels, end-exclusive) for a flag on a `width`×`height` frame, row by
 * row; a whole-frame flag (null box) covers the frame. The flag's box is first clipped to the frame;
 * a box wholly outside it is an error.
 */
export function tileBoxesOf(bbox: FlagBox | null, width: number, height: number, mode: TileMode): Result<FlagBox[]> {
  const b = bbox ?? [0, 0, width, height];
  const x0 = Math.max(0, b[0]), y0 = Math.max(0, b[1]), x1 = Math.min(width, b[2]), y1 = Math.min(height, b[3]);
  if (!(x0 < x1 && y0 < y1)) return fail('', `flag box [${b.join(', ')}] lies outside the ${width}×${height} frame`);
  if (mode.kind === 'crop') {
    const p = mode.padding;
    return ok([[Math.max(0, x0 - p), Math.max(0, y0 - p), Math.min(width, x1 + p), Math.min(height, y1 + p)]]);
  }
  const xs = tileAxisStarts(x0, x1, mode.size, width);
  const ys = tileAxisStarts(y0, y1, mode.size, height);
  const out: FlagBox[] = [];
  for (const y of ys) for (const x of xs) out.push([x, y, Math.min(width, x + mode.size), Math.min(height, y + mode.size)]);
  return ok(out);
}
