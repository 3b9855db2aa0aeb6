/**
 * The app store without React: actions call the pure core and set the result; history, import,
 * autosave and share links. Expected values come from the core called directly (cold solves on
 * a fresh model), never from the store itself.
 */
import { describe, expect, it, vi } from 'vitest';

// The store must not pull in any UI library.
vi.mock('react', () => ({}));
vi.mock('three', () => ({}));
vi.mock('@react-three/fiber', () => ({}));

import demo from '../../assets/scenarios/side-hill-stock.json';
import { buildModel, parseScenario, solveEquilibrium, tiltSweep, type Scenario } from '../../src/core';
import { createPlumbStore } from '../../src/store/store';
import { AUTOSAVE_KEY, autosave, loadAutosave, scenarioFromHash, shareHash, type KeyValueStorage } from '../../src/store/persist';

function demoScenario(): Scenario {
  const p = parseScenario(demo);
  if (!p.ok) throw new Error(JSON.stringify(p.errors));
  return p.scenario;
}

function coldLoads(s: Scenario): number[] {
  const r = solveEquilibrium(buildModel(s.vehicle, s.terrain), s.pose, { tilt: s.tilt, friction: s.friction });
  return r.wheels.map((w) => w.verticalLoadN!);
}

/** Solver tolerance 1e-8 of the weight (~22 kN): warm and cold solves agree to well under 0.01 N. */
const LOAD_EPS_N = 0.01;

function memoryStorage(): KeyValueStorage & { map: Map<string, string> } {
  const map = new Map<string, string>();
  return { map, getItem: (k) => map.get(k) ?? null, setItem: (k, v) => void map.set(k, v) };
}

describe('store', () => {
  it('opens solved, with the same loads as a cold solve of the core', () => {
    const s = demoScenario();
    const store = createPlumbStore(s);
    const st = store.getState();
    expect(st.result.status).toBe('converged');
    const cold = coldLoads(s);
    st.result.wheels.forEach((w, i) => expect(Math.abs(w.verticalLoadN! - cold[i])).toBeLessThan(LOAD_EPS_N));
  });

  it('setPose re-solves warm-started and matches a cold solve at the new pose', () => {
    const store = createPlumbStore(demoScenario());
    const before = store.getState().result;
    store.getState().setPose({ xM: 0.8, headingRad: 0.3 });
    const st = store.getState();
    expect(st.result).not.toBe(before);
    expect(st.scenario.pose).toEqual({ xM: 0.8, yM: 0, headingRad: 0.3 });
    const cold = coldLoads(st.scenario);
    st.result.wheels.forEach((w, i) => expect(Math.abs(w.verticalLoadN! - cold[i])).toBeLessThan(LOAD_EPS_N));
  });

  it('a no-op pose or tilt leaves the state object as it was (no re-render)', () => {
    const store = createPlumbStore(demoScenario());
    const st = store.getState();
    st.setPose({ xM: st.scenario.pose.xM });
    st.setTilt({ angleRad: st.scenario.tilt.angleRad });
    expect(store.getState()).toBe(st);
  });

  it('switching units changes nothing but the units', () => {
    const store = createPlumbStore(demoScenario());
    const { scenario, result } = store.getState();
    store.getState().setUnits('imperial');
    expect(store.getState().units).toBe('imperial');
    expect(store.getState().scenario).toBe(scenario);
    expect(store.getState().result).toBe(result);
  });

  it('undo and redo step through edits; a drag is one step', () => {
    const s = demoScenario();
    const store = createPlumbStore(s);
    const st = () => store.getState();
    st().setTilt({ angleRad: 0.1 });
    st().beginDrag();
    for (let i = 1; i <= 5; i++) st().setPose({ xM: 0.1 * i }, false);
    st().endDrag();
    expect(st().past).toHaveLength(2);
    expect(st().scenario.pose.xM).toBeCloseTo(0.5, 15);
    st().undo();
    expect(st().scenario.pose.xM).toBe(0);
    expect(st().scenario.tilt.angleRad).toBe(0.1);
    st().undo();
    expect(st().scenario).toBe(s);
    st().undo();
    expect(st().scenario).toBe(s);
    st().redo();
    st().redo();
    expect(st().scenario.pose.xM).toBeCloseTo(0.5, 15);
    const cold = coldLoads(st().scenario);
    st().result.wheels.forEach((w, i) => expect(Math.abs(w.verticalLoadN! - cold[i])).toBeLessThan(LOAD_EPS_N));
    // A new edit clears the redo list.
    st().undo();
    st().setPose({ yM: 0.2 });
    expect(st().future).toHaveLength(0);
  });

  it('an import that fails validation keeps the scenario and lists the errors by field', () => {
    const s = demoScenario();
    const store = createPlumbStore(s);
    const ok = store.getState().importData({ ...demo, vehicle: { ...demo.vehicle, mass: -5 } });
    expect(ok).toBe(false);
    expect(store.getState().scenario).toBe(s);
    expect(store.getState().importErrors?.map((e) => e.path)).toContain('vehicle.mass');
    expect(store.getState().importText('{"version": 1,')).toBe(false);
    expect(store.getState().importErrors?.[0].message).toMatch(/^not valid JSON/);
    expect(store.getState().scenario).toBe(s);
  });

  it('a valid import replaces the scenario, clears errors and can be undone', () => {
    const s = demoScenario();
    const store = createPlumbStore(s);
    store.getState().importData({ ...demo, vehicle: { ...demo.vehicle, mass: -5 } });
    const ok = store.getState().importData({ ...demo, name: 'Imported', pose: { x: 2, y: 0, heading: 0 } });
    expect(ok).toBe(true);
    expect(store.getState().importErrors).toBeNull();
    expect(store.getState().scenario.name).toBe('Imported');
    expect(store.getState().scenario.pose.xM).toBe(2);
    store.getState().undo();
    expect(store.getState().scenario).toBe(s);
  });

  it('runTiltSweep gives what the core tiltSweep gives on a fresh model', () => {
    const s = demoScenario();
    const store = createPlumbStore(s);
    store.getState().setTilt({ angleRad: 0.2 }); // the sweep starts from level whatever the tilt now
    const got = store.getState().runTiltSweep();
    const want = tiltSweep(buildModel(s.vehicle, s.terrain), s.pose, { downhillRad: s.tilt.downhillRad, friction: s.friction });
    expect(got.firstLift?.wheel).toBe(want.firstLift?.wheel);
    expect(Math.abs(got.firstLift!.angleRad - want.firstLift!.angleRad)).toBeLessThan(1e-6);
    expect(Math.abs(got.tip!.angleRad - want.tip!.angleRad)).toBeLessThan(1e-6);
    expect(store.getState().sweep?.result).toBe(got);
  });
});

