/**
 * Autosave, restore and share links. The scenario is saved in its file form in metric units
 * (scenarioToFile), so a restored scenario goes through the same validation as an import.
 *
 * Saved work is never lost:
 * - Every save carries a revision number (and the saving tab's id). A tab that finds a newer
 *   revision than the one it last loaded or wrote (another tab saved since) does not overwrite it:
 *   it holds its own saves and offers "load the other tab's work" or "keep this tab's" (the
 *   status below; the top bar shows it). Other tabs hear of a save at once (storage event and
 *   BroadcastChannel).
 * - A scenario up to LOCAL_MAX_CHARS is saved to localStorage at once on every change (it
 *   survives a crashed tab); a larger one (a height grid, a scan) goes to IndexedDB, up to
 *   AUTOSAVE_MAX_CHARS (the scenario file's own limit), with a small pointer in localStorage.
 * - When a save fails, the "Autosave failed" note stays among the warnings until a save succeeds
 *   (a later import's messages do not wipe it).
 */
import { SCENARIO_LIMITS, parseScenario, scenarioToFile, type Scenario, type UnitSystem } from '../core';
import { createStore, type StoreApi } from 'zustand/vanilla';
import type { PlumbStore } from './store';
import type { AsyncKeyValue } from './idb';

export const AUTOSAVE_KEY = 'plumbline.autosave.v1';
/** The revision of the latest save, whichever tab made it: `{rev, tab, inDatabase}`. */
export const AUTOSAVE_REV_KEY = 'plumbline.autosave.rev';
/** The key of the large autosave in IndexedDB's "autosave" store. */
export const AUTOSAVE_DB_KEY = 'current';
/** The channel tabs tell each other of saves on. */
export const SAVE_CHANNEL = 'plumbline.saves';

/** Largest autosave kept in localStorage (characters, about 2 MB as UTF-16); larger ones go to IndexedDB. */
export const LOCAL_MAX_CHARS = 1_000_000;
/** Largest autosave at all (characters): the scenario file's own limit (128 MiB). */
export const AUTOSAVE_MAX_CHARS = SCENARIO_LIMITS.fileChars;
/** Large (IndexedDB) saves wait for this pause in the edits (ms); small ones are written at once. */
export const DATABASE_SAVE_DELAY_MS = 300;

/** The subset of the Web Storage API used here (localStorage in the app, a Map in tests). */
export interface KeyValueStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem?(key: string): void;
}

interface SavedState {
  readonly scenario: unknown;
  readonly units: UnitSystem;
  readonly rev?: number;
  readonly tab?: string;
  readonly savedAtMs?: number;
}

interface RevMark {
  readonly rev: number;
  readonly tab: string;
  readonly inDatabase: boolean;
  readonly savedAtMs: number;
}

/**
 * Full precision: JSON keeps every double exactly (shortest round-trip form), and the file form
 * is written in the scenario's own units, so reload gives back the same numbers.
 */
export function serialiseScenario(s: Scenario): string {
  return JSON.stringify(scenarioToFile(s));
}

export interface Restored {
  readonly scenario: Scenario;
  readonly units: UnitSystem;
  /** The revision restored (0: an autosave from before revisions). */
  readonly rev: number;
}

function restore(saved: SavedState | null): Restored | null {
  if (!saved || typeof saved !== 'object') return null;
  const parsed = parseScenario(saved.scenario);
  if (!parsed.ok) return null;
  const units: UnitSystem = saved.units === 'imperial' ? 'imperial' : 'metric';
  const rev = typeof saved.rev === 'number' && Number.isFinite(saved.rev) ? saved.rev : 0;
  return { scenario: parsed.scenario, units, rev };
}

function readJson<T>(storage: KeyValueStorage, key: string): T | null {
  try {
    const text = storage.getItem(key);
    return text ? (JSON.parse(text) as T) : null;
  } catch {
    return null;
  }
}

/** The localStorage autosave (null when there is none or it is damaged). */
export function loadAutosave(storage: KeyValueStorage): Restored | null {
  try {
    return restore(readJson<SavedState>(storage, AUTOSAVE_KEY));
  } catch {
    return null;
  }
}

