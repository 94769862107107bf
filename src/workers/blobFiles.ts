import type { FrameFileReader } from '../core/frameFiles.ts';
import { fail, ok } from '../core/result.ts';
import { blobBytesBounded } from './blobBounded.ts';
import { photoDecode } from './photoDecode.ts';

/** A file as the page holds it: a Blob (a File, a fetched body, or demo bytes) and its display name. */
export interface FileBlob {
  file: string;
  blob: Blob;
}

/** Reads a frame's files in the browser: Blob bytes, photos of any type the browser decodes. */
export const blobFileReader: FrameFileReader<FileBlob> = {
  bytes: (f) => blobBytesBounded(f.blob),
  async photo(f) {
    try {
      return ok(await photoDecode(f.blob));
    } catch {
      return fail(f.file, 'the browser could not decode this image');
    }
  },
};
