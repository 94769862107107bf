import type { FrameFileReader } from '../core/frameFiles.ts';
import { photoFromBytes } from './photoFile.ts';
import { fail } from '../core/result.ts';
import { fileReadBounded } from './fileReadBounded.ts';

/** A file to read: its path on disk and the name used in messages. */
export interface FilePath {
  file: string;
  path: string;
}

/** Returns the reader of a frame's files on disk; PNG and JPEG photos are decoded (at most `maxPixels`). */
export function diskFileReader(o: { maxPixels?: number } = {}): FrameFileReader<FilePath> {
  const bytes = (f: FilePath) => fileReadBounded(f.path, o.maxPixels);
  return {
    bytes,
    async photo(f, given) {
      let data = given;
      try {
        data ??= await bytes(f);
      } catch (e) {
        return fail(f.file, `could not be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
      }
      return photoFromBytes(data, { file: f.file, maxPixels: o.maxPixels });
    },
  };
}
