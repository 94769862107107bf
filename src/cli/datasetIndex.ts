import { createHash } from 'node:crypto';
import { stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { filesUnder } from './listFiles.ts';
import { pathResolveInside } from './serveFiles.ts';

/** A file of the folder that the server will not serve, with the reason, so it is reported and not silently lost. */
export interface SkippedFile {
  path: string;
  reason: string;
}

/** The body of `/dataset/index.json` and its ETag. */
export interface DatasetIndex {
  body: string;
  etag: string;
  skipped: SkippedFile[];
}

/**
 * Returns a function giving the dataset listing, built once and rebuilt only when a folder of the tree
 * changed: a file added, removed or renamed changes its folder's modification time, so one stat per
 * folder replaces a walk of every file on each request.
 */
export function datasetIndexCache(dataReal: string): () => Promise<DatasetIndex> {
  let cached: { index: DatasetIndex; dirs: Map<string, number> } | null = null;
  let building: Promise<DatasetIndex> | null = null;
  async function fresh(): Promise<boolean> {
    if (!cached) return false;
    const stamps = await Promise.all([...cached.dirs.keys()].map((d) => stat(d).then((s) => s.mtimeMs, () => -1)));
    let i = 0;
    for (const old of cached.dirs.values()) if (stamps[i++] !== old) return false;
    return true;
  }
  async function rebuild(): Promise<DatasetIndex> {
    const dirs = new Map<string, number>();
    const all = await filesUnder(dataReal, 'dataset', dirs);
    const files: string[] = [];
    const skipped: SkippedFile[] = [];
    for (const f of all.sort()) {
      if (f.includes('\\')) {
        skipped.push({ path: f, reason: 'its name holds a backslash, which a URL path cannot carry safely; rename it to serve it' });
        continue;
      }
      const r = await pathResolveInside(dataReal, f.split('/').map(encodeURIComponent).join('/'));
      if (r.ok) files.push(f);
      else if (r.status === 403) skipped.push({ path: f, reason: r.reason });
    }
    const body = JSON.stringify({ title: basename(dataReal), files, skipped });
    const etag = `"${createHash('sha1').update(body).digest('base64url')}"`;
    const index = { body, etag, skipped };
    cached = { index, dirs };
    return index;
  }
  return async () => {
    if (await fresh()) return cached!.index;
    // Requests arriving while the walk runs share it.
    building ??= rebuild().finally(() => (building = null));
    return building;
  };
}
