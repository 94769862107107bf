import { deflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { classTableGenerated } from '../../../src/core/classTable.ts';
import { labelMapFromPng } from '../../../src/core/png/decodeLabel.ts';
import { photoFromPng } from '../../../src/core/png/decodePhoto.ts';
import { testTable } from './fixtures.ts';
import { testChunk, testIhdr, testPngFromChunks, testPngWrite, testRawImageData, type TestPngSpec } from './pngTestWriter.ts';
import { seededIds, seededRandom } from './seeded.ts';

// Chunk layout, IHDR fields and the allowed depth/colour-type pairs: ISO/IEC 15948 §5.3, §11.2.2.
const FILE = 'truth/frame7.png';
const spec: TestPngSpec = { width: 20, height: 10, colorType: 0, bitDepth: 8, interlace: 0, samples: seededIds(20, 10, 30, 1) };
const good = testPngWrite(spec);
const ihdr = (w = 20, h = 10, depth = 8, ctype = 0, interlace = 0) => testChunk('IHDR', testIhdr(w, h, depth, ctype, interlace));
const iend = testChunk('IEND', new Uint8Array(0));
const idat = (raw: Buffer) => testChunk('IDAT', deflateSync(raw));

function decodeError(bytes: Uint8Array, options: Partial<Parameters<typeof labelMapFromPng>[1]> = {}): string {
  const r = labelMapFromPng(bytes, { file: FILE, ...options });
  if (r.ok) throw new Error('expected an error, got a decoded map');
  expect(r.error.startsWith(`${FILE}: `)).toBe(true);
  return r.error;
}

describe('labelMapFromPng refuses malformed files with a message naming the file and the problem', () => {
  it('not a PNG: empty, random bytes, a JPEG', () => {
    expect(decodeError(new Uint8Array(0))).toMatch(/empty/);
    expect(decodeError(new Uint8Array([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]))).toMatch(/not a PNG file/);
    expect(decodeError(new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0, 16, 74, 70, 73, 70, 0, 1]))).toMatch(/not a PNG file.*JPEG/);
  });

  it('truncated at every possible length: an error, never a throw', () => {
    for (let n = 1; n < good.length; n++) {
      const msg = decodeError(good.subarray(0, n));
      expect(msg).toMatch(/truncated/);
    }
  });

  it('missing or corrupt IHDR', () => {
    expect(decodeError(testPngFromChunks([idat(testRawImageData(spec)), iend]))).toMatch(/first chunk must be the IHDR/);
    const badCrc = good.slice();
    badCrc[30] ^= 0xff; // inside the IHDR CRC
    expect(decodeError(badCrc)).toMatch(/IHDR header fails its CRC/);
    const shortIhdr = testPngFromChunks([testChunk('IHDR', new Uint8Array(10)), iend, Buffer.alloc(20)]);
    expect(decodeError(shortIhdr)).toMatch(/IHDR header has length 10/);
    expect(decodeError(testPngFromChunks([ihdr(20, 10, 3, 0), iend]))).toMatch(/bit depth 3 is not allowed for grayscale/);
    expect(decodeError(testPngFromChunks([ihdr(20, 10, 8, 5), iend]))).toMatch(/colour type 5 does not exist/);
    expect(decodeError(testPngFromChunks([ihdr(20, 10, 8, 0, 2), iend]))).toMatch(/interlace method 2/);
  });

  it('zero dimensions', () => {
    expect(decodeError(testPngFromChunks([ihdr(0, 10), idat(Buffer.alloc(0)), iend]))).toMatch(/zero size \(0×10 pixels\)/);
    expect(decodeError(testPngFromChunks([ihdr(7, 0), idat(Buffer.alloc(0)), iend]))).toMatch(/zero size/);
  });

  it('absurd dimensions are refused from IHDR alone, before inflating (decompression bomb)', () => {
    // 100000×100000 with a tiny IDAT: refused by size, not by the short data.
    const bomb = testPngFromChunks([ihdr(100000, 100000), idat(Buffer.alloc(100)), iend]);
    expect(decodeError(bomb)).toMatch(/100,000×100,000 pixels \(10,000 megapixels\), above the limit of 100 megapixels; refusing/);
    // A real 20×10 file above a caller's own limit.
    expect(decodeError(good, { maxPixels: 150 })).toMatch(/above the limit/);
    // A highly compressible 6000×6000 stream (36 MB of zeros, a few KB compressed) under a 10-MP limit.
    const zeros = deflateSync(Buffer.alloc(6000 * 6001));
    const big = testPngFromChunks([ihdr(6000, 6000), testChunk('IDAT', zeros), iend]);
    expect(decodeError(big, { maxPixels: 10_000_000 })).toMatch(/36 megapixels/);
    expect(photoFromPng(big, { file: FILE, maxPixels: 10_000_000 }).ok).toBe(false);
  });

  it('CRC errors in data chunks (CRCs are checked for every chunk)', () => {
    const bytes = good.slice();
    bytes[33 + 8 + 5] ^= 1; // a byte inside the IDAT data
    expect(decodeError(bytes)).toMatch(/IDAT chunk at byte 33 fails its CRC check/);
  });

  it('bad zlib data, truncated zlib stream, IDAT too short for the image', () => {
    // A valid zlib header, then a deflate block of type 3, which RFC 1951 §3.2.3 reserves as an error.
    const garbage = Buffer.from([0x78, 0x9c, 0x07, 0x55, 0xaa, 0x55, 0xaa, 0, 0, 0, 0]);
    expect(decodeError(testPngFromChunks([ihdr(), testChunk('IDAT', garbage), iend]))).toMatch(/cannot be decompressed/);
    expect(decodeError(testPngFromChunks([ihdr(), testChunk('IDAT', Buffer.from([1, 2, 3])), iend]))).toMatch(/cannot be decompressed/);
    const z = deflateSync(testRawImageData(spec));
    expect(decodeError(testPngFromChunks([ihdr(), testChunk('IDAT', z.subarray(0, z.length >> 1)), iend]))).toMatch(/stops before the image is complete/);
    const short = idat(testRawImageData(spec).subarray(0, 150)); // a complete stream of 150 of the 210 bytes
    expect(decodeError(testPngFromChunks([ihdr(), short, iend]))).toMatch(/image data holds 150 bytes, the image needs 210/);
  });

  it('no IDAT, palette without PLTE, unknown filter type, unknown critical chunk, second IHDR', () => {
    expect(decodeError(testPngFromChunks([ihdr(), iend]))).toMatch(/no image data/);
    const pal: TestPngSpec = { ...spec, colorType: 3 };
    expect(decodeError(testPngWrite(pal))).toMatch(/palette PNG without a palette/);
    const raw = testRawImageData(spec);
    raw[3 * 21] = 9; // filter byte of row 3
    expect(decodeError(testPngFromChunks([ihdr(), idat(raw), iend]))).toMatch(/unknown filter type 9/);
    const withCritical = testPngFromChunks([ihdr(), testChunk('ZZZZ', new Uint8Array(4)), idat(testRawImageData(spec)), iend]);
    expect(decodeError(withCritical)).toMatch(/"ZZZZ" chunk that is needed to read the image/);
    const withAncillary = testPngFromChunks([ihdr(), testChunk('zzZZ', new Uint8Array(4)), idat(testRawImageData(spec)), iend]);
    expect(labelMapFromPng(withAncillary, { file: FILE }).ok).toBe(true);
    expect(decodeError(testPngFromChunks([ihdr(), ihdr(), idat(testRawImageData(spec)), iend]))).toMatch(/second IHDR/);
  });

  it('formats that cannot hold label ids', () => {
    const gaSpec: TestPngSpec = { ...spec, colorType: 4, samples: new Array(400).fill(3) };
    expect(decodeError(testPngWrite(gaSpec))).toMatch(/8-bit grayscale\+alpha PNG, which is unsupported for label maps; save ids as 8- or 16-bit grayscale/);
    const rgb16 = testPngFromChunks([ihdr(20, 10, 16, 2), iend]); // refused from IHDR alone
    expect(decodeError(rgb16)).toMatch(/16-bit RGB PNG, which is unsupported for label maps; save colour-coded label maps as 8-bit RGB/);
    expect(decodeError(testPngFromChunks([ihdr(20, 10, 16, 6), iend]))).toMatch(/16-bit RGBA PNG, which is unsupported/);
  });

  it('colour-coded maps without classes.json, or with a generated table', () => {
    const rgb: TestPngSpec = { ...spec, colorType: 2, samples: new Array(600).fill(9) };
    expect(decodeError(testPngWrite(rgb))).toMatch(/colour-coded label maps need classes.json/);
    expect(decodeError(testPngWrite(rgb), { table: classTableGenerated(10) })).toMatch(/colour-coded label maps need classes.json/);
  });

  it('unknown colours: named with pixel counts, most common first, at most 3', () => {
    const table = testTable([0, 1], 3, 255, null);
    const known = parseInt(table.classes[0].color.slice(1), 16);
    const width = 100, height = 20; // 2,000 pixels
    const colours = (list: [number, number][]) => {
      const s: number[] = [];
      for (const [c, n] of list) for (let k = 0; k < n; k++) s.push(c >> 16, (c >> 8) & 255, c & 255);
      return testPngWrite({ width, height, colorType: 2, bitDepth: 8, interlace: 0, samples: s });
    };
    expect(decodeError(colours([[known, 796], [0x12ab34, 1204]]), { table })).toBe(
      `${FILE}: 1,204 pixels have colour #12ab34, which is not in classes.json (if one of them means void, set "ignoreColor" in classes.json)`,
    );
    const withIgnoreColor = testTable([0, 1], 3, 255, '#ffffff');
    const one = colours([[parseInt(withIgnoreColor.classes[1].color.slice(1), 16), 1999], [0xabcdef, 1]]);
    expect(decodeError(one, { table: withIgnoreColor })).toBe(`${FILE}: 1 pixel has colour #abcdef, which is not in classes.json`);
    const many = colours([[known, 1000], [0x000001, 10], [0x000002, 500], [0x000003, 300], [0x000004, 190]]);
    expect(decodeError(many, { table })).toBe(
      `${FILE}: 1,000 pixels have 4 colours that are not in classes.json: #000002 (500 pixels), #000003 (300 pixels), #000004 (190 pixels) and 1 more (if one of them means void, set "ignoreColor" in classes.json)`,
    );
  });

  it('seeded random byte damage never throws, hangs or passes silently through a CRC', () => {
    const rnd = seededRandom(2024);
    const base = testPngWrite({ width: 33, height: 17, colorType: 3, bitDepth: 4, interlace: 1, samples: seededIds(33, 17, 16, 5), plte: new Uint8Array(48).map((_, i) => i * 5) });
    for (let trial = 0; trial < 400; trial++) {
      const bytes = base.slice();
      const flips = 1 + Math.floor(rnd() * 4);
      for (let f = 0; f < flips; f++) bytes[Math.floor(rnd() * bytes.length)] ^= 1 + Math.floor(rnd() * 255);
      const changed = bytes.some((b, i) => b !== base[i]);
      const label = labelMapFromPng(bytes, { file: FILE });
      const photo = photoFromPng(bytes, { file: FILE });
      // Any change to signature, chunk bytes or CRCs must be caught: every byte is covered by one of them.
      if (changed) expect(label.ok).toBe(false);
      if (changed) expect(photo.ok).toBe(false);
      if (!label.ok) expect(label.error.startsWith(`${FILE}: `)).toBe(true);
    }
  });
});
