import { naturalCompare } from './naturalSort.ts';

/** File names found in each folder of a dataset (paths relative to that folder, `/`-separated). */
export interface DatasetListing {
  images: string[];
  truth: string[];
  /** Run name → files in `predictions/<run>/`. */
  predictions: Record<string, string[]>;
  /** Run name → files of its optional confidence maps. */
  confidence?: Record<string, string[]>;
}

/** The files that make up one frame, paired by stem. Paths are relative to their folder. */
export interface FrameFiles {
  name: string;
  image: string | null;
  truth: string;
  /** Run name → prediction file, or null when the run has no file for this frame. */
  predictions: Record<string, string | null>;
  confidence: Record<string, string | null>;
}

/** A file that could not be matched to a frame, and why. */
export interface UnpairedFile {
  folder: string;
  file: string;
  reason: string;
}

/** Frames in natural order of their names, plus every file left out and every gap. */
export interface Pairing {
  frames: FrameFiles[];
  runs: string[];
  unpaired: UnpairedFile[];
}

const LABEL_EXT = ['.png'];
const PHOTO_EXT = ['.png', '.jpg', '.jpeg', '.webp'];

/** Returns the file name without its last extension (the directory part is kept: `a/b.png` → `a/b`). */
export function fileStem(path: string): string {
  const slash = path.lastIndexOf('/');
  const dot = path.lastIndexOf('.');
  return dot > slash + 1 ? path.slice(0, dot) : path;
}

function extOf(path: string): string {
  const stem = fileStem(path);
  return path.slice(stem.length).toLowerCase();
}

function isHidden(path: string): boolean {
  return path.split('/').some((part) => part.startsWith('.'));
}

/** Returns stem → file for one folder, reporting wrong types and stems that occur twice. */
function indexFolder(folder: string, files: string[], exts: string[], unpaired: UnpairedFile[]): Map<string, string> {
  const index = new Map<string, string>();
  const dupes = new Set<string>();
  for (const file of [...files].sort(naturalCompare)) {
    if (isHidden(file)) continue;
    if (!exts.includes(extOf(file))) {
      unpaired.push({ folder, file, reason: `not a supported file type here (expected ${exts.join(', ')})` });
      continue;
    }
    const stem = fileStem(file);
    const prior = index.get(stem);
    if (prior !== undefined) {
      dupes.add(stem);
      unpaired.push({ folder, file, reason: `same name as ${prior}; keep one file per frame` });
      continue;
    }
    index.set(stem, file);
  }
  for (const stem of dupes) {
    const file = index.get(stem)!;
    unpaired.push({ folder, file, reason: 'another file has the same name; this frame is left out until one is removed' });
    index.delete(stem);
  }
  return index;
}

/**
 * Pairs the files of a dataset by stem. A frame exists for every ground-truth file; photos and
 * prediction files without a ground-truth partner are reported, as is every run missing a frame.
 */
export function datasetPair(listing: DatasetListing): Pairing {
  const unpaired: UnpairedFile[] = [];
  const truth = indexFolder('truth', listing.truth, LABEL_EXT, unpaired);
  const images = indexFolder('images', listing.images, PHOTO_EXT, unpaired);
  const runs = Object.keys(listing.predictions).sort(naturalCompare);
  const preds = new Map(runs.map((r) => [r, indexFolder(`predictions/${r}`, listing.predictions[r], LABEL_EXT, unpaired)]));
  const confRuns = Object.keys(listing.confidence ?? {}).sort(naturalCompare);
  const confs = new Map(
    confRuns.map((r) => [r, indexFolder(`confidence/${r}`, listing.confidence![r], LABEL_EXT, unpaired)]),
  );

  const names = [...truth.keys()].sort(naturalCompare);
  const frames: FrameFiles[] = names.map((name) => {
    const predictions: Record<string, string | null> = {};
    for (const r of runs) {
      const file = preds.get(r)!.get(name) ?? null;
      predictions[r] = file;
      if (file === null) {
        unpaired.push({ folder: `predictions/${r}`, file: name, reason: `run "${r}" has no prediction for frame ${name}` });
      }
    }
    const confidence: Record<string, string | null> = {};
    for (const r of confRuns) confidence[r] = confs.get(r)!.get(name) ?? null;
    return { name, image: images.get(name) ?? null, truth: truth.get(name)!, predictions, confidence };
  });

  const known = new Set(names);
  for (const [stem, file] of images) {
    if (!known.has(stem)) unpaired.push({ folder: 'images', file, reason: 'no ground-truth file with this name' });
  }
  for (const [r, index] of preds) {
    for (const [stem, file] of index) {
      if (!known.has(stem)) unpaired.push({ folder: `predictions/${r}`, file, reason: 'no ground-truth file with this name' });
    }
  }
  for (const [r, index] of confs) {
    for (const [stem, file] of index) {
      if (!known.has(stem)) unpaired.push({ folder: `confidence/${r}`, file, reason: 'no ground-truth file with this name' });
    }
  }
  return { frames, runs, unpaired };
}
