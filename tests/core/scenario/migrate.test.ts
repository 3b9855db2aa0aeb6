/** Scenario format versions: migrateScenario brings older files up, refuses future ones. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { migrateScenario, parseScenario, SCENARIO_VERSION, type MigrationStep } from '../../../src/core/index';

const DEMO = JSON.parse(readFileSync('assets/scenarios/side-hill-stock.json', 'utf8')) as Record<string, unknown>;

describe('migrateScenario', () => {
  it('version 1 is current', () => expect(SCENARIO_VERSION).toBe(1));

  it('passes a current file through unchanged, with no warning', () => {
    const r = migrateScenario(DEMO);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.file).toBe(DEMO);
    expect(r.fromVersion).toBe(1);
    expect(r.warnings).toEqual([]);
  });

  it('reads a file with no version as version 1, with a warning, without touching the input', () => {
    const old = { ...DEMO };
    delete old.version;
    const r = migrateScenario(old);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect((r.file as Record<string, unknown>).version).toBe(1);
    expect(old.version).toBeUndefined();
    expect(r.warnings).toEqual(['version: not given; reading the file as version 1 (add "version": 1)']);
    // The migrated file is a valid scenario, and parseScenario migrates the old one itself,
    // passing the warning on.
    expect(parseScenario(r.file).ok).toBe(true);
    const parsed = parseScenario(old);
    expect(parsed.ok).toBe(true);
    if (parsed.ok) expect(parsed.warnings).toContain('version: not given; reading the file as version 1 (add "version": 1)');
  });

  it('refuses a version from the future with a clear message', () => {
    const r = migrateScenario({ ...DEMO, version: 3 });
    expect(r).toEqual({
      ok: false,
      errors: [{ path: 'version', message: 'this file is format version 3, newer than this version of Plumbline reads (1); update Plumbline to open it' }],
    });
  });

  it('leaves a version that is no version at all to the schema', () => {
    for (const v of ['1', 1.5, 0, null]) {
      const input = { ...DEMO, version: v };
      const r = migrateScenario(input);
      expect(r.ok).toBe(true);
      if (r.ok) expect(r.file).toBe(input);
      expect(parseScenario(input).ok).toBe(false);
    }
  });

  it('runs one step per version: a v1 → v2 step is one function', () => {
    // A made-up version 2 that renames ground.friction to ground.mu.
    const v1ToV2: MigrationStep = (f) => {
      const { ground, ...rest } = f as { ground?: { friction?: number } };
      return { ...rest, version: 2, ground: { mu: ground?.friction } };
    };
    const r = migrateScenario(DEMO, { 1: v1ToV2 }, 2);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.fromVersion).toBe(1);
    expect((r.file as { version: number }).version).toBe(2);
    expect((r.file as { ground: { mu: number } }).ground.mu).toBe(0.6);
    expect(r.warnings).toEqual(['version: read as format version 1 and brought up to version 2']);
    expect(DEMO.version).toBe(1);
  });

  it('says so when a step is missing, or a step gives the wrong version', () => {
    expect(migrateScenario(DEMO, {}, 2)).toEqual({
      ok: false,
      errors: [{ path: 'version', message: 'no migration from format version 1 to 2; this file cannot be read' }],
    });
    const wrong = migrateScenario(DEMO, { 1: (f) => ({ ...f }) }, 2);
    expect(wrong.ok).toBe(false);
  });

  it('passes anything that is not an object through for the parser to report', () => {
    for (const v of [null, 3, 'x', [1]]) {
      const r = migrateScenario(v);
      expect(r.ok).toBe(true);
      if (r.ok) expect(r.file).toBe(v);
    }
  });
});
