import { describe, expect, it } from 'vitest';
import { fileBytesRead } from '../../src/core/frameFiles.ts';
import { blobFileReader } from '../../src/workers/blobFiles.ts';

// The page's file reader: Blob bytes, and a read that fails reported as the command line reports it
// ("<file>: could not be read (<reason>)"). Photos are decoded by the browser; Node has no
// createImageBitmap, so here a photo always takes the "could not decode" path (the browser tests
// decode real photos).

describe('blobFileReader (src/workers/blobFiles.ts)', () => {
  it('reads a Blob\'s bytes', async () => {
    const r = await fileBytesRead(blobFileReader, { file: 'truth/a.png', blob: new Blob([Uint8Array.of(1, 2, 250)]) });
    expect(r.ok && [...r.value.bytes]).toEqual([1, 2, 250]);
  });

  it('a Blob whose read fails gives "<file>: could not be read (<reason>)"', async () => {
    const broken: Blob = { size: 100, slice: () => broken, arrayBuffer: () => Promise.reject(new Error('A requested file or directory could not be found')) } as unknown as Blob;
    const r = await fileBytesRead(blobFileReader, { file: 'predictions/a/f.png', blob: broken });
    expect(r).toEqual({ ok: false, error: 'predictions/a/f.png: could not be read (A requested file or directory could not be found)' });
  });

  it('a photo the browser cannot decode is named', async () => {
    const r = await blobFileReader.photo({ file: 'images/f.jpg', blob: new Blob([Uint8Array.of(0)]) });
    expect(r).toEqual({ ok: false, error: 'images/f.jpg: the browser could not decode this image' });
  });
});
