import type { RgbaImage } from './png/decodePhoto.ts';
import { ok, type Result } from './result.ts';

/** A file of a frame: the name used in messages (e.g. `truth/kq-0001.png`) plus whatever locates it. */
export interface FrameFileRef {
  file: string;
}

/** One file of a frame, as bytes, with the name used in messages. */
export interface FileBytes {
  file: string;
  bytes: Uint8Array;
}

/**
 * How a frame's files reach core code: the page reads Blobs and lets the browser decode photos of any
 * image type; the command line reads paths and decodes PNG photos only.
 */
export interface FrameFileReader<F extends FrameFileRef> {
  /** Returns the file's bytes; throws (with a reason) when it cannot be read. */
  bytes(file: F): Promise<Uint8Array>;
  /**
   * Returns the photo as RGBA pixels, or why it cannot be decoded (the message names the file);
   * `bytes`, when the caller has read them already, spare a second read.
   */
  photo(file: F, bytes?: Uint8Array): Promise<Result<RgbaImage>>;
}

/** Returns the short reason of a read error: a system error code (ENOENT, EACCES) when there is one, else its message. */
function readReason(e: unknown): string {
  const code = typeof e === 'object' && e !== null && 'code' in e ? (e as { code: unknown }).code : undefined;
  if (typeof code === 'string') return code;
  return e instanceof Error ? e.message : String(e);
}

/**
 * Returns the file's bytes, or `<file>: could not be read (<reason>)`; browser and command line say it
 * alike. A reader's error that already names the file (`<file>: …`) is passed on as it is.
 */
export async function fileBytesRead<F extends FrameFileRef>(reader: FrameFileReader<F>, file: F): Promise<Result<FileBytes>> {
  try {
    return ok({ file: file.file, bytes: await reader.bytes(file) });
  } catch (e) {
    return { ok: false, error: readFailure(file.file, e) };
  }
}

/** Returns the message for `file` failing to be read with `e`: `<file>: could not be read (<reason>)`, or `e`'s own message when it names the file. */
export function readFailure(file: string, e: unknown): string {
  if (e instanceof Error && e.message.startsWith(`${file}: `)) return e.message;
  return `${file}: could not be read (${readReason(e)})`;
}
