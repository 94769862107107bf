import { dictCreate } from '../core/dict.ts';
import { fileExt, fileStem, folderGroups, folderKeys, stemAliases, type KeyedFile } from './frameKeys.ts';
import { naturalCompare } from './naturalSort.ts';

export { fileStem } from './frameKeys.ts';

/** File names found in each folder of a dataset (paths relative to that folder, `/`-separated). */
export interface DatasetListing {
  images: string[];
  truth: string[];
  /** Run name → files in `predictions/<run>/`. */
  predictions: Record<string, string[]>;
  /** Run name → files of its optional confidence maps. */
  confidence?: Record<string, string[]>;
  /** Optional instance maps (16-bit ids, 0 = no instance), for iIoU. */
  instances?: string[];
}

/** The files that make up one frame, paired by frame key. Paths are relative to their folder. */
export interface FrameFiles {
  name: string;
  image: string | null;
  truth: string;
  /** Run name → prediction file, or null when the run has no file for this frame. */
  predictions: Record<string, string | null>;
  confidence: Record<string, string | null>;
  /** The frame's instance map, when the dataset has them. */
  instance?: string | null;
}

/** A file that could not be matched to a frame, and why. */
export interface UnpairedFile {
  folder: string;
  file: string;
  reason: string;
}

/** A file that matches more than one frame (or a frame matched by more than one file): never paired by guess. */
export interface AmbiguousFile {
  folder: string;
  file: string;
  /** The files it could pair with. */
  candidates: string[];
}

/** A folder holding several encodings of each frame (suffix groups), and the one used. */
export interface GroupChoice {
  folder: string;
  /** Each group's suffix ('' for none) and number of files. */
  groups: { tail: string; files: number; sample: string }[];
  chosen: string;
  /** Why this group was chosen (filled by the probe of src/data/labelGroups.ts, else the default rule). */
  why: string;
}

/** Frames in natural order of their keys, plus every file left out, every ambiguity and group choice. */
export interface Pairing {
  frames: FrameFiles[];
  runs: string[];
  unpaired: UnpairedFile[];
  /** Absent in pairings made by hand (tests, the demo): read as empty. */
  ambiguous?: AmbiguousFile[];
  groups?: GroupChoice[];
  /** Things the user should know about how the files paired (no photos paired, …). */
  warnings?: string[];
}

/** Options of datasetPair per folder (`truth`, `images`, `predictions/<run>`, …): the suffix group to use, or a key pattern. */
export interface PairOptions {
  chosen?: Record<string, string>;
  /** A regular expression over the path without extension whose first group is the frame key. */
  patterns?: Record<string, string>;
  /** Why a folder's suffix group was chosen, when a probe (not the description file) chose it. */
  why?: Record<string, string>;
}

const LABEL_EXT = ['.png'];
const PHOTO_EXT = ['.png', '.jpg', '.jpeg', '.webp'];

function isHidden(path: string): boolean {
  return path.split('/').some((part) => part.startsWith('.'));
}

/** Returns key → file for one folder after choosing its suffix group, reporting wrong types and keys that occur twice. */
function indexFolder(
  folder: string, files: string[], exts: string[], out: { unpaired: UnpairedFile[]; groups: GroupChoice[] }, chosen?: string, pattern?: string, why?: string,
): Map<string, string> {
  const kept: string[] = [];
  for (const file of [...files].sort(naturalCompare)) {
    if (isHidden(file)) continue;
    // A JSON of shapes beside label maps is another encoding of a frame: grouped, never used as one.
    if (!exts.includes(fileExt(file)) && !(exts === LABEL_EXT && fileExt(file) === '.json')) {
      out.unpaired.push({ folder, file, reason: `not a supported file type here (expected ${exts.join(', ')})` });
      continue;
    }
    kept.push(file);
  }
  let keyed: KeyedFile[] = pattern === undefined ? folderKeys(kept) : patternKeys(folder, kept, pattern, out.unpaired);
  const groups = pattern === undefined ? folderGroups(keyed) : [];
  if (groups.length) {
    const usable = groups.filter((g) => g.files.some((f) => exts.includes(fileExt(f.file))));
    const pick = groups.find((g) => g.tail === chosen) ?? usable[0] ?? groups[0];
    const others = new Set(groups.filter((g) => g !== pick).map((g) => g.tail));
    out.groups.push({
      folder,
      groups: groups.map((g) => ({ tail: g.tail, files: g.files.length, sample: g.files[0].file })),
      chosen: pick.tail,
      why: chosen === pick.tail ? (why ?? 'chosen in the description file') : 'the largest group of files that can hold label ids',
    });
    keyed = keyed.filter((k) => !others.has(k.tail));
  }
  const index = new Map<string, string>();
  const dupes = new Set<string>();
  for (const { file, key } of keyed) {
    if (!exts.includes(fileExt(file))) {
      out.unpaired.push({ folder, file, reason: 'a JSON file is not a label map (label maps are PNG)' });
      continue;
    }
    const prior = index.get(key);
    if (prior !== undefined) {
      dupes.add(key);
      out.unpaired.push({ folder, file, reason: `same frame key "${key}" as ${prior}; keep one file per frame` });
      continue;
    }
    index.set(key, file);
  }
  for (const key of dupes) {
    const file = index.get(key)!;
    out.unpaired.push({ folder, file, reason: 'another file has the same frame key; this frame is left out until one is removed' });
    index.delete(key);
  }
  return index;
}

/** Returns the files whose path (without extension) matches `pattern`, keyed by its first group; the rest are reported. */
function patternKeys(folder: string, files: string[], pattern: string, unpaired: UnpairedFile[]): KeyedFile[] {
  const re = new RegExp(pattern);
  const out: KeyedFile[] = [];
  for (const file of files) {
    const m = re.exec(fileStem(file));
    if (m && m[1]) out.push({ file, key: m[1], tail: '' });
    else unpaired.push({ folder, file, reason: `does not match the key pattern ${pattern} of hairline.json` });
  }
  return out;
}

