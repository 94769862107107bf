/** Returns a seeded pseudo-random generator of floats in [0, 1) (mulberry32, from memory). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Returns width*height ids below `count`: runs of 1..`maxRun` equal ids, as label maps have, from a seed. */
export function seededIds(width: number, height: number, count: number, seed: number, maxRun = 12): number[] {
  const rnd = seededRandom(seed);
  const ids: number[] = [];
  while (ids.length < width * height) {
    const id = Math.floor(rnd() * count);
    const run = 1 + Math.floor(rnd() * maxRun);
    for (let k = 0; k < run && ids.length < width * height; k++) ids.push(id);
  }
  return ids;
}
