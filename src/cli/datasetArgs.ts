import { readFile, stat } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { DESCRIPTION_FILE, descriptionFromText, type Description } from '../data/description.ts';
import { LAYOUT_EXPECTED, layoutFromPaths } from '../data/layout.ts';
import { naturalCompare } from '../data/naturalSort.ts';
import { UsageError } from './args.ts';
import { filesUnder } from './listFiles.ts';
import type { ScoreOptions } from './scoreArgs.ts';

/** Returns the text of a file, null when it does not exist, or throws UsageError naming it. */
async function textOrNull(path: string): Promise<string | null> {
  try {
    return await readFile(path, 'utf8');
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw new UsageError(`${path}: cannot read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
}

/**
 * Returns the options with `--dataset` turned into folders: the root's hairline.json (or the file
 * given) says where each role is, else the folders are recognised by name; classes.json and the list
 * file come from it unless --classes / --list are given. Options without --dataset are returned as they are.
 */
export async function scoreOptionsResolve(options: ScoreOptions): Promise<ScoreOptions> {
  if (options.dataset === null) return options;
  const given = options.dataset;
  const info = await stat(given).catch((e: NodeJS.ErrnoException) => {
    throw new UsageError(`--dataset ${given}: cannot read (${e.code ?? e.message})`);
  });
  const root = info.isDirectory() ? given : dirname(given);
  const descPath = info.isDirectory() ? join(root, DESCRIPTION_FILE) : given;
  const text = await textOrNull(descPath);
  let description: Description | null = null;
  if (text !== null) {
    const d = descriptionFromText(text, descPath);
    if (!d.ok) throw new UsageError(d.error);
    description = d.value;
  } else if (!info.isDirectory()) throw new UsageError(`--dataset ${given}: cannot read`);
  const paths = await filesUnder(root, 'dataset');
  const layout = layoutFromPaths(paths, description);
  if (!layout.ok) throw new UsageError(`--dataset ${given}: ${layout.error.replace(/^hairline\.json: /, `${basename(descPath)}: `)}`);
  const { listing, dirs, classesPath, listPath, pair } = layout.value;
  const runs = Object.keys(listing.predictions).sort(naturalCompare);
  if (runs.length === 0) throw new UsageError(`--dataset ${given}: no prediction runs found: ${LAYOUT_EXPECTED}`);
  return {
    ...options,
    truth: join(root, dirs.truth),
    runs: runs.map((name) => ({ name, dir: join(root, dirs[`predictions/${name}`]) })),
    images: dirs.images !== undefined ? join(root, dirs.images) : null,
    confidence: Object.keys(listing.confidence ?? {}).map((name) => ({ name, dir: join(root, dirs[`confidence/${name}`]) })),
    instances: dirs.instances !== undefined ? join(root, dirs.instances) : null,
    classes: options.classes ?? (classesPath ? join(root, classesPath) : null),
    list: options.list ?? (listPath ? join(root, listPath) : null),
    pair,
  };
}
