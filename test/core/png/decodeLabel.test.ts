import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { classTableColorIndex, colorToRgb24 } from '../../../src/core/classTable.ts';
import { labelMapFromPng } from '../../../src/core/png/decodeLabel.ts';
import { seededPalette, testTable } from './fixtures.ts';
import { testPngWrite, type TestPngSpec } from './pngTestWriter.ts';
import { seededIds, seededRandom } from './seeded.ts';

// Sizes chosen so Adam7 passes are empty (1×1, 3×2), partial (5×9) and rows end mid-byte at every depth.
const SIZES: [number, number][] = [[1, 1], [3, 2], [5, 9], [37, 23], [64, 17]];

/** pngjs 7 `PNG.sync.read` with `skipRescale` (exact 16-bit and sub-byte samples), the second decoder. */
function pngjsRead(bytes: Uint8Array): { data: ArrayLike<number>; width: number; height: number } {
  return PNG.sync.read(Buffer.from(bytes), { skipRescale: true } as never) as never;
}

describe('labelMapFromPng: grayscale and palette, every depth, plain and Adam7', () => {
  const variants: { colorType: 0 | 3; bitDepth: 1 | 2 | 4 | 8 | 16 }[] = [
    ...([1, 2, 4, 8, 16] as const).map((bitDepth) => ({ colorType: 0 as const, bitDepth })),
    ...([1, 2, 4, 8] as const).map((bitDepth) => ({ colorType: 3 as const, bitDepth })),
  ];
  for (const { colorType, bitDepth } of variants) {
    for (const interlace of [0, 1] as const) {
      const name = `${colorType === 0 ? 'gray' : 'palette'} ${bitDepth}-bit${interlace ? ' Adam7' : ''}`;
      it(`${name}: ids equal the written samples and pngjs's decode`, () => {
        SIZES.forEach(([width, height], k) => {
          const seed = 1000 * colorType + 10 * bitDepth + interlace + 100 * k;
          const count = Math.min(2 ** bitDepth, colorType === 3 ? 256 : 65536);
          const ids = seededIds(width, height, count, seed);
          const plte = colorType === 3 ? seededPalette(count, seed) : undefined;
          const spec: TestPngSpec = { width, height, colorType, bitDepth, interlace, samples: ids, plte, idatPieces: 3 };
          const bytes = testPngWrite(spec);
          const r = labelMapFromPng(bytes, { file: 'truth/a.png' });
          if (!r.ok) throw new Error(r.error);
          const map = r.value;
          expect([map.width, map.height]).toEqual([width, height]);
          expect(map.ids).toBeInstanceOf(bitDepth === 16 ? Uint16Array : Uint8Array);
          // Check 1: against the ids the test writer packed (ISO/IEC 15948 §7.2 sample = id).
          expect(Array.from(map.ids)).toEqual(ids);
          expect(map.encoding.kind).toBe(colorType === 0 ? 'gray' : 'palette');
          if (map.encoding.kind !== 'rgb') expect(map.encoding.bitDepth).toBe(bitDepth);
          // Check 2: against pngjs's decoder (PNG.sync.read). Palette files come back as RGBA, so compare colours.
          const ref = pngjsRead(bytes);
          for (let i = 0; i < width * height; i++) {
            if (colorType === 0) {
              if (ref.data[i * 4] !== map.ids[i]) throw new Error(`${name} ${width}×${height}: pixel ${i} pngjs ${ref.data[i * 4]} ours ${map.ids[i]}`);
            } else {
              const id = map.ids[i];
              for (let c = 0; c < 3; c++) {
                if (ref.data[i * 4 + c] !== plte![id * 3 + c]) throw new Error(`${name} ${width}×${height}: pixel ${i} colour differs from pngjs`);
              }
            }
          }
          if (map.encoding.kind === 'palette') expect(Array.from(map.encoding.colors)).toEqual(Array.from(plte!));
        });
      });
    }
  }
});

