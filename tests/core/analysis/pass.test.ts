/** Obstacle pass (src/core/analysis/pass.ts) and the line sweep (src/core/analysis/lines.ts). */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runPass, stationCount, type PassEvent } from '../../../src/core/analysis/pass';
import { makeLines, rankLines, runLineSweepJob, sweepLines } from '../../../src/core/analysis/lines';
import { buildModel } from '../../../src/core/solver/equilibrium';
import { parseScenarioText } from '../../../src/core/scenario/parse';
import type { Scenario } from '../../../src/core/scenario/types';
import { testVehicle } from '../../helpers/vehicles';


function demo(): Scenario {
  const r = parseScenarioText(readFileSync('assets/scenarios/ledge-crawler.json', 'utf8'));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.scenario;
}

const key = (e: PassEvent) => `${e.kind}:${e.wheel ?? e.part ?? ''}`;

describe('obstacle pass', () => {
  it('stations: from → to at the step, both ends included', () => {
    expect(stationCount({ fromM: [0, 0], toM: [1, 0], stepM: 0.25, headingRad: null })).toBe(5);
    expect(stationCount({ fromM: [0, 0], toM: [1, 0], stepM: 0.3, headingRad: null })).toBe(5); // 0, .3, .6, .9, 1.0
  });

  it('level ground: every wheel at its level load, no events, the same margin at every station', () => {
    const model = buildModel(testVehicle(), { features: [] });
    const r = runPass(model, { fromM: [0, 0], toM: [2, 1], stepM: 0.5, headingRad: null });
    expect(r.stations).toHaveLength(stationCount(r.path));
    expect(r.events).toEqual([]);
    expect(r.firstUnload).toBeNull();
    expect(r.tip).toBeNull();
    for (const s of r.stations) {
      for (const w of s.wheels) expect(w.loadShare).toBeCloseTo(1, 6);
      expect(s.pose.headingRad).toBeCloseTo(Math.atan2(1, 2), 12);
      // Belly at 0.28 m over level ground (tests/helpers BODY), the body at ride height.
      expect(s.clearanceM).toBeCloseTo(0.28, 3);
      expect(s.clearancePart).toBe('belly');
    }
  });

  it('a ledge too tall for the belly is reported as underbody contact on the belly', () => {
    // 0.35 m step; the test vehicle's belly is 0.28 m up (tests/helpers BODY) and the wheelbase 2.8 m.
    const model = buildModel(testVehicle(), { features: [{ type: 'step', xM: 2, heightM: 0.35, yRangeM: null, edgeRadiusM: 0.05 }] });
    const r = runPass(model, { fromM: [0, 0], toM: [4, 0], stepM: 0.05, headingRad: null });
    const contact = r.events.find((e) => e.kind === 'contact');
    expect(contact?.part).toBe('belly');
    expect(r.minClearance!.clearanceM).toBeLessThanOrEqual(0);
  });

  it('is continuous: halving the step moves no event by more than one (coarse) step', () => {
    const s = demo();
    const model = buildModel(s.vehicle, s.terrain);
    const step = s.path!.stepM;
    const coarse = runPass(model, s.path!, { friction: s.friction });
    const fine = runPass(model, { ...s.path!, stepM: step / 2 }, { friction: s.friction });
    expect(coarse.events.length).toBeGreaterThan(3);
    const tol = step + 1e-9;
    const close = (a: number | null, b: number | null) => (a === null || b === null ? a === b : Math.abs(a - b) <= tol);
    for (const e of coarse.events) {
      const m = fine.events.find((f) => key(f) === key(e) && close(f.startDistanceM, e.startDistanceM) && close(f.endDistanceM, e.endDistanceM));
      expect(m, `${key(e)} ${e.startDistanceM}–${e.endDistanceM}`).toBeDefined();
    }
    // Every fine event lasting two coarse steps or more is seen at the coarse step too.
    for (const f of fine.events) {
      if (f.endDistanceM !== null && f.endDistanceM - f.startDistanceM < 2 * step) continue;
      expect(coarse.events.some((e) => key(e) === key(f) && close(f.startDistanceM, e.startDistanceM)), key(f)).toBe(true);
    }
    expect(close(coarse.firstUnload?.distanceM ?? null, fine.firstUnload?.distanceM ?? null)).toBe(true);
    expect(coarse.firstUnload?.wheel).toBe(fine.firstUnload?.wheel);
  });

  it('the demo: the rear-left wheel goes light while the front-left climbs the boulder (diagonal unloading)', () => {
    const s = demo();
    const r = runPass(buildModel(s.vehicle, s.terrain), s.path!, { friction: s.friction });
    expect(r.firstUnload?.wheel).toBe('RL');
    const at = r.stations[r.firstUnload!.station];
    // The front-left tyre is then on the boulder (x 6.2 m, radius 0.8 m): front axle at pose x + L/2.
    expect(Math.abs(at.pose.xM + 1.2 - 6.2)).toBeLessThan(0.8);
    expect(at.wheels[2].loadShare).toBeLessThan(0.25);
  });

  it('reports progress once per station', () => {
    const model = buildModel(testVehicle(), { features: [] });
    const calls: number[] = [];
    runPass(model, { fromM: [0, 0], toM: [1, 0], stepM: 0.25, headingRad: 0 }, { onProgress: (d, n) => calls.push(d * 100 + n) });
    expect(calls).toEqual([105, 205, 305, 405, 505]);
  });
});

