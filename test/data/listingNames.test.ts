// Run folders named like object members (`constructor`, `__proto__`, `toString`) are runs like any
// other, from the listing of a served or dropped folder to the paired frames.
import { describe, expect, it } from 'vitest';
import { datasetPair } from '../../src/data/pairing.ts';
import { listingFromPaths } from '../../src/data/sources/source.ts';

describe('run names from folder names', () => {
  it('pairs predictions/constructor, predictions/__proto__ and confidence/toString', () => {
    const names = ['constructor', '__proto__', 'toString', 'hasOwnProperty'];
    const paths = ['truth/a.png', 'truth/b.png', ...names.flatMap((n) => [`predictions/${n}/a.png`, `predictions/${n}/b.png`]), 'confidence/toString/a.png'];
    const { listing } = listingFromPaths(paths);
    expect(Object.keys(listing.predictions).sort()).toEqual([...names].sort());
    expect(listing.predictions.constructor).toEqual(['a.png', 'b.png']);
    const pairing = datasetPair(listing);
    expect([...pairing.runs].sort()).toEqual([...names].sort());
    for (const f of pairing.frames) {
      for (const n of names) expect(f.predictions[n]).toBe(`${f.name}.png`);
      expect(Object.keys(f.predictions).sort()).toEqual([...names].sort());
    }
    expect(pairing.frames[0].confidence.toString).toBe('a.png');
    expect(pairing.unpaired.filter((u) => u.folder.startsWith('predictions/'))).toEqual([]);
  });
});
