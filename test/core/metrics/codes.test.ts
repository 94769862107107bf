import { describe, expect, it } from 'vitest';
import { codeTableBuild, labelCodesFill } from '../../../src/core/metrics/codes.ts';

// labelCodesFill (two 8-bit pixels per lookup on long stretches) against the plain definition
// out[i] = table[ids[i]], with the table changed between calls and buffers at every alignment.
describe('labelCodesFill', () => {
  let seed = 3;
  const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) >>> 16) / 65536;
  const ids = Uint8Array.from({ length: 20_003 }, (_, i) => (i % 97 < 60 ? 4 : Math.floor(rnd() * 256)));
  const tables = [codeTableBuild([0, 1, 4, 9], 255), codeTableBuild([1, 2, 3, 200], 4), codeTableBuild([4], 0)];

  it('equals table[ids[i]] for each table in turn, at every start and byte offset', () => {
    for (const table of tables) {
      for (const shift of [0, 1, 2, 3]) {
        const src = new Uint8Array(ids.length + 4);
        src.set(ids, shift);
        const view = src.subarray(shift, shift + ids.length);
        for (const [start, end] of [[0, ids.length], [1, ids.length - 1], [2, 9000], [5000, 5003]]) {
          const out = new Uint16Array(ids.length).fill(65535);
          labelCodesFill(view, table, out, start, end);
          const want = new Uint16Array(ids.length).fill(65535);
          for (let i = start; i < end; i++) want[i] = table[ids[i]];
          expect(out).toEqual(want);
        }
      }
    }
  });

  it('reads 16-bit ids one by one, the same way', () => {
    const wide = Uint16Array.from(ids, (v, i) => v + (i % 3) * 300);
    const table = codeTableBuild([4, 304, 604], 255);
    const out = new Uint16Array(wide.length);
    labelCodesFill(wide, table, out, 0, wide.length);
    expect(Array.from(out)).toEqual(Array.from(wide, (v) => table[v]));
  });
});