/** The latest revision saved by any tab (0 when none). */
export function storedRev(storage: KeyValueStorage): RevMark | null {
  const m = readJson<RevMark>(storage, AUTOSAVE_REV_KEY);
  return m && typeof m.rev === 'number' ? m : null;
}

/** The newest autosave: localStorage's or the database's, whichever has the higher revision. */
export async function loadLatestAutosave(storage: KeyValueStorage, database: AsyncKeyValue | null): Promise<Restored | null> {
  const local = loadAutosave(storage);
  let big: Restored | null = null;
  if (database) {
    try {
      const v = await database.get(AUTOSAVE_DB_KEY);
      big = typeof v === 'string' ? restore(JSON.parse(v) as SavedState) : null;
    } catch {
      big = null;
    }
  }
  if (local && big) return big.rev > local.rev ? big : local;
  return local ?? big;
}

/** Shown (as an import warning) while autosave cannot write; removed once a save succeeds again. */
export const AUTOSAVE_FAILED_NOTE =
  'Autosave failed: the browser\'s storage for this site is full or turned off, so this edit is not saved for the next visit. Your work is still open in this tab; use "Save file" to keep a copy.';

/** Shown when the scenario is larger than any autosave may be. */
export const AUTOSAVE_TOO_LARGE_NOTE = `Autosave failed: this scenario is larger than the autosave limit (${AUTOSAVE_MAX_CHARS / 1024 / 1024} MiB of text), so it is not saved for the next visit. Use "Save file" to keep it.`;

export interface SaveStatus {
  /** 'saved': the latest edit is stored; 'pending': a large save is on its way; 'failed'; 'held': another tab saved newer work. */
  readonly state: 'saved' | 'pending' | 'failed' | 'held';
  /** Where the latest save went. */
  readonly where: 'local' | 'database' | null;
  /** The revision this tab last loaded or wrote. */
  readonly rev: number;
  /** Another tab's newer save this tab has not taken or overruled; null when none. */
  readonly newer: { readonly rev: number; readonly savedAtMs: number } | null;
  /** The failure shown, when state is 'failed'. */
  readonly failure: string | null;
}

export interface AutosaveOptions {
  /** IndexedDB's autosave store (null: none; large scenarios then cannot be autosaved). */
  readonly database?: AsyncKeyValue | null;
  /** This tab's id. */
  readonly tab?: string;
  /** The revision the scenario was loaded from. @default the stored revision */
  readonly rev?: number;
  /** Tells other tabs of saves (BroadcastChannel in the app). */
  readonly channel?: { postMessage(m: unknown): void; onmessage: ((e: { data: unknown }) => void) | null } | null;
  /** Subscribe to another tab's writes of storage (the `storage` event in the app). Returns the unsubscribe. */
  readonly onStorageEvent?: (handler: (key: string | null) => void) => () => void;
  readonly nowMs?: () => number;
}

export interface AutosaveController {
  readonly status: StoreApi<SaveStatus>;
  /** Save the current scenario now (e.g. after opening a link). */
  saveNow(): void;
  /** Load the other tab's newer work into this tab (an undoable edit: this tab's work is one Undo away). */
  loadNewer(): Promise<boolean>;
  /** Keep this tab's work: it overwrites the other tab's save (which stays one Undo away there). */
  keepMine(): void;
  /** Resolves when a large save under way is written. */
  flush(): Promise<void>;
  stop(): void;
}

let tabCounter = 0;
const newTabId = (): string => `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}-${tabCounter++}`;

