/** The last heading sweep, shared by its panel and its rose over the terrain in the 3D view. */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { HeadingSweepResult } from '../core';

export interface HeadingSweepShown {
  /** The sweep drawn over the terrain, or null (none, or hidden). */
  readonly shown: HeadingSweepResult | null;
  setShown(r: HeadingSweepResult | null): void;
}

export const headingSweepStore = createStore<HeadingSweepShown>((set) => ({ shown: null, setShown: (r) => set({ shown: r }) }));

export function useHeadingSweepShown<T>(selector: (s: HeadingSweepShown) => T): T {
  return useStore(headingSweepStore, selector);
}

/** Metres of rose radius per degree of extra tilt to the tip, over the terrain. */
export const ROSE_M_PER_DEG = 0.1;
