/**
 * Pass along a polyline (src/core/analysis/pathGeometry.ts, runPass in pass.ts): arc lengths and
 * station counts by hand, the heading blended over one wheelbase at a corner, a two-point polyline
 * against the straight-path arithmetic, an L-shaped path on an inclined plane.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { PathWalker, pathLengthM, pathPoints, polylinePath } from '../../../src/core/analysis/pathGeometry';
import { runPass, stationCount } from '../../../src/core/analysis/pass';
import { buildModel } from '../../../src/core/solver/equilibrium';
import { parseScenario, parseScenarioText } from '../../../src/core/scenario/parse';
import type { PathSpec } from '../../../src/core/model/types';
import { testVehicle } from '../../helpers/vehicles';

const DEG = Math.PI / 180;

describe('path geometry', () => {
  it('arc length and stations, by hand', () => {
    // (0,0) → (3,4) → (3,10) → (-5,10): legs 5 (the 3-4-5 triangle), 6 and 8, so 19 m.
    const p = polylinePath([[0, 0], [3, 4], [3, 10], [-5, 10]], 0.5);
    expect(pathLengthM(p)).toBe(19);
    expect(pathPoints(p)).toEqual([[0, 0], [3, 4], [3, 10], [-5, 10]]);
    // 19 / 0.5 = 38 steps: stations 0, 0.5, …, 19 → 39.
    expect(stationCount(p)).toBe(39);
    // 19 / 0.4 = 47.5: 48 stations up to 18.8 m, and the end at 19 m → 49.
    expect(stationCount({ ...p, stepM: 0.4 })).toBe(49);
    // The walker puts s = 5 + 3 = 8 on the second leg, 3 m above its start (3, 4).
    const w = new PathWalker(p, 0);
    w.at(8);
    expect(w.xM).toBe(3);
    expect(w.yM).toBe(7);
    // s = 5 + 6 + 2 = 13: 2 m along the third leg, which runs in −x from (3, 10).
    w.at(13);
    expect(w.xM).toBe(1);
    expect(w.yM).toBe(10);
    // Beyond the end: clamped at the last point.
    w.at(25);
    expect([w.xM, w.yM]).toEqual([-5, 10]);
  });

  it('a two-point polyline is the straight path, station by station (the straight-path arithmetic by hand)', () => {
    // Before polylines a station at distance s stood at from + s·(to − from)/|to − from|, with the
    // heading atan2(dy, dx) and s = min(i·step, length); the walker must give those numbers exactly.
    const from = [1.25, -0.5] as const;
    const to = [8.75, 3.1] as const;
    const path: PathSpec = { fromM: from, toM: to, stepM: 0.3, headingRad: null };
    const dx = to[0] - from[0];
    const dy = to[1] - from[1];
    const len = Math.hypot(dx, dy);
    const w = new PathWalker(polylinePath([from, to], 0.3), 2.8);
    expect(w.lengthM).toBe(len);
    for (let i = 0; i < stationCount(path); i++) {
      const s = Math.min(i * 0.3, len);
      w.at(s);
      expect(w.xM).toBe(from[0] + (dx / len) * s);
      expect(w.yM).toBe(from[1] + (dy / len) * s);
      expect(w.headingRad).toBe(Math.atan2(dy, dx));
    }
  });

  it('at a corner the heading turns at a constant rate over one wheelbase centred on it', () => {
    // L: 10 m along +x, then 10 m along +y; blend 2.8 m (the test rig's wheelbase), so the heading
    // is 0 until s = 10 − 1.4, 90° from s = 10 + 1.4, and linear between: 45° at the corner.
    const w = new PathWalker(polylinePath([[0, 0], [10, 0], [10, 10]], 0.5), 2.8);
    const at = (s: number) => (w.at(s), w.headingRad);
    expect(at(0)).toBe(0);
    expect(at(8.6)).toBeCloseTo(0, 12);
    expect(at(9)).toBeCloseTo((Math.PI / 2) * ((9 - 8.6) / 2.8), 12); // 1/7 of 90°
    expect(at(10)).toBeCloseTo(Math.PI / 4, 12);
    expect(at(11)).toBeCloseTo((Math.PI / 2) * ((11 - 8.6) / 2.8), 12);
    expect(at(11.4)).toBeCloseTo(Math.PI / 2, 12);
    expect(at(20)).toBe(Math.PI / 2);
    // The reference point stays on the drawn legs through the blend.
    w.at(9.5);
    expect([w.xM, w.yM]).toEqual([9.5, 0]);
    w.at(10.5);
    expect(w.xM).toBe(10);
    expect(w.yM).toBeCloseTo(0.5, 12);
    // A right turn (clockwise) the short way round: −90°, never +270°.
    const r = new PathWalker(polylinePath([[0, 0], [10, 0], [10, -10]], 0.5), 2.8);
    r.at(20);
    expect(r.headingRad).toBeCloseTo(-Math.PI / 2, 12);
    // A short leg shortens the blend to half of it: legs 10, 1 and 10 (a jog), blend ≤ 0.5 m a side.
    const j = new PathWalker(polylinePath([[0, 0], [10, 0], [10, 1], [20, 1]], 0.5), 2.8);
    j.at(10 - 0.5);
    expect(j.headingRad).toBeCloseTo(0, 12);
    j.at(10.5);
    expect(j.headingRad).toBeCloseTo(Math.PI / 2, 12); // the middle of the jog: fully turned, both blends meet here
    j.at(11.5);
    expect(j.headingRad).toBeCloseTo(0, 12);
  });

  it('a fixed heading holds on every leg', () => {
    const w = new PathWalker(polylinePath([[0, 0], [10, 0], [10, 10]], 0.5, 0.3), 2.8);
    for (const s of [0, 9, 10, 11, 20]) {
      w.at(s);
      expect(w.headingRad).toBe(0.3);
    }
  });
});

describe('pass along a polyline', () => {
  it('a file path with two points gives the same pass as the first form (from, to): same stations, same events', () => {
    const text = readFileSync('assets/scenarios/ledge-crawler.json', 'utf8');
    const old = parseScenarioText(text);
    if (!old.ok) throw new Error(JSON.stringify(old.errors));
    const obj = JSON.parse(text);
    obj.path = { points: [{ x: obj.path.from[0], y: obj.path.from[1] }, { x: obj.path.to[0], y: obj.path.to[1] }], step: obj.path.step };
    const now = parseScenario(obj);
    if (!now.ok) throw new Error(JSON.stringify(now.errors));
    expect(now.scenario.path).toEqual(old.scenario.path);
    const s = old.scenario;
    const model = buildModel(s.vehicle, s.terrain);
    const a = runPass(model, s.path!, { friction: s.friction });
    const b = runPass(model, now.scenario.path!, { friction: s.friction });
    expect(b.stations.map((x) => x.pose)).toEqual(a.stations.map((x) => x.pose));
    expect(b.events).toEqual(a.events);
    expect(b.firstUnload).toEqual(a.firstUnload);
    // And a corner point on the straight line (no turn) changes nothing either: same events, poses within 1e-12 m.
    const mid = polylinePath([s.path!.fromM, [3.5, 0], s.path!.toM], s.path!.stepM);
    const c = runPass(model, mid, { friction: s.friction });
    expect(c.events.map((e) => [e.kind, e.wheel, e.part, e.startStation, e.endStation])).toEqual(a.events.map((e) => [e.kind, e.wheel, e.part, e.startStation, e.endStation]));
    for (let i = 0; i < a.stations.length; i++) {
      expect(c.stations[i].pose.xM).toBeCloseTo(a.stations[i].pose.xM, 12);
      expect(c.stations[i].pose.headingRad).toBe(a.stations[i].pose.headingRad);
    }
  });

  it('an L-shaped path on a 10° plane: climbing on the first leg, side-on on the second', () => {
    // The plane rises 10° along +x. Leg 1 runs up it (+x), leg 2 across it (+y), so the ground under
    // the vehicle is 10° nose-up on leg 1 and 10° right side up on leg 2 (ISO 8855: pitch + nose down,
    // roll + right side down). The springs add a lean by load transfer, by hand (rigid-body statics,
    // small angles): each corner is the wheel rate and the tyre in series, k = 1/(1/40 000 + 1/300 000 N/m)
    // ≈ 35.3 kN/m; along the slope each axle shifts W·sin10°·h/L (h = 0.75 m CG, L = 2.8 m) to the
    // other, half a wheel, so the body pitches by 2·(ΔF/2)/k/L more; across it each side shifts
    // W·sin10°·h/T (T = 1.6 m) and rolls by 2·(ΔF/2)/k/T more. Tolerance 0.3°: the lean moves the CG
    // itself a little (second order), and the tyres' contact patches shift on the slope.
    const W = 2000 * 9.80665;
    const k = 1 / (1 / 40_000 + 1 / 300_000);
    const pitchLean = (W * Math.sin(10 * DEG) * 0.75) / 2.8 / k / 2.8;
    const rollLean = (W * Math.sin(10 * DEG) * 0.75) / 1.6 / k / 1.6;
    const model = buildModel(testVehicle(), { features: [{ type: 'plane', gradeRad: 10 * DEG, crossSlopeRad: 0, heightM: 0 }] });
    const r = runPass(model, polylinePath([[0, 0], [10, 0], [10, 10]], 0.5), {});
    expect(r.plannedStations).toBe(41); // 20 m at 0.5 m, both ends
    expect(r.stations).toHaveLength(41);
    expect(r.tip).toBeNull();
    let leg1 = 0;
    let leg2 = 0;
    for (const st of r.stations) {
      if (st.distanceM <= 8.6) {
        leg1++;
        expect(st.pose.yM).toBe(0);
        expect(st.pose.headingRad).toBeCloseTo(0, 12);
        expect(Math.abs(st.pitchRad - -(10 * DEG + pitchLean)) / DEG).toBeLessThan(0.3);
        expect(Math.abs(st.rollRad / DEG)).toBeLessThan(0.1);
      } else if (st.distanceM >= 11.4) {
        leg2++;
        expect(st.pose.xM).toBe(10);
        expect(st.pose.headingRad).toBeCloseTo(Math.PI / 2, 12);
        expect(Math.abs(st.rollRad - -(10 * DEG + rollLean)) / DEG).toBeLessThan(0.3);
        expect(Math.abs(st.pitchRad / DEG)).toBeLessThan(0.1);
      }
    }
    expect(leg1).toBe(18); // 0 … 8.5 m
    expect(leg2).toBe(18); // 11.5 … 20 m
    // The pose sequence is continuous: no heading step larger than 90° × step / wheelbase.
    for (let i = 1; i < r.stations.length; i++) {
      expect(Math.abs(r.stations[i].pose.headingRad - r.stations[i - 1].pose.headingRad)).toBeLessThanOrEqual((Math.PI / 2) * (0.5 / 2.8) + 1e-12);
    }
  });
});
