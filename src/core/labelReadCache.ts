import type { ClassTable } from './classTable.ts';
import { labelMapRead, type ReadLabelMap } from './labelRead.ts';
import type { LabelDecodeOptions } from './png/decodeLabel.ts';
import { ok, type Result } from './result.ts';

/**
 * The last few label maps one thread decoded, with the file bytes they came from. A frame's flicker
 * needs the run's predictions at the frame before and after it, and frames reach a thread in order,
 * so each prediction is needed by up to three consecutive frames: kept here it is decoded once.
 * A hit needs the same file name, role, class table and limit and byte-for-byte the same file, so
 * a hit returns exactly what decoding again would. Decoded maps are never written to.
 */
export interface LabelReadCache {
  /** Most maps kept (least recently used dropped first); 0 keeps none. */
  capacity: number;
  entries: { key: string; bytes: Uint8Array; value: ReadLabelMap }[];
}

/** Returns an empty cache of at most `capacity` maps. */
export function labelReadCacheCreate(capacity: number): LabelReadCache {
  return { capacity, entries: [] };
}

const tableKeys = new WeakMap<ClassTable, string>();

function tableKeyOf(table: ClassTable | undefined): string {
  if (!table) return '';
  let key = tableKeys.get(table);
  if (key === undefined) {
    key = JSON.stringify(table);
    tableKeys.set(table, key);
  }
  return key;
}

function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** labelMapRead through `cache`: a map decoded before from the same bytes is returned again; errors are not kept. */
export function labelMapReadCached(
  cache: LabelReadCache, bytes: Uint8Array, options: LabelDecodeOptions & { role: 'truth' | 'prediction' },
): Result<ReadLabelMap> {
  if (cache.capacity <= 0) {
    cache.entries.length = 0;
    return labelMapRead(bytes, options);
  }
  const key = `${options.role}\u0000${options.file}\u0000${options.maxPixels ?? ''}\u0000${tableKeyOf(options.table)}`;
  const at = cache.entries.findIndex((e) => e.key === key);
  if (at >= 0) {
    const [hit] = cache.entries.splice(at, 1);
    if (sameBytes(hit.bytes, bytes)) {
      cache.entries.push(hit);
      return ok(hit.value);
    }
  }
  const r = labelMapRead(bytes, options);
  if (r.ok) {
    cache.entries.push({ key, bytes, value: r.value });
    while (cache.entries.length > cache.capacity) cache.entries.shift();
  }
  return r;
}
