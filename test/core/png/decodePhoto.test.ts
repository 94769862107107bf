import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { photoFromPng } from '../../../src/core/png/decodePhoto.ts';
import { testPngWrite, type TestPngSpec } from './pngTestWriter.ts';
import { seededIds } from './seeded.ts';

const CH: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 };

/** pngjs 7 PNG.sync.read with skipRescale: raw samples (16-bit kept), palettes and tRNS applied. */
const pngjsRead = (b: Uint8Array) => PNG.sync.read(Buffer.from(b), { skipRescale: true } as never) as unknown as { data: ArrayLike<number> };

/** Expected 8-bit value of a raw sample: 16-bit keeps the high byte; 1/2/4-bit scale as round(v·255/(2^d−1)) (ISO/IEC 15948 §13.12). */
const to8 = (v: number, depth: number) => (depth === 16 ? v >> 8 : depth === 8 ? v : Math.round((v * 255) / (2 ** depth - 1)));

describe('photoFromPng: every colour type and depth, plain and Adam7, against pngjs', () => {
  const width = 23, height = 11;
  const cases: { colorType: 0 | 2 | 3 | 4 | 6; bitDepth: 1 | 2 | 4 | 8 | 16 }[] = [
    ...([1, 2, 4, 8, 16] as const).map((bitDepth) => ({ colorType: 0 as const, bitDepth })),
    ...([1, 2, 4, 8] as const).map((bitDepth) => ({ colorType: 3 as const, bitDepth })),
    ...([2, 4, 6] as const).flatMap((colorType) => ([8, 16] as const).map((bitDepth) => ({ colorType, bitDepth }))),
  ];
  for (const { colorType, bitDepth } of cases) {
    for (const interlace of [0, 1] as const) {
      it(`colour type ${colorType}, ${bitDepth}-bit${interlace ? ', Adam7' : ''}`, () => {
        const ch = CH[colorType];
        const samples = seededIds(width * ch, height, 2 ** bitDepth, colorType * 100 + bitDepth + interlace, 3);
        const spec: TestPngSpec = { width, height, colorType, bitDepth, interlace, samples };
        if (colorType === 3) spec.plte = Uint8Array.from({ length: 3 * 2 ** bitDepth }, (_, i) => (i * 41 + 7) & 255);
        const bytes = testPngWrite(spec);
        const r = photoFromPng(bytes, { file: 'images/a.png' });
        if (!r.ok) throw new Error(r.error);
        const ref = pngjsRead(bytes).data;
        const ours = r.value.rgba;
        expect(ours.length).toBe(width * height * 4);
        for (let i = 0; i < width * height * 4; i++) {
          const want = colorType === 3 ? ref[i] : to8(ref[i], bitDepth);
          if (ours[i] !== want) throw new Error(`byte ${i}: ours ${ours[i]}, pngjs ${ref[i]} → ${want}`);
        }
      });
    }
  }

  it('tRNS: gray value 0, an RGB colour and palette alphas become transparent', () => {
    const gray = testPngWrite({ width: 4, height: 1, colorType: 0, bitDepth: 8, interlace: 0, samples: [0, 5, 0, 9], trns: Uint8Array.from([0, 0]) });
    const g = photoFromPng(gray, { file: 'g.png' });
    expect(g.ok && [...g.value.rgba].filter((_, i) => i % 4 === 3)).toEqual([0, 255, 0, 255]);
    const rgb = testPngWrite({ width: 2, height: 1, colorType: 2, bitDepth: 8, interlace: 0, samples: [1, 2, 3, 4, 5, 6], trns: Uint8Array.from([0, 4, 0, 5, 0, 6]) });
    const c = photoFromPng(rgb, { file: 'c.png' });
    expect(c.ok && [...c.value.rgba]).toEqual([1, 2, 3, 255, 4, 5, 6, 0]);
    const pal = testPngWrite({ width: 3, height: 1, colorType: 3, bitDepth: 2, interlace: 0, samples: [0, 1, 2], plte: Uint8Array.from([9, 9, 9, 8, 8, 8, 7, 7, 7]), trns: Uint8Array.from([17, 0]) });
    const p = photoFromPng(pal, { file: 'p.png' });
    expect(p.ok && [...p.value.rgba]).toEqual([9, 9, 9, 17, 8, 8, 8, 0, 7, 7, 7, 255]);
    // pngjs agrees on which pixels are transparent (it also zeroes their colour, so compare alpha only).
    for (const [bytes, ours] of [[gray, g], [rgb, c], [pal, p]] as const) {
      const ref = pngjsRead(bytes).data;
      const a = ours.ok ? ours.value.rgba : new Uint8Array(0);
      for (let i = 3; i < a.length; i += 4) expect(a[i]).toBe(ref[i]);
    }
  });

  it('refuses a damaged file with a message', () => {
    const r = photoFromPng(new Uint8Array([1, 2, 3]), { file: 'images/x.png' });
    expect(r).toEqual({ ok: false, error: 'images/x.png: is not a PNG file: it does not start with the PNG signature' });
  });
});
