/**
 * A fixed open-addressing hash from 24-bit colour (0xRRGGBB) to id, built once per class table and
 * probed per pixel without allocation. Keys are stored +1 so 0 marks an empty slot.
 */
export interface ColorLookup {
  keys: Int32Array;
  values: Int32Array;
  mask: number;
  /** 32 − log2(slots): the hash keeps the top bits of the product, the best-mixed ones. */
  shift: number;
}

/** Returns a lookup for every colour → id pair of `index` (e.g. from classTableColorIndex). */
export function colorLookupBuild(index: Map<number, number>): ColorLookup {
  let size = 16, shift = 28;
  while (size < index.size * 4) {
    size <<= 1; // load factor ≤ 1/4 keeps probe chains short
    shift--;
  }
  const keys = new Int32Array(size);
  const values = new Int32Array(size);
  const mask = size - 1;
  for (const [rgb, id] of index) {
    let slot = colorSlot(rgb, shift);
    while (keys[slot] !== 0 && keys[slot] !== rgb + 1) slot = (slot + 1) & mask;
    keys[slot] = rgb + 1;
    values[slot] = id;
  }
  return { keys, values, mask, shift };
}

/** Returns the home slot of a colour (Fibonacci hashing: neighbouring colours land far apart). */
export function colorSlot(rgb: number, shift: number): number {
  return Math.imul(rgb, 0x9e3779b1) >>> shift;
}

/** Returns the id of colour `rgb`, or -1 when the lookup does not hold it. */
export function colorLookupGet(lookup: ColorLookup, rgb: number): number {
  const { keys, values, mask } = lookup;
  let slot = colorSlot(rgb, lookup.shift);
  for (;;) {
    const k = keys[slot];
    if (k === rgb + 1) return values[slot];
    if (k === 0) return -1;
    slot = (slot + 1) & mask;
  }
}
