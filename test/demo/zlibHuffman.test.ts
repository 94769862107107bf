// The Huffman-only zlib writer against two independent inflaters: Node's zlib (the zlib library)
// and fflate. Streams follow RFC 1950 (zlib) and RFC 1951 (deflate).
import { inflateSync } from 'node:zlib';
import { unzlibSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import { Rng } from '../../src/demo/random.ts';
import { adler32 } from '../../src/core/png/adler32.ts';
import { huffmanLengths, zlibHuffmanOnly } from '../../src/demo/zlibHuffman.ts';

function inputs(): Uint8Array[] {
  const rng = new Rng(5);
  const noisy = new Uint8Array(200_000).map((_, i) => (128 + 40 * Math.sin(i / 300) + rng.range(-6, 6)) & 255);
  const skewed = new Uint8Array(150_000).map(() => (rng.next() < 0.97 ? 0 : rng.int(256)));
  // Fibonacci-like frequencies force a Huffman tree deeper than 15 levels before limiting
  const fib: number[] = [];
  for (let s = 0, a = 1, b = 1; s < 24; s++, [a, b] = [b, a + b]) for (let k = 0; k < a; k++) fib.push(s);
  return [new Uint8Array(0), new Uint8Array([7]), new Uint8Array(1000).fill(3), noisy, skewed, Uint8Array.from(fib)];
}

describe('zlibHuffmanOnly', () => {
  it('round-trips through Node zlib and fflate for empty, constant, noisy, skewed and deep-tree inputs', () => {
    for (const data of inputs()) {
      const z = zlibHuffmanOnly(data);
      expect(Buffer.compare(inflateSync(z), Buffer.from(data)), `length ${data.length}`).toBe(0);
      expect(Buffer.compare(Buffer.from(unzlibSync(z)), Buffer.from(data))).toBe(0);
    }
  });

  it('compresses a skewed byte distribution well', () => {
    const data = inputs()[4];
    expect(zlibHuffmanOnly(data).length).toBeLessThan(data.length * 0.2);
  });
});

describe('huffmanLengths', () => {
  it('never exceeds the length limit and gives a complete prefix code (Kraft sum exactly 1)', () => {
    const freq = Array.from({ length: 40 }, (_, i) => Math.round(1.6 ** i));
    for (const max of [7, 15]) {
      const l = huffmanLengths(freq, max);
      expect(Math.max(...l)).toBeLessThanOrEqual(max);
      expect(Array.from(l).reduce((s, v) => s + (v ? 2 ** -v : 0), 0)).toBeCloseTo(1, 12);
    }
  });
});

describe('trailer', () => {
  it('ends with the Adler-32 of the input, big-endian (RFC 1950 §2.2), which Node’s inflate checks', () => {
    const big = new Uint8Array(100_000).fill(255);
    const z = zlibHuffmanOnly(big);
    expect(inflateSync(z).length).toBe(big.length);
    expect(new DataView(z.buffer, z.byteOffset + z.length - 4).getUint32(0)).toBe(adler32(big));
  });
});
