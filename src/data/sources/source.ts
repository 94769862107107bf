import { dictCreate } from '../../core/dict.ts';
import type { DatasetListing, PairOptions, Pairing } from '../pairing.ts';

/** Where a dataset's files come from: the built-in demo, a folder served by `npm start`, or a folder dropped on the page. */
export interface DatasetSource {
  kind: 'demo' | 'served' | 'folder';
  /** Shown to the user; also part of the dataset fingerprint. */
  title: string;
  listing: DatasetListing;
  /** Text of classes.json, or null when the dataset has none. */
  classesText: string | null;
  /** Suffix groups and key patterns from hairline.json (served and dropped folders). */
  pair?: PairOptions;
  /** Text of the list file of frames to use, or null / absent for every frame. */
  listText?: string | null;
  /** The pairing of `listing` with `pair`, when opening the source made it already (absent: pair when loading). */
  paired?: Pairing;
  /** How the folders were found ("hairline.json" or "folder names"), for the "opened" panel. */
  how?: string;
  /** Returns the bytes of `path` inside `folder` (`images`, `truth`, `predictions/<run>`, `confidence/<run>`). */
  read(folder: string, path: string): Promise<Blob>;
  /** Frees what the source holds (workers, cached files) once another dataset replaces it. */
  close?(): void;
}

/** Splits `a/b/c.png` under a dataset root into its top folder and the rest, for the layout of src/docs/design.md. */
export function datasetPathSplit(path: string): { folder: string; rest: string } | null {
  const parts = path.split('/').filter((p) => p !== '' && p !== '.');
  if (parts.length < 2) return null;
  if ((parts[0] === 'predictions' || parts[0] === 'confidence') && parts.length >= 3) {
    return { folder: `${parts[0]}/${parts[1]}`, rest: parts.slice(2).join('/') };
  }
  return { folder: parts[0], rest: parts.slice(1).join('/') };
}

/** Returns the dataset listing of a flat list of paths relative to the dataset root, and the classes.json path. */
export function listingFromPaths(paths: string[]): { listing: DatasetListing; classesPath: string | null; ignored: string[] } {
  const listing: DatasetListing = { images: [], truth: [], predictions: dictCreate(), confidence: dictCreate() };
  let classesPath: string | null = null;
  const ignored: string[] = [];
  for (const path of paths) {
    const clean = path.split('/').filter((p) => p !== '' && p !== '.').join('/');
    if (clean === 'classes.json') {
      classesPath = clean;
      continue;
    }
    const split = datasetPathSplit(clean);
    if (!split) {
      if (clean !== 'hairline.json' && !clean.startsWith('.')) ignored.push(clean);
      continue;
    }
    const { folder, rest } = split;
    if (folder === 'images') listing.images.push(rest);
    else if (folder === 'truth') listing.truth.push(rest);
    else if (folder.startsWith('predictions/')) (listing.predictions[folder.slice(12)] ??= []).push(rest);
    else if (folder.startsWith('confidence/')) (listing.confidence![folder.slice(11)] ??= []).push(rest);
    else ignored.push(clean);
  }
  return { listing, classesPath, ignored };
}
