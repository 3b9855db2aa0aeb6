/**
 * Saved work is never lost (the logic, over in-memory stand-ins for localStorage, IndexedDB and the
 * tabs' channel): two tabs sharing one storage never overwrite each other's newer work silently; a
 * large scenario goes to the database; a failed save's note survives later messages; share links
 * past the stated size are refused.
 */
import { describe, expect, it } from 'vitest';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario, type Scenario } from '../../src/core';
import { memoryKeyValue } from '../../src/store/idb';
import {
  AUTOSAVE_DB_KEY,
  AUTOSAVE_FAILED_NOTE,
  AUTOSAVE_KEY,
  LOCAL_MAX_CHARS,
  SHARE_MAX_URL_CHARS,
  loadLatestAutosave,
  scenarioFromHash,
  shareLink,
  startAutosave,
  type KeyValueStorage,
} from '../../src/store/persist';
import { createPlumbStore } from '../../src/store/store';

function demoScenario(): Scenario {
  const p = parseScenario(demo);
  if (!p.ok) throw new Error('demo');
  return p.scenario;
}

/** One browser's localStorage, shared by its tabs; each write is heard by the other tabs (the storage event). */
function sharedStorage() {
  const map = new Map<string, string>();
  const listeners = new Set<{ tab: string; h: (key: string | null) => void }>();
  let full = false;
  const forTab = (tab: string): KeyValueStorage & { onStorageEvent: (h: (key: string | null) => void) => () => void } => ({
    getItem: (k) => map.get(k) ?? null,
    setItem: (k, v) => {
      if (full) throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
      map.set(k, v);
      for (const l of listeners) if (l.tab !== tab) l.h(k);
    },
    removeItem: (k) => void map.delete(k),
    onStorageEvent: (h) => {
      const l = { tab, h };
      listeners.add(l);
      return () => listeners.delete(l);
    },
  });
  return { map, forTab, setFull: (f: boolean) => (full = f) };
}

/** A terrain grid big enough that its file form is past LOCAL_MAX_CHARS. */
function bigScenario(): Scenario {
  const s = demoScenario();
  const n = 400;
  const heights = new Float64Array(n * n);
  for (let i = 0; i < heights.length; i++) heights[i] = 0.123456789 * Math.sin(i * 0.001);
  return {
    ...s,
    terrain: { ...s.terrain, features: [...s.terrain.features, { type: 'grid', originM: [-20, -20], spacingM: 0.1, cols: n, rows: n, heightsM: Array.from(heights) }] },
  };
}

describe('two tabs on one storage', () => {
  it("a tab never overwrites another tab's newer save: it holds, then loads it or keeps its own on request", async () => {
    const shared = sharedStorage();
    const a = createPlumbStore(demoScenario());
    const b = createPlumbStore(demoScenario());
    const sa = shared.forTab('A');
    const sb = shared.forTab('B');
    const ca = startAutosave(a, sa, { tab: 'A', onStorageEvent: sa.onStorageEvent });
    const cb = startAutosave(b, sb, { tab: 'B', onStorageEvent: sb.onStorageEvent });
    a.getState().setPose({ xM: 0.9 });
    expect(JSON.parse(shared.map.get(AUTOSAVE_KEY)!).scenario.pose.x).toBe(0.9);
    // B hears of A's save at once and holds its own saves.
    expect(cb.status.getState().state).toBe('held');
    expect(cb.status.getState().newer?.rev).toBe(1);
    b.getState().setPose({ xM: 1.7 });
    // B's edit is in B, but A's save is not overwritten.
    expect(b.getState().scenario.pose.xM).toBe(1.7);
    expect(JSON.parse(shared.map.get(AUTOSAVE_KEY)!).scenario.pose.x).toBe(0.9);
    // "Load the other tab's work": B shows 0.9, and B's own 1.7 is one Undo away.
    await cb.loadNewer();
    expect(b.getState().scenario.pose.xM).toBe(0.9);
    b.getState().undo();
    expect(b.getState().scenario.pose.xM).toBe(1.7);
    // That undo is an edit in B, saved now (B is up to date), and A in turn holds.
    expect(JSON.parse(shared.map.get(AUTOSAVE_KEY)!).scenario.pose.x).toBe(1.7);
    expect(ca.status.getState().state).toBe('held');
    a.getState().setTilt({ angleRad: 0.05 });
    expect(JSON.parse(shared.map.get(AUTOSAVE_KEY)!).scenario.pose.x).toBe(1.7);
    // "Keep this tab's": A saves over it, with a higher revision.
    ca.keepMine();
    const saved = JSON.parse(shared.map.get(AUTOSAVE_KEY)!);
    expect(saved.scenario.pose.x).toBe(0.9);
    expect(saved.rev).toBeGreaterThan(2);
    expect(cb.status.getState().state).toBe('held');
    ca.stop();
    cb.stop();
  });
});

