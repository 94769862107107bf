import { pixelCountText, countText } from './countText.ts';
import type { LabelIds, LabelMap } from './labelMap.ts';
import { fail, ok, type Result } from './result.ts';

/**
 * Stored id → class id pairs read from `truthIds` / `predictionIds` of classes.json; a null class
 * means void. Kept as plain pairs (not a 65536-entry table) so a class table stays small when it is
 * sent to a worker with every frame job.
 */
export type IdPairs = [stored: number, classId: number | null][];

/** Largest stored id a label PNG can hold (16-bit gray). */
const STORED_MAX = 65535;

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/**
 * Returns the validated pairs of an id map (`{ "7": 1, "8": null }`) whose class ids must be in
 * `classIds`, or a one-line error naming the key and the problem.
 */
export function idPairsFromJson(json: unknown, key: string, classIds: ReadonlySet<number>, file: string): Result<IdPairs> {
  if (!isPlainObject(json)) return fail(file, `"${key}" must be an object from stored id to class id, like { "7": 1, "0": null }`);
  const pairs: IdPairs = [];
  for (const [k, v] of Object.entries(json)) {
    if (!/^\d+$/.test(k) || Number(k) > STORED_MAX) return fail(file, `"${key}" key "${k}": stored ids must be integers 0..${STORED_MAX}`);
    if (v !== null && !(typeof v === 'number' && classIds.has(v))) {
      return fail(file, `"${key}" key "${k}": ${JSON.stringify(v)} is not a class id in "classes" (use null for void)`);
    }
    pairs.push([Number(k), v as number | null]);
  }
  if (pairs.length === 0) return fail(file, `"${key}" is empty: list the stored ids, or leave the key out`);
  pairs.sort((a, b) => a[0] - b[0]);
  return ok(pairs);
}

/** Returns the id a prediction's unmapped stored ids become: the smallest id 0..255 that is neither a class nor void, else 65535. */
export function idMapInvalidId(classIds: readonly number[], ignore: number): number {
  const used = new Set([...classIds, ignore]);
  for (let id = 0; id < 256; id++) if (!used.has(id)) return id;
  return STORED_MAX;
}

/** A label map after its id map was applied, the stored ids it came from, and the stored ids the map does not list. */
export interface MappedLabelMap extends LabelMap {
  stored: LabelIds;
  /** Stored ids absent from the map with their pixel counts, most pixels first. */
  unmapped: { id: number; count: number }[];
}

/**
 * Returns the map with every stored id replaced by its class id (void → `ignore`, unlisted → `unlisted`).
 * Hot loop: one 65536-entry look-up table built per call, no allocation per pixel.
 */
export function labelMapIdsMap(map: LabelMap, pairs: IdPairs, ignore: number, unlisted: number): MappedLabelMap {
  const lut = new Int32Array(STORED_MAX + 1).fill(-1);
  let top = Math.max(ignore, unlisted);
  for (const [s, c] of pairs) {
    const to = c === null ? ignore : c;
    lut[s] = to;
    if (to > top) top = to;
  }
  const src = map.ids;
  const out = top > 255 ? new Uint16Array(src.length) : new Uint8Array(src.length);
  const missing = new Uint32Array(STORED_MAX + 1);
  for (let i = 0; i < src.length; i++) {
    const to = lut[src[i]];
    if (to < 0) {
      missing[src[i]]++;
      out[i] = unlisted;
    } else out[i] = to;
  }
  const unmapped: { id: number; count: number }[] = [];
  for (let id = 0; id <= STORED_MAX; id++) if (missing[id]) unmapped.push({ id, count: missing[id] });
  unmapped.sort((a, b) => b.count - a.count || a.id - b.id);
  return { width: map.width, height: map.height, ids: out, stored: src, unmapped };
}

/** Returns "stored id 7 (120 pixels)" or "stored ids 7 (120 pixels), 9 (4 pixels) and 3 more" for up to 3 ids. */
export function unmappedIdsText(unmapped: { id: number; count: number }[]): string {
  const named = unmapped.slice(0, 3).map((u) => `${u.id} (${pixelCountText(u.count)})`);
  const more = unmapped.length > 3 ? ` and ${countText(unmapped.length - 3)} more` : '';
  return `stored id${unmapped.length === 1 ? '' : 's'} ${named.join(', ')}${more}`;
}
