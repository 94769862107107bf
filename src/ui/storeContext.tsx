import { createContext, useContext, type ReactNode } from 'react';
import { useStore } from 'zustand';
import { useShallow } from 'zustand/react/shallow';
import type { AppState, AppStore } from '../state/store.ts';

const StoreContext = createContext<AppStore | null>(null);

/** Makes `store` available to every component below. */
export function StoreProvider({ store, children }: { store: AppStore; children: ReactNode }) {
  return <StoreContext.Provider value={store}>{children}</StoreContext.Provider>;
}

/** Returns the app store itself (for actions and non-React subscribers). */
export function useAppStore(): AppStore {
  const store = useContext(StoreContext);
  if (!store) throw new Error('useAppStore outside StoreProvider');
  return store;
}

/** Returns one value from the app state; the component re-renders only when it changes. */
export function useApp<T>(selector: (s: AppState) => T): T {
  return useStore(useAppStore(), selector);
}

/** Returns several values (an object or array) compared shallowly. */
export function useAppShallow<T>(selector: (s: AppState) => T): T {
  return useStore(useAppStore(), useShallow(selector));
}
