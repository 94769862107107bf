// Seeded randomness for the demo generator: integer hashes, a small PRNG and value noise. Everything
// is a pure function of its arguments so any frame can be generated alone, in any worker, and
// reproduce the same bytes.

/** Returns a well-mixed unsigned 32-bit hash of three integers. */
export function hash3(a: number, b: number, c: number): number {
  let h = Math.imul(a | 0, 0x27d4eb2d) ^ Math.imul(b | 0, 0x165667b1) ^ Math.imul(c | 0, 0x9e3779b1);
  h = Math.imul(h ^ (h >>> 15), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  return (h ^ (h >>> 16)) >>> 0;
}

/** Returns the hash of three integers as a number in [0, 1). */
export function hashUnit(a: number, b: number, c: number): number {
  return hash3(a, b, c) / 4294967296;
}

// Lattice values of the value noise: a 256×256 table filled once from the hash (so it is the same in
// every process); a seed shifts the lattice. Table look-ups keep noise cheap enough to call per pixel.
const LATTICE = new Float32Array(65536);
for (let i = 0; i < 65536; i++) LATTICE[i] = hashUnit(i & 255, i >>> 8, 0x1a77);

/** Returns smooth 2-D value noise at (x, y) for `seed`, in [0, 1]; lattice spacing 1, period 256. */
export function noise2(x: number, y: number, seed: number): number {
  const xf = Math.floor(x);
  const yf = Math.floor(y);
  const fx = x - xf;
  const fy = y - yf;
  const ux = fx * fx * (3 - 2 * fx);
  const uy = fy * fy * (3 - 2 * fy);
  const x0 = (xf + Math.imul(seed, 73)) & 255;
  const y0 = (yf + Math.imul(seed, 151)) & 255;
  const x1 = (x0 + 1) & 255;
  const r0 = y0 << 8;
  const r1 = ((y0 + 1) & 255) << 8;
  const a = LATTICE[r0 | x0];
  const b = LATTICE[r0 | x1];
  const c = LATTICE[r1 | x0];
  const d = LATTICE[r1 | x1];
  const top = a + (b - a) * ux;
  const bottom = c + (d - c) * ux;
  return top + (bottom - top) * uy;
}

/** Returns fractal value noise (octaves halving in size) at (x, y), in [0, 1]. */
export function fbm2(x: number, y: number, seed: number, octaves: number): number {
  let sum = 0;
  let amp = 0.5;
  let norm = 0;
  for (let o = 0; o < octaves; o++) {
    sum += amp * noise2(x, y, seed + o * 1013);
    norm += amp;
    x = x * 2.03 + 17.1;
    y = y * 2.03 + 5.7;
    amp *= 0.5;
  }
  return sum / norm;
}

/** A seeded pseudo-random sequence (mulberry32); used for layout decisions, never per pixel. */
export class Rng {
  private state: number;

  constructor(seed: number) {
    this.state = hash3(seed, 0x5eed, 0x1234) | 0;
  }

  /** Returns the next number in [0, 1). */
  next(): number {
    this.state = (this.state + 0x6d2b79f5) | 0;
    let t = this.state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  /** Returns a number in [lo, hi). */
  range(lo: number, hi: number): number {
    return lo + (hi - lo) * this.next();
  }

  /** Returns an integer in [0, n). */
  int(n: number): number {
    return Math.floor(this.next() * n);
  }

  /** Returns one element of `items`. */
  pick<T>(items: readonly T[]): T {
    return items[this.int(items.length)];
  }
}
