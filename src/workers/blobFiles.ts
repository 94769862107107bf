import { readFailure, type FrameFileReader } from '../core/frameFiles.ts';
import { fail, ok } from '../core/result.ts';
import { blobBytesBounded } from './blobBounded.ts';
import { photoDecode } from './photoDecode.ts';

/**
 * A file as the page holds it: a Blob (a File, a fetched body, or demo bytes) and its display name;
 * or, when the page could not get it from its source, why (the worker reports it like any file that
 * cannot be read).
 */
export type FileBlob = { file: string; blob: Blob } | { file: string; blob: null; error: string };

/** Returns `file` as a FileBlob from `read`; a failed read is kept as the FileBlob's error, not thrown. */
export async function fileBlobOf(file: string, read: () => Promise<Blob>): Promise<FileBlob> {
  try {
    return { file, blob: await read() };
  } catch (e) {
    return { file, blob: null, error: e instanceof Error ? e.message : String(e) };
  }
}

/** Reads a frame's files in the browser: Blob bytes, photos of any type the browser decodes. */
export const blobFileReader: FrameFileReader<FileBlob> = {
  async bytes(f) {
    if (!f.blob) throw new Error(f.error);
    return blobBytesBounded(f.blob);
  },
  async photo(f) {
    if (!f.blob) return { ok: false, error: readFailure(f.file, new Error(f.error)) };
    try {
      return ok(await photoDecode(f.blob));
    } catch {
      return fail(f.file, 'the browser could not decode this image');
    }
  },
};
