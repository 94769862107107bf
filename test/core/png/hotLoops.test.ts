// Plain reference versions of the fast loops in src/core/png, checked against them on seeded data.
import { describe, expect, it } from 'vitest';
import { colorLookupBuild, colorLookupGet } from '../../../src/core/png/colorLookup.ts';
import { rgbRowsToIds } from '../../../src/core/png/rgbIds.ts';
import { idsFromPackedRows } from '../../../src/core/png/unpackIds.ts';
import { pngUnfilter } from '../../../src/core/png/unfilter.ts';
import { unfilterPlain } from './unfilterPlain.ts';
import { seededColors } from './fixtures.ts';
import { seededIds, seededRandom } from './seeded.ts';

/** Reference: a JS Map per pixel, no cache, no hashing of our own. */
function rgbIdsReference(rows: Uint8Array, pixels: number, channels: number, index: Map<number, number>) {
  const ids: number[] = [];
  const unknown = new Map<number, number>();
  for (let i = 0; i < pixels; i++) {
    const o = i * channels;
    const rgb = rows[o] * 65536 + rows[o + 1] * 256 + rows[o + 2];
    const id = index.get(rgb);
    if (id === undefined) unknown.set(rgb, (unknown.get(rgb) ?? 0) + 1);
    ids.push(id ?? 0);
  }
  return { ids, unknown };
}

/** Reference: read each sample bit by bit, most significant first (ISO/IEC 15948 §7.2). */
function unpackReference(rows: Uint8Array, width: number, height: number, bytesPerRow: number, depth: number): number[] {
  const out: number[] = [];
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      let v = 0;
      for (let b = 0; b < depth; b++) {
        const bit = x * depth + b;
        v = v * 2 + ((rows[y * bytesPerRow + Math.floor(bit / 8)] >> (7 - (bit % 8))) & 1);
      }
      out.push(v);
    }
  }
  return out;
}

describe('colorLookup and rgbRowsToIds against a Map', () => {
  for (const size of [1, 7, 300, 20000]) {
    it(`${size} colours`, () => {
      const colors = seededColors(size + 50, size);
      const index = new Map<number, number>();
      colors.slice(0, size).forEach((c, i) => index.set(c, (i * 7919) % 65535));
      const lookup = colorLookupBuild(index);
      for (const c of colors) expect(colorLookupGet(lookup, c)).toBe(index.get(c) ?? -1);
      const rnd = seededRandom(size);
      for (const channels of [3, 4] as const) {
        const pixels = 5000;
        const which = seededIds(pixels, 1, colors.length, size + channels, 6); // runs, and ~50 unknown colours
        const rows = new Uint8Array(pixels * channels);
        which.forEach((k, i) => {
          const c = colors[k];
          rows.set([c >> 16, (c >> 8) & 255, c & 255], i * channels);
          if (channels === 4) rows[i * channels + 3] = Math.floor(rnd() * 256);
        });
        const ids = new Uint16Array(pixels);
        const got = rgbRowsToIds(rows, pixels, channels, lookup, ids);
        const ref = rgbIdsReference(rows, pixels, channels, index);
        expect(Array.from(ids)).toEqual(ref.ids);
        expect(new Map([...got.unknown].sort())).toEqual(new Map([...ref.unknown].sort()));
      }
    });
  }
});

describe('idsFromPackedRows against bit-by-bit reading', () => {
  for (const depth of [1, 2, 4, 8, 16]) {
    it(`${depth}-bit`, () => {
      for (const width of [1, 3, 8, 13]) {
        const height = 5;
        const bytesPerRow = Math.ceil((width * depth) / 8);
        const rnd = seededRandom(depth * 100 + width);
        const rows = Uint8Array.from({ length: bytesPerRow * height }, () => Math.floor(rnd() * 256));
        expect(Array.from(idsFromPackedRows(rows, width, height, bytesPerRow, depth))).toEqual(unpackReference(rows, width, height, bytesPerRow, depth));
      }
    });
  }
});

describe('pngUnfilter against the standard per byte (unfilterPlain.ts)', () => {
  for (const bpp of [1, 2, 3, 4, 6, 8]) {
    it(`${bpp} byte(s) per pixel, every filter, mostly-zero and random rows, aligned and not`, () => {
      const rnd = seededRandom(bpp * 31);
      for (const bytesPerRow of [1, 5, bpp * 13, 203]) {
        const height = 12;
        for (const off of [0, 3]) {
          const raw = new Uint8Array(off + height * (bytesPerRow + 1) + 2);
          for (let y = 0; y < height; y++) {
            const r = off + y * (bytesPerRow + 1);
            raw[r] = y < 5 ? y : Math.floor(rnd() * 5); // each filter on row y < 5, then any
            // Rows of zeros with a few changes (label-map like), or noise on every third row.
            for (let x = 0; x < bytesPerRow; x++) raw[r + 1 + x] = y % 3 === 2 || rnd() < 0.05 ? Math.floor(rnd() * 256) : 0;
          }
          for (const src of [raw, new Uint8Array([0, ...raw]).subarray(1)]) { // byteOffset 0, and a copy at byteOffset 1
            expect(Array.from(pngUnfilter(src, off, height, bytesPerRow, bpp))).toEqual(unfilterPlain(src, off, height, bytesPerRow, bpp));
          }
        }
      }
    });
  }
});
