/**
 * Autosave, restore and share links. The scenario is saved in its file form in metric units
 * (scenarioToFile), so a restored scenario goes through the same validation as an import.
 */
import { parseScenario, scenarioToFile, type Scenario, type UnitSystem } from '../core';
import type { PlumbStore } from './store';

export const AUTOSAVE_KEY = 'plumbline.autosave.v1';

/** The subset of the Web Storage API used here (localStorage in the app, a Map in tests). */
export interface KeyValueStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
}

interface SavedState {
  readonly scenario: unknown;
  readonly units: UnitSystem;
}

/**
 * Full precision: JSON keeps every double exactly (shortest round-trip form), and the file form
 * is written in the scenario's own units, so reload gives back the same numbers.
 */
export function serialiseScenario(s: Scenario): string {
  return JSON.stringify(scenarioToFile(s));
}

export function loadAutosave(storage: KeyValueStorage): { scenario: Scenario; units: UnitSystem } | null {
  let text: string | null;
  try {
    text = storage.getItem(AUTOSAVE_KEY);
  } catch {
    return null;
  }
  if (!text) return null;
  try {
    const saved = JSON.parse(text) as SavedState;
    const parsed = parseScenario(saved.scenario);
    if (!parsed.ok) return null;
    const units: UnitSystem = saved.units === 'imperial' ? 'imperial' : 'metric';
    return { scenario: parsed.scenario, units };
  } catch {
    return null;
  }
}

/** Shown (as an import warning) while autosave cannot write; removed once a save succeeds again. */
export const AUTOSAVE_FAILED_NOTE =
  'Autosave failed: the browser\'s storage for this site is full or turned off, so this edit is not saved for the next visit. Your work is still open in this tab; use "Save file" to keep a copy.';

/** Save on every change of the scenario or units. Returns the unsubscribe function. */
export function autosave(store: PlumbStore, storage: KeyValueStorage): () => void {
  const save = (s: Scenario, units: UnitSystem): void => {
    const warnings = store.getState().importWarnings;
    try {
      storage.setItem(AUTOSAVE_KEY, JSON.stringify({ scenario: scenarioToFile(s), units }));
    } catch {
      // Storage full or disabled (private mode): the app still works, it just cannot autosave; say so once.
      if (!warnings.includes(AUTOSAVE_FAILED_NOTE)) store.setState({ importWarnings: [...warnings, AUTOSAVE_FAILED_NOTE] });
      return;
    }
    if (warnings.includes(AUTOSAVE_FAILED_NOTE)) store.setState({ importWarnings: warnings.filter((w) => w !== AUTOSAVE_FAILED_NOTE) });
  };
  return store.subscribe((st, prev) => {
    if (st.scenario !== prev.scenario || st.units !== prev.units) save(st.scenario, st.units);
  });
}

function toBase64Url(bytes: Uint8Array): string {
  let bin = '';
  for (let i = 0; i < bytes.length; i++) bin += String.fromCharCode(bytes[i]);
  return btoa(bin).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

function fromBase64Url(text: string): Uint8Array {
  const b64 = text.replace(/-/g, '+').replace(/_/g, '/');
  const bin = atob(b64 + '='.repeat((4 - (b64.length % 4)) % 4));
  const out = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
  return out;
}

/** The URL hash form of a scenario: `#s=` + base64url of the UTF-8 JSON file form. */
export function shareHash(s: Scenario): string {
  return '#s=' + toBase64Url(new TextEncoder().encode(serialiseScenario(s)));
}

/** Parse a share hash; null when the hash holds no scenario, errors when it holds a bad one. */
export function scenarioFromHash(hash: string): ReturnType<typeof parseScenario> | null {
  const m = /^#?s=([A-Za-z0-9_-]+)$/.exec(hash);
  if (!m) return null;
  try {
    const json = new TextDecoder().decode(fromBase64Url(m[1]));
    return parseScenario(JSON.parse(json));
  } catch (e) {
    return { ok: false, errors: [{ path: '(link)', message: `the share link is damaged: ${(e as Error).message}` }] };
  }
}
