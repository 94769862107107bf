import type { PickedFile } from '../data/sources/folderSource.ts';

/** Returns every file below a dropped folder/file entry, with paths relative to the drop. */
async function entryFiles(entry: FileSystemEntry, prefix: string, out: PickedFile[]): Promise<void> {
  if (entry.isFile) {
    const file = await new Promise<File>((resolve, reject) => (entry as FileSystemFileEntry).file(resolve, reject));
    out.push({ path: prefix + entry.name, file });
    return;
  }
  if (!entry.isDirectory) return;
  const reader = (entry as FileSystemDirectoryEntry).createReader();
  // readEntries returns at most ~100 entries per call; read until it returns none.
  for (;;) {
    const batch = await new Promise<FileSystemEntry[]>((resolve, reject) => reader.readEntries(resolve, reject));
    if (batch.length === 0) break;
    for (const child of batch) await entryFiles(child, `${prefix}${entry.name}/`, out);
  }
}

/** Returns the files of a drop (folders walked recursively). */
export async function droppedFiles(data: DataTransfer): Promise<PickedFile[]> {
  const entries = [...data.items].map((i) => i.webkitGetAsEntry?.()).filter((e): e is FileSystemEntry => !!e);
  const out: PickedFile[] = [];
  if (entries.length) {
    for (const e of entries) await entryFiles(e, '', out);
    return out;
  }
  return [...data.files].map((f) => ({ path: f.name, file: f }));
}

/** Returns the files of an `<input webkitdirectory>` selection with their relative paths. */
export function inputFiles(list: FileList): PickedFile[] {
  return [...list].map((f) => ({ path: f.webkitRelativePath || f.name, file: f }));
}

interface FsHandle {
  kind: 'file' | 'directory';
  name: string;
  getFile?: () => Promise<File>;
  values?: () => AsyncIterable<FsHandle>;
}
type DirHandle = FsHandle & { values(): AsyncIterable<FsHandle> };

/** Returns the files below a directory handle from `showDirectoryPicker`. */
export async function directoryHandleFiles(dir: DirHandle, prefix = ''): Promise<PickedFile[]> {
  const out: PickedFile[] = [];
  for await (const h of dir.values()) {
    if (h.kind === 'file' && h.getFile) out.push({ path: `${prefix}${h.name}`, file: await h.getFile() });
    else if (h.kind === 'directory' && h.values) out.push(...(await directoryHandleFiles(h as DirHandle, `${prefix}${h.name}/`)));
  }
  return out;
}

/** True when the browser offers the directory picker (Chromium does; others use the folder input). */
export function hasDirectoryPicker(): boolean {
  return typeof (window as unknown as { showDirectoryPicker?: unknown }).showDirectoryPicker === 'function';
}

/** Opens the browser's directory picker and returns the chosen folder's files (null if cancelled). */
export async function directoryPick(): Promise<PickedFile[] | null> {
  try {
    const dir = await (window as unknown as { showDirectoryPicker(o: object): Promise<DirHandle> }).showDirectoryPicker({ mode: 'read' });
    return directoryHandleFiles(dir);
  } catch (e) {
    if ((e as DOMException).name === 'AbortError') return null;
    throw e;
  }
}