describe('line sweep', () => {
  it('lines: offsets to the left of the path, turned about its midpoint', () => {
    const lines = makeLines({ fromM: [0, 0], toM: [4, 0], stepM: 0.1, headingRad: null }, { from: -1, to: 1, step: 1 }, { from: 0, to: Math.PI / 2, step: Math.PI / 2 });
    expect(lines).toHaveLength(6);
    expect(lines[0].path.fromM).toEqual([0, -1]);
    expect(lines[2].path.toM).toEqual([4, 1]);
    const turned = lines[4].path; // offset 0, turned 90°: from (2, −2) to (2, 2)
    expect(turned.fromM[0]).toBeCloseTo(2, 12);
    expect(turned.fromM[1]).toBeCloseTo(-2, 12);
    expect(turned.toM[1]).toBeCloseTo(2, 12);
  });

  it('the best line\'s smallest margin is ≥ every other line\'s', () => {
    const s = demo();
    const path = { ...s.path!, stepM: 0.1 };
    const ranking = sweepLines(s.vehicle, s.terrain, path, { from: -0.6, to: 0.6, step: 0.3 }, { from: -0.1, to: 0.1, step: 0.1 }, { friction: s.friction });
    expect(ranking.ranked).toHaveLength(15);
    for (const l of ranking.ranked) expect(ranking.best.minForceAngleRad).toBeGreaterThanOrEqual(l.minForceAngleRad);
    for (const l of ranking.ranked) expect(ranking.worst.minForceAngleRad).toBeLessThanOrEqual(l.minForceAngleRad);
    // The lines differ (the boulder is under some of them only), so the ranking means something.
    expect(ranking.best.minForceAngleRad).toBeGreaterThan(ranking.worst.minForceAngleRad);
    // The pure job function gives the same line as the sweep.
    const job = runLineSweepJob({ vehicle: s.vehicle, terrain: s.terrain, options: { friction: s.friction }, lines: [makeLines(path, { from: -0.6, to: -0.6, step: 1 }, { from: -0.1, to: -0.1, step: 1 })[0]] });
    expect(job[0].minForceAngleRad).toBe(ranking.ranked.find((l) => l.index === 0)!.minForceAngleRad);
  });

  it('a line that tips ranks below one that does not', () => {
    const base = { index: 0, offsetM: 0, headingChangeRad: 0, path: { fromM: [0, 0] as const, toM: [1, 0] as const, stepM: 1, headingRad: null }, stationsSolved: 2, plannedStations: 2, firstUnload: null, firstLift: null, minMarginDistanceM: 0, energyAtMinM: 0.1, minClearanceM: 0.2 };
    const ranking = rankLines([
      { ...base, index: 0, tip: { distanceM: 0.5, reason: 'x' }, minForceAngleRad: 0 },
      { ...base, index: 1, tip: null, minForceAngleRad: 0.3 },
    ]);
    expect(ranking.best.index).toBe(1);
    expect(() => rankLines([])).toThrow('rankLines: no lines to rank');
  });
});
