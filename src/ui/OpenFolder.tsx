import { useRef } from 'react';
import { folderSourceOpen, type PickedFile } from '../data/sources/folderSource.ts';
import { datasetFromSource, datasetInstall } from '../state/datasetLoad.ts';
import type { AppStore } from '../state/store.ts';
import { directoryPick, hasDirectoryPicker, inputFiles } from './pickedFiles.ts';
import { useAppStore } from './storeContext.tsx';

/** Opens the picked or dropped files as the dataset; an unusable folder leaves the current one in place. */
export async function filesOpen(store: AppStore, files: PickedFile[]): Promise<void> {
  const s = store.getState();
  if (files.length === 0) return s.datasetErrorSet('The folder is empty.');
  s.datasetLoadingSet(`Reading ${files.length} files…`);
  try {
    const source = await folderSourceOpen(files);
    const dataset = datasetFromSource(source);
    if (dataset.pairing.frames.length === 0) {
      const why = source.listing.truth.length === 0 ? 'it has no truth/ folder with label PNGs' : 'no ground-truth file could be paired';
      return s.datasetErrorSet(`Could not open "${source.title}": ${why}. Expected images/, truth/, predictions/<run>/ (see the README).`);
    }
    datasetInstall(store, dataset);
  } catch (e) {
    s.datasetErrorSet(`Could not open the folder: ${(e as Error).message}`);
  }
}

/** "Open folder": the directory picker where the browser has one, a folder input otherwise. */
export function OpenFolderButton() {
  const store = useAppStore();
  const input = useRef<HTMLInputElement>(null);
  return (
    <>
      <button
        onClick={async () => {
          if (!hasDirectoryPicker()) return input.current?.click();
          const files = await directoryPick().catch((e: Error) => {
            store.getState().datasetErrorSet(`Could not read the folder: ${e.message}`);
            return null;
          });
          if (files) await filesOpen(store, files);
        }}
        title="Open a dataset folder (images/, truth/, predictions/<run>/), or drop one on the page"
      >
        Open folder…
      </button>
      <input
        ref={input}
        type="file"
        className="folder-input"
        webkitdirectory=""
        multiple
        onChange={(e) => e.currentTarget.files && void filesOpen(store, inputFiles(e.currentTarget.files))}
      />
    </>
  );
}
