import { readdir, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { UsageError } from './args.ts';

/** Returns every file under `dir` as `/`-separated paths relative to it, in no particular order. */
export async function filesUnder(dir: string, option: string): Promise<string[]> {
  let info;
  try {
    info = await stat(dir);
  } catch (e) {
    throw new UsageError(`--${option} ${dir}: cannot read this folder (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  if (!info.isDirectory()) throw new UsageError(`--${option} ${dir}: is not a folder`);
  const out: string[] = [];
  async function walk(abs: string, rel: string): Promise<void> {
    let entries;
    try {
      entries = await readdir(abs, { withFileTypes: true });
    } catch (e) {
      throw new UsageError(`--${option} ${abs}: cannot list this folder (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    }
    for (const ent of entries) {
      if (ent.name.startsWith('.')) continue;
      const r = rel ? `${rel}/${ent.name}` : ent.name;
      if (ent.isDirectory()) await walk(join(abs, ent.name), r);
      else if (ent.isFile() || ent.isSymbolicLink()) out.push(r);
    }
  }
  await walk(dir, '');
  return out;
}
