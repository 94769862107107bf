import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import { afterAll, describe, expect, it } from 'vitest';
import { diskFileReader } from '../../src/cli/diskFiles.ts';
import { classTableGenerated } from '../../src/core/classTable.ts';
import { frameDecode } from '../../src/core/decodedFrame.ts';
import { fileBytesRead } from '../../src/core/frameFiles.ts';

// The command line's file reader under the shared frame decoder: files from disk, PNG and JPEG photos,
// read errors named by their system code. PNGs are written by pngjs, a second PNG implementation.

const dir = mkdtempSync(join(tmpdir(), 'hairline-disk-files-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function pngWrite(name: string, width: number, height: number, rgba: boolean): string {
  const p = new PNG({ width, height, colorType: rgba ? 6 : 0, bitDepth: 8, inputColorType: rgba ? 6 : 0, inputHasAlpha: rgba });
  p.data = Buffer.alloc(width * height * (rgba ? 4 : 1), rgba ? 200 : 1);
  const path = join(dir, name);
  writeFileSync(path, PNG.sync.write(p, { colorType: rgba ? 6 : 0, bitDepth: 8, inputColorType: rgba ? 6 : 0, inputHasAlpha: rgba }));
  return path;
}

describe('diskFileReader (src/cli/diskFiles.ts)', () => {
  const reader = diskFileReader();

  it('a file that is not there gives "<file>: could not be read (ENOENT)"', async () => {
    const r = await fileBytesRead(reader, { file: 'run-a/f.png', path: join(dir, 'missing.png') });
    expect(r).toEqual({ ok: false, error: 'run-a/f.png: could not be read (ENOENT)' });
  });

  it('decodes PNG photos and names a photo that is neither PNG nor JPEG', async () => {
    const photo = pngWrite('photo.png', 3, 2, true);
    const r = await reader.photo({ file: 'images/f.png', path: photo });
    expect(r.ok && [r.value.width, r.value.height, r.value.rgba[0]]).toEqual([3, 2, 200]);
    writeFileSync(join(dir, 'f.jpg'), 'not an image');
    const jpg = await reader.photo({ file: 'images/f.jpg', path: join(dir, 'f.jpg') });
    expect(jpg).toEqual({ ok: false, error: 'images/f.jpg: is neither a PNG nor a JPEG photo' });
  });

  it('frameDecode over disk files: notes for an unreadable prediction and a non-PNG photo, as in the browser', async () => {
    const truth = pngWrite('truth.png', 3, 2, false);
    const r = await frameDecode({
      name: 'f',
      truth: { file: 'truth/f.png', path: truth },
      preds: [{ run: 'a', file: { file: 'a/f.png', path: truth } }, { run: 'b', file: { file: 'b/f.png', path: join(dir, 'nope.png') } }],
      photo: { file: 'images/f.jpg', path: join(dir, 'f.jpg') },
      table: classTableGenerated(-1, 255),
    }, reader);
    if (!r.ok) throw new Error(r.error);
    expect(Object.keys(r.value.preds)).toEqual(['a']);
    expect(r.value.notes).toEqual(['b/f.png: could not be read (ENOENT)', 'images/f.jpg: is neither a PNG nor a JPEG photo']);
  });
});
