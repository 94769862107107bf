import { useRef } from 'react';
import { useCommand } from './commands/useCommand.tsx';
import { directoryPick, hasDirectoryPicker, inputFiles } from './pickedFiles.ts';

/** "Open folder": the directory picker where the browser has one, a folder input otherwise. */
export function OpenFolderButton() {
  const run = useCommand();
  const input = useRef<HTMLInputElement>(null);
  return (
    <>
      <button
        onClick={async () => {
          if (!hasDirectoryPicker()) return input.current?.click();
          await run('dataset.openFiles', directoryPick);
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
        onChange={(e) => {
          const files = e.currentTarget.files;
          if (files) void run('dataset.openFiles', async () => inputFiles(files));
        }}
      />
    </>
  );
}
