import { useRef } from 'react';
import { useCommand } from './commands/useCommand.tsx';
import { directoryPick, hasDirectoryPicker, inputFiles } from './pickedFiles.ts';

/** A button that picks a folder (the directory picker where the browser has one, a folder input otherwise) and runs `command` on its files. */
function FolderPickButton({ command, label, title }: { command: 'dataset.openFiles' | 'results.openFiles'; label: string; title: string }) {
  const run = useCommand();
  const input = useRef<HTMLInputElement>(null);
  return (
    <>
      <button
        onClick={async () => {
          if (!hasDirectoryPicker()) return input.current?.click();
          await run(command, directoryPick);
        }}
        title={title}
      >
        {label}
      </button>
      <input
        ref={input}
        type="file"
        className="folder-input"
        webkitdirectory=""
        multiple
        onChange={(e) => {
          const files = e.currentTarget.files;
          if (files) void run(command, async () => inputFiles(files));
        }}
      />
    </>
  );
}

/** "Open folder": a dataset folder. */
export function OpenFolderButton() {
  return <FolderPickButton command="dataset.openFiles" label="Open folder…" title="Open a dataset folder (images/, truth/, predictions/<run>/), or drop one on the page" />;
}

/** "Open results…": a results folder of the dataset on screen (summary.json and its tables); also by dropping it on the page. */
export function OpenResultsButton() {
  return (
    <FolderPickButton
      command="results.openFiles"
      label="Open results…"
      title="Open a results folder of this dataset (npm run score -- --results DIR), or drop one on the page: its scores show at once, without scoring again"
    />
  );
}
