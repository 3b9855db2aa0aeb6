/**
 * What the app's shell tells the user about this visit, outside the scenario store: a share link
 * that was opened (and where the earlier work was kept), a new version ready to load, and the
 * autosave controller (save status, another tab's newer work).
 */
import { createStore } from 'zustand/vanilla';
import type { AutosaveController } from './persist';

export interface SessionState {
  /** A share link opened at start: its scenario's name, and the garage entry the earlier work was kept as (null: none kept). */
  readonly linkOpened: { readonly name: string; readonly keptAs: string | null } | null;
  /** A new build of the app is installed: a reload shows it. */
  readonly updateReady: boolean;
  readonly autosave: AutosaveController | null;
}

export const session = createStore<SessionState>()(() => ({ linkOpened: null, updateReady: false, autosave: null }));
