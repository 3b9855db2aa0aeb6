/**
 * Shown poses (a pass station, a build) and the outline build, without React; the pass replay
 * used for the scene. Expected values come from the core called directly (runPass, cold solves
 * on fresh models), never from the store itself.
 */
import { describe, expect, it, vi } from 'vitest';

vi.mock('react', () => ({}));
vi.mock('three', () => ({}));
vi.mock('@react-three/fiber', () => ({}));

import demo from '../../assets/scenarios/side-hill-stock.json';
import buildsDemo from '../../assets/scenarios/side-hill-builds.json';
import { applyBuild, buildModel, parseScenario, passOptionsOf, runPass, solveEquilibrium, type Scenario, type Vehicle } from '../../src/core';
import { createPlumbStore, shownModel, shownPose, shownResult, shownVehicle } from '../../src/store/store';
import { runPassWithSolves } from '../../src/worker/passReplay';
import { passHeadline } from '../../src/present/words';

function scenarioOf(data: unknown): Scenario {
  const p = parseScenario(data);
  if (!p.ok) throw new Error(JSON.stringify(p.errors));
  return p.scenario;
}

function coldLoads(v: Vehicle, s: Scenario): number[] {
  const r = solveEquilibrium(buildModel(v, s.terrain), s.pose, { tilt: s.tilt, friction: s.friction });
  return r.wheels.map((w) => w.verticalLoadN!);
}

/** Solver tolerance 1e-8 of the weight: warm and cold solves agree to well under 0.01 N. */
const LOAD_EPS_N = 0.01;

describe('pass replay (the full solve per station, for the scene)', () => {
  it('gives at every station the solve the pass summary was made from, and the same pass as runPass alone', () => {
    const s = scenarioOf(demo);
    expect(s.path).not.toBeNull();
    const model = buildModel(s.vehicle, s.terrain);
    const pass = runPass(model, s.path!, passOptionsOf(s));
    const { result, solved } = runPassWithSolves(buildModel(s.vehicle, s.terrain), s.path!, passOptionsOf(s));
    expect(result.stations.map((st) => st.wheels.map((w) => w.loadN))).toEqual(pass.stations.map((st) => st.wheels.map((w) => w.loadN)));
    expect(solved).toHaveLength(pass.stations.length);
    expect(pass.stations.length).toBeGreaterThan(100);
    for (let i = 0; i < solved.length; i++) {
      for (let k = 0; k < 4; k++) expect(solved[i].wheels[k].loadN).toBe(pass.stations[i].wheels[k].loadN);
      expect(solved[i].margins.forceAngleRad).toBe(pass.stations[i].forceAngleRad);
    }
  });

  it('the headline names the first light wheel, the smallest margin and where, as runPass has them', () => {
    const s = scenarioOf(demo);
    const pass = runPass(buildModel(s.vehicle, s.terrain), s.path!, passOptionsOf(s));
    const text = passHeadline(pass, 'metric');
    const deg = ((pass.minMargin!.forceAngleRad * 180) / Math.PI).toFixed(1);
    expect(text).toContain(`smallest force-angle margin ${deg}° at ${pass.minMargin!.distanceM.toFixed(2)} m`);
    // The outcome leads (on this side hill nothing stops the crawl), then the first wheel to go light.
    expect(pass.tip ?? pass.hangUp ?? pass.firstSlide).toBeNull();
    expect(text).toMatch(/^Stands all along the path; /);
    if (pass.firstUnload) expect(text).toContain(`${pass.firstUnload.wheel} unloads first at ${pass.firstUnload.distanceM.toFixed(2)} m`);
    else expect(text).toMatch(/no wheel goes below 25 %/);
    // Imperial: distances in feet (1 ft = 0.3048 m exactly).
    expect(passHeadline(pass, 'imperial')).toContain(`${(pass.minMargin!.distanceM / 0.3048).toFixed(2)} ft`);
  });
});