/** Save on every change of the scenario or units, with revisions. */
export function startAutosave(store: PlumbStore, storage: KeyValueStorage, opts: AutosaveOptions = {}): AutosaveController {
  const tab = opts.tab ?? newTabId();
  const now = opts.nowMs ?? (() => Date.now());
  const database = opts.database ?? null;
  const status = createStore<SaveStatus>()(() => ({
    state: 'saved',
    where: null,
    rev: opts.rev ?? storedRev(storage)?.rev ?? 0,
    newer: null,
    failure: null,
  }));
  let stopped = false;
  let dbTimer: ReturnType<typeof setTimeout> | null = null;
  let dbWrite: Promise<void> = Promise.resolve();

  const setFailure = (note: string | null): void => {
    const warnings = store.getState().importWarnings;
    const mine = [AUTOSAVE_FAILED_NOTE, AUTOSAVE_TOO_LARGE_NOTE];
    const rest = warnings.filter((w) => !mine.includes(w));
    const next = note ? [...rest, note] : rest;
    if (next.length !== warnings.length || next.some((w, i) => w !== warnings[i])) store.setState({ importWarnings: next });
  };
  const fail = (note: string): void => {
    status.setState({ state: 'failed', failure: note });
    setFailure(note);
  };
  const succeed = (rev: number, where: 'local' | 'database'): void => {
    status.setState({ state: 'saved', where, rev, failure: null, newer: null });
    setFailure(null);
    opts.channel?.postMessage({ type: 'saved', rev, tab });
  };

  /** Another tab's save newer than ours, if any. */
  const newerElsewhere = (): RevMark | null => {
    const m = storedRev(storage);
    return m && m.tab !== tab && m.rev > status.getState().rev ? m : null;
  };

  const hold = (m: { rev: number; savedAtMs: number }): void => {
    status.setState({ state: 'held', newer: { rev: m.rev, savedAtMs: m.savedAtMs } });
  };

  const write = (force: boolean): void => {
    if (stopped) return;
    const st = store.getState();
    const cur = status.getState();
    if (!force) {
      const other = newerElsewhere();
      if (other) return hold(other);
      if (cur.state === 'held') return;
    }
    const rev = Math.max(cur.rev, storedRev(storage)?.rev ?? 0) + 1;
    const savedAtMs = now();
    let text: string;
    try {
      text = JSON.stringify({ scenario: scenarioToFile(st.scenario), units: st.units, rev, tab, savedAtMs });
    } catch {
      return fail(AUTOSAVE_FAILED_NOTE);
    }
    if (text.length > AUTOSAVE_MAX_CHARS) return fail(AUTOSAVE_TOO_LARGE_NOTE);
    if (text.length <= LOCAL_MAX_CHARS) {
      try {
        storage.setItem(AUTOSAVE_KEY, text);
        storage.setItem(AUTOSAVE_REV_KEY, JSON.stringify({ rev, tab, inDatabase: false, savedAtMs } satisfies RevMark));
        return succeed(rev, 'local');
      } catch {
        // Full or turned off: the database may still take it.
        if (!database) return fail(AUTOSAVE_FAILED_NOTE);
      }
    }
    if (!database) return fail(AUTOSAVE_FAILED_NOTE);
    // Large: to IndexedDB after a pause in the edits (a drag of a vehicle on a big grid saves once).
    status.setState({ state: 'pending' });
    if (dbTimer) clearTimeout(dbTimer);
    const payload = text;
    dbTimer = setTimeout(() => {
      dbTimer = null;
      dbWrite = dbWrite.then(async () => {
        if (stopped) return;
        try {
          await database.put(AUTOSAVE_DB_KEY, payload);
        } catch {
          return fail(AUTOSAVE_FAILED_NOTE);
        }
        try {
          storage.setItem(AUTOSAVE_REV_KEY, JSON.stringify({ rev, tab, inDatabase: true, savedAtMs } satisfies RevMark));
          // The small copy is older now: drop it, so a reload takes the database's.
          storage.removeItem?.(AUTOSAVE_KEY);
        } catch {
          // localStorage full: the revision lives in the database copy; other tabs hear of it on the channel.
        }
        succeed(rev, 'database');
      });
    }, DATABASE_SAVE_DELAY_MS);
  };

  const unsubscribe = store.subscribe((st, prev) => {
    if (st.scenario !== prev.scenario || st.units !== prev.units) write(false);
    else if (st.importWarnings !== prev.importWarnings) {
      // A later message (an import's) must not wipe the failure note while saving still fails.
      const f = status.getState().failure;
      if (f && !st.importWarnings.includes(f)) setFailure(f);
    }
  });

  const heard = (): void => {
    if (stopped) return;
    const other = newerElsewhere();
    if (other) hold(other);
  };
  const offStorage = opts.onStorageEvent?.((key) => {
    if (key === null || key === AUTOSAVE_REV_KEY) heard();
  });
  if (opts.channel) {
    opts.channel.onmessage = (e) => {
      const m = e.data as { type?: string; rev?: number; tab?: string } | null;
      if (!m || m.type !== 'saved' || m.tab === tab || typeof m.rev !== 'number') return;
      if (m.rev > status.getState().rev) hold({ rev: m.rev, savedAtMs: now() });
    };
  }

  return {
    status,
    saveNow: () => write(false),
    async loadNewer() {
      const latest = await loadLatestAutosave(storage, database);
      if (!latest) return false;
      // An edit like any other: this tab's work stays one Undo away.
      store.getState().replaceScenario(latest.scenario);
      store.getState().setUnits(latest.units);
      status.setState({ state: 'saved', rev: Math.max(latest.rev, status.getState().newer?.rev ?? 0), newer: null });
      return true;
    },
    keepMine() {
      status.setState({ newer: null, state: 'saved' });
      write(true);
    },
    flush: async () => {
      while (dbTimer) await new Promise((r) => setTimeout(r, DATABASE_SAVE_DELAY_MS / 2));
      await dbWrite;
    },
    stop() {
      stopped = true;
      unsubscribe();
      offStorage?.();
      if (opts.channel) opts.channel.onmessage = null;
      if (dbTimer) clearTimeout(dbTimer);
    },
  };
}

