import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { classTableGenerated } from '../../src/core/classTable.ts';
import { frameDecode, type FrameDecodeInput } from '../../src/core/decodedFrame.ts';
import type { FrameFileReader } from '../../src/core/frameFiles.ts';
import { fail, ok } from '../../src/core/result.ts';

// The one frame decoder of the viewer and the tile export. Label PNGs are written by pngjs (a second
// PNG implementation), so the ids decoded here are checked against an encoder that shares no code with
// src/core/png.

/** An 8-bit gray PNG written by pngjs holding `ids`. */
function grayPng(width: number, height: number, ids: number[]): Uint8Array {
  const p = new PNG({ width, height, colorType: 0, bitDepth: 8, inputColorType: 0, inputHasAlpha: false });
  p.data = Buffer.from(ids);
  return new Uint8Array(PNG.sync.write(p, { colorType: 0, bitDepth: 8, inputColorType: 0, inputHasAlpha: false }));
}

/** A file in memory: bytes, or the error its read throws. */
interface MemFile {
  file: string;
  bytes?: Uint8Array;
  throws?: Error;
  photo?: { width: number; height: number } | 'bad';
}

const reader: FrameFileReader<MemFile> = {
  async bytes(m) {
    if (m.throws) throw m.throws;
    return m.bytes!;
  },
  async photo(m) {
    if (m.photo === 'bad' || !m.photo) return fail(m.file, 'not an image this reader decodes');
    return ok({ ...m.photo, rgba: new Uint8Array(m.photo.width * m.photo.height * 4).fill(7) });
  },
};

const W = 4, H = 3;
const truthIds = [0, 0, 1, 1, 0, 0, 1, 1, 2, 2, 2, 2];
const predIds = [0, 1, 1, 1, 0, 0, 1, 1, 2, 2, 2, 0];
const table = classTableGenerated(-1, 255);
const enoent = Object.assign(new Error('ENOENT: no such file or directory, open /x/a.png'), { code: 'ENOENT' });

function input(over: Partial<FrameDecodeInput<MemFile>> = {}): FrameDecodeInput<MemFile> {
  return {
    name: 'f1',
    truth: { file: 'truth/f1.png', bytes: grayPng(W, H, truthIds) },
    preds: [{ run: 'a', file: { file: 'a/f1.png', bytes: grayPng(W, H, predIds) } }],
    photo: null,
    table,
    ...over,
  };
}

describe('frameDecode (src/core/decodedFrame.ts)', () => {
  it('decodes truth and predictions to the ids pngjs wrote, keeping their encodings; band bins only when asked', async () => {
    const r = await frameDecode(input(), reader);
    if (!r.ok) throw new Error(r.error);
    expect([r.value.width, r.value.height, r.value.name]).toEqual([W, H, 'f1']);
    expect([...r.value.truth.ids]).toEqual(truthIds);
    expect([...r.value.preds.a.ids]).toEqual(predIds);
    expect(r.value.truth.encoding).toEqual({ kind: 'gray', bitDepth: 8 });
    expect(r.value.bandBins).toBeNull();
    expect(r.value.notes).toEqual([]);
    const withBins = await frameDecode(input({ bandBins: true }), reader);
    expect(withBins.ok && withBins.value.bandBins?.length).toBe(W * H);
  });

  it('a ground truth that cannot be read or decoded fails the frame, naming the file', async () => {
    const unread = await frameDecode(input({ truth: { file: 'truth/f1.png', throws: enoent } }), reader);
    expect(unread).toEqual({ ok: false, error: 'truth/f1.png: could not be read (ENOENT)' });
    const notPng = await frameDecode(input({ truth: { file: 'truth/f1.png', bytes: new Uint8Array([1, 2, 3]) } }), reader);
    expect(notPng.ok).toBe(false);
    expect(!notPng.ok && notPng.error).toMatch(/^truth\/f1\.png: /);
  });

  it('a missing, unreadable or wrong-size prediction only leaves the frame, with a note naming it', async () => {
    const r = await frameDecode(input({
      preds: [
        { run: 'none', file: null },
        { run: 'gone', file: { file: 'gone/f1.png', throws: enoent } },
        { run: 'locked', file: { file: 'locked/f1.png', throws: new Error('the file was moved') } },
        { run: 'small', file: { file: 'small/f1.png', bytes: grayPng(2, 2, [0, 0, 0, 0]) } },
        { run: 'a', file: { file: 'a/f1.png', bytes: grayPng(W, H, predIds) } },
      ],
    }), reader);
    if (!r.ok) throw new Error(r.error);
    expect(Object.keys(r.value.preds)).toEqual(['a']);
    expect(r.value.notes).toEqual([
      'run "none" has no prediction for this frame',
      'gone/f1.png: could not be read (ENOENT)',
      'locked/f1.png: could not be read (the file was moved)',
      'small/f1.png: is 2×2 pixels but truth/f1.png is 4×3; a prediction must have the label\'s size or a whole fraction of it (1/2, 1/3, …, same in both directions)',
    ]);
  });

  it('a photo the reader cannot decode, or of another size, is left out with a note; a good one is kept', async () => {
    const bad = await frameDecode(input({ photo: { file: 'images/f1.jpg', photo: 'bad' } }), reader);
    expect(bad.ok && [bad.value.photo, bad.value.notes]).toEqual([null, ['images/f1.jpg: not an image this reader decodes']]);
    const sized = await frameDecode(input({ photo: { file: 'images/f1.png', photo: { width: 5, height: 3 } } }), reader);
    expect(sized.ok && sized.value.notes).toEqual(["images/f1.png: is 5×3 pixels but truth/f1.png is 4×3; a photo must have the label's size, a whole multiple or a whole fraction of it (same in both directions)"]);
    const double = await frameDecode(input({ photo: { file: 'images/f1.png', photo: { width: W * 2, height: H * 2 } } }), reader);
    expect(double.ok && [double.value.photo?.length, double.value.notes]).toEqual([W * H * 4, ["images/f1.png: averaged down ×2 to the label's size"]]);
    const good = await frameDecode(input({ photo: { file: 'images/f1.png', photo: { width: W, height: H } } }), reader);
    expect(good.ok && good.value.photo?.length).toBe(W * H * 4);
  });
});