describe('labelMapFromPng: colour-coded RGB / RGBA through classes.json', () => {
  const classIds = Array.from({ length: 40 }, (_, i) => 3 * i + 1);
  const table = testTable(classIds, 77, 255, '#000000');
  const palette = [...classIds, 255]; // 255 is the ignore id, drawn in the ignore colour #000000
  const colorOf = (id: number) => (id === 255 ? 0 : colorToRgb24(table.classes.find((c) => c.id === id)!.color));

  for (const colorType of [2, 6] as const) {
    for (const interlace of [0, 1] as const) {
      const name = `${colorType === 2 ? 'RGB' : 'RGBA'} 8-bit${interlace ? ' Adam7' : ''}`;
      it(`${name}: colours map to class ids (ignore colour → ignore id), matching pngjs`, () => {
        SIZES.forEach(([width, height], k) => {
          const seed = 500 + colorType * 10 + interlace + k * 100;
          const ids = seededIds(width, height, palette.length, seed).map((j) => palette[j]);
          const rnd = seededRandom(seed);
          const ch = colorType === 2 ? 3 : 4;
          const samples: number[] = [];
          for (const id of ids) {
            const c = colorOf(id);
            samples.push(c >> 16, (c >> 8) & 255, c & 255);
            if (ch === 4) samples.push(Math.floor(rnd() * 256)); // any alpha: the RGB alone names the class
          }
          const bytes = testPngWrite({ width, height, colorType, bitDepth: 8, interlace, samples, idatPieces: 2 });
          const r = labelMapFromPng(bytes, { file: 'truth/c.png', table });
          if (!r.ok) throw new Error(r.error);
          expect(r.value.encoding).toEqual({ kind: 'rgb' });
          expect(r.value.ids).toBeInstanceOf(Uint8Array);
          expect(Array.from(r.value.ids)).toEqual(ids);
          // pngjs (PNG.sync.read) must see the colour that classes.json gives our id.
          const ref = pngjsRead(bytes);
          const index = classTableColorIndex(table);
          for (let i = 0; i < width * height; i++) {
            const rgb = (ref.data[i * 4] << 16) | (ref.data[i * 4 + 1] << 8) | ref.data[i * 4 + 2];
            if (index.get(rgb) !== r.value.ids[i]) throw new Error(`${name}: pixel ${i} pngjs colour ${rgb.toString(16)} vs id ${r.value.ids[i]}`);
          }
          if (width * height > 100) expect(ids).toContain(255); // the ignore colour was really exercised
        });
      });
    }
  }

  it('ids above 255 in classes.json give a Uint16Array map', () => {
    const bigIds = [300, 301, 1000, 65000];
    const big = testTable(bigIds, 5, 65535, '#ffffff');
    const width = 31, height = 7;
    const ids = seededIds(width, height, bigIds.length + 1, 9).map((j) => (j === bigIds.length ? 65535 : bigIds[j]));
    const samples: number[] = [];
    for (const id of ids) {
      const c = id === 65535 ? 0xffffff : colorToRgb24(big.classes.find((x) => x.id === id)!.color);
      samples.push(c >> 16, (c >> 8) & 255, c & 255);
    }
    const r = labelMapFromPng(testPngWrite({ width, height, colorType: 2, bitDepth: 8, interlace: 0, samples }), { file: 'f.png', table: big });
    if (!r.ok) throw new Error(r.error);
    expect(r.value.ids).toBeInstanceOf(Uint16Array);
    expect(Array.from(r.value.ids)).toEqual(ids);
  });
});

describe('labelMapFromPng: files written by pngjs (PNG.sync.write)', () => {
  const width = 45, height = 19;
  it('8-bit and 16-bit grayscale', () => {
    for (const bitDepth of [8, 16] as const) {
      const ids = seededIds(width, height, bitDepth === 8 ? 256 : 65536, bitDepth);
      const png = new PNG({ width, height, colorType: 0, bitDepth, inputColorType: 0, inputHasAlpha: false } as never);
      png.data = bitDepth === 8 ? Buffer.from(ids) : Buffer.from(new Uint16Array(ids).buffer);
      const bytes = PNG.sync.write(png, { colorType: 0, bitDepth, inputColorType: 0, inputHasAlpha: false } as never);
      const r = labelMapFromPng(new Uint8Array(bytes), { file: 'p.png' });
      if (!r.ok) throw new Error(r.error);
      expect(r.value.encoding).toEqual({ kind: 'gray', bitDepth });
      expect(Array.from(r.value.ids)).toEqual(ids);
    }
  });

  it('8-bit RGB and RGBA colour-coded', () => {
    const table = testTable([0, 1, 2, 3, 4, 5, 6], 31);
    const all = [...table.classes.map((c) => c.id), 255];
    for (const colorType of [2, 6] as const) {
      const ids = seededIds(width, height, all.length, colorType).map((j) => all[j]);
      const rgba = Buffer.alloc(width * height * 4);
      ids.forEach((id, i) => {
        const c = id === 255 ? 0 : colorToRgb24(table.classes.find((x) => x.id === id)!.color);
        rgba.set([c >> 16, (c >> 8) & 255, c & 255, colorType === 6 ? (i * 37) & 255 : 255], i * 4);
      });
      const png = new PNG({ width, height });
      png.data = rgba;
      const bytes = PNG.sync.write(png, { colorType });
      expect(bytes[25]).toBe(colorType);
      const r = labelMapFromPng(new Uint8Array(bytes), { file: 'p.png', table });
      if (!r.ok) throw new Error(r.error);
      expect(Array.from(r.value.ids)).toEqual(ids);
    }
  });
});
