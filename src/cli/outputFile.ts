// Every file the CLI writes goes through here: written under `NAME.partial` next to its final name,
// flushed to disk and renamed, so a reader never sees a half-written report, CSV or ZIP under the
// final name. A write error is a one-line OutputError; Ctrl+C removes the partial files and exits 130.
import { rmSync } from 'node:fs';
import { open, rename, rm, stat, type FileHandle } from 'node:fs/promises';
import { dirname } from 'node:path';

/** A file that could not be written: the message is one line naming the option, the file and the reason. */
export class OutputError extends Error {
  override name = 'OutputError';
}

/** An output being written; nothing is under its final name until `commit` resolves. */
export interface OutputFile {
  /** Appends bytes or UTF-8 text; rejects with an OutputError. */
  write(chunk: Uint8Array | string): Promise<void>;
  /** Flushes to disk, closes and renames the partial file to its final name. */
  commit(): Promise<void>;
  /** Closes and removes the partial file. */
  abort(): Promise<void>;
}

/** Exit code after Ctrl+C (128 + SIGINT), as shells report it. */
export const EXIT_INTERRUPTED = 130;

const live = new Set<string>();

function onInterrupt(signal: NodeJS.Signals): void {
  for (const p of live) rmSync(p, { force: true });
  process.stderr.write(`\ncancelled (${signal}); no unfinished file was left behind\n`);
  process.exit(EXIT_INTERRUPTED);
}

function track(partial: string): void {
  if (live.size === 0) {
    process.on('SIGINT', onInterrupt);
    process.on('SIGTERM', onInterrupt);
  }
  live.add(partial);
}

function untrack(partial: string): void {
  live.delete(partial);
  if (live.size === 0) {
    process.off('SIGINT', onInterrupt);
    process.off('SIGTERM', onInterrupt);
  }
}

/** Returns the plain words for a file-system error code. */
function reasonOf(e: unknown, path: string): string {
  const code = (e as NodeJS.ErrnoException).code;
  const words: Record<string, string> = {
    ENOENT: `the folder ${dirname(path)} does not exist`,
    ENOTDIR: `${dirname(path)} is not a folder`,
    EISDIR: 'it is a folder',
    EACCES: 'permission denied',
    EPERM: 'permission denied',
    EROFS: 'the file system is read-only',
    ENOSPC: 'the disk is full',
    EDQUOT: 'the disk quota is used up',
    EFBIG: 'the file is too large for this file system',
    EIO: 'an input/output error',
  };
  return code && words[code] ? `${words[code]} (${code})` : code ?? (e as Error).message;
}

function fail(option: string, path: string, e: unknown): OutputError {
  return new OutputError(`${option} ${path}: cannot write (${reasonOf(e, path)}); nothing was written`);
}

/** Opens `path` for writing under its partial name; rejects with an OutputError (missing folder, no permission, a folder there). */
export async function outputOpen(path: string, option: string): Promise<OutputFile> {
  const partial = `${path}.partial`;
  const existing = await stat(path).catch(() => null);
  if (existing?.isDirectory()) throw fail(option, path, Object.assign(new Error('is a folder'), { code: 'EISDIR' }));
  let fh: FileHandle;
  try {
    fh = await open(partial, 'w');
  } catch (e) {
    throw fail(option, path, e);
  }
  track(partial);
  let closed = false;
  const close = async () => {
    if (closed) return;
    closed = true;
    await fh.close().catch(() => undefined);
  };
  const abort = async () => {
    await close();
    await rm(partial, { force: true });
    untrack(partial);
  };
  // Writes and the commit run one after another in call order: writes issued without waiting (a
  // streaming ZIP hands over chunks faster than the disk takes them) would otherwise land interleaved.
  let queue: Promise<unknown> = Promise.resolve();
  const inOrder = <T>(step: () => Promise<T>): Promise<T> => {
    const next = queue.then(step);
    queue = next.catch(() => undefined);
    return next;
  };
  return {
    write: (chunk) => inOrder(async () => {
      if (closed) throw fail(option, path, new Error('the file was closed after an earlier error'));
      try {
        // writeFile loops until every byte is written (a plain write may stop short on a filling disk).
        await fh.writeFile(chunk);
      } catch (e) {
        await abort();
        throw fail(option, path, e);
      }
    }),
    commit: () => inOrder(async () => {
      try {
        await fh.sync();
        await close();
        await rename(partial, path);
        untrack(partial);
      } catch (e) {
        await abort();
        throw fail(option, path, e);
      }
    }),
    abort,
  };
}

/** Checks, before any work, that `path` can be written: opens its partial file and removes it again. */
export async function outputCheck(path: string, option: string): Promise<void> {
  const f = await outputOpen(path, option);
  await f.abort();
}

/** Writes `data` to `path` whole (partial name, flush, rename); rejects with an OutputError. */
export async function outputWrite(path: string, option: string, data: Uint8Array | string): Promise<void> {
  const f = await outputOpen(path, option);
  await f.write(data);
  await f.commit();
}
