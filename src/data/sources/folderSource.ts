import type { DatasetSource } from './source.ts';
import { layoutPath, sourceFieldsOf, sourceLayoutOpen } from './sourceLayout.ts';

/** A file of a dropped or picked folder with its path relative to the folder that was chosen. */
export interface PickedFile {
  path: string;
  file: Blob;
}

const LAYOUT_FOLDERS = new Set(['images', 'truth', 'predictions', 'confidence', 'hairline.json']);

/**
 * Returns the paths with the chosen folder's own name removed when the files sit one level down
 * (`kq/truth/a.png` → `truth/a.png`), which is how browsers report a picked or dropped folder.
 */
export function pickedPathsRoot(paths: string[]): { prefix: string; title: string } {
  const tops = new Set(paths.map((p) => p.split('/')[0]));
  if ([...tops].some((t) => LAYOUT_FOLDERS.has(t) || t === 'classes.json')) return { prefix: '', title: 'dropped folder' };
  if (tops.size === 1) {
    const top = [...tops][0];
    return { prefix: top + '/', title: top };
  }
  return { prefix: '', title: 'dropped files' };
}

/** Returns a dataset source over files the user dropped or picked (nothing is uploaded anywhere). */
export async function folderSourceOpen(files: PickedFile[]): Promise<DatasetSource> {
  const { prefix, title } = pickedPathsRoot(files.map((f) => f.path));
  const byPath = new Map<string, Blob>();
  for (const f of files) {
    if (!f.path.startsWith(prefix)) continue;
    byPath.set(f.path.slice(prefix.length), f.file);
  }
  const layout = await sourceLayoutOpen([...byPath.keys()], (path) => byPath.get(path)!.text(), async (path) => new Uint8Array(await byPath.get(path)!.arrayBuffer()));
  return {
    kind: 'folder',
    title,
    ...sourceFieldsOf(layout),
    async read(folder, path) {
      const at = layoutPath(layout, folder, path);
      const blob = byPath.get(at);
      if (!blob) throw new Error(`${at}: not in the dropped folder`);
      return blob;
    },
  };
}
