/**
 * Hardening: autosave when the storage refuses to write (full, or turned off): the store keeps the
 * edit, a note says autosave failed, and the note goes once a save works again.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseScenarioText } from '../../src/core/index';
import { AUTOSAVE_FAILED_NOTE, AUTOSAVE_KEY, autosave, type KeyValueStorage } from '../../src/store/persist';
import { createPlumbStore } from '../../src/store/store';

describe('autosave with a full storage', () => {
  it('keeps the edit, says autosave failed once, and clears the note when saving works again', () => {
    const p = parseScenarioText(readFileSync('assets/scenarios/side-hill-stock.json', 'utf8'));
    if (!p.ok) throw new Error('demo');
    const store = createPlumbStore(p.scenario);
    const map = new Map<string, string>();
    let full = true;
    const storage: KeyValueStorage = {
      getItem: (k) => map.get(k) ?? null,
      setItem: (k, v) => {
        if (full) throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
        map.set(k, v);
      },
    };
    const stop = autosave(store, storage);
    store.getState().setPose({ xM: 1.1 });
    store.getState().setPose({ xM: 1.2 });
    expect(store.getState().scenario.pose.xM).toBe(1.2);
    expect(store.getState().importWarnings.filter((w) => w === AUTOSAVE_FAILED_NOTE)).toHaveLength(1);
    expect(map.has(AUTOSAVE_KEY)).toBe(false);
    full = false;
    store.getState().setPose({ xM: 1.3 });
    expect(store.getState().importWarnings).not.toContain(AUTOSAVE_FAILED_NOTE);
    expect(JSON.parse(map.get(AUTOSAVE_KEY)!).scenario.pose.x).toBe(1.3);
    stop();
  });
});
