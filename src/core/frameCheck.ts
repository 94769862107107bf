import { classTableMaxId, type ClassTable } from './classTable.ts';
import { countText, pixelCountText } from './countText.ts';
import { idRunEnd, idWords } from './idRuns.ts';
import type { LabelMap } from './labelMap.ts';
import { fail, ok, type Result } from './result.ts';

/** Returns the common size in pixels of a frame's files, or an error naming both files and sizes that differ. */
export function frameSizesCheck(parts: { file: string; width: number; height: number }[]): Result<{ width: number; height: number }> {
  if (parts.length === 0) return fail('', 'frame has no files to compare sizes of');
  const first = parts[0];
  for (let i = 1; i < parts.length; i++) {
    const p = parts[i];
    if (p.width !== first.width || p.height !== first.height) {
      return fail(p.file, `is ${p.width}×${p.height} pixels but ${first.file} is ${first.width}×${first.height}; all files of a frame must have the same size`);
    }
  }
  return ok({ width: first.width, height: first.height });
}

/**
 * Returns an error when ground truth holds ids that are neither a class in the table nor `ignore`,
 * naming each such id (up to 3) with its pixel count. Predictions may hold any id (the scorer counts
 * them as invalid), as may any map when the table was generated; those always succeed.
 * Hot loop: one dense histogram, no allocation per pixel.
 */
export function labelMapIdsCheck(map: LabelMap, table: ClassTable, file: string, role: 'truth' | 'prediction'): Result<void> {
  if (role === 'prediction' || table.generated) return ok(undefined);
  const ids = map.ids;
  const hist = new Uint32Array(ids instanceof Uint8Array ? 256 : 65536);
  const words = idWords(ids);
  for (let i = 0, n = ids.length; i < n;) {
    // Runs of one id counted in a register and added once (regions are long runs of one id).
    const v = ids[i];
    const j = idRunEnd(ids, words, i + 1, n, v);
    hist[v] += j - i;
    i = j;
  }
  const known = new Uint8Array(hist.length);
  for (const c of table.classes) if (c.id < known.length) known[c.id] = 1;
  if (table.ignore < known.length) known[table.ignore] = 1;
  const bad: { id: number; count: number }[] = [];
  for (let id = 0; id < hist.length; id++) if (hist[id] > 0 && !known[id]) bad.push({ id, count: hist[id] });
  if (bad.length === 0) return ok(undefined);
  const largest = `largest id ${classTableMaxId(table)}`;
  if (bad.length === 1) {
    return fail(file, `${pixelCountText(bad[0].count)} ${bad[0].count === 1 ? 'has' : 'have'} id ${bad[0].id}, which is not in classes.json (${largest})`);
  }
  bad.sort((a, b) => b.count - a.count || a.id - b.id);
  const total = bad.reduce((s, b) => s + b.count, 0);
  const named = bad.slice(0, 3).map((b) => `${b.id} (${pixelCountText(b.count)})`);
  const more = bad.length > 3 ? ` and ${countText(bad.length - 3)} more` : '';
  return fail(file, `${pixelCountText(total)} have ids that are not in classes.json (${largest}): ${named.join(', ')}${more}`);
}