describe('shown poses', () => {
  it('a pass station is shown in place of the scenario pose, and the next edit ends it', () => {
    const s = scenarioOf(demo);
    const store = createPlumbStore(s);
    const model = buildModel(s.vehicle, s.terrain);
    const { result: pass, solved } = runPassWithSolves(model, s.path!, passOptionsOf(s));
    const i = Math.floor(pass.stations.length / 2);
    const before = store.getState().scenario;
    store.getState().showStation('station', pass.stations[i].pose, solved[i]);
    const st = store.getState();
    expect(st.scenario).toBe(before);
    expect(st.past).toHaveLength(0);
    expect(shownPose(st)).toEqual(pass.stations[i].pose);
    expect(shownResult(st)).toBe(solved[i]);
    expect(shownModel(st)).toBe(st.model);
    store.getState().setTilt({ angleRad: 0.05 });
    expect(store.getState().shown).toBeNull();
    expect(shownResult(store.getState())).toBe(store.getState().result);
  });

  it('a build shown alone or as an outline is solved at the scenario pose, follows a move, and ends with a vehicle edit', () => {
    const s = scenarioOf(buildsDemo);
    expect(s.builds!.length).toBeGreaterThanOrEqual(2);
    const a = applyBuild(s.vehicle, s.builds![0]).vehicle;
    const b = applyBuild(s.vehicle, s.builds![1]).vehicle;
    const store = createPlumbStore(s);
    store.getState().showBuild(a, 'A', 'alone');
    store.getState().showBuild(b, 'B', 'ghost');
    let st = store.getState();
    expect(shownVehicle(st)).toBe(a);
    expect(st.ghost!.vehicle).toBe(b);
    const coldA = coldLoads(a, s);
    const coldB = coldLoads(b, s);
    st.shown!.result.wheels.forEach((w, k) => expect(Math.abs(w.verticalLoadN! - coldA[k])).toBeLessThan(LOAD_EPS_N));
    st.ghost!.result.wheels.forEach((w, k) => expect(Math.abs(w.verticalLoadN! - coldB[k])).toBeLessThan(LOAD_EPS_N));
    // The builds differ from each other and from the vehicle as given.
    expect(Math.abs(coldA[0] - coldB[0]) + Math.abs(coldA[0] - store.getState().result.wheels[0].verticalLoadN!)).toBeGreaterThan(1);

    store.getState().setPose({ xM: 1.2, headingRad: 0.2 });
    st = store.getState();
    expect(st.shown!.pose).toEqual(st.scenario.pose);
    expect(st.ghost!.pose).toEqual(st.scenario.pose);
    const movedA = coldLoads(a, st.scenario);
    const movedB = coldLoads(b, st.scenario);
    st.shown!.result.wheels.forEach((w, k) => expect(Math.abs(w.verticalLoadN! - movedA[k])).toBeLessThan(LOAD_EPS_N));
    st.ghost!.result.wheels.forEach((w, k) => expect(Math.abs(w.verticalLoadN! - movedB[k])).toBeLessThan(LOAD_EPS_N));

    store.getState().replaceScenario({ ...st.scenario, vehicle: { ...st.scenario.vehicle, massKg: st.scenario.vehicle.massKg + 50 } });
    expect(store.getState().shown).toBeNull();
    expect(store.getState().ghost).toBeNull();
  });

  it('clearShown(true) ends both; the overlay path is a view setting only', () => {
    const s = scenarioOf(buildsDemo);
    const store = createPlumbStore(s);
    const a = applyBuild(s.vehicle, s.builds![0]).vehicle;
    store.getState().showBuild(a, 'A', 'alone');
    store.getState().showBuild(a, 'A', 'ghost');
    store.getState().clearShown(true);
    expect(store.getState().shown).toBeNull();
    expect(store.getState().ghost).toBeNull();
    const line = { fromM: [0, 1] as const, toM: [5, 1] as const, stepM: 0.1, headingRad: null };
    store.getState().setOverlayPath(line);
    expect(store.getState().overlayPath).toBe(line);
    expect(store.getState().scenario).toBe(s);
    expect(store.getState().past).toHaveLength(0);
  });
});