/** Save on every change of the scenario or units (localStorage only). Returns the unsubscribe function. */
export function autosave(store: PlumbStore, storage: KeyValueStorage): () => void {
  const c = startAutosave(store, storage);
  return () => c.stop();
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

/**
 * Longest share link made (characters of the whole address): 32 kB. Browsers and mail programs
 * cut or refuse much longer addresses (common practice: keep links well under 64 kB); a scenario
 * past it is shared as a file ("Save file").
 */
export const SHARE_MAX_URL_CHARS = 32 * 1024;

/** The URL hash form of a scenario: `#s=` + base64url of the UTF-8 JSON file form. */
export function shareHash(s: Scenario): string {
  return '#s=' + toBase64Url(new TextEncoder().encode(serialiseScenario(s)));
}

/** A share link for the scenario, or why there is none (too long). */
export function shareLink(base: string, s: Scenario): { ok: true; url: string } | { ok: false; message: string } {
  // Cheap bound first: base64 of UTF-8 is at least 4/3 of the JSON's length in characters.
  const json = serialiseScenario(s);
  if (base.length + 3 + Math.ceil((json.length * 4) / 3) > SHARE_MAX_URL_CHARS) return tooLong(Math.ceil((json.length * 4) / 3) + base.length + 3);
  const url = base + shareHash(s);
  if (url.length > SHARE_MAX_URL_CHARS) return tooLong(url.length);
  return { ok: true, url };
}

function tooLong(chars: number): { ok: false; message: string } {
  return {
    ok: false,
    message: `This scenario is too large for a link (${(chars / 1024).toFixed(0)} kB; links stop at ${SHARE_MAX_URL_CHARS / 1024} kB). Use "Save file" and send the file instead.`,
  };
}

/** Parse a share hash; null when the hash holds no scenario, errors when it holds a bad one. */
export function scenarioFromHash(hash: string): ReturnType<typeof parseScenario> | null {
  const m = /^#?s=([A-Za-z0-9_-]+)$/.exec(hash);
  if (!m) {
    if (/^#?s=/.test(hash)) return { ok: false, errors: [{ path: '(link)', message: 'the share link is damaged: characters outside base64url' }] };
    return null;
  }
  if (m[1].length > SHARE_MAX_URL_CHARS) {
    return { ok: false, errors: [{ path: '(link)', message: `the share link is longer than ${SHARE_MAX_URL_CHARS / 1024} kB` }] };
  }
  try {
    const json = new TextDecoder('utf-8', { fatal: true }).decode(fromBase64Url(m[1]));
    return parseScenario(JSON.parse(json));
  } catch (e) {
    return { ok: false, errors: [{ path: '(link)', message: `the share link is damaged: ${(e as Error).message}` }] };
  }
}