describe('persistence', () => {
  it('autosaves on every scenario or units change, and restores the same numbers', () => {
    const storage = memoryStorage();
    const store = createPlumbStore(demoScenario());
    const stop = autosave(store, storage);
    expect(storage.map.has(AUTOSAVE_KEY)).toBe(false);
    store.getState().setPose({ xM: 1.2345678901234 });
    store.getState().setTilt({ angleRad: 0.123456789 });
    store.getState().setUnits('imperial');
    const restored = loadAutosave(storage);
    expect(restored?.units).toBe('imperial');
    expect(restored?.scenario.pose.xM).toBe(1.2345678901234);
    // Angles go through degrees in the file form: equal to the last bit or so.
    expect(restored!.scenario.tilt.angleRad).toBeCloseTo(0.123456789, 14);
    expect(restored?.scenario.vehicle.massKg).toBe(store.getState().scenario.vehicle.massKg);
    stop();
    store.getState().setPose({ xM: 3 });
    expect(loadAutosave(storage)?.scenario.pose.xM).toBe(1.2345678901234);
  });

  it('ignores a damaged autosave', () => {
    const storage = memoryStorage();
    storage.setItem(AUTOSAVE_KEY, '{"scenario": {"version": 1}');
    expect(loadAutosave(storage)).toBeNull();
    storage.setItem(AUTOSAVE_KEY, JSON.stringify({ scenario: { version: 1 }, units: 'metric' }));
    expect(loadAutosave(storage)).toBeNull();
  });

  it('a share link carries the scenario and reads back; a damaged one reports an error', () => {
    const s = { ...demoScenario(), name: 'Über die Kante – ledge ≥ 0.3 m' };
    const hash = shareHash(s);
    expect(hash).toMatch(/^#s=[A-Za-z0-9_-]+$/);
    const back = scenarioFromHash(hash);
    expect(back?.ok).toBe(true);
    if (back?.ok) {
      expect(back.scenario.name).toBe(s.name);
      expect(back.scenario.vehicle.wheelbaseM).toBe(s.vehicle.wheelbaseM);
      expect(coldLoads(back.scenario).map((v) => Math.round(v))).toEqual(coldLoads(s).map((v) => Math.round(v)));
    }
    expect(scenarioFromHash('')).toBeNull();
    expect(scenarioFromHash('#view=top')).toBeNull();
    const bad = scenarioFromHash('#s=' + hash.slice(3, 40));
    expect(bad?.ok).toBe(false);
  });
});

describe('display units follow an opened file', () => {
  it('opening an imperial file shows imperial, a metric one metric', async () => {
    const { readFileSync } = await import('node:fs');
    const imperial = JSON.parse(readFileSync('tests/fixtures/side-hill-stock-imperial.json', 'utf8'));
    const store = createPlumbStore(demoScenario(), 'metric');
    expect(store.getState().importData(imperial)).toBe(true);
    expect(store.getState().units).toBe('imperial');
    expect(store.getState().importData(demo)).toBe(true);
    expect(store.getState().units).toBe('metric');
  });
});
