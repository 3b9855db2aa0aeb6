/** React binding of the vanilla store: one store per app, read through selectors only. */
import { createContext, createElement, useContext, type ReactNode } from 'react';
import { useStore } from 'zustand';
import type { PlumbState, PlumbStore } from '../store/store';

const StoreContext = createContext<PlumbStore | null>(null);

export function StoreProvider({ store, children }: { store: PlumbStore; children: ReactNode }) {
  return createElement(StoreContext.Provider, { value: store }, children);
}

/** The store itself (for actions and transient subscriptions). */
export function usePlumbStore(): PlumbStore {
  const s = useContext(StoreContext);
  if (!s) throw new Error('app: usePlumbStore must be inside <StoreProvider>');
  return s;
}

/** A slice of the state; re-renders only when the selected value changes (Object.is). */
export function usePlumb<T>(selector: (s: PlumbState) => T): T {
  return useStore(usePlumbStore(), selector);
}
