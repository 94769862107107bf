import type { StateCreator } from 'zustand/vanilla';
import { DEFAULT_SCORE_SETTINGS, type ScoreSettings } from '../core/metrics/settings.ts';
import type { AppState } from './store.ts';

export interface SettingsSlice {
  /** Score settings (src/docs/metrics.md); changing any of them rescores every frame. */
  settings: ScoreSettings;
  settingsSet(patch: Partial<ScoreSettings>): void;
}

/** Returns the score-settings slice of the app store. */
export const settingsSlice: StateCreator<AppState, [], [], SettingsSlice> = (set, get) => ({
  settings: { ...DEFAULT_SCORE_SETTINGS },
  settingsSet: (patch) => {
    const next = { ...get().settings, ...patch };
    const cur = get().settings;
    if (next.ignore === cur.ignore && next.biouDilationRatio === cur.biouDilationRatio && next.bfTolerance === cur.bfTolerance) return;
    set({ settings: next });
  },
});
