import type { AppStore } from './store.ts';
import { PANE_WIDTH_MAX, PANE_WIDTH_MIN, type PaneWidths } from './viewSlice.ts';

/** The storage pane widths are kept in (the page's localStorage, or a stand-in in tests). */
export type PaneStorage = Pick<Storage, 'getItem' | 'setItem'>;

/** Storage key of the pane widths; the number is the layout's version. */
export const PANE_WIDTHS_KEY = 'hairline.paneWidths.v1';

/** Returns the pane widths stored under PANE_WIDTHS_KEY, or null when none (or none readable) are stored. */
export function paneWidthsRead(storage: PaneStorage): PaneWidths | null {
  let raw: unknown;
  try {
    raw = JSON.parse(storage.getItem(PANE_WIDTHS_KEY) ?? 'null');
  } catch {
    return null;
  }
  if (!raw || typeof raw !== 'object') return null;
  const fits = (v: unknown): v is number => typeof v === 'number' && v >= PANE_WIDTH_MIN && v <= PANE_WIDTH_MAX;
  const { left, right } = raw as Record<string, unknown>;
  return fits(left) && fits(right) ? { left, right } : null;
}

/** Restores the pane widths from `storage` and writes them back whenever they change; returns the stop function. */
export function paneKeep(store: AppStore, storage: PaneStorage): () => void {
  const kept = paneWidthsRead(storage);
  if (kept) store.getState().paneWidthsSet(kept);
  return store.subscribe(
    (s) => s.paneWidths,
    (w) => {
      try {
        storage.setItem(PANE_WIDTHS_KEY, JSON.stringify(w));
      } catch {
        // A full or refused storage only loses the widths for the next visit.
      }
    },
  );
}