/** Looks a key up among the truth keys: exactly, then by its last path part (nested against flat), then by its aliases. */
function truthMatcher(truthKeys: string[]): (key: string) => string[] {
  const exact = new Set(truthKeys);
  const byBase = new Map<string, string[]>();
  const byAlias = new Map<string, string[]>();
  const push = (m: Map<string, string[]>, k: string, v: string) => {
    const list = m.get(k) ?? m.set(k, []).get(k)!;
    if (!list.includes(v)) list.push(v);
  };
  for (const k of truthKeys) {
    const aliases = stemAliases(k);
    push(byBase, aliases[0], k);
    for (const a of aliases) push(byAlias, a, k);
  }
  return (key) => {
    if (exact.has(key)) return [key];
    const aliases = stemAliases(key);
    const base = byBase.get(aliases[0]);
    if (base) return base;
    for (const a of aliases) {
      const hit = byAlias.get(a);
      if (hit) return hit;
    }
    return [];
  };
}

/** Matches one folder's keys to truth keys; returns truth key → file, reporting ambiguities and files without a frame. */
function folderMatch(
  folder: string, index: Map<string, string>, match: (key: string) => string[], truthFile: Map<string, string>,
  out: { unpaired: UnpairedFile[]; ambiguous: AmbiguousFile[] },
): Map<string, string> {
  const claims = new Map<string, string[]>();
  for (const [key, file] of index) {
    const hits = match(key);
    if (hits.length === 0) out.unpaired.push({ folder, file, reason: 'no ground-truth file with this frame key' });
    else if (hits.length > 1) out.ambiguous.push({ folder, file, candidates: hits.map((h) => `truth/${truthFile.get(h)}`) });
    else (claims.get(hits[0]) ?? claims.set(hits[0], []).get(hits[0])!).push(file);
  }
  const result = new Map<string, string>();
  for (const [truthKey, files] of claims) {
    if (files.length === 1) result.set(truthKey, files[0]);
    else for (const file of files) out.ambiguous.push({ folder, file, candidates: files.filter((f) => f !== file).map((f) => `${folder}/${f}`).concat(`truth/${truthFile.get(truthKey)}`) });
  }
  return result;
}

/**
 * Pairs the files of a dataset by frame key (src/data/frameKeys.ts): suffixes shared by a folder's
 * files are stripped, a nested `site/key` pairs with a flat `key` when only one truth file has that
 * key, and a folder holding several encodings per frame uses one suffix group. A frame exists for every
 * ground-truth file; photos and predictions without a ground-truth partner are reported, as is every
 * run missing a frame and every file that could pair with more than one frame (never guessed).
 */
export function datasetPair(listing: DatasetListing, options: PairOptions = {}): Pairing {
  const out = { unpaired: [] as UnpairedFile[], ambiguous: [] as AmbiguousFile[], groups: [] as GroupChoice[] };
  const chosen = options.chosen ?? {};
  const pat = options.patterns ?? {};
  const truth = indexFolder('truth', listing.truth, LABEL_EXT, out, chosen.truth, pat.truth, options.why?.truth);
  const truthFile = truth;
  const match = truthMatcher([...truth.keys()]);
  const images = folderMatch('images', indexFolder('images', listing.images, PHOTO_EXT, out, chosen.images, pat.images), match, truthFile, out);
  const runs = Object.keys(listing.predictions).sort(naturalCompare);
  const preds = new Map(runs.map((r) => {
    const folder = `predictions/${r}`;
    return [r, folderMatch(folder, indexFolder(folder, listing.predictions[r], LABEL_EXT, out, chosen[folder], pat[folder], options.why?.[folder]), match, truthFile, out)];
  }));
  const confRuns = Object.keys(listing.confidence ?? {}).sort(naturalCompare);
  const confs = new Map(confRuns.map((r) => {
    const folder = `confidence/${r}`;
    return [r, folderMatch(folder, indexFolder(folder, listing.confidence![r], LABEL_EXT, out, chosen[folder], pat[folder]), match, truthFile, out)];
  }));

  const instances = listing.instances?.length
    ? folderMatch('instances', indexFolder('instances', listing.instances, LABEL_EXT, out, chosen.instances), match, truthFile, out)
    : null;

  const names = [...truth.keys()].sort(naturalCompare);
  const frames: FrameFiles[] = names.map((name) => {
    const predictions = dictCreate<string | null>();
    for (const r of runs) {
      const file = preds.get(r)!.get(name) ?? null;
      predictions[r] = file;
      if (file === null) out.unpaired.push({ folder: `predictions/${r}`, file: name, reason: `run "${r}" has no prediction for frame ${name}` });
    }
    const confidence = dictCreate<string | null>();
    for (const r of confRuns) confidence[r] = confs.get(r)!.get(name) ?? null;
    const frame: FrameFiles = { name, image: images.get(name) ?? null, truth: truth.get(name)!, predictions, confidence };
    if (instances) frame.instance = instances.get(name) ?? null;
    return frame;
  });
  const warnings: string[] = [];
  const photos = listing.images.filter((f) => !isHidden(f)).length;
  if (photos > 0 && frames.length > 0 && !frames.some((f) => f.image)) {
    warnings.push(`none of the ${photos} photos pairs with a frame (photo ${listing.images[0]} against truth ${frames[0].truth}); image evidence and photo crops are off`);
  }
  return { frames, runs, unpaired: out.unpaired, ambiguous: out.ambiguous, groups: out.groups, warnings };
}
