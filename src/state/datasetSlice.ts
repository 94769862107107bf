import type { StateCreator } from 'zustand/vanilla';
import type { ClassTable } from '../core/classTable.ts';
import type { Opened } from '../data/opened.ts';
import type { Pairing } from '../data/pairing.ts';
import type { DatasetSource } from '../data/sources/source.ts';
import type { AppState } from './store.ts';

/** A dataset ready to inspect: where its files come from, how they pair, and its class table. */
export interface LoadedDataset {
  /** Fingerprint of the dataset (source title and frame names); keys persisted review data. */
  key: string;
  title: string;
  source: DatasetSource;
  pairing: Pairing;
  /** The table from classes.json, or null when the dataset has none (ids are then named by number). */
  table: ClassTable | null;
  /** Why classes.json could not be used, or null. */
  tableError: string | null;
  /** What was opened and how (pairing, groups, id maps, warnings), for the "opened" panel; absent for hand-made datasets. */
  opened?: Opened & { how: string | null };
}

export interface DatasetSlice {
  dataset: LoadedDataset | null;
  /** A message while a dataset is being opened, or null. */
  datasetLoading: string | null;
  /** Why the last dataset could not be opened, or null. */
  datasetError: string | null;
  datasetSet(dataset: LoadedDataset): void;
  datasetLoadingSet(message: string | null): void;
  datasetErrorSet(message: string | null): void;
}

/** Returns the dataset slice of the app store. */
export const datasetSlice: StateCreator<AppState, [], [], DatasetSlice> = (set) => ({
  dataset: null,
  datasetLoading: null,
  datasetError: null,
  datasetSet: (dataset) => set({ dataset, datasetError: null, datasetLoading: null }),
  datasetLoadingSet: (datasetLoading) => set({ datasetLoading }),
  datasetErrorSet: (datasetError) => set({ datasetError, datasetLoading: null }),
});

/** Returns a fingerprint of a dataset from its title and frame names (FNV-1a, 32-bit, hex). */
export function datasetKey(title: string, frameNames: readonly string[]): string {
  let h = 0x811c9dc5;
  const feed = (s: string) => {
    for (let i = 0; i < s.length; i++) {
      h ^= s.charCodeAt(i);
      h = Math.imul(h, 0x01000193) >>> 0;
    }
    h ^= 0x1f;
    h = Math.imul(h, 0x01000193) >>> 0;
  };
  feed(title);
  for (const n of frameNames) feed(n);
  return `${frameNames.length}-${h.toString(16).padStart(8, '0')}`;
}
