import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const SCRIPT = fileURLToPath(new URL('./zip_tiles_ref.py', import.meta.url));

/** What Python's zipfile and csv modules read from a tile-export ZIP. */
export interface ZipTilesRef {
  bad: string | null;
  names: string[];
  utf8: Record<string, boolean>;
  manifest: unknown;
  rows: Record<string, string>[];
}

/** Returns what zip_tiles_ref.py reads from the ZIP at `path`; throws with its stderr when it fails. */
export function zipTilesRef(path: string): ZipTilesRef {
  const r = spawnSync('python3', [SCRIPT, path], { encoding: 'utf8', maxBuffer: 1 << 28 });
  if (r.error || r.status !== 0) throw new Error(`zip_tiles_ref.py failed: ${r.error?.message ?? r.stderr}`);
  return JSON.parse(r.stdout) as ZipTilesRef;
}
