import { naturalCompare } from './naturalSort.ts';

/** A file of one folder with the frame key found for it and the suffix that was stripped ('' for none). */
export interface KeyedFile {
  file: string;
  key: string;
  tail: string;
}

/** Returns the file name without its last extension (the directory part is kept: `a/b.png` → `a/b`). */
export function fileStem(path: string): string {
  const slash = path.lastIndexOf('/');
  const dot = path.lastIndexOf('.');
  return dot > slash + 1 ? path.slice(0, dot) : path;
}

/** Returns the lower-case extension with its dot (`.png`), or '' when there is none. */
export function fileExt(path: string): string {
  return path.slice(fileStem(path).length).toLowerCase();
}

function splitDir(stem: string): { dir: string; base: string } {
  const slash = stem.lastIndexOf('/');
  return { dir: stem.slice(0, slash + 1), base: stem.slice(slash + 1) };
}

/**
 * Returns the suffixes of a file's base name that could name an encoding rather than a frame: each
 * starts at a `_`, `-` or `.` after the first character and the name ends with a letter
 * (`k_0001_gt_mask` → `_0001_gt_mask`, `_gt_mask`, `_mask`). A name ending in a digit has none, so
 * frame numbers are never taken for suffixes.
 */
export function stemTails(base: string): string[] {
  if (!/[A-Za-z]$/.test(base)) return [];
  const out: string[] = [];
  for (let i = 1; i < base.length; i++) if (base[i] === '_' || base[i] === '-' || base[i] === '.') out.push(base.slice(i));
  return out;
}

/** Returns the keys a file's stem might also go by: its base name without each possible suffix. */
export function stemAliases(stem: string): string[] {
  const { base } = splitDir(stem);
  return [base, ...stemTails(base).map((t) => base.slice(0, base.length - t.length))];
}

/**
 * Returns every file of a folder with its frame key: the stem without the suffix it shares with
 * other files of the folder. Each file takes the suffix shared by the most files (the longest on a
 * tie), so `a_gt.png`, `b_gt.png` key as `a`, `b`, and a folder holding `k_ids.png` and `k_color.png`
 * per frame splits into the groups `_ids` and `_color` with the same keys. A folder of one file keeps its stem.
 */
export function folderKeys(files: string[]): KeyedFile[] {
  const stems = files.map((file) => ({ file, ...splitDir(fileStem(file)) }));
  const count = new Map<string, number>();
  for (const s of stems) for (const t of stemTails(s.base)) count.set(t, (count.get(t) ?? 0) + 1);
  return stems
    .map(({ file, dir, base }) => {
      let tail = '';
      let best = 1;
      for (const t of stemTails(base)) {
        const n = count.get(t)!;
        if (n > best || (n === best && n > 1 && t.length > tail.length)) {
          tail = t;
          best = n;
        }
      }
      return { file, key: dir + base.slice(0, base.length - tail.length), tail };
    })
    .sort((a, b) => naturalCompare(a.file, b.file));
}

/** Suffix groups of a folder that hold the same frames in different encodings, largest first; empty for a plain folder. */
export function folderGroups(keyed: KeyedFile[]): { tail: string; files: KeyedFile[] }[] {
  const byTail = new Map<string, KeyedFile[]>();
  for (const k of keyed) (byTail.get(k.tail) ?? byTail.set(k.tail, []).get(k.tail)!).push(k);
  const groups = [...byTail].map(([tail, files]) => ({ tail, files })).sort((a, b) => b.files.length - a.files.length || naturalCompare(a.tail, b.tail));
  if (groups.length < 2) return [];
  const mainKeys = new Set(groups[0].files.map((f) => f.key));
  // A group is another encoding of the same frames when most of its keys are the main group's keys.
  const same = groups.filter((g, i) => {
    if (i === 0) return true;
    const hits = g.files.filter((f) => mainKeys.has(f.key)).length;
    return hits * 2 >= Math.min(g.files.length, mainKeys.size) && hits > 0;
  });
  return same.length > 1 ? same : [];
}
