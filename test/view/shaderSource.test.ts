import { describe, expect, it } from 'vitest';
import { FRAGMENT_SOURCE } from '../../src/view/shaderSource.ts';

describe('fragment shader blend', () => {
  it('divides by 255 with (n + 1 + (n >> 8)) >> 8, which equals floor(n / 255) for every sum a blend can make', () => {
    expect(FRAGMENT_SOURCE).toContain('return (n + 1 + (n >> 8)) >> 8;');
    expect(FRAGMENT_SOURCE).toContain('ivec3 n = a * s + (255 - a) * d + 127;');
    const largest = 255 * 255 + 127; // a·s + (255 − a)·d ≤ 255·255, plus the rounding term
    for (let n = 0; n <= largest; n++) {
      if (((n + 1 + (n >> 8)) >> 8) !== Math.floor(n / 255)) throw new Error(`differs at n = ${n}`);
    }
    expect(((65535 + 1 + (65535 >> 8)) >> 8) === Math.floor(65535 / 255)).toBe(false); // the form's limit, past our range
  });
});
