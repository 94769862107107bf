import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { pngHeaderRead } from '../../../src/core/png/header.ts';
import { testChunk, testIhdr, testPngFromChunks, testPngWrite, type TestPngSpec } from './pngTestWriter.ts';
import { seededIds } from './seeded.ts';

describe('pngHeaderRead', () => {
  it('reads the same IHDR fields as pngjs (PNG.sync.read metadata)', () => {
    const specs: TestPngSpec[] = [
      { width: 13, height: 5, colorType: 0, bitDepth: 16, interlace: 1, samples: seededIds(13, 5, 65536, 1) },
      { width: 9, height: 4, colorType: 3, bitDepth: 2, interlace: 0, samples: seededIds(9, 4, 4, 2), plte: new Uint8Array(12).map((_, i) => i * 20) },
      { width: 4, height: 3, colorType: 6, bitDepth: 8, interlace: 1, samples: seededIds(4, 3 * 4, 256, 3) },
    ];
    for (const s of specs) {
      const bytes = testPngWrite(s);
      const r = pngHeaderRead(bytes, 'x.png');
      if (!r.ok) throw new Error(r.error);
      const ref = PNG.sync.read(Buffer.from(bytes), { skipRescale: true } as never);
      expect(r.value).toEqual({ width: ref.width, height: ref.height, bitDepth: ref.depth, colorType: ref.colorType, interlace: ref.interlace ? 1 : 0 });
    }
  });

  it('needs no image data: a file cut right after IHDR still gives its header', () => {
    const bytes = testPngFromChunks([testChunk('IHDR', testIhdr(70000, 3, 8, 2, 0))]);
    expect(pngHeaderRead(bytes, 'x.png')).toEqual({ ok: true, value: { width: 70000, height: 3, bitDepth: 8, colorType: 2, interlace: 0 } });
  });

  it('names the file and the problem', () => {
    expect(pngHeaderRead(new Uint8Array([0x89, 0x50, 0x4e]), 'a/b.png')).toEqual({
      ok: false,
      error: 'a/b.png: is truncated: 3 bytes, too short to hold even the PNG header (IHDR)',
    });
    // A signature whose CR-LF became LF (ISO/IEC 15948 §5.2 designs the signature to detect this).
    const mangled = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 73, 72, 68, 82]);
    const r = pngHeaderRead(mangled, 'a/b.png');
    expect(r.ok ? '' : r.error).toMatch(/^a\/b\.png: is not a PNG file.*line-ending/);
  });
});
