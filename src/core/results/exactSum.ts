// Sums of fractional values that come out the same whatever order they are added in (frames finish
// in any order, shards are summed at the end): each value is rounded once to a multiple of 2^-60 and
// the multiples are summed exactly as integers.

const SCALE = 2 ** 60;

/** Returns `x` as an exact sum term (a whole number of 2^-60). */
export function exactOf(x: number): bigint {
  return BigInt(Math.round(x * SCALE));
}

/** Returns the value of an exact sum as the nearest number. */
export function exactValue(sum: bigint): number {
  return Number(sum) / SCALE;
}
