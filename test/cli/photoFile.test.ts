import jpeg from 'jpeg-js';
import { describe, expect, it } from 'vitest';
import { photoFromBytes } from '../../src/cli/photoFile.ts';
import { rgbaToPng } from '../../src/core/png/encode.ts';

// Photos headless: PNG by our decoder, JPEG by jpeg-js. A JPEG of flat colour blocks aligned to its 8×8
// DCT blocks decodes to within a few levels of each colour (JPEG, ITU-T T.81: a block of one colour is
// carried by its DC term alone, so only quantisation of that term and colour conversion round it).

const W = 32, H = 16;
function blocks(): Uint8Array {
  const rgba = new Uint8Array(W * H * 4);
  for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) rgba.set(x < 16 ? [200, 60, 30, 255] : [20, 120, 220, 255], (y * W + x) * 4);
  return rgba;
}

describe('photoFromBytes', () => {
  it('decodes a JPEG to RGBA at its size, each flat block within 6 levels of its colour', () => {
    const bytes = jpeg.encode({ width: W, height: H, data: blocks() }, 95).data;
    const r = photoFromBytes(new Uint8Array(bytes), { file: 'photos/a.jpg' });
    if (!r.ok) throw new Error(r.error);
    expect([r.value.width, r.value.height, r.value.rgba.length]).toEqual([W, H, W * H * 4]);
    const want = blocks();
    for (let i = 0; i < want.length; i++) expect(Math.abs(r.value.rgba[i] - want[i])).toBeLessThanOrEqual(6);
  });

  it('decodes PNG the same as our PNG decoder, and names what it cannot decode', () => {
    const png = photoFromBytes(rgbaToPng(W, H, blocks()), { file: 'a.png' });
    expect(png.ok && png.value.rgba).toEqual(blocks());
    const webp = new Uint8Array([0x52, 0x49, 0x46, 0x46, 0, 0, 0, 0, 0x57, 0x45, 0x42, 0x50]);
    expect(photoFromBytes(webp, { file: 'a.webp' })).toEqual({ ok: false, error: 'a.webp: WebP photos are decoded in the browser only (no WebP decoder headless)' });
    expect(photoFromBytes(new Uint8Array([0xff, 0xd8, 0xff, 0]), { file: 'b.jpg' })).toMatchObject({ ok: false, error: expect.stringMatching(/^b.jpg: could not be decoded as JPEG/) });
    const big = jpeg.encode({ width: W, height: H, data: blocks() }, 90).data;
    expect(photoFromBytes(new Uint8Array(big), { file: 'c.jpg', maxPixels: 100 })).toMatchObject({ ok: false });
  });
});
