import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { labelMapFromPng } from '../../../src/core/png/decodeLabel.ts';
import { photoFromPng } from '../../../src/core/png/decodePhoto.ts';
import { labelMapToPng, rgbaToPng } from '../../../src/core/png/encode.ts';
import { pngHeaderRead } from '../../../src/core/png/header.ts';
import { seededPalette } from './fixtures.ts';
import { seededIds, seededRandom } from './seeded.ts';

/** pngjs 7 PNG.sync.read with skipRescale: the independent decoder for every round trip here. */
const pngjsRead = (b: Uint8Array) => PNG.sync.read(Buffer.from(b), { skipRescale: true } as never) as unknown as { data: ArrayLike<number>; depth: number; colorType: number };

describe('labelMapToPng round trips exactly', () => {
  const sizes: [number, number][] = [[1, 1], [2, 3], [129, 67]];

  it('8-bit grayscale, through labelMapFromPng and pngjs', () => {
    for (const [width, height] of sizes) {
      const ids = Uint8Array.from(seededIds(width, height, 256, width));
      const png = labelMapToPng({ width, height, ids }, { kind: 'gray', bitDepth: 8 });
      const r = labelMapFromPng(png, { file: 'out.png' });
      if (!r.ok) throw new Error(r.error);
      expect(r.value.encoding).toEqual({ kind: 'gray', bitDepth: 8 });
      expect(r.value.ids).toEqual(ids);
      const ref = pngjsRead(png);
      expect([ref.depth, ref.colorType]).toEqual([8, 0]);
      for (let i = 0; i < ids.length; i++) expect(ref.data[i * 4]).toBe(ids[i]);
    }
  });

  it('16-bit grayscale with ids above 255, through labelMapFromPng and pngjs', () => {
    for (const [width, height] of sizes) {
      const ids = Uint16Array.from(seededIds(width, height, 65536, 7 + width));
      ids[0] = 65535;
      if (ids.length > 1) ids[1] = 256;
      const png = labelMapToPng({ width, height, ids }, { kind: 'gray', bitDepth: 16 });
      const r = labelMapFromPng(png, { file: 'out.png' });
      if (!r.ok) throw new Error(r.error);
      expect(r.value.encoding).toEqual({ kind: 'gray', bitDepth: 16 });
      expect(r.value.ids).toBeInstanceOf(Uint16Array);
      expect(r.value.ids).toEqual(ids);
      const ref = pngjsRead(png);
      for (let i = 0; i < ids.length; i++) expect(ref.data[i * 4]).toBe(ids[i]);
    }
  });

  it('palette (index = id), through labelMapFromPng and pngjs by colour', () => {
    const colors = seededPalette(256, 11);
    for (const [width, height] of sizes) {
      const ids = Uint8Array.from(seededIds(width, height, 256, 3 + height));
      const png = labelMapToPng({ width, height, ids }, { kind: 'palette', colors });
      const r = labelMapFromPng(png, { file: 'out.png' });
      if (!r.ok) throw new Error(r.error);
      expect(r.value.ids).toEqual(ids);
      expect(r.value.encoding).toEqual({ kind: 'palette', bitDepth: 8, colors });
      const ref = pngjsRead(png);
      for (let i = 0; i < ids.length; i++) {
        for (let c = 0; c < 3; c++) expect(ref.data[i * 4 + c]).toBe(colors[ids[i] * 3 + c]);
      }
    }
  });

  it('accepts Uint16Array ids that fit 8 bits; refuses ids the encoding cannot hold', () => {
    const ids = Uint16Array.from([0, 200, 255, 7]);
    const r = labelMapFromPng(labelMapToPng({ width: 2, height: 2, ids }, { kind: 'gray', bitDepth: 8 }), { file: 'o.png' });
    expect(r.ok && Array.from(r.value.ids)).toEqual([0, 200, 255, 7]);
    expect(() => labelMapToPng({ width: 2, height: 2, ids: Uint16Array.from([0, 300, 1, 1]) }, { kind: 'gray', bitDepth: 8 })).toThrow(/id 300/);
    expect(() => labelMapToPng({ width: 2, height: 2, ids: Uint8Array.from([0, 3, 1, 1]) }, { kind: 'palette', colors: new Uint8Array(9) })).toThrow(/id 3/);
    expect(() => labelMapToPng({ width: 2, height: 2, ids: new Uint8Array(3) }, { kind: 'gray', bitDepth: 8 })).toThrow(/3 ids/);
  });
});

describe('rgbaToPng', () => {
  const width = 57, height = 31;
  const rnd = seededRandom(99);
  const rgba = Uint8Array.from({ length: width * height * 4 }, () => Math.floor(rnd() * 256));

  it('writes RGB when every alpha is 255 and RGBA otherwise, losslessly (pngjs and photoFromPng agree)', () => {
    const opaque = rgba.slice();
    for (let i = 3; i < opaque.length; i += 4) opaque[i] = 255;
    for (const [pixels, colorType] of [[opaque, 2], [rgba, 6]] as const) {
      const png = rgbaToPng(width, height, pixels);
      const h = pngHeaderRead(png, 'p.png');
      expect(h.ok && [h.value.colorType, h.value.bitDepth]).toEqual([colorType, 8]);
      expect(Uint8Array.from(pngjsRead(png).data)).toEqual(pixels);
      const back = photoFromPng(png, { file: 'p.png' });
      expect(back.ok && back.value.rgba).toEqual(pixels);
    }
  });

  it('takes a view into a larger buffer', () => {
    const big = new Uint8Array(rgba.length + 8);
    big.set(rgba, 4);
    const png = rgbaToPng(width, height, big.subarray(4, 4 + rgba.length));
    expect(Uint8Array.from(pngjsRead(png).data)).toEqual(rgba);
  });
});
