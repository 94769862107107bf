import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { adler32 } from '../../../src/core/png/adler32.ts';
import { seededRandom } from './seeded.ts';

/** Reference: RFC 1950 §8.2 as written, one byte at a time, both sums reduced every byte. */
function adler32Reference(data: Uint8Array): number {
  let a = 1, b = 0;
  for (const byte of data) {
    a = (a + byte) % 65521;
    b = (b + a) % 65521;
  }
  return b * 65536 + a;
}

// Lengths around the 8-byte step and the 3,800-byte run, and all-0xff data, where the sums grow fastest.
const rnd = seededRandom(1950);
const inputs: Uint8Array[] = [0, 1, 7, 8, 9, 15, 3799, 3800, 3801, 7600, 100_003].map((n) => Uint8Array.from({ length: n }, () => Math.floor(rnd() * 256)));
inputs.push(new Uint8Array(50_000).fill(255));

describe('adler32', () => {
  it('equals the per-byte RFC 1950 definition, whole and continued across pieces', () => {
    for (const data of inputs) {
      expect(adler32(data)).toBe(adler32Reference(data));
      const cut = Math.floor(data.length / 3);
      expect(adler32(data.subarray(cut), adler32(data.subarray(0, cut)))).toBe(adler32Reference(data));
    }
  });

  it("equals python3's zlib.adler32", () => {
    const hex = inputs.map((d) => Buffer.from(d).toString('hex')).join(' ');
    const py = spawnSync('python3', ['-c', 'import sys, zlib\nfor h in sys.stdin.read().split(" "): print(zlib.adler32(bytes.fromhex(h)))'], { input: hex, encoding: 'utf8' });
    expect(py.status, py.stderr).toBe(0);
    expect(py.stdout.trim().split('\n').map(Number)).toEqual(inputs.map((d) => adler32(d)));
  });
});

describe('adler32 on mostly-zero data (zero words skipped), at every byte offset', () => {
  it('equals the per-byte definition', () => {
    const r = seededRandom(77);
    const data = Uint8Array.from({ length: 20_011 }, () => (r() < 0.03 ? Math.floor(r() * 256) : 0));
    const big = new Uint8Array(data.length + 8);
    for (let shift = 0; shift < 4; shift++) {
      big.set(data, shift);
      const view = big.subarray(shift, shift + data.length);
      expect(adler32(view)).toBe(adler32Reference(data));
      expect(adler32(view.subarray(0, 2))).toBe(adler32Reference(data.subarray(0, 2)));
      expect(adler32(view.subarray(1, 1))).toBe(1);
    }
  });
});
