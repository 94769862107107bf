import { deflateSync } from 'node:zlib';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { rgbaToPngFast } from '../../../src/core/export/rgbPng.ts';
import { seededRandom } from '../png/seeded.ts';

function rgbaRandom(w: number, h: number, seed: number, alpha: boolean): Uint8Array {
  const rnd = seededRandom(seed);
  return Uint8Array.from({ length: w * h * 4 }, (_, i) => (i % 4 === 3 && !alpha ? 255 : Math.floor(rnd() * 256)));
}

describe('rgbaToPngFast: lossless RGB/RGBA PNG (pngjs PNG.sync.read as the decoder)', () => {
  it('opaque pixels give an RGB PNG whose pixels pngjs reads back exactly, with either zlib', () => {
    for (const [w, h] of [[1, 1], [3, 7], [97, 61], [256, 3]]) {
      const rgba = rgbaRandom(w, h, w * 31 + h, false);
      for (const compress of [undefined, (d: Uint8Array) => new Uint8Array(deflateSync(d))]) {
        const png = rgbaToPngFast(w, h, rgba, compress);
        expect(png[25], 'colour type').toBe(2); // IHDR colour type, ISO/IEC 15948 §11.2.2
        const ref = PNG.sync.read(Buffer.from(png));
        expect([ref.width, ref.height]).toEqual([w, h]);
        expect(Buffer.compare(ref.data, Buffer.from(rgba))).toBe(0);
      }
    }
  });

  it('keeps alpha when any pixel is not opaque (RGBA PNG)', () => {
    const rgba = rgbaRandom(13, 9, 5, true);
    const png = rgbaToPngFast(13, 9, rgba);
    expect(png[25]).toBe(6);
    expect(Buffer.compare(PNG.sync.read(Buffer.from(png)).data, Buffer.from(rgba))).toBe(0);
  });

  it('refuses a buffer of the wrong size', () => {
    expect(() => rgbaToPngFast(2, 2, new Uint8Array(15))).toThrow(/15 bytes for 2×2 RGBA/);
  });
});
