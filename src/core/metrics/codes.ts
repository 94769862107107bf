import type { LabelIds } from '../labelMap.ts';
import { fail, ok, type Result } from '../result.ts';

/**
 * Pixel codes: every raw id 0..65535 gets a 16-bit code. Table classes take codes 0..K-1 (their
 * index in the ascending id list), `ignore` takes K, every other id K+1.. in ascending order. The map
 * is one-to-one, so two pixels differ in code exactly when they differ in id: boundaries and windows
 * can be read from codes, while `code < K` says "a class" and `code === K` says "void" in one compare.
 */
export const CODE_TABLE_SIZE = 65536;

/** Returns the id → code table (length 65536) for ascending `classIds` and `ignore`. */
export function codeTableBuild(classIds: readonly number[], ignore: number, out?: Uint16Array): Uint16Array {
  const table = out ?? new Uint16Array(CODE_TABLE_SIZE);
  const k = classIds.length;
  const isClass = new Uint8Array(CODE_TABLE_SIZE);
  for (let c = 0; c < k; c++) {
    table[classIds[c]] = c;
    isClass[classIds[c]] = 1;
  }
  table[ignore] = k;
  let next = k + 1;
  for (let id = 0; id < CODE_TABLE_SIZE; id++) {
    if (isClass[id] || id === ignore) continue;
    table[id] = next++;
  }
  return table;
}

/** True on little-endian platforms (every current one): byte and word views of a buffer agree as labelCodesFill assumes. */
const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
/** Fewest pixels for which the two-pixel table pays (checking it is current costs 256 reads). */
const PAIR_FILL_MIN = 4096;

/** Codes of two 8-bit ids at once: entry a + 256·b holds code(a) | code(b) << 16, built from `pairSource`'s first 256 codes. */
let pairCodes: Uint32Array | null = null;
const pairSource = new Uint16Array(256);

/** Returns the two-pixel code table for `table`'s codes of ids 0..255, rebuilt when they changed since the last call. */
function pairCodesFor(table: Uint16Array): Uint32Array {
  let same = pairCodes !== null;
  for (let id = 0; id < 256 && same; id++) same = pairSource[id] === table[id];
  if (!same || !pairCodes) {
    pairSource.set(table.subarray(0, 256));
    pairCodes ??= new Uint32Array(65536);
    for (let v = 0; v < 65536; v++) pairCodes[v] = (table[v & 255] | (table[v >> 8] << 16)) >>> 0;
  }
  return pairCodes;
}

/**
 * Writes the codes of pixels [start, end) of `ids` into the same positions of `out`. Long stretches
 * of 8-bit ids are looked up two pixels at a time (a 16-bit read, one table entry, a 32-bit write)
 * when the buffers line up; anything else one pixel at a time. Same codes either way.
 * Hot loop: flat typed arrays, no allocation per pixel.
 */
export function labelCodesFill(ids: LabelIds, table: Uint16Array, out: Uint16Array, start: number, end: number): void {
  if (ids instanceof Uint8Array && LITTLE_ENDIAN && end - start >= PAIR_FILL_MIN && ((ids.byteOffset + start) & 1) === 0 && ((out.byteOffset + 2 * start) & 3) === 0) {
    const pairs = (end - start) >> 1;
    const src = new Uint16Array(ids.buffer, ids.byteOffset + start, pairs);
    const dst = new Uint32Array(out.buffer, out.byteOffset + 2 * start, pairs);
    const pt = pairCodesFor(table);
    for (let j = 0; j < pairs; j++) dst[j] = pt[src[j]];
    start += 2 * pairs;
  }
  for (let i = start; i < end; i++) out[i] = table[ids[i]];
}

/** Returns the class ids if they are ascending, distinct integers 0..65535 without `ignore`, or the problem. */
export function classIdsCheck(classIds: readonly number[], ignore: number): Result<readonly number[]> {
  if (classIds.length === 0) return fail('', 'class list is empty: score at least one class');
  for (let c = 0; c < classIds.length; c++) {
    const id = classIds[c];
    if (!Number.isInteger(id) || id < 0 || id > 65535) return fail('', `class id ${id} is not an integer 0..65535`);
    if (c > 0 && id <= classIds[c - 1]) return fail('', `class ids must be ascending and distinct (${classIds[c - 1]} then ${id})`);
    if (id === ignore) return fail('', `class id ${id} is also the "ignore" (void) id`);
  }
  return ok(classIds);
}
