import { readdir, realpath, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { UsageError } from './args.ts';

/**
 * Returns every file under `dir` as `/`-separated paths relative to it, in no particular order; names
 * starting with `.` are left out. When `dirs` is given, each folder walked (absolute path) is put in it
 * with its modification time (ms) read before the folder is listed, so a later change shows.
 * Symbolic links to folders are followed (a link back to a folder above it is not followed, so a loop ends); whether a
 * link may lead outside a served root is for the server to decide per file.
 */
export async function filesUnder(dir: string, option: string, dirs?: Map<string, number>): Promise<string[]> {
  let info;
  try {
    info = await stat(dir);
  } catch (e) {
    throw new UsageError(`--${option} ${dir}: cannot read this folder (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  if (!info.isDirectory()) throw new UsageError(`--${option} ${dir}: is not a folder`);
  const out: string[] = [];
  async function walk(abs: string, rel: string, above: ReadonlySet<string> = new Set()): Promise<void> {
    const real = await realpath(abs).catch(() => abs);
    if (above.has(real)) return;
    const chain = new Set(above).add(real);
    if (dirs) dirs.set(abs, await stat(abs).then((s) => s.mtimeMs, () => -1));
    let entries;
    try {
      entries = await readdir(abs, { withFileTypes: true });
    } catch (e) {
      throw new UsageError(`--${option} ${abs}: cannot list this folder (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    }
    for (const ent of entries) {
      if (ent.name.startsWith('.')) continue;
      const r = rel ? `${rel}/${ent.name}` : ent.name;
      if (ent.isDirectory()) await walk(join(abs, ent.name), r, chain);
      else if (ent.isSymbolicLink() && (await stat(join(abs, ent.name)).then((i) => i.isDirectory(), () => false))) await walk(join(abs, ent.name), r, chain);
      else if (ent.isFile() || ent.isSymbolicLink()) out.push(r);
    }
  }
  await walk(dir, '');
  return out;
}
