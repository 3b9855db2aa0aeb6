/**
 * Build options edited through the store: adding, changing, reordering and removing builds in
 * the scenario's `builds` list are each one undo step (keystrokes in one field merge), undo gives
 * back the scenario as it was, and every candidate is checked by the scenario rules in the file
 * form. Expected physical values come from handbook statics, never from the store.
 */
import { describe, expect, it, vi } from 'vitest';

vi.mock('react', () => ({}));
vi.mock('three', () => ({}));
vi.mock('@react-three/fiber', () => ({}));

import demo from '../../assets/scenarios/side-hill-stock.json';
import { applyBuild, parseScenario, scenarioToFile, totalCgHeightM, type Scenario } from '../../src/core';
import { createPlumbStore } from '../../src/store/store';
import { addBuild, freshBuildName, moveBuild, removeBuild, replaceBuild, setBuildValue, validateBuilds } from '../../src/app/buildEdit';

function demoScenario(): Scenario {
  const p = parseScenario(demo);
  if (!p.ok) throw new Error(JSON.stringify(p.errors));
  return p.scenario;
}

/** What the form does for one field: set the value in build i, validate, then editScenario. */
function editField(store: ReturnType<typeof createPlumbStore>, i: number, path: (string | number)[], value: unknown, key: string): boolean {
  const cur = store.getState().scenario;
  const cand = replaceBuild(cur, i, setBuildValue(cur.builds![i], path, value));
  if (!validateBuilds(cand, store.getState().units).ok) return false;
  store.getState().editScenario(cand, key);
  return true;
}

describe('build options in the store', () => {
  it('add, edit and remove a build: each one undo step, undo restores, the file form round-trips', () => {
    const s0 = demoScenario();
    expect(s0.builds ?? []).toEqual([]);
    const store = createPlumbStore(s0);
    const st = () => store.getState();

    st().replaceScenario(addBuild(st().scenario));
    expect(st().scenario.builds).toEqual([{ name: 'build 1' }]);
    expect(st().past.length).toBe(1);

    // Two keystrokes in the lift field ("0.0", then "0.05") are one undo step.
    expect(editField(store, 0, ['lift', 'suspensionM'], 0.0, 'builds[0].lift.suspension')).toBe(true);
    expect(editField(store, 0, ['lift', 'suspensionM'], 0.05, 'builds[0].lift.suspension')).toBe(true);
    expect(st().past.length).toBe(2);
    const lifted = st().scenario;
    expect(lifted.builds![0]).toEqual({ name: 'build 1', lift: { suspensionM: 0.05 } });
    // The vehicle itself is untouched (a build is compared, not applied).
    expect(lifted.vehicle).toBe(s0.vehicle);

    // The file form keeps it: parse(write(s)) gives the same build.
    const back = parseScenario(scenarioToFile(lifted, 'imperial'));
    expect(back.ok).toBe(true);
    if (back.ok) expect(back.scenario.builds![0].lift!.suspensionM).toBeCloseTo(0.05, 12);

    // A suspension lift raises the sprung mass only: the CG as weighed rises by Δ·m_sprung/m
    // (composite centre of mass, e.g. Meriam & Kraige, Engineering Mechanics: Statics, "composite
    // bodies"); the payload rides on the body and rises by Δ.
    const v = s0.vehicle;
    const sprungKg = v.massKg - v.unsprungMassFrontKg - v.unsprungMassRearKg;
    let mKg = v.massKg;
    let mzKgM = v.massKg * (v.cg.heightM + (0.05 * sprungKg) / v.massKg);
    for (const p of v.payload) {
      mKg += p.massKg;
      mzKgM += p.massKg * (p.heightM + 0.05);
    }
    expect(totalCgHeightM(applyBuild(v, lifted.builds![0]).vehicle)).toBeCloseTo(mzKgM / mKg, 12);

    st().replaceScenario(removeBuild(st().scenario, 0));
    expect(st().scenario.builds).toEqual([]);
    expect(st().past.length).toBe(3);
    st().undo();
    expect(st().scenario).toBe(lifted);
    st().undo();
    expect(st().scenario.builds).toEqual([{ name: 'build 1' }]);
    st().undo();
    expect(st().scenario).toBe(s0);
    expect(st().past.length).toBe(0);
    st().redo();
    st().redo();
    expect(st().scenario).toBe(lifted);

    // Clearing the field removes the lift altogether (no empty block in the file); typed right
    // after in the same field it merges with that field's step, so one undo takes both back.
    st().replaceScenario(lifted);
    expect(editField(store, 0, ['lift', 'suspensionM'], 0.07, 'builds[0].lift.suspension')).toBe(true);
    expect(editField(store, 0, ['lift', 'suspensionM'], undefined, 'builds[0].lift.suspension')).toBe(true);
    expect(st().scenario.builds![0]).toEqual({ name: 'build 1' });
    st().undo();
    expect(st().scenario).toBe(lifted);
  });

  it('reorders builds; undo gives the old order back', () => {
    const store = createPlumbStore(demoScenario());
    const st = () => store.getState();
    st().replaceScenario(addBuild(st().scenario, { name: 'lift', lift: { suspensionM: 0.05 } }));
    st().replaceScenario(addBuild(st().scenario, { name: 'spacers', wheels: { axle: 'both', spacerM: 0.03 } }));
    expect(freshBuildName(st().scenario.builds!)).toBe('build 3');
    const before = st().scenario;
    st().replaceScenario(moveBuild(before, 1, -1));
    expect(st().scenario.builds!.map((b) => b.name)).toEqual(['spacers', 'lift']);
    expect(moveBuild(st().scenario, 0, -1)).toBe(st().scenario);
    st().undo();
    expect(st().scenario).toBe(before);
  });

  it('refuses what the scenario rules refuse, naming the field, in the units shown', () => {
    const s = addBuild(addBuild(demoScenario(), { name: 'a' }), { name: 'b' });
    // The file format's limit: a lift of at most 0.5 m (src/core/scenario/schema.ts BUILD_LIMITS).
    const tooHigh = replaceBuild(s, 0, setBuildValue(s.builds![0], ['lift', 'suspensionM'], 0.6));
    const m = validateBuilds(tooHigh, 'metric');
    expect(m.ok).toBe(false);
    if (!m.ok) expect(m.errors.find((e) => e.path === 'builds[0].lift.suspension')?.message).toMatch(/≤ 0\.5 m/);
    const imp = validateBuilds(tooHigh, 'imperial');
    expect(imp.ok).toBe(false);
    if (!imp.ok) expect(imp.errors.find((e) => e.path === 'builds[0].lift.suspension')?.message).toMatch(/ in\b/);
    // Two builds of one name, and a new wheel without the stock one it is measured against.
    const dup = replaceBuild(s, 1, { name: 'a' });
    const d = validateBuilds(dup, 'metric');
    expect(!d.ok && d.errors.some((e) => e.path === 'builds[1].name')).toBe(true);
    const wheel = replaceBuild(s, 0, { name: 'a', wheels: { axle: 'both', fitted: { rimWidthM: 9 * 0.0254, offsetM: -0.012 } } });
    const w = validateBuilds(wheel, 'metric');
    expect(!w.ok && w.errors.some((e) => e.path === 'builds[0].wheels.stock')).toBe(true);
    expect(validateBuilds(s, 'metric').ok).toBe(true);
  });
});