describe('large scenarios and failed saves', () => {
  it('a scenario past the localStorage share is saved to the database and restored from it', async () => {
    const shared = sharedStorage();
    const db = memoryKeyValue();
    const big = bigScenario();
    const store = createPlumbStore(demoScenario());
    const st = shared.forTab('A');
    const c = startAutosave(store, st, { tab: 'A', database: db });
    store.getState().setPose({ xM: 0.4 });
    expect(c.status.getState().where).toBe('local');
    store.getState().replaceScenario(big);
    expect(c.status.getState().state).toBe('pending');
    await c.flush();
    expect(c.status.getState()).toMatchObject({ state: 'saved', where: 'database' });
    expect((db.map.get(AUTOSAVE_DB_KEY) as string).length).toBeGreaterThan(LOCAL_MAX_CHARS);
    // The older small copy is gone, so a reload cannot pick it.
    expect(shared.map.has(AUTOSAVE_KEY)).toBe(false);
    const back = await loadLatestAutosave(st, db);
    const grid = back!.scenario.terrain.features.find((f) => f.type === 'grid') as unknown as { heightsM: ArrayLike<number> };
    expect(grid.heightsM.length).toBe(400 * 400);
    expect(grid.heightsM[12345]).toBe(0.123456789 * Math.sin(12345 * 0.001));
    c.stop();
  });

  it("a failed save's note stays through later messages until a save succeeds", () => {
    const shared = sharedStorage();
    const store = createPlumbStore(demoScenario());
    const c = startAutosave(store, shared.forTab('A'), { tab: 'A' });
    shared.setFull(true);
    store.getState().setPose({ xM: 1.1 });
    expect(c.status.getState().state).toBe('failed');
    expect(store.getState().importWarnings).toContain(AUTOSAVE_FAILED_NOTE);
    // An import's own warnings (or none) replace the list: the note comes back with them.
    store.setState({ importWarnings: ['the file used an older format'] });
    expect(store.getState().importWarnings).toEqual(['the file used an older format', AUTOSAVE_FAILED_NOTE]);
    store.setState({ importWarnings: [] });
    expect(store.getState().importWarnings).toEqual([AUTOSAVE_FAILED_NOTE]);
    shared.setFull(false);
    store.getState().setPose({ xM: 1.2 });
    expect(c.status.getState().state).toBe('saved');
    expect(store.getState().importWarnings).toEqual([]);
    c.stop();
  });
});

describe('share links', () => {
  it('a link up to the stated size is made and reads back; past it, a message and no link', () => {
    const s = demoScenario();
    const ok = shareLink('http://127.0.0.1:4173/', s);
    expect(ok.ok).toBe(true);
    if (ok.ok) {
      expect(ok.url.length).toBeLessThanOrEqual(SHARE_MAX_URL_CHARS);
      const back = scenarioFromHash(new URL(ok.url).hash);
      expect(back?.ok && back.scenario.name).toBe(s.name);
    }
    const tooBig = shareLink('http://127.0.0.1:4173/', bigScenario());
    expect(tooBig.ok).toBe(false);
    if (!tooBig.ok) expect(tooBig.message).toMatch(/too large for a link \(\d+ kB; links stop at 32 kB\)\. Use "Save file"/);
    // A link longer than the limit is refused when read, before decoding.
    const long = scenarioFromHash('#s=' + 'A'.repeat(SHARE_MAX_URL_CHARS + 1));
    expect(long?.ok).toBe(false);
  });
});
