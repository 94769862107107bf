import { rngCreate as seededRandom } from '../../support/paint.ts';

/** Seeded generator of floats in [0, 1): the shared fixture generator (mulberry32). */
export { seededRandom };

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
