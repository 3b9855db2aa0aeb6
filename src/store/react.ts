/** React binding of the vanilla store: one store per app, read through selectors only. */
import { createContext, createElement, useContext, useRef, type ReactNode } from 'react';
import { useStore } from 'zustand';
import type { Scenario } from '../core';
import type { PlumbState, PlumbStore } from './store';

const StoreContext = createContext<PlumbStore | null>(null);

export function StoreProvider({ store, children }: { store: PlumbStore; children: ReactNode }) {
  return createElement(StoreContext.Provider, { value: store }, children);
}

/** The store itself (for actions and transient subscriptions). */
export function usePlumbStore(): PlumbStore {
  const s = useContext(StoreContext);
  if (!s) throw new Error('store: usePlumbStore must be inside <StoreProvider>');
  return s;
}

/** A slice of the state; re-renders only when the selected value changes (Object.is). */
export function usePlumb<T>(selector: (s: PlumbState) => T): T {
  return useStore(usePlumbStore(), selector);
}

/** Whether two scenarios differ in nothing but the pose (by reference, key by key). */
function samePoseAside(a: Scenario, b: Scenario): boolean {
  for (const k of Object.keys(b) as (keyof Scenario)[]) if (k !== 'pose' && a[k] !== b[k]) return false;
  return Object.keys(a).length === Object.keys(b).length;
}

/**
 * The scenario for panels whose content does not depend on where the vehicle stands (a pass along
 * the path, a comparison, a line sweep): moving or dragging the vehicle does not re-render them,
 * so dragging stays smooth. Its `pose` may be out of date; read the live one from the store.
 */
export function useScenarioPoseAside(): Scenario {
  const last = useRef<Scenario | null>(null);
  return useStore(usePlumbStore(), (s) => {
    const prev = last.current;
    if (prev !== null && (prev === s.scenario || samePoseAside(prev, s.scenario))) return prev;
    last.current = s.scenario;
    return s.scenario;
  });
}
