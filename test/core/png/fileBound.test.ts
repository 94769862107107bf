// A file is checked from its first 33 bytes before it is read whole: the bound is the image's raw
// size stored uncompressed (ISO/IEC 15948 §10: zlib stored blocks add 5 bytes per 65,535) plus room
// for other chunks; pngjs (a second encoder) makes the headers.
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { PNG_HEAD_BYTES, pngBytesMax, pngFileBound, OTHER_FILE_BYTES_MAX } from '../../../src/core/png/fileBound.ts';
import { pngHeaderRead } from '../../../src/core/png/header.ts';

function pngjs(width: number, height: number, bitDepth: 8 | 16, colorType: 0 | 2 | 6): Uint8Array {
  const png = new PNG({ width, height, bitDepth, colorType, inputColorType: colorType, inputHasAlpha: colorType === 6 });
  return new Uint8Array(PNG.sync.write(png, { bitDepth, colorType, inputColorType: colorType, inputHasAlpha: colorType === 6 }));
}

describe('pngFileBound', () => {
  it('lets through every real file, compressed or not, and refuses one far larger than its header allows', () => {
    for (const [w, h, d, c] of [[30, 30, 8, 0], [2048, 1024, 16, 0], [640, 480, 8, 6], [1, 1, 8, 2]] as const) {
      const bytes = pngjs(w, h, d, c);
      expect(pngFileBound(bytes.subarray(0, PNG_HEAD_BYTES), bytes.length, 1e8)).toEqual({ ok: true, value: undefined });
      const header = pngHeaderRead(bytes, 'x');
      if (!header.ok) throw new Error(header.error);
      const raw = h * (1 + (w * (c === 6 ? 4 : c === 2 ? 3 : 1) * d) / 8);
      // Stored (uncompressed) deflate: the raw rows plus 5 bytes per 65,535-byte block, and zlib's 6.
      expect(pngBytesMax(header.value)).toBeGreaterThanOrEqual(raw + Math.ceil(raw / 65535) * 5 + 6 + 8 + 25 + 12);
      const over = pngBytesMax(header.value) + 1;
      const r = pngFileBound(bytes.subarray(0, PNG_HEAD_BYTES), over, 1e8);
      expect(r.ok ? 'ok' : r.error).toMatch(/^it is [\d.]+ MB, more than a [\d,]+×[\d,]+ \d+-bit \S+ PNG can hold \(at most [\d.]+ MB even uncompressed\)$/);
    }
  });

  it('refuses too many pixels from the header alone, and a large file that is not a PNG', () => {
    const bytes = pngjs(30, 30, 8, 0);
    const r = pngFileBound(bytes.subarray(0, PNG_HEAD_BYTES), bytes.length, 899);
    expect(r.ok ? 'ok' : r.error).toBe('it is 30×30 pixels (900 pixels), above the limit of 899 pixels; refusing to decode it');
    const jpeg = new Uint8Array([0xff, 0xd8, 0xff, 0xe0]);
    expect(pngFileBound(jpeg, 5e6, 1e8).ok).toBe(true);
    const big = pngFileBound(jpeg, OTHER_FILE_BYTES_MAX + 1, 1e8);
    expect(big.ok ? 'ok' : big.error).toMatch(/^it is 268\.4 MB and not a PNG/);
    // A small damaged file is read: its decoder gives the precise message.
    expect(pngFileBound(bytes.subarray(0, 20), 20, 1e8).ok).toBe(true);
  });
});
