import { countText } from '../core/countText.ts';
import { dictCreate } from '../core/dict.ts';
import { fail, ok, type Result } from '../core/result.ts';
import { DESCRIPTION_FILE, type Description, type FolderSpec } from './description.ts';
import { naturalCompare } from './naturalSort.ts';
import type { DatasetListing, PairOptions } from './pairing.ts';

/** Where a dataset's roles lie under its root, found from hairline.json or guessed from folder names. */
export interface DatasetLayout {
  listing: DatasetListing;
  /** Folder id (`truth`, `images`, `predictions/<run>`, `confidence/<run>`) → folder relative to the root ('' is the root). */
  dirs: Record<string, string>;
  classesPath: string | null;
  listPath: string | null;
  pair: PairOptions;
  /** How the layout was found, for the user: "hairline.json" or "folder names". */
  how: string;
}

// Folder names recognised without a description file (common practice in dataset layouts).
const TRUTH_NAMES = ['truth', 'gt', 'ground_truth', 'groundtruth', 'labels', 'annotations', 'masks'];
const IMAGE_NAMES = ['images', 'photos', 'img', 'imgs', 'rgb'];
const PRED_NAMES = ['predictions', 'preds', 'pred', 'outputs'];

/** Returns the files under `dir` (relative to it), or every file for the root. */
function filesIn(paths: string[], dir: string): string[] {
  if (dir === '' || dir === '.') return paths;
  const prefix = dir.replace(/\/+$/, '') + '/';
  return paths.filter((p) => p.startsWith(prefix)).map((p) => p.slice(prefix.length));
}

/** Returns the top-level entries of the root with their file counts, e.g. "scans/ (12 files), notes.txt". */
export function rootSummary(paths: string[]): string {
  const tops = new Map<string, number>();
  for (const p of paths) {
    const slash = p.indexOf('/');
    const top = slash < 0 ? p : p.slice(0, slash + 1);
    tops.set(top, (tops.get(top) ?? 0) + 1);
  }
  if (tops.size === 0) return 'nothing (the folder is empty)';
  const list = [...tops].sort((a, b) => naturalCompare(a[0], b[0]));
  const shown = list.slice(0, 12).map(([t, n]) => (t.endsWith('/') ? `${t} (${countText(n)} file${n === 1 ? '' : 's'})` : t));
  return shown.join(', ') + (list.length > 12 ? ` and ${list.length - 12} more` : '');
}

function topFolder(paths: string[], names: string[]): string | null {
  const tops = new Set(paths.filter((p) => p.includes('/')).map((p) => p.slice(0, p.indexOf('/'))));
  for (const n of names) for (const t of tops) if (t.toLowerCase() === n) return t;
  return null;
}

/** What the app and the scorer expect at a dataset root; said whenever a folder cannot be opened. */
export const LAYOUT_EXPECTED =
  'expected truth/ (or gt/, labels/, masks/, annotations/) with label PNGs, images/ (or photos/) and predictions/<run>/ (or preds/), ' +
  `or a ${DESCRIPTION_FILE} at the root naming the folders (README "Your data")`;

/** Returns the layout of a root from its file paths: as its description says, or guessed from folder names. */
export function layoutFromPaths(paths: string[], description: Description | null): Result<DatasetLayout> {
  const listing: DatasetListing = { images: [], truth: [], predictions: dictCreate(), confidence: dictCreate() };
  const dirs: Record<string, string> = dictCreate();
  const pair: Required<PairOptions> = { chosen: dictCreate(), patterns: dictCreate(), why: dictCreate() };
  const classesPath = description?.classes ?? (paths.includes('classes.json') ? 'classes.json' : null);
  const place = (id: string, spec: FolderSpec): string[] => {
    dirs[id] = spec.folder.replace(/^\.\/?/, '').replace(/\/+$/, '');
    if (spec.suffix !== undefined) pair.chosen[id] = spec.suffix;
    if (spec.pattern !== undefined) pair.patterns[id] = spec.pattern;
    return filesIn(paths, dirs[id]);
  };
  if (description) {
    listing.truth = place('truth', description.truth);
    if (listing.truth.length === 0) return fail(DESCRIPTION_FILE, `"truth": no files under ${description.truth.folder}/`);
    if (description.images) listing.images = place('images', description.images);
    for (const [run, spec] of Object.entries(description.predictions ?? {})) {
      listing.predictions[run] = place(`predictions/${run}`, spec);
      if (listing.predictions[run].length === 0) return fail(DESCRIPTION_FILE, `"predictions.${run}": no files under ${spec.folder}/`);
    }
    for (const [run, spec] of Object.entries(description.confidence ?? {})) {
      if (!description.predictions?.[run]) return fail(DESCRIPTION_FILE, `"confidence.${run}": no run named "${run}" in "predictions"`);
      listing.confidence![run] = place(`confidence/${run}`, spec);
    }
    if (description.instances) listing.instances = place('instances', description.instances);
    return ok({ listing, dirs, classesPath, listPath: description.list ?? null, pair, how: DESCRIPTION_FILE });
  }
  const truth = topFolder(paths, TRUTH_NAMES);
  if (!truth) return fail('', `no ground-truth folder found: ${LAYOUT_EXPECTED}. Found: ${rootSummary(paths)}`);
  listing.truth = place('truth', { folder: truth });
  const images = topFolder(paths, IMAGE_NAMES);
  if (images) listing.images = place('images', { folder: images });
  const preds = topFolder(paths, PRED_NAMES);
  if (preds) {
    const files = filesIn(paths, preds);
    if (files.some((f) => !f.includes('/'))) listing.predictions[preds] = place(`predictions/${preds}`, { folder: preds });
    else {
      const runs = new Set(files.map((f) => f.slice(0, f.indexOf('/'))));
      for (const run of [...runs].sort(naturalCompare)) listing.predictions[run] = place(`predictions/${run}`, { folder: `${preds}/${run}` });
    }
  }
  const conf = topFolder(paths, ['confidence']);
  if (conf) {
    const runs = new Set(filesIn(paths, conf).filter((f) => f.includes('/')).map((f) => f.slice(0, f.indexOf('/'))));
    for (const run of runs) if (listing.predictions[run]) listing.confidence![run] = place(`confidence/${run}`, { folder: `${conf}/${run}` });
  }
  const instances = topFolder(paths, ['instances']);
  if (instances) listing.instances = place('instances', { folder: instances });
  return ok({ listing, dirs, classesPath, listPath: null, pair, how: 'folder names' });
}
