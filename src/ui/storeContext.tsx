import { createContext, useContext, type ReactNode } from 'react';
import { useStore } from 'zustand';
import { useShallow } from 'zustand/react/shallow';
import type { AppState, AppStore } from '../state/store.ts';
import type { ViewPool } from '../workers/scorePool.ts';

const StoreContext = createContext<AppStore | null>(null);
const ViewPoolContext = createContext<ViewPool | null>(null);

/** Makes `store` (and the view workers, for exports) available to every component below. */
export function StoreProvider({ store, viewPool, children }: { store: AppStore; viewPool?: ViewPool; children: ReactNode }) {
  return (
    <StoreContext.Provider value={store}>
      <ViewPoolContext.Provider value={viewPool ?? null}>{children}</ViewPoolContext.Provider>
    </StoreContext.Provider>
  );
}

/** Returns the pool of view workers (frames decoded for the viewer and for tile exports). */
export function useViewPool(): ViewPool {
  const pool = useContext(ViewPoolContext);
  if (!pool) throw new Error('useViewPool outside StoreProvider with a viewPool');
  return pool;
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
