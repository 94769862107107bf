import { describe, expect, it } from 'vitest';
import { naturalCompare, naturalSorted } from '../../src/data/naturalSort.ts';

describe('naturalCompare', () => {
  it('puts frame2 before frame10 and handles leading zeros and long digit runs', () => {
    expect(naturalSorted(['frame10', 'frame2', 'frame1', 'frame002', 'frame02'])).toEqual([
      'frame1',
      'frame2',
      'frame02',
      'frame002',
      'frame10',
    ]);
    expect(naturalCompare('a99999999999999999999', 'a100000000000000000000')).toBeLessThan(0);
    expect(naturalCompare('seq2/f10', 'seq10/f1')).toBeLessThan(0);
    expect(naturalCompare('x', 'x')).toBe(0);
  });

  it('agrees with ECMA-402 numeric collation (Intl.Collator, numeric: true) on seeded random names', () => {
    // Outside reference: the numeric collation of ECMA-402 as implemented by ICU in Node.
    // Names without leading zeros and in one letter case, where both orders are total and equal.
    const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });
    let seed = 12345;
    const rand = (n: number) => {
      seed = (seed * 1103515245 + 12345) >>> 0;
      return seed % n;
    };
    const names = new Set<string>();
    while (names.size < 400) {
      let s = '';
      const parts = 1 + rand(4);
      for (let p = 0; p < parts; p++) {
        s += ['cam', 'f', 'frame_', 'x-', 'q'][rand(5)];
        s += String(1 + rand(3000));
      }
      names.add(s);
    }
    const ours = naturalSorted([...names]);
    const theirs = [...names].sort(collator.compare);
    expect(ours).toEqual(theirs);
  });
});
